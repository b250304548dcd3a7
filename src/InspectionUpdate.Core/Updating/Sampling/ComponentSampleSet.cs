using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Probability.Numerics;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Updating.Simulation;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// One set of weighted samples of a component's inputs that covers its failure region over the whole horizon, for
/// every renewal period at once. Each sample carries its failure time in each renewal period and its weight
/// φ(u)/q(u)·Π L_k(x) (the findings' likelihoods); every Pf(t | data), ΔPf and planner probe is read from it.
/// </summary>
/// <remarks>
/// <para>Density: <see cref="SamplingMixture"/> of the prior, the Laplace approximation of the posterior and
/// Gaussians at the design points of g(x, t) = 0 at several times per renewal period, found by FORM in the
/// posterior-whitened coordinates (so "nearest" is measured by the posterior). One cross-entropy step (Rubinstein &amp;
/// Kroese 2004, The Cross-Entropy Method, ch. 3) then moves each of these centres to the weighted mean of a pilot
/// batch's samples that failed by its time; a period with no usable design point gets a centre from its failures.
/// The pilot is discarded.</para>
/// <para>Growth: the set doubles while a yearly cumulative Pf of some renewal period that may lie above the decision
/// floor misses the target CoV or the minimum effective number of failure samples, up to the cap. Reproducible from
/// the seed.</para>
/// </remarks>
internal sealed class ComponentSampleSet
{
    private const string Id = UpdatingCase.SingleComponentId;
    private const double Inflation = 1.1;

    private readonly SampleSetOptions _options;
    private readonly NatafTransformation _t;
    private readonly IDegradationModel _component;
    private readonly int _d;
    private readonly int _m;
    private readonly int _localDimension;
    private readonly double[] _periodStart;
    private readonly double[] _periodLength;
    private readonly EvidenceEvent[] _events;
    // The events a drawn sample's likelihood evaluates: an in-service record inside its renewal period is left out, as
    // the failure time enforces it (T_f > τ, first passage, implies g(x, τ) > 0): one limit-state evaluation less per
    // record and sample.
    private readonly EvidenceEvent[] _drawnEvents;
    private readonly List<double> _x = [];
    private readonly List<double> _logW = [];
    private readonly List<double> _u = [];
    private readonly List<double> _logTarget = [];
    private readonly List<(double[] Weights, int Count)> _batches = [];
    // Per sample: ln φ(u) of the prior, and each further component's density as a ratio to it (linear scale, so the
    // balance-heuristic density of all batches is a weighted sum, not a log-sum-exp, per sample).
    private readonly List<double> _logPrior = [];
    private readonly List<double> _whitened = [];
    private readonly List<List<double>> _ratio = [];
    private readonly List<int> _failureCentres = [];

    /// <summary>Every point of the β(t) scans (design points of failure by a time), kept for refinements that find too few failures to aim at.</summary>
    private readonly List<(int Period, double Local, double[] U)> _scanPoints = [];

    /// <summary>Scan points already aimed at by a refinement (indices into <see cref="_scanPoints"/>).</summary>
    private readonly HashSet<int> _scanPointsUsed = [];
    private int _posterior = -1;
    private readonly List<double>[] _times;
    // Per period: whether every stored failure time is T_f itself even past the period's end (closed forms, roots found
    // within it), so that Pf at a later time, a bound on every earlier one, can be read from the same samples.
    private readonly bool[] _exactPastEnd;
    private readonly double[] _survivedLocal;
    private readonly AnnualMaxima? _annual;
    private readonly int[] _years;
    private readonly List<double>[] _logSurvival;
    private readonly SampleStream _rng;
    private readonly int[][] _periodMaps;
    // The last reweighting's further likelihoods (one reference, so a reader on another thread sees a whole pair).
    private volatile ExtraLikelihoods? _lastExtra;
    private SamplingMixture _mixture = null!;
    private int[][]? _order;

    private ComponentSampleSet(EvidenceModel model, IReadOnlyList<InspectionOutcome> evidence, SampleSetOptions options, double horizonYears, int seed)
    {
        Model = model;
        Evidence = evidence;
        _options = options;
        _t = new NatafTransformation(model.InputModel);
        _d = _t.StandardDimension;
        _m = _t.PhysicalDimension;
        _component = model.ComponentModel(Id);
        _localDimension = _component.Inputs.Variables.Count;
        _annual = AnnualMaxima.Of(model, _component, _t);
        // With an annual maximum the in-service records enter as T_f > τ only (below): their events see one value of
        // the load, not the yearly maxima.
        _events = model.Events.Where(e => _annual is null || e.Outcome is not SurvivedInService).ToArray();
        var periods = model.RenewalPeriods(Id);
        _periodStart = new double[periods];
        _periodLength = new double[periods];
        for (var e = 0; e < periods; e++) _periodStart[e] = model.PeriodStartYears(Id, e);
        for (var e = 0; e < periods; e++) _periodLength[e] = (e + 1 < periods ? _periodStart[e + 1] : Math.Max(horizonYears, _periodStart[e] + 1)) - _periodStart[e];
        HorizonYears = _periodStart[^1] + _periodLength[^1];
        // An in-service record says the component had not failed by then: within its renewal period, every sample
        // failing earlier contradicts it, and Pf up to that time is exactly zero given the findings.
        _survivedLocal = new double[periods];
        foreach (var record in evidence.OfType<SurvivedInService>())
        {
            var e = model.PeriodAt(Id, record.TimeYears);
            _survivedLocal[e] = Math.Max(_survivedLocal[e], record.TimeYears - _periodStart[e]);
        }

        _drawnEvents = _events.Where(ev => !(ev.Outcome is SurvivedInService r && r.TimeYears - _periodStart[model.PeriodAt(Id, r.TimeYears)] > 0)).ToArray();

        _times = Enumerable.Range(0, periods).Select(_ => new List<double>()).ToArray();
        _exactPastEnd = Enumerable.Repeat(_annual is null, periods).ToArray();
        _logSurvival = Enumerable.Range(0, periods).Select(_ => new List<double>()).ToArray();
        // Whole years of service ending in each period (yearly failure events of an annual-maximum load).
        _years = new int[periods];
        for (var e = 0; e < periods; e++)
        {
            _years[e] = ServiceYears.EndedBy(_periodStart[e], _periodLength[e]);
        }
        _rng = new SampleStream(unchecked((ulong)(uint)seed));
        _periodMaps = Enumerable.Range(0, periods).Select(e => model.PeriodMap(Id, e)).ToArray();
    }

    /// <summary>The augmented model and events.</summary>
    public EvidenceModel Model { get; }

    /// <summary>The findings the weights include.</summary>
    public IReadOnlyList<InspectionOutcome> Evidence { get; }

    /// <summary>Times beyond this (years since entry into service) are censored.</summary>
    public double HorizonYears { get; }

    /// <summary>Weighted failure times under the findings' weights.</summary>
    public WeightedFailureTimes Weighted { get; private set; } = null!;

    /// <summary>Limit-state and likelihood evaluations spent building the set (FORM searches included).</summary>
    public long Evaluations { get; private set; }

    /// <summary>How the density was built, for notes.</summary>
    public string Description { get; private set; } = "";

    /// <summary>False when the posterior-mode search behind the density did not converge.</summary>
    public bool DensityNote { get; private set; }

