using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The sample-set route: per component, one set of weighted samples covers the failure region over the whole horizon
/// (<see cref="ComponentSampleSet"/>); Pf(t | data) for every t is the weighted distribution function of the failure
/// time, so a profile is monotone by construction and every ΔPf is estimated directly with its own standard error.
/// A planned finding (an inspection that finds nothing, say) multiplies each sample's weight by its likelihood:
/// nothing is re-sampled per planner probe.
/// </summary>
/// <remarks>
/// <para>Where a Pf(t) has too few effective failure samples to be trusted, first order (the
/// <see cref="UpdatingRoute.FirstOrder"/> route of <see cref="ReliabilityUpdater"/>) gives the number, marked converged
/// only when it converged below <see cref="SampleSetOptions.NegligibleProbability"/> and the samples do not
/// contradict it; otherwise the sampled value is reported as not converged. With
/// <see cref="SampleSetOptions.FirstOrderBelowResolution"/> a profile also carries the first-order value of every step
/// as a cross-check: where the two differ by more than three combined standard errors plus the stated margin, the
/// step's note says so.</para>
/// <para>Thread-safe: sets are built once per (model, findings) and cached (the last few).</para>
/// </remarks>
public sealed class SampleSetUpdater : IReliabilityUpdater
{
    private const int CachedSets = 6;

    /// <summary>Share of a set's effective sample size that a reweighting must keep to be reused when the set itself stopped unresolved at its cap.</summary>
    private const double MinimumEffectiveShare = 0.5;

    /// <summary>Smallest share of a set's effective sample size that a reweighting may keep when it still resolves every yearly Pf that matters.</summary>
    private const double SmallestEffectiveShare = 0.1;
    private readonly Lock _gate = new();
    private readonly LinkedList<Entry> _recent = new();
    private readonly ReliabilityUpdater _firstOrder;

    /// <summary>Creates an updater.</summary>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range (the message names it).</exception>
    public SampleSetUpdater(SampleSetOptions? options = null)
    {
        options ??= SampleSetOptions.Default;
        options.Validate();
        Options = options;
        _firstOrder = new ReliabilityUpdater(UpdatingOptions.Default with { Route = UpdatingRoute.FirstOrder, Form = options.Form });
    }

    /// <summary>The settings.</summary>
    public SampleSetOptions Options { get; }

    /// <inheritdoc />
    public UpdatedEstimate Estimate(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double timeYears)
    {
        RequireTime(timeYears, nameof(timeYears));
        var (set, weighted, note) = Resolve(model, evidence, timeYears);
        var (period, local) = set.Locate(timeYears);
        var p = weighted.Cumulative(period, local);
        return Decide(model, evidence, timeYears, p, weighted, set, note, crossCheck: false, out _);
    }

    /// <summary>The interval probability P(t₀ &lt; T_f ≤ t₁ | data) read directly from the sample set (same renewal period), or null.</summary>
    public SampledProbability? Interval(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double fromYears, double toYears)
    {
        RequireTime(fromYears, nameof(fromYears));
        RequireTime(toYears, nameof(toYears));
        var (set, weighted, _) = Resolve(model, evidence, toYears);
        var (e0, l0) = set.Locate(fromYears);
        var (e1, l1) = set.Locate(toYears);
        if (e0 != e1) return null;
        return weighted.Between(e1, l0, l1);
    }

