using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Updating.Simulation;

/// <summary>A simulated probability with its coefficient of variation.</summary>
internal sealed record SimulatedValue(double Value, double CoefficientOfVariation, long Samples, long Evaluations, bool Converged, string? Note);

/// <summary>
/// The simulation route: likelihood-weighted importance sampling in the standard normal space of the model inputs.
/// The findings enter through their likelihoods L_k(x) (the detectable sizes and sizing errors integrated out:
/// 1 − F_Ad(a), F_Ad(a), the density of the measured size, the survival indicator), so
/// P(F | data) = E_q[1_F φL/q] / E_q'[φL/q'] with two independent sample sets.
/// </summary>
/// <remarks>
/// <para>Sampling densities: the Laplace approximation N(m, S) of the posterior in u-space (m the posterior mode found by
/// damped Newton on ½‖u‖² − Σ ln L_k with the smooth likelihoods, S the inverse Hessian), inflated by 1.1, mixed with
/// the prior N(0, I) as a defensive component (Hesterberg 1995, Technometrics 37(2):185–194) so the weights stay
/// bounded. For the numerator the Laplace component is moved to the design point of g found by FORM in the
/// posterior-whitened coordinates v (u = m + C v, CCᵀ = S).</para>
/// <para>The CoV of the ratio is √(CoV_N² + CoV_D²); the estimate is converged when it is at most the target.
/// Not thread-safe; reproducible from the seed.</para>
/// </remarks>
internal sealed class LikelihoodImportanceSampler
{
    private const double Inflation = 1.1;
    private const double HalfLog2Pi = 0.91893853320467274178;
    private readonly EvidenceModel _model;
    private readonly UpdatingOptions _options;
    private readonly NatafTransformation _t;
    private readonly int _d;
    private readonly int _m;
    private readonly EvidenceEvent[] _events;
    private readonly EvidenceEvent[] _smooth;
    private readonly double[] _x;
    private Laplace? _laplace;
    private EvidenceSamples? _evidence;

    public LikelihoodImportanceSampler(EvidenceModel model, UpdatingOptions options)
    {
        _model = model;
        _options = options;
        _t = new NatafTransformation(model.InputModel);
        _d = _t.StandardDimension;
        _m = _t.PhysicalDimension;
        _events = model.Events.ToArray();
        _smooth = _events.Where(e => e.Outcome is not SurvivedInService).ToArray();
        _x = new double[_m];
    }

    /// <summary>Weighted posterior samples of the inputs (physical values), with their weights.</summary>
    public sealed record EvidenceSamples(double[][] X, double[] Weights, SimulatedValue Evidence, double LogScale, double EffectiveSampleSize);

    internal sealed record Laplace(double[] Mean, double[,] Lower, double LogDet, bool Converged, string? Note, long Evaluations);

    /// <summary>The evidence P(data) (a density for equalities) and the weighted posterior samples behind it.</summary>
    public EvidenceSamples Evidence()
    {
        if (_evidence is not null) return _evidence;
        var lap = FitLaplace();
        var rng = new Random(_options.Seed);
        var xs = new List<double[]>();
        var logW = new List<double>();
        var u = new double[_d];
        long evaluations = lap.Evaluations;
        double cov;
        while (true)
        {
            for (var s = 0; s < _options.SamplesPerBatch; s++)
            {
                var fromPrior = rng.NextDouble() < _options.DefensiveWeight;
                Draw(rng, u, fromPrior ? null : lap.Mean, lap);
                var lp = LogPosterior(u);
                evaluations += _events.Length;
                logW.Add(lp - LogMixture(u, lap, null));
                xs.Add((double[])_x.Clone());
            }

            cov = CoefficientOfVariation(logW, null, out _);
            // The evidence is the denominator of every P(F | data): it gets half the CoV budget, so that the ratio can
            // still reach the target (with equal shares the numerator alone could never bring the total under it).
            if (cov <= EvidenceShare * _options.TargetCoefficientOfVariation || logW.Count + _options.SamplesPerBatch > _options.MaxSamples) break;
        }

        var logScale = logW.Max();
        var w = logW.Select(l => Math.Exp(l - logScale)).ToArray();
        var sum = w.Sum();
        var ess = sum * sum / w.Sum(v => v * v);
        var value = Math.Exp(logScale) * sum / w.Length;
        var converged = cov <= _options.TargetCoefficientOfVariation && lap.Converged;
        var note = FormattableString.Invariant($"likelihood-weighted importance sampling (Laplace-fitted mixture), ESS {ess:F0} of {w.Length}")
            + (lap.Note is null ? "" : "; " + lap.Note);
        _evidence = new EvidenceSamples(xs.ToArray(), w, new SimulatedValue(value, cov, w.Length, evaluations, converged, note), logScale, ess);
        return _evidence;
    }