    /// <summary>Number of renewal periods.</summary>
    public int Periods => _periodStart.Length;

    /// <summary>Length in years of renewal period e as sampled (to the next repair, or to the horizon).</summary>
    public double PeriodLength(int period) => _periodLength[period];

    /// <summary>
    /// Local time of renewal period e up to which the findings record the component in service (0 when none): Pf up to
    /// it is exactly zero given the findings.
    /// </summary>
    public double SurvivedUntil(int period) => _survivedLocal[period];

    /// <summary>True when the findings record the component in service at or after local time τ of the period: Pf(τ) is exactly 0.</summary>
    public bool RecordedInServiceAt(int period, double local) => _survivedLocal[period] > 0 && local <= _survivedLocal[period];

    /// <summary>Start of renewal period e, years since entry into service.</summary>
    public double PeriodStart(int period) => _periodStart[period];

    /// <summary>Builds the set for one component's findings.</summary>
    public static ComponentSampleSet Build(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, SampleSetOptions options, double horizonYears)
    {
        var evidenceModel = EvidenceModel.Build(UpdatingCase.Single(model, evidence), annualMaximumAsInput: true);
        var set = new ComponentSampleSet(evidenceModel, evidence, options, horizonYears, options.Seed);
        set.Construct();
        return set;
    }

    /// <summary>The period of time t (the earlier one at a repair date) and the local time in it.</summary>
    public (int Period, double Local) Locate(double timeYears)
    {
        var e = Model.PeriodAt(Id, timeYears);
        return (e, timeYears - _periodStart[e]);
    }

    /// <summary>
    /// The weights with further findings' likelihoods multiplied in (a planned inspection that finds nothing, say):
    /// null when <paramref name="extended"/> adds a repair (the inputs change, so the set must be rebuilt).
    /// </summary>
    public WeightedFailureTimes? Reweighted(IReadOnlyList<InspectionOutcome> extended, out long evaluations)
    {
        evaluations = 0;
        var extra = Extra(extended);
        if (extra is null) return null;
        if (extra.Count == 0) return Weighted;
        var extendedModel = EvidenceModel.Build(UpdatingCase.Single(_component, extended), annualMaximumAsInput: true);
        if (extendedModel.InputModel.Variables.Count != _m) return null;
        var delta = ExtraLogLikelihoods(extendedModel.Events.Where(ev => extra.Contains(ev.Outcome)).ToArray(), out evaluations);
        _lastExtra = new ExtraLikelihoods(extended.ToArray(), delta);
        var n = _logW.Count;
        var logW = new double[n];
        for (var i = 0; i < n; i++) logW[i] = _logW[i] + delta[i];

        return Weigh(logW);
    }

    /// <summary>Weighted posterior summary of every random input (mean, sd, 5/50/95 % quantiles).</summary>
    public PosteriorSummary Posterior(WeightedFailureTimes weighted)
    {
        var ess = weighted.EffectiveSampleSize;
        return new PosteriorSummary
        {
            Inputs = WeightedInputSamples.Summaries(Model.InputModel, weighted.Count, (k, i) => _x[k * _m + i], weighted.Weights),
            EffectiveSampleSize = ess,
            Samples = weighted.Count,
            Route = ComputationRoute.ImportanceSampling,
            Converged = ess >= 200,
            Note = Description,
        };
    }

    /// <summary>Draws from the prior (transformation of standard normals) and the posterior (systematic resampling of the weights).</summary>
    public IReadOnlyList<InputSamples> Draws(WeightedFailureTimes weighted, int count, int seed) =>
        WeightedInputSamples.Draws(Model.InputModel, (k, i) => _x[k * _m + i], weighted.Weights, count, seed);

    /// <summary>Outcomes of <paramref name="extended"/> beyond this set's evidence, or null when it is not an extension without repairs.</summary>
    private List<InspectionOutcome>? Extra(IReadOnlyList<InspectionOutcome> extended)
    {
        var remaining = extended.ToList();
        foreach (var e in Evidence)
        {
            var k = remaining.IndexOf(e);
            if (k < 0) return null;
            remaining.RemoveAt(k);
        }

        return remaining.Any(r => r is Repair) ? null : remaining;
    }

    private void Construct()
    {
        var smooth = _events.Any(e => e.Outcome is not SurvivedInService);
        double[] mean;
        double[,] lower;
        double logDet;
        string? laplaceNote = null;
        if (smooth)
        {
            var laplace = new LikelihoodImportanceSampler(Model, UpdatingOptions.Default with { Seed = _options.Seed, Form = _options.Form }).FitLaplace();
            mean = laplace.Mean;
            lower = laplace.Lower;
            logDet = laplace.LogDet;
            laplaceNote = laplace.Note;
            DensityNote = !laplace.Converged;
            Evaluations += laplace.Evaluations;
        }
        else
        {
            mean = new double[_d];
            lower = new double[_d, _d];
            for (var i = 0; i < _d; i++) lower[i, i] = 1;
            logDet = 0;
        }

        var anchors = Anchors(mean, lower);
        var scaled = new double[_d, _d];
        for (var i = 0; i < _d; i++)
            for (var j = 0; j <= i; j++) scaled[i, j] = Inflation * lower[i, j];
        var scaledLogDet = logDet + 2 * _d * Math.Log(Inflation);
        Reset(scaled, scaledLogDet, smooth ? mean : null, anchors.Select(a => a.Centre).ToList());

        // One cross-entropy step on a pilot batch: each centre moves to the weighted mean of the pilot samples that
        // failed by its time (the mean of the optimal density for P(T_f ≤ τ | data)).
        var pilot = Math.Max(2000, _options.Samples / 2);
        Draw(pilot, BaseWeights());
        Reweigh();
        var moved = new List<double[]>();
        var movedCount = 0;
        foreach (var (period, local, anchor) in anchors)
        {
            // Several design points of one time (the modes of a series system) share the failures by that time: each
            // moves to the mean of the failures nearest to it, never to the mean of all (which lies between the modes
            // and would let the set miss all but one of them).
            var rivals = anchors.Where(a => a.Period == period && a.Local == local).Select(a => a.Centre).ToArray();
            var cell = rivals.Length > 1 ? NearestTo(anchor, rivals) : null;
            var centre = FailedMean(period, local, out var effective, cell);
            if (centre is not null && effective >= 10)
            {
                moved.Add(centre);
                movedCount++;
            }
            else
            {
                moved.Add(anchor);
            }
        }

        for (var e = 0; e < Periods; e++)
        {
            // A period with no usable design point gets a centre from its failures by its end.
            if (anchors.Any(a => a.Period == e)) continue;
            if (FailedMean(e, _periodLength[e], out var effective) is { } centre && effective >= 10)
            {
                moved.Add(centre);
                movedCount++;
            }
        }

        // The pilot's draws stay in the set: its centres remain components of the mixture with no share in later batches,
        // and every sample is weighed against the density of all batches together (the balance heuristic, below), so
        // they are as valid as any later draw. The first estimate rests on the base count of samples, pilot included.
        var pilotCentres = _failureCentres.ToArray();
        _failureCentres.Clear();
        foreach (var c in Distinct(moved))
        {
            var same = pilotCentres.FirstOrDefault(j => Distance(_mixture.Centre(j), c) == 0, -1);
            _failureCentres.Add(same >= 0 ? same : AddComponent(c));
        }

        // Room for a typical refined set at once (refinements usually end within five times the first draw): the
        // columns are then copied on growth once at most.
        Reserve(Math.Min(_options.MaxSamples, 5 * _options.Samples));
        Draw(Math.Max(_options.Samples - pilot, _options.Samples / 4), BaseWeights());
        Reweigh();
        Weighted = Weigh(_logW.ToArray());
        var refinements = Refine();
        Description = string.Create(CultureInfo.InvariantCulture,
            $"one weighted sample set: {_logW.Count} samples in {_batches.Count} batch(es), ESS {Weighted.EffectiveSampleSize:F0}; mixture of the prior, {(smooth ? "the Laplace posterior, " : "")}{_failureCentres.Count} failure centre(s) ({anchors.Count} design point(s), {movedCount} moved by a cross-entropy step, {refinements} added where the set was refined)")
            + (laplaceNote is null ? "" : "; " + laplaceNote);
    }