    /// <inheritdoc />
    public ReliabilityProfile Profile(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, IReadOnlyList<double> timesYears, string label)
    {
        ArgumentNullException.ThrowIfNull(timesYears);
        for (var i = 0; i < timesYears.Count; i++)
        {
            var t = timesYears[i];
            if (!double.IsFinite(t) || t < 0) throw new ArgumentOutOfRangeException(nameof(timesYears), t, $"Time [{i}] must be finite and ≥ 0 years.");
            if (i > 0 && !(t > timesYears[i - 1])) throw new ArgumentOutOfRangeException(nameof(timesYears), t, $"Times must increase strictly (entry {i}).");
        }

        var end = timesYears.Count == 0 ? 0 : timesYears[^1];
        var (set, weighted, setNote) = Resolve(model, evidence, end);
        var points = new List<ProfilePoint>(timesYears.Count);
        var prevPeriod = -1;
        var prevLocal = 0.0;
        var prevPf = 0.0;
        var prevFirstOrder = false;
        var names = set.Model.InputModel.RandomIndices.Select(i => set.Model.InputModel.Variables[i].Name).ToArray();
        foreach (var t in timesYears)
        {
            var (period, local) = set.Locate(t);
            var restarted = period != prevPeriod;
            var cumulative = weighted.Cumulative(period, local);
            var estimate = Decide(model, evidence, t, cumulative, weighted, set, null, crossCheck: Options.FirstOrderBelowResolution, out var firstOrderValue);
            var usedFirstOrder = estimate.Route != ComputationRoute.ImportanceSampling;
            var basePf = restarted ? 0.0 : prevPf;
            if (!restarted && estimate.CumulativePf < prevPf)
            {
                // Pf never falls with time within a renewal period; below the resolution the route can switch between a
                // first-order and a sampled value (both tiny) that do not keep that order: the earlier value stands.
                estimate = estimate with
                {
                    CumulativePf = prevPf,
                    Beta = -StandardNormal.InverseCdf(prevPf),
                    Note = Append(estimate.Note, string.Create(CultureInfo.InvariantCulture,
                        $"held at the previous step's {prevPf:0.###E+00} (computed {estimate.CumulativePf:0.###E+00}; Pf never falls with time)")),
                };
            }
            double interval;
            double? intervalCov = null;
            if (!usedFirstOrder && !prevFirstOrder || restarted && !usedFirstOrder)
            {
                var d = restarted ? cumulative : weighted.Between(period, prevLocal, local);
                interval = d.Value;
                intervalCov = d.Value > 0 ? d.CoefficientOfVariation : null;
            }
            else
            {
                interval = Math.Max(0, estimate.CumulativePf - basePf);
            }

            var note = estimate.Note;
            if (Options.FirstOrderBelowResolution && !usedFirstOrder && estimate.Converged && firstOrderValue is { } fo && Disagrees(cumulative, fo))
            {
                note = Append(note, string.Create(CultureInfo.InvariantCulture,
                    $"first order gives {fo:0.###E+00}, outside three standard errors and {Options.CrossCheckMargin:P0} of the sampled value"));
            }

            double hazard;
            if (basePf < 1)
            {
                hazard = interval / (1 - basePf);
            }
            else
            {
                hazard = double.NaN;
                note = Append(note, "hazard undefined: Pf had reached 1 at the previous step");
            }

            if (restarted && prevPeriod >= 0)
            {
                note = Append(string.Create(CultureInfo.InvariantCulture, $"renewed by a repair at {set.PeriodStart(period):0.###} y; ΔPf counts from the renewal"), note);
            }

            points.Add(new ProfilePoint
            {
                TimeYears = t,
                Beta = estimate.Beta,
                CumulativePf = estimate.CumulativePf,
                IntervalPf = interval,
                IntervalCoefficientOfVariation = intervalCov,
                Hazard = hazard,
                Route = estimate.Route,
                Converged = estimate.Converged,
                CoefficientOfVariation = estimate.CoefficientOfVariation,
                UpperBound = estimate.UpperBound,
                Evaluations = 0,
                Note = note,
            });
            prevPeriod = period;
            prevLocal = local;
            prevPf = estimate.CumulativePf;
            prevFirstOrder = usedFirstOrder;
        }

        var first = points.Count > 0 ? points[0] : null;
        if (first is not null)
        {
            points[0] = first with { Evaluations = (int)Math.Min(int.MaxValue, set.Evaluations), Note = Append(setNote, first.Note) };
        }

        return new ReliabilityProfile { Label = label, VariableNames = names, Points = points };
    }