    /// <summary>P(F(t) | data) of a component.</summary>
    public SimulatedValue Conditional(string componentId, double timeYears)
    {
        var evidence = Evidence();
        var lap = _laplace!;
        var g = _model.FailureFunction(componentId, timeYears);
        long evaluations = 0;

        // Centre of the numerator's sampling density: the design point of g in posterior-whitened coordinates.
        var shifted = new ShiftedTransformation(_t, lap.Mean, lap.Lower);
        var form = FormSolver.Solve(new ReliabilityProblem(shifted, _model.FailureLimitState(componentId, timeYears)), _options.Form);
        evaluations += form.LimitStateEvaluations;
        double[]? centre = null;
        var centreSource = "";
        if (form.Converged && form.DesignPointU.All(double.IsFinite))
        {
            centre = new double[_d];
            shifted.ToU(form.DesignPointU.ToArray(), centre);
        }
        else
        {
            // Where the findings make failure at t nearly or wholly impossible (e.g. t before an in-service record),
            // the posterior-coordinate search has no design point to find. The prior's design point still lies in
            // F(t): sampling there either finds the failures the findings allow or shows that every failure
            // contradicts them (the "impossible" stop below), where sampling around the posterior mode draws no
            // failure at all and runs to the cap.
            var prior = PriorDesignPoint(componentId, timeYears, ref evaluations);
            if (prior is not null)
            {
                centre = prior;
                centreSource = "; FORM in posterior coordinates failed, sampling around the prior design point";
            }
        }

        // Common random numbers: every time of a component draws the same standard normal stream, moved to that
        // time's sampling centre, so neighbouring estimates are strongly correlated and their difference ΔPf keeps
        // far less noise than two independent estimates would give.
        var rng = new Random(unchecked(_options.Seed * 7919 + StableHash(componentId)));
        var logW = new List<double>();
        var u = new double[_d];
        double cov;
        var wCentre = 1 - _options.DefensiveWeight;
        long failures = 0;
        string? stop = null;
        var evidenceMean = evidence.Weights.Sum() / evidence.Weights.Length;
        var pilot = true;
        var recentred = 0;
        var failureU = new List<double[]>();
        var failureLogW = new List<double>();
        while (true)
        {
            for (var s = 0; s < _options.SamplesPerBatch; s++)
            {
                // Mixture: (1−w)·N(centre) + w·[(1−w)·N(m) + w·N(0, I)].
                double[]? at;
                if (centre is not null && rng.NextDouble() < wCentre) at = centre;
                else at = rng.NextDouble() < _options.DefensiveWeight ? null : lap.Mean;
                Draw(rng, u, at, lap);
                _t.ToPhysical(u, _x);
                evaluations++;
                if (g(_x) > 0)
                {
                    logW.Add(double.NegativeInfinity);
                    continue;
                }

                failures++;
                var lp = LogPosterior(u);
                evaluations += _events.Length;
                logW.Add(lp - LogMixture(u, lap, centre));
                if (pilot)
                {
                    failureU.Add((double[])u.Clone());
                    failureLogW.Add(logW[^1]);
                }
            }

            var scale = logW.Max();
            cov = CoefficientOfVariation(logW, scale, out var scaledMean);
            var covEvidence = evidence.Evidence.CoefficientOfVariation;
            var covTotal = Math.Sqrt(cov * cov + covEvidence * covEvidence);
            if (covTotal <= _options.TargetCoefficientOfVariation || logW.Count + _options.SamplesPerBatch > _options.MaxSamples) break;

            // Two honest early stops, so that probabilities far below any decision level do not spend the sample cap:
            // (1) many failures were drawn and every one contradicts the findings (zero likelihood), so F ∩ data is
            // empty to working precision; (2) the estimate plus three standard errors lies below the negligible level.
            if (failures >= ImpossibleAfterFailures && double.IsPositiveInfinity(cov))
            {
                stop = FormattableString.Invariant($"all {failures} sampled failures contradict the findings (zero likelihood): P(F | data) is 0 to working precision");
                break;
            }

            // The batch's estimate from the mean the CoV pass already formed (no second pass over the weights).
            var estimate = double.IsFinite(cov) ? scaledMean * Math.Exp(scale - evidence.LogScale) / evidenceMean : double.NaN;
            // Only with a design point to sample around: without one the density may simply miss the failure region.
            if (centre is not null && double.IsFinite(estimate) && estimate * (1 + 3 * covTotal) < _options.NegligibleProbability)
            {
                stop = FormattableString.Invariant($"below the negligible level {_options.NegligibleProbability:G3} with three standard errors");
                break;
            }

            // Cross-entropy steps (Rubinstein & Kroese 2004, the mean of the optimal density): where a pilot batch
            // did not reach the target, the design point in posterior coordinates is a poor centre (the
            // findings bend the failure region), so the centre moves to the weighted mean of the batch's failures
            // and the estimate restarts from the new density; the pilot batch is not used in the estimate.
            if (pilot)
            {
                var moved = WeightedMean(failureU, failureLogW);
                failureU.Clear();
                failureLogW.Clear();
                pilot = moved is not null && recentred + 1 < CrossEntropySteps;
                if (moved is not null)
                {
                    centre = moved;
                    recentred++;
                    logW.Clear();
                    failures = 0;
                    continue;
                }
            }
        }

        var ratio = RatioOf(logW, evidence.LogScale, evidenceMean);
        var total = Math.Sqrt(cov * cov + evidence.Evidence.CoefficientOfVariation * evidence.Evidence.CoefficientOfVariation);
        if (ratio == 0 && stop is null) total = double.PositiveInfinity;
        var converged = (stop is not null || total <= _options.TargetCoefficientOfVariation) && evidence.Evidence.Converged;
        var note = FormattableString.Invariant($"likelihood-weighted importance sampling: {logW.Count} samples for P(F ∩ data), {evidence.Weights.Length} for P(data)")
            + (centre is null ? "; FORM in posterior and prior coordinates failed, sampling around the posterior mode" : centreSource)
            + (recentred > 0 ? FormattableString.Invariant($"; sampling centre moved {recentred} time(s) to the weighted mean of a pilot batch's failures") : "")
            + (stop is null ? "" : "; stopped early: " + stop)
            + (converged ? "" : FormattableString.Invariant($"; target CoV {_options.TargetCoefficientOfVariation:G3} not reached (CoV {total:G3})"));
        return new SimulatedValue(Math.Clamp(ratio, 0, 1), total, logW.Count + evidence.Weights.Length, evaluations + evidence.Evidence.Evaluations, converged, note);
    }