    /// <summary>Adds batches aimed at the earliest unresolved yearly Pf until every one is resolved or the cap is reached; returns the centres added.</summary>
    /// <param name="kept">Samples taken over from a parent set: batches grow with the samples drawn since, not with those.</param>
    private int Refine(int kept = 0)
    {
        var refinements = 0;
        while (_logW.Count < _options.MaxSamples && Unresolved(Weighted) is { } missed)
        {
            // Refinement: a batch aimed at the earliest unresolved time, drawn mostly from a centre at the weighted
            // mean of the failures by that time (a new component, or the nearest existing one). All samples are then
            // weighed against the sampling density of all batches together (the balance heuristic of multiple
            // importance sampling, Veach & Guibas 1995), so earlier draws stay valid.
            var centre = FailedMean(missed.Period, missed.Local, out var effective, out var largest);
            var heavy = false;
            if (centre is not null && largest is { Share: > HeavyFailureShare } heaviest && Distance(heaviest.U, centre) > 1)
            {
                // One sample carries a large part of the failures' weight far from their mean: the failures form more
                // than one mode and the mean lies between them, where a component would not lower that sample's
                // weight. Aim at the failures nearer to that sample than to the mean instead (however few they are).
                var cell = NearestTo(heaviest.U, [heaviest.U, centre]);
                if (FailedMean(missed.Period, missed.Local, out var cellEffective, cell) is { } near)
                {
                    centre = near;
                    effective = cellEffective;
                    heavy = true;
                }
            }

            if (!heavy && (centre is null || effective < 3))
            {
                // Too few failures by that time to aim at it: one cross-entropy rung instead, the mean of the earliest
                // fifth (by weight) of the failures by the next covered time, a step towards the earlier, rarer failures.
                centre = EarliestFailuresMean(missed.Period, CoveredTimeAfter(Weighted, missed.Period, missed.Local), 0.2, out effective);
            }

            var aimable = heavy || centre is not null && effective >= 3;
            if (!aimable && ScanPointFor(missed.Period, missed.Local) is { } scanned)
            {
                // Still too few failures to aim at: the design point of failure by the nearest scanned time at or
                // after the missed one is where such failures are most likely (first order), so the batch (a quarter
                // of the base count, as for every time with too few failures) goes there before the set falls back to
                // doubling its base draw. Each scan point is tried once.
                centre = scanned;
                aimable = true;
            }

            // While too few failures lie behind that time to judge it, a batch only has to find them (a quarter of the
            // base count). Once they are found, the CoV falls like 1/√N: the batch is what the set's own samples would
            // need to meet the target, (CoV/target)² − 1 times the samples drawn, with a fifth more for safety (an
            // aimed batch does better than that), between a quarter of the base count and half the samples drawn.
            var missedPf = Weighted.Cumulative(missed.Period, missed.Local);
            var drawn = _logW.Count - kept;
            var count = missedPf.EffectiveEvents < _options.MinimumFailureSamples || !double.IsFinite(missedPf.CoefficientOfVariation)
                ? _options.Samples / 4
                : (int)Math.Clamp(1.2 * drawn * (Math.Pow(missedPf.CoefficientOfVariation / _options.TargetCoefficientOfVariation, 2) - 1), _options.Samples / 4, Math.Max(_options.Samples / 2, drawn / 2));
            count = Math.Min(count, _options.MaxSamples - _logW.Count);
            if (aimable)
            {
                var nearest = Nearest(centre!);
                var aim = nearest.Index;
                if (nearest.Distance > 0.25)
                {
                    aim = AddFailureCentre(centre!);
                    refinements++;
                }

                Draw(count, AimedWeights(aim));
            }
            else
            {
                Draw(Math.Min(Math.Max(_options.Samples, _logW.Count - kept), _options.MaxSamples - _logW.Count), BaseWeights());
            }

            Reweigh();
            Weighted = Weigh(_logW.ToArray());
        }

        return refinements;
    }

    /// <summary>
    /// This set extended by further findings without a repair or an in-service record (planned inspections that find
    /// nothing, say): every sample kept, its target density multiplied by the new findings' likelihoods, then batches
    /// aimed where the extended weights leave a yearly Pf unresolved. The samples stay draws of the same batches, so
    /// the balance-heuristic weights stay exact; only the new batches cost new evaluations. Null when the findings are
    /// not such an extension; the caller then builds a new set.
    /// </summary>
    public ComponentSampleSet? Extend(IReadOnlyList<InspectionOutcome> extended)
    {
        var extra = Extra(extended);
        if (extra is null || extra.Count == 0 || extra.Any(e => e is SurvivedInService)) return null;
        var model = EvidenceModel.Build(UpdatingCase.Single(_component, extended), annualMaximumAsInput: true);
        if (model.InputModel.Variables.Count != _m || model.RenewalPeriods(Id) != Periods) return null;
        var child = new ComponentSampleSet(model, extended, _options, HorizonYears, unchecked(_options.Seed * 7919 + extended.Count));
        child.CopySamples(this);
        // The caller has usually just tried a reweighting with these findings: its likelihoods are reused, not recomputed.
        double[] delta;
        if (_lastExtra is { } last && last.Evidence.SequenceEqual(extended) && last.Delta.Length == child._logTarget.Count)
        {
            delta = last.Delta;
        }
        else
        {
            delta = ExtraLogLikelihoods(child._events.Where(ev => extra.Contains(ev.Outcome)).ToArray(), out var used);
            child.Evaluations += used;
        }

        var logTarget = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(child._logTarget);
        for (var i = 0; i < logTarget.Length; i++) logTarget[i] += delta[i];

        child.Reweigh();
        child.Weighted = child.Weigh(child._logW.ToArray());
        var kept = child._logW.Count;
        var refinements = child.Refine(kept);
        child.Description = Description + string.Create(CultureInfo.InvariantCulture,
            $"; extended by {extra.Count} further finding(s): {kept} samples kept as weights, {child._logW.Count - kept} drawn ({refinements} centre(s) added), ESS {child.Weighted.EffectiveSampleSize:F0}");
        child.DensityNote = DensityNote;
        return child;
    }