    /// <summary>Posterior summaries of the model inputs from the sample set's weights.</summary>
    public PosteriorSummary Posterior(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence)
    {
        var (set, weighted, _) = Resolve(model, evidence, 0);
        return set.Posterior(weighted);
    }

    /// <summary>Prior and posterior draws of every random input, for histograms (systematic resampling of the set).</summary>
    public IReadOnlyList<InputSamples> PosteriorSamples(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, int count = 2000)
    {
        if (count < 10) throw new ArgumentOutOfRangeException(nameof(count), count, "At least 10 draws.");
        var (set, weighted, _) = Resolve(model, evidence, 0);
        return set.Draws(weighted, count, Options.Seed);
    }

    private bool Disagrees(SampledProbability sampled, double firstOrder) =>
        Math.Abs(firstOrder - sampled.Value) > 3 * sampled.StandardError + Options.CrossCheckMargin * sampled.Value;

    /// <summary>The reported estimate at t: sampled where resolved, else first order below the negligible level, else the sampled value flagged.</summary>
    private UpdatedEstimate Decide(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double t, SampledProbability p,
        WeightedFailureTimes weighted, ComponentSampleSet set, string? note, bool crossCheck, out double? firstOrderValue)
    {
        firstOrderValue = null;
        var evidenceProbability = evidence.Any(e => e is SizedIndication) ? double.NaN : Math.Exp(weighted.LogMeanWeight);
        if (!(weighted.TotalWeight > 0))
        {
            return new UpdatedEstimate
            {
                CumulativePf = double.NaN,
                Beta = double.NaN,
                EvidenceProbability = 0,
                Route = ComputationRoute.ImportanceSampling,
                Converged = false,
                CoefficientOfVariation = null,
                Note = Append(note, "every sample contradicts the findings (zero likelihood): the findings cannot be explained by the model"),
            };
        }

        var (period, local) = set.Locate(t);
        if (set.RecordedInServiceAt(period, local))
        {
            // Not an estimate: the findings record the component in service at a later time of this renewal period.
            return new UpdatedEstimate
            {
                CumulativePf = 0,
                Beta = double.PositiveInfinity,
                EvidenceProbability = evidenceProbability,
                Route = ComputationRoute.ImportanceSampling,
                Converged = true,
                CoefficientOfVariation = null,
                Note = Append(note, string.Create(CultureInfo.InvariantCulture,
                    $"exactly 0: the findings record the component in service at {set.PeriodStart(period) + set.SurvivedUntil(period):0.###} y")),
            };
        }

        var covered = p.Value > 0 && p.EffectiveEvents >= Options.MinimumFailureSamples;
        // Converged: the target CoV is met, or (with the failure region covered) the value is shown below the level
        // at which no planning decision depends on more digits.
        var belowDecisions = covered && p.Value + 3 * p.StandardError < Options.DecisionFloor;
        var resolved = covered && (p.CoefficientOfVariation <= Options.TargetCoefficientOfVariation || belowDecisions);
        // Between two whole years the set has resolved (a planner's probe), Pf lies between theirs (it never falls
        // with time) and its own estimate rests on nearly the same failures: up to twice the target CoV it is converged.
        var betweenResolvedYears = !resolved && covered && !IsWholeYear(t) && p.CoefficientOfVariation <= 2 * Options.TargetCoefficientOfVariation
            && set.Resolves(weighted);
        resolved |= betweenResolvedYears;
        UpdatedEstimate? firstOrder = null;
        if (crossCheck || Options.FirstOrderBelowResolution && !resolved)
        {
            firstOrder = TryFirstOrder(model, evidence, t);
            if (firstOrder is not null && double.IsFinite(firstOrder.CumulativePf)) firstOrderValue = firstOrder.CumulativePf;
        }

        var sampleNote = string.Create(CultureInfo.InvariantCulture, $"{p.EffectiveEvents:F0} effective failure samples of {weighted.Count}");
        if (resolved)
        {
            return Sampled(p, true, Append(note, betweenResolvedYears
                ? string.Create(CultureInfo.InvariantCulture, $"{sampleNote}; CoV {p.CoefficientOfVariation:0.###} between whole years the set resolves to the target {Options.TargetCoefficientOfVariation:0.###} (within twice the target)")
                : belowDecisions && p.CoefficientOfVariation > Options.TargetCoefficientOfVariation
                ? string.Create(CultureInfo.InvariantCulture, $"{sampleNote}; below {Options.DecisionFloor:0.#E+0} with three standard errors")
                : sampleNote));
        }

        // Pf never falls with time within a renewal period: a later resolved value bounds this one from above.
        if (LaterBound(weighted, set, t) is { } bound && bound.Value < Options.DecisionFloor)
        {
            var bounded = Sampled(p, true, Append(note, string.Create(CultureInfo.InvariantCulture,
                $"bounded: Pf ≤ {bound.Value:0.###E+00} (the sampled value at {bound.AtYears:0.###} y, from at least {Options.MinimumFailureSamples} effective failure samples, plus three standard errors; Pf never falls with time), {sampleNote}")));
            return bounded with { UpperBound = bound.Value };
        }

        if (firstOrder is { Converged: true } f && f.CumulativePf < Options.NegligibleProbability
            && p.Value <= Math.Max(10 * f.CumulativePf, Options.NegligibleProbability))
        {
            return f with
            {
                Note = Append(note, string.Create(CultureInfo.InvariantCulture,
                    $"below the sampling resolution ({sampleNote}, sampled {p.Value:0.###E+00}); first order, below the negligible level {Options.NegligibleProbability:0.#E+0}")),
            };
        }

        var why = p.EffectiveEvents < Options.MinimumFailureSamples
            ? string.Create(CultureInfo.InvariantCulture, $"not converged: {sampleNote}, fewer than {Options.MinimumFailureSamples}")
            : string.Create(CultureInfo.InvariantCulture, $"not converged: CoV {p.CoefficientOfVariation:0.###} above the target {Options.TargetCoefficientOfVariation:0.###} ({sampleNote})");
        if (firstOrderValue is { } fv) why += string.Create(CultureInfo.InvariantCulture, $"; first order gives {fv:0.###E+00}");
        return Sampled(p, false, Append(note, why));

        UpdatedEstimate Sampled(SampledProbability s, bool converged, string? text) => new()
        {
            CumulativePf = s.Value,
            Beta = -StandardNormal.InverseCdf(s.Value),
            EvidenceProbability = evidenceProbability,
            Route = ComputationRoute.ImportanceSampling,
            Converged = converged,
            CoefficientOfVariation = s.Value > 0 ? s.CoefficientOfVariation : null,
            Note = text,
        };
    }