    /// <summary>
    /// A point on the prior limit state G(t) = 0 to sample around, or null: FORM from the origin, else (the median
    /// point in a flat region) from a later time's design point (<see cref="LaterTimeStart"/>) back to t through the
    /// halved times, each search started from the last point. A search that ended on the limit state without meeting
    /// its alignment tolerance (<see cref="FormResult.EndsOnLimitState"/>) is all a sampling centre needs.
    /// </summary>
    private double[]? PriorDesignPoint(string componentId, double timeYears, ref long evaluations)
    {
        long used = 0;
        FormResult Solve(double time, IReadOnlyList<double>? start)
        {
            var f = FormSolver.Solve(new ReliabilityProblem(_t, _model.FailureLimitState(componentId, time)), _options.Form with { StartPoint = start });
            used += f.LimitStateEvaluations;
            return f;
        }

        static bool Usable(FormResult f) => f.DesignPointU.All(double.IsFinite) && (f.Converged || f.EndsOnLimitState);

        var form = Solve(timeYears, null);
        var point = Usable(form) ? form.DesignPointU : null;
        if (point is null && LaterTimeStart.Find(timeYears, time => Solve(time, null)) is { } later)
        {
            point = later.Form.DesignPointU;
            for (var j = later.Doublings - 1; j >= 0 && point is not null; j--)
            {
                form = Solve(timeYears * (1 << j), point);
                point = Usable(form) ? form.DesignPointU : null;
            }
        }

        evaluations += used;
        return point?.ToArray();
    }

