namespace InspectionUpdate.Reliability.Simulation;

/// <summary>
/// Crude Monte Carlo estimate of Pf = P(g(X) ≤ 0): samples u ~ N(0, I) mapped to x by the problem's
/// transformation, so correlated and non-normal inputs are handled exactly.
/// </summary>
/// <remarks>
/// The estimate is the failure fraction p̂; its coefficient of variation is √(s²/N)/p̂ with s² the sample variance
/// of the indicator (≈ √((1 − p̂)/(N·p̂))). Seeded, parallel over cores and reproducible for any thread count (see
/// <see cref="SamplingOptions"/>). The limit state is called from several threads at once.
/// </remarks>
public static class CrudeMonteCarlo
{
    /// <summary>The name reported in <see cref="SimulationResult.Method"/>.</summary>
    public const string MethodName = "crude Monte Carlo";

    /// <summary>Estimates Pf; never throws for a poor estimate: check <see cref="SimulationResult.Converged"/>.</summary>
    /// <param name="problem">The random inputs, their transformation and the limit state.</param>
    /// <param name="options">Settings; null takes <see cref="SamplingOptions.Default"/>.</param>
    /// <param name="cancellationToken">Stops the run between blocks.</param>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    /// <exception cref="OperationCanceledException">The run was cancelled.</exception>
    public static SimulationResult Run(ReliabilityProblem problem, SamplingOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= SamplingOptions.Default;
        options.Validate();
        var t = problem.Transformation;
        var g = problem.LimitState;
        var n = t.StandardDimension;
        var m = t.PhysicalDimension;
        var outcome = BlockSampler.Run(options, (stream, count) =>
        {
            var u = new double[n];
            var x = new double[m];
            long failures = 0, nonFinite = 0;
            for (var s = 0; s < count; s++)
            {
                stream.NextStandardNormal(u);
                t.ToPhysical(u, x);
                var value = g.Evaluate(x);
                if (value <= 0) failures++;
                else if (!double.IsFinite(value)) nonFinite++;
            }

            return new SampleSums(count, failures, failures, failures, nonFinite);
        }, cancellationToken);
        return BlockSampler.ToResult(MethodName, options, outcome, null);
    }
}