    /// <summary>p + 3·se at the first later time of the period whose failure region is covered, or null.</summary>
    private static (double Value, double AtYears)? LaterBound(WeightedFailureTimes weighted, ComponentSampleSet set, double t)
    {
        var (period, local) = set.Locate(t);
        return set.CoveredAfter(weighted, period, local) is { } covered
            ? (covered.Probability.Value + 3 * covered.Probability.StandardError, set.PeriodStart(period) + covered.Local)
            : null;
    }

    private UpdatedEstimate? TryFirstOrder(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double t)
    {
        try
        {
            return _firstOrder.Estimate(model, evidence, t);
        }
        catch (Exception e) when (e is ArgumentException or InvalidOperationException or NotSupportedException or ArithmeticException)
        {
            // The cross-check is a second opinion: where first order cannot run, the sampled value stands alone.
            return null;
        }
    }

    private (ComponentSampleSet Set, WeightedFailureTimes Weighted, string Note) Resolve(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double timeYears)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(evidence);
        var horizon = Math.Max(Options.HorizonYears, Math.Ceiling(timeYears));
        Entry? entry;
        lock (_gate)
        {
            entry = _recent.FirstOrDefault(e => ReferenceEquals(e.Model, model) && e.Evidence.SequenceEqual(evidence) && e.HorizonYears >= horizon);
            if (entry is not null)
            {
                _recent.Remove(entry);
                _recent.AddFirst(entry);
                return (entry.Set.Value, entry.Set.Value.Weighted, entry.Set.Value.Description);
            }

            // A cached set whose findings are a part of these, the rest planned findings without a repair: reweight it.
            Entry? parent = null;
            foreach (var candidate in _recent)
            {
                // The prior's set is not reweighted with findings: its density does not look where they point.
                if (!ReferenceEquals(candidate.Model, model) || candidate.HorizonYears < horizon || candidate.Evidence.Length == 0
                    || candidate.Evidence.Length >= evidence.Count) continue;
                if (!candidate.Set.IsValueCreated) continue;
                if (parent is null || candidate.Evidence.Length > parent.Evidence.Length) parent = candidate;
                var known = candidate.Derived.FirstOrDefault(d => d.Evidence.SequenceEqual(evidence));
                var reweighted = known.Weighted ?? candidate.Set.Value.Reweighted(evidence, out _);
                // Reused while the weights stay balanced, or while they still resolve every yearly Pf that matters with
                // enough effective failure samples: a finding that moves the posterior further gets a set of its own.
                if (reweighted is null) continue;
                var share = reweighted.EffectiveSampleSize / candidate.Set.Value.Weighted.EffectiveSampleSize;
                // A set that resolves its own findings must resolve the extended ones too, else a set is drawn for them; a
                // set at its cap that does not (its flags say so) is reused while the weights stay balanced.
                var baseResolved = candidate.Set.Value.Resolves(candidate.Set.Value.Weighted);
                var reuse = share >= SmallestEffectiveShare && candidate.Set.Value.Resolves(reweighted)
                    || !baseResolved && share >= MinimumEffectiveShare;
                if (!reuse) continue;
                if (known.Weighted is null)
                {
                    candidate.Derived.Add((evidence.ToArray(), reweighted));
                    if (candidate.Derived.Count > 16) candidate.Derived.RemoveAt(0);
                }

                var extra = evidence.Count - candidate.Evidence.Length;
                return (candidate.Set.Value, reweighted, candidate.Set.Value.Description
                    + string.Create(CultureInfo.InvariantCulture, $"; {extra} further finding(s) applied as weights, ESS {reweighted.EffectiveSampleSize:F0}"));
            }

            var evidenceCopy = evidence.ToArray();
            // Where no reweighting resolves, the set with the most of these findings is extended (its samples kept, new
            // batches aimed where the new findings leave a yearly Pf unresolved); a new set is built only when that is
            // not an extension or still does not resolve.
            var from = parent?.Set.Value;
            entry = new Entry(model, evidenceCopy, horizon, new Lazy<ComponentSampleSet>(() =>
                from?.Extend(evidenceCopy) is { } child && child.Resolves(child.Weighted) ? child : ComponentSampleSet.Build(model, evidenceCopy, Options, horizon)));
            _recent.AddFirst(entry);
            while (_recent.Count > CachedSets) _recent.RemoveLast();
        }

        var set = entry.Set.Value;
        return (set, set.Weighted, set.Description);
    }

    private static bool IsWholeYear(double t) => Math.Abs(t - Math.Round(t)) < 1e-9;

    private static void RequireTime(double t, string name)
    {
        if (!double.IsFinite(t) || t < 0) throw new ArgumentOutOfRangeException(name, t, "Time must be finite and ≥ 0 years since entry into service.");
    }

    private static string? Append(string? a, string? b) => a is null ? b : b is null ? a : a + "; " + b;

    private sealed record Entry(IDegradationModel Model, InspectionOutcome[] Evidence, double HorizonYears, Lazy<ComponentSampleSet> Set)
    {
        /// <summary>Weights of extended findings (planned inspections) already applied, newest last.</summary>
        public List<(InspectionOutcome[] Evidence, WeightedFailureTimes Weighted)> Derived { get; } = [];
    }
}