    /// <summary>Largest number of cross-entropy moves of the sampling centre (each costs one discarded batch).</summary>
    private const int CrossEntropySteps = 4;

    /// <summary>Share of the target CoV given to the evidence P(data), the common denominator.</summary>
    private const double EvidenceShare = 0.5;

    /// <summary>Smallest number of sampled failures, all of zero likelihood, that ends the sampling with P(F | data) = 0.</summary>
    private const int ImpossibleAfterFailures = 2000;

    /// <summary>Σ wᵢuᵢ / Σ wᵢ with wᵢ = exp(ln wᵢ), or null when no weight is positive.</summary>
    private static double[]? WeightedMean(List<double[]> us, List<double> logW)
    {
        if (us.Count == 0) return null;
        var top = logW.Max();
        if (!double.IsFinite(top)) return null;
        var mean = new double[us[0].Length];
        var total = 0.0;
        for (var k = 0; k < us.Count; k++)
        {
            var w = Math.Exp(logW[k] - top);
            total += w;
            for (var i = 0; i < mean.Length; i++) mean[i] += w * us[k][i];
        }

        for (var i = 0; i < mean.Length; i++) mean[i] /= total;
        return mean;
    }

    private static double RatioOf(List<double> logW, double evidenceLogScale, double evidenceMean)
    {
        var mean = 0.0;
        foreach (var l in logW) mean += Math.Exp(l - evidenceLogScale);
        return mean / logW.Count / evidenceMean;
    }

    /// <summary>ln φ(u) + Σ ln L_k(x(u)); leaves x(u) in the scratch vector.</summary>
    private double LogPosterior(double[] u)
    {
        _t.ToPhysical(u, _x);
        var s = 0.0;
        for (var i = 0; i < _d; i++) s -= 0.5 * u[i] * u[i];
        s -= _d * HalfLog2Pi;
        foreach (var e in _events)
        {
            s += e.LogLikelihood(_x);
            if (double.IsNegativeInfinity(s)) return s;
        }

        return s;
    }

    private double SmoothObjective(double[] u)
    {
        _t.ToPhysical(u, _x);
        var s = 0.0;
        for (var i = 0; i < _d; i++) s += 0.5 * u[i] * u[i];
        foreach (var e in _smooth) s -= e.LogLikelihood(_x);
        return s;
    }

    private void Draw(Random rng, double[] u, double[]? centre, Laplace lap)
    {
        Span<double> z = stackalloc double[_d];
        for (var i = 0; i < _d; i++) z[i] = Gaussian(rng);
        if (centre is null)
        {
            z.CopyTo(u);
            return;
        }

        for (var i = 0; i < _d; i++)
        {
            var s = centre[i];
            for (var j = 0; j <= i; j++) s += Inflation * lap.Lower[i, j] * z[j];
            u[i] = s;
        }
    }