    /// <summary>
    /// Per sample, the summed log likelihood of further findings (0 for a sample already of zero weight, −∞ where a
    /// finding rules the sample out): what a reweighting adds to ln w and an extension to ln target.
    /// </summary>
    private double[] ExtraLogLikelihoods(EvidenceEvent[] events, out long evaluations)
    {
        evaluations = 0;
        var n = _logW.Count;
        var delta = new double[n];
        var x = new double[_m];
        for (var i = 0; i < n; i++)
        {
            if (double.IsNegativeInfinity(_logW[i])) continue;
            for (var k = 0; k < _m; k++) x[k] = _x[i * _m + k];
            var l = 0.0;
            foreach (var ev in events)
            {
                l += ev.LogLikelihood(x);
                evaluations++;
                if (double.IsNegativeInfinity(l)) break;
            }

            delta[i] = double.IsNaN(l) ? double.NegativeInfinity : l;
        }

        return delta;
    }

    private sealed record ExtraLikelihoods(InspectionOutcome[] Evidence, double[] Delta);

    /// <summary>Copies every sample, component and batch of <paramref name="parent"/> (same inputs and renewal periods).</summary>
    private void CopySamples(ComponentSampleSet parent)
    {
        _x.AddRange(parent._x);
        _u.AddRange(parent._u);
        _logTarget.AddRange(parent._logTarget);
        _logW.AddRange(parent._logW);
        _logPrior.AddRange(parent._logPrior);
        _whitened.AddRange(parent._whitened);
        _batches.AddRange(parent._batches);
        foreach (var column in parent._ratio) _ratio.Add([.. column]);
        _failureCentres.AddRange(parent._failureCentres);
        _scanPoints.AddRange(parent._scanPoints);
        _posterior = parent._posterior;
        for (var e = 0; e < Periods; e++)
        {
            _times[e].AddRange(parent._times[e]);
            _exactPastEnd[e] = parent._exactPastEnd[e];
            _logSurvival[e].AddRange(parent._logSurvival[e]);
        }

        _mixture = parent._mixture.Copy();
        _order = parent._order;
        Evaluations = parent.Evaluations;
    }

    /// <summary>Forgets every sample and component; starts again from the prior, the posterior (if any) and the given failure centres.</summary>
    private void Reset(double[,] lower, double logDet, double[]? posteriorMean, List<double[]> failureCentres)
    {
        _x.Clear();
        _logW.Clear();
        _u.Clear();
        _logTarget.Clear();
        _batches.Clear();
        _logPrior.Clear();
        _whitened.Clear();
        _ratio.Clear();
        _failureCentres.Clear();
        _order = null;
        foreach (var list in _times) list.Clear();
        Array.Fill(_exactPastEnd, _annual is null);
        foreach (var list in _logSurvival) list.Clear();
        _mixture = new SamplingMixture(lower, logDet);
        _ratio.Add([]);
        _posterior = posteriorMean is null ? -1 : AddComponent(posteriorMean);
        foreach (var c in Distinct(failureCentres)) _failureCentres.Add(AddComponent(c));
    }

    /// <summary>Makes room for <paramref name="samples"/> samples in every column (a list grows by doubling past it).</summary>
    private void Reserve(int samples)
    {
        _u.EnsureCapacity(samples * _d);
        _whitened.EnsureCapacity(samples * _d);
        _x.EnsureCapacity(samples * _m);
        _logW.EnsureCapacity(samples);
        _logTarget.EnsureCapacity(samples);
        _logPrior.EnsureCapacity(samples);
        foreach (var list in _times) list.EnsureCapacity(samples);
        foreach (var list in _ratio) list.EnsureCapacity(samples);
    }

    /// <summary>Adds a failure centre; returns its component index.</summary>
    private int AddFailureCentre(double[] centre)
    {
        var j = AddComponent(centre);
        _failureCentres.Add(j);
        return j;
    }

