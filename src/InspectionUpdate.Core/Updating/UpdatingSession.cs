using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating.FirstOrder;
using InspectionUpdate.Updating.Simulation;

namespace InspectionUpdate.Updating;

/// <summary>
/// An updating problem prepared once: the augmented model, the linearized evidence and the simulated evidence are
/// cached, so repeated estimates at many times (a profile, a planner's root search) pay for the findings once.
/// Obtain one from <see cref="ReliabilityUpdater.Prepare(UpdatingCase)"/>. Thread-safe (calls are serialized).
/// </summary>
public sealed class UpdatingSession
{
    private readonly Lock _gate = new();
    private readonly UpdatingOptions _options;
    private readonly FirstOrderUpdater _firstOrder;
    private readonly NatafTransformation _transformation;
    private readonly LikelihoodImportanceSampler _sampler;
    private readonly Dictionary<string, double[]> _warm = new(StringComparer.Ordinal);
    private readonly Dictionary<string, double> _simulateFrom = new(StringComparer.Ordinal);
    private readonly Dictionary<(string, double), (UpdatedEstimate, IReadOnlyList<double>?, IReadOnlyList<double>?, int)> _memo = [];

    internal UpdatingSession(UpdatingCase updatingCase, UpdatingOptions options)
    {
        Case = updatingCase;
        _options = options;
        Model = EvidenceModel.Build(updatingCase);
        var transformation = new NatafTransformation(Model.Model);
        _transformation = transformation;
        _firstOrder = new FirstOrderUpdater(Model, transformation, options);
        _sampler = new LikelihoodImportanceSampler(Model, options);
        VariableNames = Model.Model.RandomIndices.Select(i => Model.Model.Variables[i].Name).ToArray();
    }

    /// <summary>The case this session updates.</summary>
    public UpdatingCase Case { get; }

    /// <summary>The augmented model and its events.</summary>
    public EvidenceModel Model { get; }

    /// <summary>Names of the augmented random variables, matching the α of first-order profile points.</summary>
    public IReadOnlyList<string> VariableNames { get; }

    /// <summary>P(F(t) | all findings of the case) for one component, cumulative.</summary>
    /// <exception cref="ArgumentException">Unknown component.</exception>
    /// <exception cref="ArgumentOutOfRangeException">t not finite or negative.</exception>
    public UpdatedEstimate Estimate(string componentId, double timeYears) => EstimateDetailed(componentId, timeYears).Estimate;

    /// <summary>Updated profile of a component on a strictly increasing time grid (years since entry into service).</summary>
    /// <remarks>
    /// ΔPf of a step is Pf(t) − Pf(t_prev); for the first point it is Pf(t₀) (from entry into service). Where a repair
    /// falls in (t_prev, t] the profile restarts: ΔPf = Pf(t) and the hazard is Pf(t), with a note. FORM runs are
    /// warm-started from the previous step's design point within one renewal period.
    /// </remarks>
    public ReliabilityProfile Profile(string componentId, IReadOnlyList<double> timesYears, string label)
    {
        ArgumentNullException.ThrowIfNull(timesYears);
        for (var i = 0; i < timesYears.Count; i++)
        {
            var t = timesYears[i];
            if (!double.IsFinite(t) || t < 0) throw new ArgumentOutOfRangeException(nameof(timesYears), t, $"Time [{i}] must be finite and ≥ 0 years.");
            if (i > 0 && !(t > timesYears[i - 1])) throw new ArgumentOutOfRangeException(nameof(timesYears), t, $"Times must increase strictly (entry {i}).");
        }

        var points = new List<ProfilePoint>(timesYears.Count);
        var prevPf = 0.0;
        double? prevCov = null;
        var prevT = double.NegativeInfinity;
        foreach (var t in timesYears)
        {
            var (est, alpha, x, evaluations) = EstimateDetailed(componentId, t);
            var renewal = Model.RenewalStartYears(componentId, t);
            var restarted = renewal > 0 && renewal >= prevT;
            var basePf = restarted ? 0.0 : prevPf;
            var note = est.Note;
            var (interval, consistent, incrementNote) = ProfileIncrement.Of(est.CumulativePf, est.CoefficientOfVariation, basePf, restarted ? null : prevCov);
            var converged = est.Converged && consistent;
            if (incrementNote is not null) note = Append(note, incrementNote);

            var hazard = basePf < 1 ? interval / (1 - basePf) : double.NaN;
            if (restarted && double.IsFinite(prevT))
            {
                note = FormattableString.Invariant($"renewed by a repair at {renewal:0.###} y; ΔPf counts from the renewal") + (note is null ? "" : "; " + note);
            }

            points.Add(new ProfilePoint
            {
                TimeYears = t,
                Beta = est.Beta,
                CumulativePf = est.CumulativePf,
                IntervalPf = interval,
                Hazard = hazard,
                Route = est.Route,
                Converged = converged,
                CoefficientOfVariation = est.CoefficientOfVariation,
                Evaluations = evaluations,
                Alpha = alpha,
                DesignPointX = x,
                Note = note,
            });
            prevPf = est.CumulativePf;
            prevCov = est.CoefficientOfVariation;
            prevT = t;
        }

        return new ReliabilityProfile { Label = label, VariableNames = VariableNames, Points = points };
    }