    /// <summary>ln of the sampling mixture density at u.</summary>
    private double LogMixture(double[] u, Laplace lap, double[]? centre)
    {
        var w = _options.DefensiveWeight;
        var prior = -_d * HalfLog2Pi;
        for (var i = 0; i < _d; i++) prior -= 0.5 * u[i] * u[i];
        var atMode = LogGaussian(u, lap.Mean, lap);
        var inner = LogSumExp(Math.Log(1 - w) + atMode, Math.Log(w) + prior);
        if (centre is null) return inner;
        return LogSumExp(Math.Log(1 - w) + LogGaussian(u, centre, lap), Math.Log(w) + inner);
    }

    private double LogGaussian(double[] u, double[] centre, Laplace lap)
    {
        Span<double> z = stackalloc double[_d];
        var q = 0.0;
        for (var i = 0; i < _d; i++)
        {
            var s = (u[i] - centre[i]) / Inflation;
            for (var j = 0; j < i; j++) s -= lap.Lower[i, j] * z[j];
            z[i] = s / lap.Lower[i, i];
            q += z[i] * z[i];
        }

        return -0.5 * q - _d * HalfLog2Pi - 0.5 * lap.LogDet - _d * Math.Log(Inflation);
    }

    private static double LogSumExp(double a, double b)
    {
        if (double.IsNegativeInfinity(a)) return b;
        if (double.IsNegativeInfinity(b)) return a;
        var m = Math.Max(a, b);
        return m + Math.Log(Math.Exp(a - m) + Math.Exp(b - m));
    }

    /// <summary>CoV of the mean of exp(logW) (sample estimate); +∞ when every weight is zero.</summary>
    private static double CoefficientOfVariation(List<double> logW, double? scale, out double mean)
    {
        var s = scale ?? logW.Max();
        mean = 0;
        if (double.IsNegativeInfinity(s)) return double.PositiveInfinity;
        double sum = 0, sum2 = 0;
        foreach (var l in logW)
        {
            var w = Math.Exp(l - s);
            sum += w;
            sum2 += w * w;
        }

        var n = logW.Count;
        mean = sum / n;
        var variance = Math.Max(0, sum2 / n - mean * mean) / (n - 1);
        return Math.Sqrt(variance) / mean;
    }

    // string.GetHashCode is randomized per process; results must be reproducible from the seed.
    private static int StableHash(string s)
    {
        var h = unchecked((int)2166136261);
        foreach (var ch in s) h = unchecked((h ^ ch) * 16777619);
        return h;
    }