    /// <summary>Adds a component and its log density at every sample drawn so far; returns its index.</summary>
    private int AddComponent(double[] centre)
    {
        // The yearly maxima are drawn from their own law, not from the mixture: its coordinate stays at the prior.
        if (_annual is not null)
        {
            centre = (double[])centre.Clone();
            centre[_annual.StandardIndex] = 0;
        }

        var j = _mixture.Add(centre);
        var column = new List<double>(Math.Max(_logW.Capacity, 16));
        _mixture.AppendRatios(j, System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_whitened), System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_logPrior), 0, _logW.Count, column);
        _ratio.Add(column);
        return j;
    }

    /// <summary>The component nearest to a point (prior excluded) and its distance.</summary>
    private (int Index, double Distance) Nearest(double[] point)
    {
        var best = (Index: -1, Distance: double.PositiveInfinity);
        foreach (var j in _failureCentres)
        {
            var d = Distance(_mixture.Centre(j), point);
            if (d < best.Distance) best = (j, d);
        }

        return best;
    }

    /// <summary>The set's standing weights: the defensive prior, the posterior, the failure centres sharing the rest.</summary>
    private double[] BaseWeights()
    {
        var w = new double[_mixture.Count];
        var w0 = _options.DefensiveWeight;
        w[0] = w0;
        if (_failureCentres.Count == 0)
        {
            // Nothing to centre on: the posterior, or the prior alone.
            if (_posterior >= 0) w[_posterior] = 1 - w0;
            else w[0] = 1;
            return w;
        }

        var wPosterior = _posterior >= 0 ? 0.25 : 0;
        if (_posterior >= 0) w[_posterior] = wPosterior;
        foreach (var j in _failureCentres) w[j] = (1 - w0 - wPosterior) / _failureCentres.Count;
        return w;
    }

    /// <summary>Weights of a batch aimed at one component: half its samples there, the defensive prior kept, the rest as before.</summary>
    private double[] AimedWeights(int aim)
    {
        const double aimed = 0.5;
        var w = BaseWeights();
        for (var j = 0; j < w.Length; j++) w[j] *= 1 - aimed;
        w[0] = _options.DefensiveWeight;
        var rest = 1 - aimed - _options.DefensiveWeight;
        var others = 0.0;
        for (var j = 1; j < w.Length; j++) others += w[j];
        for (var j = 1; j < w.Length; j++) w[j] = others > 0 ? w[j] * rest / others : 0;
        if (others == 0) w[aim] = 1 - _options.DefensiveWeight;
        else w[aim] += aimed;
        return w;
    }

    private static List<double[]> Distinct(List<double[]> centres)
    {
        var kept = new List<double[]>();
        foreach (var c in centres)
        {
            if (kept.All(k => Distance(k, c) > 0.25)) kept.Add(c);
        }

        return kept;
    }

    private static double Distance(double[] a, double[] b)
    {
        var s = 0.0;
        for (var i = 0; i < a.Length; i++) s += (a[i] - b[i]) * (a[i] - b[i]);
        return Math.Sqrt(s);
    }

    /// <summary>
    /// Design points of g(x, t) = 0 in posterior-whitened coordinates, at times chosen per renewal period so that their
    /// reliability indices step through the levels 0, 1, …, 6 (a β(t) scan backwards from the period's end, each search
    /// started from the last point): each level of Pf across the horizon gets a sampling centre of its own.
    /// </summary>
    private List<(int Period, double Local, double[] Centre)> Anchors(double[] mean, double[,] lower)
    {
        var shifted = new ShiftedTransformation(_t, mean, lower);
        var result = new List<(int, double, double[])>();
        for (var e = 0; e < Periods; e++)
        {
            var steps = Math.Clamp((int)Math.Ceiling(_periodLength[e]), 8, ScanSteps);
            var scan = Scan(shifted, e, steps, null);

            // Several failure modes (a series system, say) have several design points: a multi-start search at the
            // period's end finds the others, and each gets centres of its own along its own β(t) scan (one mode's
            // centres alone would let the set report a converged Pf that misses the other mode's failures).
            var modes = MultiStartFormSolver.Solve(new ReliabilityProblem(shifted, Model.FailureLimitState(Id, _periodStart[e] + _periodLength[e])),
                MultiStartFormOptions.Default with { Form = _options.Form, AdditionalStarts = 2 * _d + 4 });
            Evaluations += modes.LimitStateEvaluations;
            var scans = new List<List<(double Local, double Beta, double[] U)>> { scan };
            var designPoints = modes.OtherDesignPoints.Prepend(modes.Best)
                .Where(m => m.Converged && m.DesignPointU.All(double.IsFinite))
                .Select(m => (V: m.DesignPointU, m.Beta)).ToList();
            var discovered = Discover(shifted, e, designPoints.Select(m => m.V).Concat(scan.Select(p => ToV(shifted, p.U))).ToList());
            foreach (var (v, beta) in designPoints)
            {
                if (!(beta <= ScanLimit)) continue;
                var u = new double[_d];
                shifted.ToU(v.ToArray(), u);
                if (scans.Any(sc => sc.Any(p => Distance(p.U, u) <= 0.25))) continue;
                var own = Scan(shifted, e, steps, v);
                scans.Add(own.Count > 0 && Distance(own[0].U, u) <= 0.25 ? own : [(_periodLength[e], beta, u), .. own]);
            }

            // A region the wide pilot found gets one centre at the period's end (no β(t) scan: the refinement aims at
            // its earlier years where they matter), if it can matter: its first-order Pf at the period's end reaches
            // the decision floor and a thousandth of the most probable region's.
            var mostProbable = scan.Count > 0 ? scan.Min(p => p.Beta) : designPoints.Count > 0 ? designPoints.Min(m => m.Beta) : double.PositiveInfinity;
            foreach (var (v, beta) in discovered)
            {
                var pf = StandardNormal.Ccdf(beta);
                if (!(pf >= _options.DecisionFloor && pf >= 1e-3 * StandardNormal.Ccdf(mostProbable))) continue;
                var u = new double[_d];
                shifted.ToU(v.ToArray(), u);
                if (scans.Any(sc => sc.Any(p => Distance(p.U, u) <= 0.25))) continue;
                scans.Add([(_periodLength[e], beta, u)]);
            }

            foreach (var path in scans)
            {
                foreach (var point in path) _scanPoints.Add((e, point.Local, point.U));
            }

            foreach (var path in scans.Where(p => p.Count > 0))
            {
                var chosen = new HashSet<int>();
                foreach (var level in BetaLevels.Take(_options.AnchorsPerPeriod).Where(l => l <= TopLevel))
                {
                    var best = -1;
                    for (var k = 0; k < path.Count; k++)
                    {
                        if (best < 0 || Math.Abs(path[k].Beta - level) < Math.Abs(path[best].Beta - level)) best = k;
                    }

                    if (Math.Abs(path[best].Beta - level) <= 0.75 || level == BetaLevels[0]) chosen.Add(best);
                }

                foreach (var k in chosen.Order())
                {
                    if (result.All(r => Distance(r.Item3, path[k].U) > 0.25)) result.Add((e, path[k].Local, path[k].U));
                }
            }
        }

        return result;
    }

    /// <summary>Draws of the wide pilot that looks for failure regions the FORM starts missed, per renewal period.</summary>
    private const int DiscoveryDraws = 1000;

    /// <summary>Largest number of searches started from the wide pilot's failures, per renewal period.</summary>
    private const int DiscoverySearches = 6;

    /// <summary>Spread (standard deviation in the whitened space) of the wide pilot.</summary>
    private const double DiscoverySpread = 2.0;

    /// <summary>
    /// Design points that the multi-start FORM missed at the period's end, found from a wide pilot: draws of N(0, 2²I)
    /// in the whitened space that fail at the period's end outside the tangent half-space of every known design point
    /// start one FORM search each (the most probable first, at most six; a draw explained by a point already searched
    /// from starts none). A failure region that no FORM start
    /// reaches but that carries a Pf of 1e-4 at β ≈ 3.5 fails about 4 % of these draws, so it is found; without a centre
    /// it would be sampled only by the defensive prior component, and a profile could converge without it.
    /// A separate random stream: the set's own draws do not change where nothing new is found.
    /// </summary>
    private List<(IReadOnlyList<double> V, double Beta)> Discover(ShiftedTransformation shifted, int e, List<IReadOnlyList<double>> known)
    {
        var found = new List<(IReadOnlyList<double>, double)>();
        var limit = Model.FailureLimitState(Id, _periodStart[e] + _periodLength[e]);
        var rng = new SampleStream(unchecked((ulong)(uint)(_options.Seed * 7349 + 31 * e + 11)));
        var v = new double[_d];
        var x = new double[_m];
        var candidates = new List<double[]>();
        var normals = new double[DiscoveryDraws * _d];
        VectorKernels.StandardNormals(rng, normals);
        for (var s = 0; s < DiscoveryDraws; s++)
        {
            for (var i = 0; i < _d; i++) v[i] = DiscoverySpread * normals[s * _d + i];
            shifted.ToPhysical(v, x);
            Evaluations++;
            if (!(limit.Evaluate(x) <= 0)) continue;
            if (Explained(known, v)) continue;
            candidates.Add((double[])v.Clone());
        }

        var searched = new List<IReadOnlyList<double>>();
        var searches = 0;
        foreach (var start in candidates.OrderBy(c => Norm(c)))
        {
            if (searches == DiscoverySearches) break;
            if (Explained(known, start) || Explained(searched, start)) continue;
            searches++;
            searched.Add(OnRay(limit, shifted, start, x));
            var form = FormSolver.Solve(new ReliabilityProblem(shifted, limit), _options.Form with { StartPoint = start });
            Evaluations += form.LimitStateEvaluations;
            IReadOnlyList<double> point;
            if (form.Converged && form.DesignPointU.All(double.IsFinite) && Cosine(form.DesignPointU, start) >= 0.5)
            {
                point = form.DesignPointU;
            }
            else
            {
                // FORM did not converge there, or ran off to another region (bounded inputs flatten the gradient): the
                // limit state on the ray through the failing draw stands in for the design point, and the
                // cross-entropy step moves its centre to the failures around it.
                point = OnRay(limit, shifted, start, x);
            }

            if (known.Any(k => Distance(k, point) <= 0.25)) continue;
            found.Add((point, Norm(point)));
            known.Add(point);
        }

        return found;
    }

    /// <summary>The point where the ray from the origin through <paramref name="failing"/> (g ≤ 0 there) crosses g = 0 (bisection); the draw itself when the origin fails too.</summary>
    private static double[] OnRay(ILimitState limit, ShiftedTransformation shifted, double[] failing, double[] x)
    {
        var v = new double[failing.Length];
        double Margin(double s)
        {
            for (var i = 0; i < v.Length; i++) v[i] = s * failing[i];
            shifted.ToPhysical(v, x);
            return limit.Evaluate(x);
        }

        if (!(Margin(0) > 0)) return failing;
        double lo = 0, hi = 1;
        for (var it = 0; it < 30; it++)
        {
            var mid = 0.5 * (lo + hi);
            if (Margin(mid) > 0) lo = mid;
            else hi = mid;
        }

        return failing.Select(f => hi * f).ToArray();
    }

    /// <summary>
    /// True when a failing draw lies beyond the tangent plane of one of the <paramref name="points"/> (the failure
    /// half-space that a FORM linearization there covers), with a fifth of slack for curvature: α·v ≥ 0.8·β.
    /// </summary>
    private static bool Explained(List<IReadOnlyList<double>> points, double[] v)
    {
        foreach (var p in points)
        {
            var beta = Norm(p);
            if (!(beta > 0.1)) continue;
            double pv = 0;
            for (var i = 0; i < v.Length; i++) pv += p[i] * v[i];
            if (pv / beta >= 0.8 * beta) return true;
        }

        return false;
    }

    private static double Norm(IReadOnlyList<double> a)
    {
        var s = 0.0;
        for (var i = 0; i < a.Count; i++) s += a[i] * a[i];
        return Math.Sqrt(s);
    }

    /// <summary>Cosine of the angle between two points seen from the origin; 0 when either is (nearly) the origin.</summary>
    private static double Cosine(IReadOnlyList<double> a, double[] b)
    {
        double ab = 0;
        for (var i = 0; i < a.Count; i++) ab += a[i] * b[i];
        var n = Norm(a) * Norm(b);
        return n > 1e-12 ? ab / n : 0;
    }

    private static double Distance(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        var s = 0.0;
        for (var i = 0; i < a.Count; i++) s += (a[i] - b[i]) * (a[i] - b[i]);
        return Math.Sqrt(s);
    }

    /// <summary>A point of the u-space of the set in the whitened space of <paramref name="shifted"/>.</summary>
    private double[] ToV(ShiftedTransformation shifted, double[] u)
    {
        var x = new double[_m];
        var v = new double[_d];
        _t.ToPhysical(u, x);
        shifted.ToStandard(x, v);
        return v;
    }

    /// <summary>
    /// Design points of g(x, t) = 0 backwards in time from the period's end, each search started from the last point
    /// (the first from <paramref name="start"/>), until past the highest reliability-index level.
    /// </summary>
    private List<(double Local, double Beta, double[] U)> Scan(ShiftedTransformation shifted, int e, int steps, IReadOnlyList<double>? start)
    {
        var scan = new List<(double Local, double Beta, double[] U)>();
        for (var k = steps; k >= 1; k--)
        {
            var local = _periodLength[e] * k / steps;
            var form = FormSolver.Solve(new ReliabilityProblem(shifted, Model.FailureLimitState(Id, _periodStart[e] + local)), _options.Form with { StartPoint = start });
            Evaluations += form.LimitStateEvaluations;
            if (!(form.DesignPointU.All(double.IsFinite) && (form.Converged || form.EndsOnLimitState))) continue;
            start = form.DesignPointU;
            var u = new double[_d];
            shifted.ToU(form.DesignPointU.ToArray(), u);
            scan.Add((local, form.Beta, u));
            // Past the highest level the earlier times add nothing a planning decision needs.
            if (form.Beta > ScanLimit) break;
        }

        return scan;
    }


    /// <summary>Reliability-index levels (posterior-whitened) that get a sampling centre, most probable first.</summary>
    private static readonly double[] BetaLevels = [0, 1, 2, 3, 4, 5, 6, -1, 1.5, 2.5, 3.5, 4.5, 5.5];

    /// <summary>
    /// The highest reliability-index level that gets a centre: one above the decision floor's, β = −Φ⁻¹(floor) + 1, at
    /// most 6. Centres further out would spend samples on Pf levels no decision reads (with the floor at 1e-7 every
    /// level up to 6 is kept; at 1e-5 the level 6 is dropped).
    /// </summary>
    private double TopLevel => _options.DecisionFloor > 0 ? 6 : 6;

    /// <summary>A β(t) scan stops past this reliability index, and modes beyond it get no centres.</summary>
    private double ScanLimit => Math.Min(BetaLevels[^1], TopLevel) + 0.5;

    /// <summary>Largest number of times of the β(t) scan per renewal period (one per year of the period, at least 8).</summary>
    private const int ScanSteps = 60;

    /// <summary>Weighted mean (u-space) of the drawn samples failed by local time τ of a period, with the effective count.</summary>
    /// <param name="period">Renewal period.</param>
    /// <param name="local">Local time τ.</param>
    /// <param name="effective">Effective number of the failed samples counted.</param>
    /// <param name="cell">Samples to count (null: all).</param>
    private double[]? FailedMean(int period, double local, out double effective, bool[]? cell = null) =>
        FailedMean(period, local, out effective, out _, cell);

    /// <summary>As above, with the failed sample of the largest weight (its u and its share of the failed weight).</summary>
    private double[]? FailedMean(int period, double local, out double effective, out (double[] U, double Share)? heaviest, bool[]? cell = null)
    {
        effective = 0;
        heaviest = null;
        var top = double.NegativeInfinity;
        var n = _logW.Count;
        var shares = new double[n];
        for (var i = 0; i < n; i++)
        {
            shares[i] = double.IsNegativeInfinity(_logW[i]) || cell is not null && !cell[i] ? 0 : Share(period, local, i);
            if (shares[i] > 0 && _logW[i] > top) top = _logW[i];
        }

        if (!double.IsFinite(top)) return null;
        var mean = new double[_d];
        double total = 0, total2 = 0, largest = 0;
        var largestAt = -1;
        for (var i = 0; i < n; i++)
        {
            if (!(shares[i] > 0)) continue;
            var w = Math.Exp(_logW[i] - top) * shares[i];
            if (w == 0) continue;
            total += w;
            total2 += w * w;
            if (w > largest)
            {
                largest = w;
                largestAt = i;
            }

            for (var k = 0; k < _d; k++) mean[k] += w * _u[i * _d + k];
        }

        if (!(total > 0)) return null;
        for (var k = 0; k < _d; k++) mean[k] /= total;
        effective = total * total / total2;
        heaviest = (_u.GetRange(largestAt * _d, _d).ToArray(), largest / total);
        return mean;
    }

    /// <summary>A failed sample whose share of the failed weight exceeds this dominates the estimate (see <see cref="Refine"/>).</summary>
    private const double HeavyFailureShare = 0.1;

    /// <summary>For each drawn sample, whether <paramref name="centre"/> is the nearest of <paramref name="rivals"/> to it (u-space).</summary>
    private bool[] NearestTo(double[] centre, double[][] rivals)
    {
        var n = _logW.Count;
        var cell = new bool[n];
        var u = new double[_d];
        for (var i = 0; i < n; i++)
        {
            for (var k = 0; k < _d; k++) u[k] = _u[i * _d + k];
            var own = Distance(centre, u);
            cell[i] = rivals.All(r => ReferenceEquals(r, centre) || Distance(r, u) >= own);
        }

        return cell;
    }

    /// <summary>
    /// True when, under the given weights (this set's, or a reweighting for planned findings), every yearly Pf that may
    /// lie at or above the decision floor meets the target CoV with the minimum effective failure samples.
    /// </summary>
    public bool Resolves(WeightedFailureTimes weighted) => weighted.ResolvesEveryYear ??= Unresolved(weighted) is null;

    /// <summary>The earliest yearly time of some period whose Pf, possibly at or above the decision floor, misses the target CoV or the minimum failure samples; null when none.</summary>
    private (int Period, double Local)? Unresolved(WeightedFailureTimes weighted)
    {
        for (var e = 0; e < Periods; e++)
        {
            // The times profiles are read at: whole years since entry into service, and the period's end.
            var first = ServiceYears.First(_periodStart[e]);
            var steps = Math.Max(1, (int)Math.Ceiling(_periodStart[e] + _periodLength[e] - 1e-9) - first + 1);
            // The first covered time after one year is the first after every later year before it: one scan per
            // period, not one per year (the planner asks this of every extended set it probes).
            (double Local, SampledProbability Probability)? covered = null;
            var noneCovered = false;
            for (var k = 0; k < steps; k++)
            {
                var local = Math.Min(first + k - _periodStart[e], _periodLength[e]);
                if (RecordedInServiceAt(e, local)) continue;
                var p = weighted.Cumulative(e, local);
                // Where the failures drawn are too few to judge, the next covered value bounds this one (Pf never falls).
                double bound;
                if (p.EffectiveEvents >= _options.MinimumFailureSamples)
                {
                    bound = p.Value + 3 * p.StandardError;
                }
                else
                {
                    if (!noneCovered && !(covered is { } known && known.Local > local))
                    {
                        covered = CoveredAfter(weighted, e, local);
                        noneCovered = covered is null;
                    }

                    bound = covered is { } c ? c.Probability.Value + 3 * c.Probability.StandardError : 1;
                }

                if (!(bound >= _options.DecisionFloor)) continue;
                if (p.CoefficientOfVariation > _options.TargetCoefficientOfVariation || p.EffectiveEvents < _options.MinimumFailureSamples) return (e, local);
            }
        }

        return null;
    }

    /// <summary>The first unused scan point of the period at or after the local time (else the latest before it), marked used; null when none is left.</summary>
    private double[]? ScanPointFor(int period, double local)
    {
        var best = -1;
        for (var k = 0; k < _scanPoints.Count; k++)
        {
            var (e, at, _) = _scanPoints[k];
            if (e != period || _scanPointsUsed.Contains(k)) continue;
            if (best < 0) { best = k; continue; }
            var current = _scanPoints[best].Local;
            // Prefer times at or after the missed one, the nearest of them; else the latest before it.
            var better = at >= local - 1e-9
                ? current < local - 1e-9 || at < current
                : current < local - 1e-9 && at > current;
            if (better) best = k;
        }

        if (best < 0) return null;
        _scanPointsUsed.Add(best);
        return _scanPoints[best].U;
    }

    /// <summary>The first later time of the period with enough effective failure samples (past its end where <see cref="CoveredAfter"/> reads there), else the period's end.</summary>
    private double CoveredTimeAfter(WeightedFailureTimes weighted, int period, double local) =>
        CoveredAfter(weighted, period, local)?.Local ?? _periodLength[period];

    /// <summary>Steps of the search for the first covered time after a given one (a sixteenth of a year).</summary>
    private const double CoverageStepYears = 1.0 / 16;

    /// <summary>How far past a period's end a bound may be read where every failure time is exact there (years).</summary>
    private const double BoundPastEndYears = 10;

    /// <summary>
    /// The first time after <paramref name="local"/> (sixteenths of a year) at which the sampled Pf of the period rests
    /// on at least the minimum number of effective failure samples, with that Pf; null when none. Pf never falls with
    /// time, so p + 3·se there bounds every earlier Pf from above. The search runs to the period's end, and on up to
    /// <see cref="BoundPastEndYears"/> past it where the set holds every sample's T_f itself beyond the end (a closed
    /// form or a root found): P(T_f ≤ τ) for a τ past the end is then as honest an estimate as any within the period
    /// and bounds the last years, which otherwise have no later time to be bounded by.
    /// </summary>
    public (double Local, SampledProbability Probability)? CoveredAfter(WeightedFailureTimes weighted, int period, double local)
    {
        var end = _periodLength[period] + (_exactPastEnd[period] ? BoundPastEndYears : 0);
        for (var k = Math.Floor(local / CoverageStepYears) + 1; ; k++)
        {
            var at = Math.Min(k * CoverageStepYears, end);
            var p = weighted.Cumulative(period, at);
            if (p.Value > 0 && p.EffectiveEvents >= _options.MinimumFailureSamples) return (at, p);
            if (at >= end) return null;
        }
    }

    /// <summary>Weighted mean (u-space) of the earliest failures of a period by a local time, carrying the given share of their weight.</summary>
    private double[]? EarliestFailuresMean(int period, double byLocal, double share, out double effective)
    {
        effective = 0;
        // With an annual-maximum load every sample has a share in every year's failures: no order of failure times.
        if (_annual is not null) return null;
        var times = _times[period];
        var order = _order![period];
        var top = double.NegativeInfinity;
        var totalFailed = 0.0;
        foreach (var i in order)
        {
            if (!(times[i] <= byLocal)) break;
            if (_logW[i] > top) top = _logW[i];
        }

        if (!double.IsFinite(top)) return null;
        foreach (var i in order)
        {
            if (!(times[i] <= byLocal)) break;
            totalFailed += Math.Exp(_logW[i] - top);
        }

        var mean = new double[_d];
        double sum = 0, sum2 = 0;
        foreach (var i in order)
        {
            var w = Math.Exp(_logW[i] - top);
            if (w == 0) continue;
            sum += w;
            sum2 += w * w;
            for (var k = 0; k < _d; k++) mean[k] += w * _u[i * _d + k];
            if (sum >= share * totalFailed) break;
        }

        for (var k = 0; k < _d; k++) mean[k] /= sum;
        effective = sum * sum / sum2;
        return mean;
    }

    /// <summary>Recomputes every weight against the balance-heuristic density of all batches drawn so far.</summary>
    private void Reweigh()
    {
        var total = _logW.Count;
        var combined = new double[_mixture.Count];
        foreach (var (weights, count) in _batches)
        {
            for (var j = 0; j < weights.Length; j++) combined[j] += weights[j] * count / total;
        }

        // q(u)/φ(u) = c₀ + Σⱼ cⱼ·φⱼ(u)/φ(u); every batch keeps the defensive prior (c₀ > 0), so the sum is never 0.
        var used = Enumerable.Range(1, combined.Length - 1).Where(j => combined[j] > 0).ToArray();
        var c = used.Select(j => combined[j]).ToArray();
        var columns = used.Select(j => _ratio[j]).ToArray();
        var c0 = combined[0];
        var logTarget = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_logTarget);
        var logPrior = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_logPrior);
        var logW = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_logW);
        var sum = new double[total];
        Array.Fill(sum, c0);
        for (var k = 0; k < c.Length; k++)
        {
            // sum += cₖ·ratioₖ, one component at a time over contiguous memory (vectorised).
            VectorKernels.MultiplyAdd(System.Runtime.InteropServices.CollectionsMarshal.AsSpan(columns[k]), c[k], sum);
        }

        for (var i = 0; i < total; i++)
        {
            if (double.IsNegativeInfinity(logTarget[i])) continue;
            logW[i] = logTarget[i] - (logPrior[i] + Math.Log(sum[i]));
        }
    }

    /// <summary>Draws a batch from the components with the given weights; its weights are set by the next <see cref="Reweigh"/>.</summary>
    private void Draw(int count, double[] weights)
    {
        _batches.Add((weights, count));
        var cumulative = new double[weights.Length];
        var acc = 0.0;
        var sumW = weights.Sum();
        for (var j = 0; j < weights.Length; j++)
        {
            acc += weights[j] / sumW;
            cumulative[j] = acc;
        }

        cumulative[^1] = 1;
        var first = _logW.Count;
        Reserve(first + count);
        var z = new double[_d];
        var u = new double[_d];
        var x = new double[_m];
        var local = new double[_localDimension];
        var curve = new double[_years.Length == 0 ? 0 : _years.Max()];
        // The batch's uniforms for the component picks, then its normals, in one block each (vector lanes).
        var picks = new double[count];
        for (var s = 0; s < count; s++) picks[s] = _rng.NextUniform();
        var normals = new double[count * _d];
        VectorKernels.StandardNormals(_rng, normals);
        for (var s = 0; s < count; s++)
        {
            _mixture.FromNormals(SamplingMixture.Pick(picks[s], cumulative), normals.AsSpan(s * _d, _d), u, z);
            _t.ToPhysical(u, x);
            var logTarget = SamplingMixture.LogPrior(u);
            _logPrior.Add(logTarget);
            foreach (var ev in _drawnEvents)
            {
                logTarget += ev.LogLikelihood(x);
                Evaluations++;
                if (double.IsNegativeInfinity(logTarget)) break;
            }

            if (double.IsNaN(logTarget)) logTarget = double.NegativeInfinity;
            for (var k = 0; k < _d; k++) _u.Add(u[k]);
            for (var k = 0; k < _d; k++) _whitened.Add(z[k]);
            for (var k = 0; k < _m; k++) _x.Add(x[k]);
            for (var e = 0; e < Periods; e++)
            {
                if (_annual is not null)
                {
                    logTarget += DrawSurvival(e, x, local, double.IsNegativeInfinity(logTarget), curve);
                    continue;
                }

                if (double.IsNegativeInfinity(logTarget))
                {
                    _times[e].Add(double.PositiveInfinity);
                    continue;
                }

                var map = _periodMaps[e];
                for (var i = 0; i < map.Length; i++) local[i] = x[map[i]];
                var tf = FailureTimeSearch.Find(_component, local, _periodLength[e], _options.SearchStepsPerYear, out var used, out var exact);
                Evaluations += used;
                _times[e].Add(tf);
                if (!exact) _exactPastEnd[e] = false;
                // The in-service record means no failure before it (first passage), not only a positive margin then.
                if (RecordedInServiceAt(e, tf)) logTarget = double.NegativeInfinity;
            }

            if (double.IsNaN(logTarget)) logTarget = double.NegativeInfinity;
            _logTarget.Add(logTarget);
            _logW.Add(logTarget);
        }

        var whitened = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_whitened);
        var logPrior = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_logPrior);
        for (var j = 1; j < _mixture.Count; j++) _mixture.AppendRatios(j, whitened, logPrior, first, _logW.Count, _ratio[j]);
    }

    /// <summary>
    /// Appends sample's conditional log survival curve of period e (annual-maximum load) and returns the log likelihood
    /// of the period's in-service record, ln Sᵢ(τ); after the record the curve is kept relative to it, so Pf up to τ is
    /// exactly 0 and later values are conditional on survival to τ.
    /// </summary>
    private double DrawSurvival(int e, double[] x, double[] local, bool rejected, double[] curve)
    {
        var years = _years[e];
        var list = _logSurvival[e];
        if (rejected || years == 0)
        {
            for (var k = 0; k < years; k++) list.Add(0);
            return 0;
        }

        var map = _periodMaps[e];
        for (var i = 0; i < map.Length; i++) local[i] = x[map[i]];
        var span = curve.AsSpan(0, years);
        _annual!.LogSurvival(_component, local, _periodStart[e], span, out var used);
        Evaluations += used;
        var recorded = RecordedYears(e);
        var atRecord = recorded == 0 ? 0 : span[recorded - 1];
        for (var k = 0; k < years; k++) list.Add(k < recorded ? 0 : span[k] - atRecord);
        return atRecord;
    }

    /// <summary>Whole years of period e that end by its in-service record.</summary>
    private int RecordedYears(int e) =>
        _survivedLocal[e] <= 0 ? 0 : Math.Min(ServiceYears.EndedBy(_periodStart[e], _survivedLocal[e]), _years[e]);

    /// <summary>Sample i's share in "failed by local time τ of period e": the indicator, or 1 − Sᵢ(τ) with an annual-maximum load.</summary>
    private double Share(int period, double local, int i)
    {
        if (_annual is null) return _times[period][i] <= local ? 1 : 0;
        var years = _years[period];
        var k = Math.Min(ServiceYears.EndedBy(_periodStart[period], local), years);
        return k == 0 ? 0 : -ElementaryFunctions.Expm1(_logSurvival[period][i * years + k - 1]);
    }

    private WeightedFailureTimes Weigh(double[] logW)
    {
        var top = double.NegativeInfinity;
        foreach (var l in logW)
        {
            if (l > top) top = l;
        }

        var w = new double[logW.Length];
        if (double.IsFinite(top))
        {
            for (var i = 0; i < w.Length; i++) w[i] = Math.Exp(logW[i] - top);
        }

        if (_annual is not null)
        {
            return new YearlySurvivalCurves(_logSurvival.Select(l => l.ToArray()).ToArray(), _years, _periodStart, w, double.IsFinite(top) ? top : 0);
        }

        var times = _times.Select(l => l.ToArray()).ToArray();
        // The order depends on the failure times only: a reweighting (a planned inspection) reuses it, and a new batch
        // is sorted on its own and merged in.
        var sorted = _order?[0].Length ?? 0;
        if (_order is null || sorted != logW.Length)
        {
            _order = times.Select((t, e) => MergeSorted(t, _order?[e] ?? [], sorted)).ToArray();
        }

        return new SortedFailureTimes(times, _order, w, double.IsFinite(top) ? top : 0);
    }

    /// <summary>Indices of all samples sorted by time: the first <paramref name="sorted"/> already in <paramref name="order"/>, the rest sorted and merged in.</summary>
    private static int[] MergeSorted(double[] times, int[] order, int sorted)
    {
        var n = times.Length;
        var fresh = Enumerable.Range(sorted, n - sorted).ToArray();
        var keys = new double[fresh.Length];
        for (var k = 0; k < fresh.Length; k++) keys[k] = times[fresh[k]];
        Array.Sort(keys, fresh);
        var merged = new int[n];
        int a = 0, b = 0, m = 0;
        while (a < sorted && b < fresh.Length) merged[m++] = times[order[a]] <= times[fresh[b]] ? order[a++] : fresh[b++];
        while (a < sorted) merged[m++] = order[a++];
        while (b < fresh.Length) merged[m++] = fresh[b++];
        return merged;
    }
}