    private static string Append(string? note, string text) => note is null ? text : note + "; " + text;

    /// <summary>Posterior summaries of the model inputs given every finding (likelihood-weighted importance sampling).</summary>
    public PosteriorSummary Posterior()
    {
        lock (_gate)
        {
            var samples = _sampler.Evidence();
            var inputs = WeightedInputSamples.Summaries(Model.InputModel, samples.X.Length, (k, i) => samples.X[k][i], samples.Weights);
            var ev = samples.Evidence;
            return new PosteriorSummary
            {
                Inputs = inputs,
                EffectiveSampleSize = samples.EffectiveSampleSize,
                Samples = samples.Weights.Length,
                Route = ComputationRoute.ImportanceSampling,
                Converged = ev.Converged && samples.EffectiveSampleSize >= 200,
                Note = ev.Note,
            };
        }
    }

    /// <summary>
    /// Draws of every random model input from the prior and from the posterior given every finding, for
    /// histograms: the prior by the transformation of independent standard normals, the posterior by systematic
    /// resampling of the weighted samples behind <see cref="Posterior"/> (so it shows what that summary rests on,
    /// with its effective sample size as the limit of its detail). Reproducible from the options' seed.
    /// </summary>
    /// <param name="count">Draws per distribution (≥ 10).</param>
    /// <exception cref="ArgumentOutOfRangeException">count below 10.</exception>
    public IReadOnlyList<InputSamples> PosteriorSamples(int count = 2000)
    {
        if (count < 10) throw new ArgumentOutOfRangeException(nameof(count), count, "At least 10 draws.");
        lock (_gate)
        {
            var samples = _sampler.Evidence();
            return WeightedInputSamples.Draws(Model.InputModel, (k, i) => samples.X[k][i], samples.Weights, count, _options.Seed);
        }
    }

    internal (UpdatedEstimate Estimate, IReadOnlyList<double>? Alpha, IReadOnlyList<double>? X, int Evaluations) EstimateDetailed(string componentId, double timeYears)
    {
        lock (_gate)
        {
            // A planner asks for the same times again (the next inspection, then the remaining life on the same
            // curve); every estimate is a deterministic function of (component, time) within a session.
            if (_memo.TryGetValue((componentId, timeYears), out var known)) return known;
            var result = EstimateUncached(componentId, timeYears);
            _memo[(componentId, timeYears)] = result;
            return result;
        }
    }