    private static double Gaussian(Random rng)
    {
        // Box–Muller; one value per call keeps the stream simple to reproduce.
        var u1 = 1.0 - rng.NextDouble();
        var u2 = rng.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    internal Laplace FitLaplace()
    {
        if (_laplace is not null) return _laplace;
        var u = new double[_d];
        long evaluations = 0;
        var f = SmoothObjective(u);
        evaluations++;
        var converged = false;
        string? note = null;
        Matrix<double> h = Matrix<double>.Build.DenseIdentity(_d);
        if (_smooth.Length == 0)
        {
            converged = true;
        }
        else if (!double.IsFinite(f))
        {
            note = "the findings have zero likelihood at the prior median; the sampling density is the prior";
        }
        else
        {
            for (var it = 0; it < 60; it++)
            {
                var (grad, hess) = Derivatives(u, f, ref evaluations);
                h = hess;
                if (grad.L2Norm() < 1e-6)
                {
                    converged = true;
                    break;
                }

                var step = NewtonStep(hess, grad);
                var t = 1.0;
                var improved = false;
                for (var k = 0; k < 30; k++)
                {
                    var trial = u.Select((v, i) => v + t * step[i]).ToArray();
                    var ft = SmoothObjective(trial);
                    evaluations++;
                    if (double.IsFinite(ft) && ft < f - 1e-4 * t * Math.Abs(grad.DotProduct(step)))
                    {
                        u = trial;
                        f = ft;
                        improved = true;
                        break;
                    }

                    t *= 0.5;
                }

                if (!improved)
                {
                    converged = grad.L2Norm() < 1e-3;
                    break;
                }
            }

            h = Derivatives(u, f, ref evaluations).Hessian;
            if (!converged) note = "the posterior-mode search did not converge; sampling densities may be poor (see CoV)";
        }

        // S = H⁻¹ with the eigenvalues of H kept ≥ 0.25 (variance ≤ 4 in u) so a flat likelihood cannot blow S up.
        var evd = (0.5 * (h + h.Transpose())).Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
        var lambda = evd.EigenValues.Real().Map(v => 1.0 / Math.Max(v, 0.25));
        var s = evd.EigenVectors * Matrix<double>.Build.DenseOfDiagonalVector(lambda) * evd.EigenVectors.Transpose();
        s = 0.5 * (s + s.Transpose());
        var l = s.Cholesky().Factor;
        var lower = new double[_d, _d];
        var logDet = 0.0;
        for (var i = 0; i < _d; i++)
        {
            for (var j = 0; j <= i; j++) lower[i, j] = l[i, j];
            logDet += 2 * Math.Log(l[i, i]);
        }

        _laplace = new Laplace(u, lower, logDet, converged, note, evaluations);
        return _laplace;
    }

    private (Vector<double> Gradient, Matrix<double> Hessian) Derivatives(double[] u, double f0, ref long evaluations)
    {
        const double h = 1e-3;
        var n = _d;
        var g = Vector<double>.Build.Dense(n);
        var hess = Matrix<double>.Build.Dense(n, n);
        var w = (double[])u.Clone();
        var fp = new double[n];
        var fm = new double[n];
        for (var i = 0; i < n; i++)
        {
            w[i] = u[i] + h;
            fp[i] = SmoothObjective(w);
            w[i] = u[i] - h;
            fm[i] = SmoothObjective(w);
            w[i] = u[i];
            g[i] = (fp[i] - fm[i]) / (2 * h);
            hess[i, i] = (fp[i] - 2 * f0 + fm[i]) / (h * h);
        }

        for (var i = 0; i < n; i++)
            for (var j = 0; j < i; j++)
            {
                w[i] = u[i] + h;
                w[j] = u[j] + h;
                var fpp = SmoothObjective(w);
                w[j] = u[j] - h;
                var fpm = SmoothObjective(w);
                w[i] = u[i] - h;
                var fmm = SmoothObjective(w);
                w[j] = u[j] + h;
                var fmp = SmoothObjective(w);
                w[i] = u[i];
                w[j] = u[j];
                var v = (fpp - fpm - fmp + fmm) / (4 * h * h);
                hess[i, j] = v;
                hess[j, i] = v;
            }

        evaluations += 2 * n + 4L * n * (n - 1) / 2;
        return (g, hess);
    }

    private static Vector<double> NewtonStep(Matrix<double> hess, Vector<double> grad)
    {
        // Levenberg damping until the matrix is positive definite.
        var mu = 0.0;
        for (var k = 0; k < 20; k++)
        {
            var a = hess + mu * Matrix<double>.Build.DenseIdentity(hess.RowCount);
            var chol = TryCholesky(a);
            if (chol is not null) return -chol.Solve(grad);
            mu = mu == 0 ? 1e-3 : mu * 10;
        }

        return -grad;
    }

    private static MathNet.Numerics.LinearAlgebra.Factorization.Cholesky<double>? TryCholesky(Matrix<double> a)
    {
        try
        {
            return a.Cholesky();
        }
        catch (ArgumentException)
        {
            return null;
        }
    }
}
