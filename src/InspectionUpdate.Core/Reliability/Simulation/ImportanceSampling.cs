namespace InspectionUpdate.Reliability.Simulation;

/// <summary>
/// Importance sampling in standard normal space with the sampling density φ(u − c), a unit normal shifted to a
/// centre c, normally the FORM design point u* (Harbitz 1986; Melchers 1989; from memory).
/// </summary>
/// <remarks>
/// With u = c + v, v ~ N(0, I), the weight is φ(u)/φ(u − c) = exp(−vᵀc − ½‖c‖²). The estimate is the mean of the
/// weighted failure indicator I(g ≤ 0)·w, and its coefficient of variation is √(s²/N)/p̂ with s² the sample
/// variance of the weighted indicators. The estimator is unbiased for any centre; a centre far from the important
/// region only costs samples. Seeded and reproducible for any thread count (see <see cref="SamplingOptions"/>).
/// </remarks>
public static class ImportanceSampling
{
    /// <summary>The name reported in <see cref="SimulationResult.Method"/>.</summary>
    public const string MethodName = "importance sampling (unit normal at the design point)";

    /// <summary>
    /// Estimates Pf with the sampling density centred at a FORM design point. The evaluations reported are those of
    /// the sampling only, not of the FORM run.
    /// </summary>
    /// <param name="problem">The random inputs, their transformation and the limit state.</param>
    /// <param name="form">A FORM result of the same problem; its <see cref="FormResult.DesignPointU"/> is the centre.
    /// A non-converged FORM result still gives a valid (perhaps slow) estimate; the diagnostic says so.</param>
    /// <param name="options">Settings; null takes <see cref="SamplingOptions.Default"/>.</param>
    /// <param name="cancellationToken">Stops the run between blocks.</param>
    /// <exception cref="ArgumentException">The design point does not match the problem or is not finite.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static SimulationResult Run(ReliabilityProblem problem, FormResult form, SamplingOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(form);
        var note = form.Converged ? null : "The FORM result used as the centre did not converge; the estimate is still unbiased.";
        return Run(problem, form.DesignPointU, options, note, cancellationToken);
    }

    /// <summary>Estimates Pf with the sampling density centred at <paramref name="centerU"/>.</summary>
    /// <param name="problem">The random inputs, their transformation and the limit state.</param>
    /// <param name="centerU">The centre in standard normal space (one entry per random variable).</param>
    /// <param name="options">Settings; null takes <see cref="SamplingOptions.Default"/>.</param>
    /// <param name="cancellationToken">Stops the run between blocks.</param>
    /// <exception cref="ArgumentException">The centre does not match the problem or is not finite.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static SimulationResult Run(ReliabilityProblem problem, IReadOnlyList<double> centerU, SamplingOptions? options = null, CancellationToken cancellationToken = default) =>
        Run(problem, centerU, options, null, cancellationToken);

    private static SimulationResult Run(ReliabilityProblem problem, IReadOnlyList<double> centerU, SamplingOptions? options,
        string? note, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(centerU);
        options ??= SamplingOptions.Default;
        options.Validate();
        var t = problem.Transformation;
        var g = problem.LimitState;
        var n = t.StandardDimension;
        var m = t.PhysicalDimension;
        if (centerU.Count != n)
        {
            throw new ArgumentException($"The centre has {centerU.Count} entries; the problem has {n} random variables.", nameof(centerU));
        }

        var c = new double[n];
        var c2 = 0.0;
        for (var i = 0; i < n; i++)
        {
            c[i] = centerU[i];
            if (!double.IsFinite(c[i]))
            {
                throw new ArgumentException(FormattableString.Invariant($"The centre entry [{i}] = {c[i]} is not finite."), nameof(centerU));
            }

            c2 += c[i] * c[i];
        }

        var outcome = BlockSampler.Run(options, (stream, count) =>
        {
            var v = new double[n];
            var u = new double[n];
            var x = new double[m];
            long failures = 0, nonFinite = 0;
            double sumW = 0, sumW2 = 0;
            for (var s = 0; s < count; s++)
            {
                stream.NextStandardNormal(v);
                var vc = 0.0;
                for (var i = 0; i < n; i++)
                {
                    u[i] = c[i] + v[i];
                    vc += v[i] * c[i];
                }

                t.ToPhysical(u, x);
                var value = g.Evaluate(x);
                if (value <= 0)
                {
                    var w = Math.Exp(-vc - 0.5 * c2);
                    failures++;
                    sumW += w;
                    sumW2 += w * w;
                }
                else if (!double.IsFinite(value))
                {
                    nonFinite++;
                }
            }

            return new SampleSums(count, failures, sumW, sumW2, nonFinite);
        }, cancellationToken);
        return BlockSampler.ToResult(MethodName, options, outcome, note);
    }
}