    private (UpdatedEstimate Estimate, IReadOnlyList<double>? Alpha, IReadOnlyList<double>? X, int Evaluations) EstimateUncached(string componentId, double timeYears)
    {
        var pEvidenceKnown = !Model.Events.Any(e => e.Kind == EvidenceEventKind.Equality);
        string? flagNote = null;
        var key = componentId + "#" + Model.RenewalStartYears(componentId, timeYears).ToString("R", System.Globalization.CultureInfo.InvariantCulture);
        if (_options.Route == UpdatingRoute.Auto && _simulateFrom.TryGetValue(key, out var flaggedAt) && timeYears >= flaggedAt)
        {
            // Once first order was flagged at some time of a renewal period, later times of that period are simulated
            // too: a profile that switches back and forth between routes would mix two approximations in one ΔPf.
            flagNote = FormattableString.Invariant($"simulated because first order was flagged at {flaggedAt:0.###} y, earlier in this renewal period");
        }
        else if (_options.Route != UpdatingRoute.Simulation)
        {
            _warm.TryGetValue(key, out var warm);
            var fo = _firstOrder.Estimate(componentId, timeYears, warm);
            if (fo.Failure.Converged) _warm[key] = fo.Failure.PointU;
            var flags = fo.Flags.Count == 0 ? null : string.Join(" ", fo.Flags);
            // A Pf that is not a number (P(findings) underflowing to 0 in the conditioning, say) is never reported: the
            // step is simulated instead, on the first-order route too, and the note says why.
            var finite = double.IsFinite(fo.Pf) && fo.Pf is >= 0 and <= 1;
            if (finite && (_options.Route == UpdatingRoute.FirstOrder || fo.Reliable && fo.Converged))
            {
                var note = (fo.Joint ? "linearized at the joint design points" : null) is { } j
                    ? j + (flags is null ? "" : "; " + flags)
                    : flags is null ? null : "first-order flags: " + flags;
                if (fo.Problem is not null) note = fo.Problem + (note is null ? "" : "; " + note);
                foreach (var certain in _firstOrder.CertainEventNotes) note = Append(note, certain);
                var x = new double[Model.Model.PhysicalDimension];
                _transformation.ToPhysical(fo.Failure.PointU, x);
                return (new UpdatedEstimate
                {
                    CumulativePf = fo.Pf,
                    Beta = -StandardNormal.InverseCdf(Math.Clamp(fo.Pf, 0, 1)),
                    EvidenceProbability = fo.EvidenceProbability,
                    Route = ComputationRoute.FirstOrder,
                    Converged = fo.Converged && double.IsFinite(fo.Pf),
                    CoefficientOfVariation = null,
                    Note = note,
                }, fo.Failure.Alpha, x, fo.Evaluations);
            }

            flagNote = finite
                ? "first order flagged unreliable, simulated instead: " + (fo.Problem ?? flags ?? "not converged")
                : FormattableString.Invariant($"first order gave no probability ({fo.Pf}), simulated instead") + (fo.Problem is null ? "" : ": " + fo.Problem);
            if (!_simulateFrom.TryGetValue(key, out var known) || timeYears < known) _simulateFrom[key] = timeYears;
        }

        var sim = _sampler.Conditional(componentId, timeYears);
        var ev = _sampler.Evidence().Evidence;
        return (new UpdatedEstimate
        {
            CumulativePf = sim.Value,
            Beta = -StandardNormal.InverseCdf(sim.Value),
            EvidenceProbability = pEvidenceKnown ? ev.Value : double.NaN,
            Route = ComputationRoute.ImportanceSampling,
            Converged = sim.Converged,
            CoefficientOfVariation = sim.CoefficientOfVariation,
            Note = flagNote is null ? sim.Note : flagNote + "; " + sim.Note,
        }, null, null, (int)Math.Min(int.MaxValue, sim.Evaluations));
    }
}

/// <summary>Prior and posterior draws of one model input (physical units).</summary>
/// <param name="Name">Input name.</param>
/// <param name="Prior">Draws from the prior.</param>
/// <param name="Posterior">Draws from the posterior given the findings (resampled importance samples).</param>
public sealed record InputSamples(string Name, IReadOnlyList<double> Prior, IReadOnlyList<double> Posterior);
