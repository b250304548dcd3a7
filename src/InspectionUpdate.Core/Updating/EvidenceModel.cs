using InspectionUpdate.Degradation;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>
/// The augmented stochastic model of an updating problem and its inspection events (DESIGN §3).
/// </summary>
/// <remarks>
/// <para>Variables, in order: first the model inputs (<see cref="InputModel"/>): every input of every component, with
/// shared inputs once, and one renewed copy of each <see cref="IDegradationModel.RenewedOnRepair"/> input per repair,
/// distributed as the repair's post-repair prior (or the original prior where the repair names none); then one
/// auxiliary variable per finding: the detectable size A_d (CDF = PoD) of a no-indication or indication-not-sized
/// finding, the sizing error ε of a sized indication.</para>
/// <para>Renewal: after a repair at t_r the component's degradation is evaluated at local time t − t_r with the
/// renewed copies in place of the renewed inputs; every other input (the shared parameters, e.g. a corrosion rate
/// or a stress range) is the same variable before and after, so findings made before the repair keep informing it
/// and no longer inform the renewed state. A finding dated exactly at a repair describes the state before it.</para>
/// <para>Correlations of a model's inputs are copied into each renewal period and each component; copies in
/// different periods or components are independent, except through the shared variables themselves.</para>
/// </remarks>
public sealed class EvidenceModel
{
    private readonly Dictionary<string, Layout> _layouts;

    private EvidenceModel(StochasticModel inputModel, StochasticModel model, IReadOnlyList<EvidenceEvent> events,
        Dictionary<string, Layout> layouts, IReadOnlyList<string> componentIds)
    {
        InputModel = inputModel;
        Model = model;
        Events = events;
        _layouts = layouts;
        ComponentIds = componentIds;
    }

    /// <summary>The model inputs only (all components and renewals): a prefix of <see cref="Model"/>.</summary>
    public StochasticModel InputModel { get; }

    /// <summary>The augmented model: <see cref="InputModel"/> followed by one auxiliary variable per finding.</summary>
    public StochasticModel Model { get; }

    /// <summary>The events, sorted by component, then time, then kind, then reference (so logging order does not matter).</summary>
    public IReadOnlyList<EvidenceEvent> Events { get; }

    /// <summary>The component ids, in the order of the case.</summary>
    public IReadOnlyList<string> ComponentIds { get; }

    /// <summary>Builds the augmented model and the events of a case.</summary>
    /// <exception cref="ArgumentException">An invalid finding (time, size, method), a shared input with different
    /// marginals in two components, a shared input that a repair renews, or a post-repair input that the model does
    /// not renew. The message names the finding reference or the input.</exception>
    /// <exception cref="NotSupportedException">A model with an annual-maximum input (series system over years).</exception>
    public static EvidenceModel Build(UpdatingCase updatingCase) => Build(updatingCase, annualMaximumAsInput: false);

    /// <summary>
    /// Builds the augmented model; with <paramref name="annualMaximumAsInput"/> an annual-maximum input is kept as one
    /// ordinary input, for a caller that replaces it by yearly draws where g is evaluated (the sample-set route). The
    /// findings' sizes must not depend on it; the in-service records' events then hold for the single value only.
    /// </summary>
    internal static EvidenceModel Build(UpdatingCase updatingCase, bool annualMaximumAsInput)
    {
        ArgumentNullException.ThrowIfNull(updatingCase);
        var single = updatingCase.Components.Count == 1;
        var shared = new HashSet<string>(updatingCase.SharedInputs, StringComparer.Ordinal);
        var variables = new List<RandomVariable>();
        var sharedIndex = new Dictionary<string, int>(StringComparer.Ordinal);
        var correlations = new Dictionary<(int, int), double>();
        var layouts = new Dictionary<string, Layout>(StringComparer.Ordinal);
        var pending = new List<(ComponentEvidence Component, Layout Layout, InspectionOutcome[] Sorted)>();

        foreach (var component in updatingCase.Components)
        {
            var model = component.Model;
            if (model.AnnualMaximumInput is not null && !annualMaximumAsInput)
            {
                throw new NotSupportedException(
                    $"Model '{model.Name}' of component '{component.ComponentId}' has the annual-maximum input '{model.AnnualMaximumInput}'; updating supports time-invariant inputs only.");
            }

            var inputs = model.Inputs.Variables;
            var prefix = single ? "" : component.ComponentId + "/";
            var renewed = new HashSet<string>(model.RenewedOnRepair, StringComparer.Ordinal);
            foreach (var r in renewed)
            {
                if (model.Inputs.IndexOf(r) < 0) throw new ArgumentException($"Model '{model.Name}' renews '{r}', which is not one of its inputs.", nameof(updatingCase));
                if (shared.Contains(r)) throw new ArgumentException($"Input '{r}' cannot be shared across components: model '{model.Name}' renews it on repair.", nameof(updatingCase));
            }

            var map0 = new int[inputs.Count];
            for (var i = 0; i < inputs.Count; i++)
            {
                var v = inputs[i];
                if (shared.Contains(v.Name))
                {
                    if (sharedIndex.TryGetValue(v.Name, out var existing))
                    {
                        RequireSameMarginal(variables[existing], v, component.ComponentId);
                        map0[i] = existing;
                    }
                    else
                    {
                        sharedIndex[v.Name] = variables.Count;
                        map0[i] = variables.Count;
                        variables.Add(v);
                    }
                }
                else
                {
                    map0[i] = variables.Count;
                    variables.Add(Renamed(v, prefix + v.Name));
                }
            }

            var sorted = SortEvidence(component.Evidence);
            var epochs = new List<Epoch> { new(0.0, map0, null) };
            foreach (var repair in sorted.OfType<Repair>())
            {
                ValidateTime(repair);
                ArgumentNullException.ThrowIfNull(repair.PostRepairInputs);
                foreach (var key in repair.PostRepairInputs.Keys)
                {
                    if (!renewed.Contains(key))
                    {
                        throw new ArgumentException($"Repair '{repair.Reference}' gives a post-repair prior for '{key}', which model '{model.Name}' does not renew on repair.", nameof(updatingCase));
                    }
                }

                var k = epochs.Count;
                var map = (int[])epochs[^1].Map.Clone();
                for (var i = 0; i < inputs.Count; i++)
                {
                    if (!renewed.Contains(inputs[i].Name)) continue;
                    var prior = repair.PostRepairInputs.TryGetValue(inputs[i].Name, out var p) ? p : inputs[i];
                    map[i] = variables.Count;
                    variables.Add(Renamed(prior, FormattableString.Invariant($"{prefix}{inputs[i].Name}@repair{k}")));
                }

                epochs.Add(new Epoch(repair.TimeYears, map, repair));
            }

            if (model.Inputs.Correlation is { IsIdentity: false } r0)
            {
                foreach (var epoch in epochs)
                    for (var i = 0; i < inputs.Count; i++)
                        for (var j = 0; j < i; j++)
                        {
                            if (r0[i, j] == 0) continue;
                            var a = epoch.Map[i];
                            var b = epoch.Map[j];
                            correlations[(Math.Max(a, b), Math.Min(a, b))] = r0[i, j];
                        }
            }

            var layout = new Layout(model, epochs.ToArray());
            layouts[component.ComponentId] = layout;
            pending.Add((component, layout, sorted));
        }

        var inputCount = variables.Count;
        var inputModel = new StochasticModel(variables.ToArray(), BuildCorrelation(inputCount, correlations));

        var events = new List<EvidenceEvent>();
        var counter = 0;
        foreach (var (component, layout, sorted) in pending)
        {
            foreach (var outcome in sorted)
            {
                if (outcome is Repair) continue;
                counter++;
                events.Add(BuildEvent(component, layout, outcome, counter, variables));
            }
        }

        var model2 = new StochasticModel(variables.ToArray(), BuildCorrelation(variables.Count, correlations));
        return new EvidenceModel(inputModel, model2, events, layouts, updatingCase.Components.Select(c => c.ComponentId).ToArray());
    }

    /// <summary>
    /// g at time t of a component over the augmented (or input) vector: the renewal period current at t is used,
    /// at local time t − t_r.
    /// </summary>
    /// <exception cref="ArgumentException">Unknown component.</exception>
    /// <exception cref="ArgumentOutOfRangeException">t not finite or negative.</exception>
    public LimitStateFunction FailureFunction(string componentId, double timeYears)
    {
        var layout = LayoutOf(componentId);
        RequireTime(timeYears);
        var epoch = layout.EpochAt(timeYears);
        var local = timeYears - epoch.StartYears;
        var model = layout.Model;
        var map = epoch.Map;
        return x => Evaluate(model, map, x, local, margin: true);
    }

    /// <summary>
    /// <see cref="FailureFunction"/> as a limit state, with the model's analytic gradient where it has one
    /// (<see cref="IDegradationMarginGradient"/>), scattered onto the augmented vector.
    /// </summary>
    public ILimitState FailureLimitState(string componentId, double timeYears)
    {
        var f = FailureFunction(componentId, timeYears);
        var layout = LayoutOf(componentId);
        var name = FormattableString.Invariant($"failure of {componentId} at {timeYears:0.###} y");
        if (layout.Model is not IDegradationMarginGradient { HasMarginGradient: true } withGradient) return new LimitState(name, f);
        var epoch = layout.EpochAt(timeYears);
        var local = timeYears - epoch.StartYears;
        var map = epoch.Map;
        return new LimitState(name, f, (x, gradient) =>
        {
            Span<double> lx = map.Length <= 64 ? stackalloc double[map.Length] : new double[map.Length];
            Span<double> lg = map.Length <= 64 ? stackalloc double[map.Length] : new double[map.Length];
            for (var i = 0; i < map.Length; i++) lx[i] = x[map[i]];
            var g = withGradient.MarginWithGradient(lx, local, lg);
            gradient.Clear();
            for (var i = 0; i < map.Length; i++) gradient[map[i]] += lg[i];
            return g;
        });
    }

    /// <summary>Degradation size a(X, t) in mm of a component at time t, from the augmented (or input) vector.</summary>
    public double Size(string componentId, ReadOnlySpan<double> x, double timeYears)
    {
        var layout = LayoutOf(componentId);
        RequireTime(timeYears);
        var epoch = layout.EpochAt(timeYears);
        return Evaluate(layout.Model, epoch.Map, x, timeYears - epoch.StartYears, margin: false);
    }

    /// <summary>Start (years) of the renewal period current at t: 0, or the time of the last repair strictly before t.</summary>
    public double RenewalStartYears(string componentId, double timeYears) => LayoutOf(componentId).EpochAt(timeYears).StartYears;

    /// <summary>Number of renewal periods of a component (1 + number of repairs).</summary>
    public int RenewalPeriods(string componentId) => LayoutOf(componentId).Epochs.Length;

    /// <summary>Index in <see cref="Model"/> of a component's model input in the renewal period current at t.</summary>
    public int IndexOfInput(string componentId, string inputName, double timeYears)
    {
        var layout = LayoutOf(componentId);
        var i = layout.Model.Inputs.IndexOf(inputName);
        if (i < 0) throw new ArgumentException($"Component '{componentId}' has no input '{inputName}'.", nameof(inputName));
        return layout.EpochAt(timeYears).Map[i];
    }

    /// <summary>The degradation model of a component.</summary>
    internal IDegradationModel ComponentModel(string componentId) => LayoutOf(componentId).Model;

    /// <summary>Start (years) of a component's renewal period k (0 for the first).</summary>
    internal double PeriodStartYears(string componentId, int period) => LayoutOf(componentId).Epochs[period].StartYears;

    /// <summary>Index of the renewal period current at t (the period a finding dated exactly at a repair belongs to is the earlier one).</summary>
    internal int PeriodAt(string componentId, double timeYears) => LayoutOf(componentId).EpochIndexAt(timeYears);

    /// <summary>Where each input of the component's model sits in x during renewal period <paramref name="period"/> (a copy).</summary>
    internal int[] PeriodMap(string componentId, int period) => (int[])LayoutOf(componentId).Epochs[period].Map.Clone();

    private Layout LayoutOf(string componentId) =>
        componentId is not null && _layouts.TryGetValue(componentId, out var layout)
            ? layout
            : throw new ArgumentException($"Unknown component '{componentId}'.", nameof(componentId));

    private static void RequireTime(double timeYears)
    {
        if (!double.IsFinite(timeYears) || timeYears < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(timeYears), timeYears, "Time must be finite and ≥ 0 years since entry into service.");
        }
    }

    private static double Evaluate(IDegradationModel model, int[] map, ReadOnlySpan<double> x, double localTime, bool margin)
    {
        Span<double> local = map.Length <= 64 ? stackalloc double[map.Length] : new double[map.Length];
        for (var i = 0; i < map.Length; i++) local[i] = x[map[i]];
        return margin ? model.Margin(local, localTime) : model.Size(local, localTime);
    }

    private static InspectionOutcome[] SortEvidence(IReadOnlyList<InspectionOutcome> evidence)
    {
        foreach (var e in evidence) ArgumentNullException.ThrowIfNull(e, nameof(evidence));
        // A total order on (time, kind, reference, size) so the result does not depend on the logging order.
        return evidence
            .OrderBy(e => e.TimeYears)
            .ThenBy(KindRank)
            .ThenBy(e => e.Reference, StringComparer.Ordinal)
            .ThenBy(e => e is SizedIndication s ? s.MeasuredSizeMm : 0.0)
            .ToArray();
    }

    // Findings at a repair's date are ordered before it: they describe the state that was repaired.
    private static int KindRank(InspectionOutcome e) => e switch
    {
        NoIndication => 0,
        IndicationNotSized => 1,
        SizedIndication => 2,
        SurvivedInService => 3,
        Repair => 4,
        _ => throw new ArgumentException($"Unknown kind of finding '{e.GetType().Name}' ({e.Reference}).", nameof(e)),
    };

    private static void ValidateTime(InspectionOutcome e)
    {
        if (!double.IsFinite(e.TimeYears) || e.TimeYears < 0)
        {
            throw new ArgumentException(FormattableString.Invariant(
                $"Finding '{e.Reference}': TimeYears = {e.TimeYears} must be finite and ≥ 0 (years since entry into service)."), nameof(e));
        }
    }

    private static EvidenceEvent BuildEvent(ComponentEvidence component, Layout layout, InspectionOutcome outcome, int counter, List<RandomVariable> variables)
    {
        ValidateTime(outcome);
        var epochIndex = layout.EpochIndexAt(outcome.TimeYears);
        var epoch = layout.Epochs[epochIndex];
        var model = layout.Model;
        var map = epoch.Map;
        var local = outcome.TimeYears - epoch.StartYears;
        var label = FormattableString.Invariant($"at {outcome.TimeYears:0.###} y ({outcome.Reference})");
        var tag = FormattableString.Invariant($"#{counter} {outcome.Reference}");
        switch (outcome)
        {
            case NoIndication n:
                {
                    var ad = RequireMethod(n.Method, n).Detection.DetectableSize("A_d " + tag);
                    var k = variables.Count;
                    variables.Add(ad);
                    return new EvidenceEvent("no indication " + label, outcome, component.ComponentId, epochIndex, EvidenceEventKind.Inequality,
                        x => Evaluate(model, map, x, local, false) - x[k],
                        x => SafeLog(ad.Ccdf(Evaluate(model, map, x, local, false))), ad);
                }

            case IndicationNotSized d:
                {
                    var ad = RequireMethod(d.Method, d).Detection.DetectableSize("A_d " + tag);
                    var k = variables.Count;
                    variables.Add(ad);
                    return new EvidenceEvent("indication, not sized, " + label, outcome, component.ComponentId, epochIndex, EvidenceEventKind.Inequality,
                        x => x[k] - Evaluate(model, map, x, local, false),
                        x => SafeLog(ad.Cdf(Evaluate(model, map, x, local, false))), ad);
                }

            case SizedIndication s:
                {
                    var sizing = RequireMethod(s.Method, s).Sizing ?? throw new ArgumentException($"Finding '{s.Reference}': method '{s.Method.Name}' has no sizing-error model.", nameof(outcome));
                    var am = s.MeasuredSizeMm;
                    if (!double.IsFinite(am) || am <= 0 || am > model.MaximumSizeMm)
                    {
                        throw new ArgumentException(FormattableString.Invariant(
                            $"Finding '{s.Reference}': MeasuredSizeMm = {am} must be finite, > 0 and ≤ the model's maximum size {model.MaximumSizeMm} mm."), nameof(outcome));
                    }

                    var eps = sizing.ErrorVariable("eps " + tag);
                    var k = variables.Count;
                    variables.Add(eps);
                    var name = FormattableString.Invariant($"sized {am:0.###} mm ") + label;
                    if (sizing.Kind == SizingErrorKind.AdditiveNormal)
                    {
                        return new EvidenceEvent(name, outcome, component.ComponentId, epochIndex, EvidenceEventKind.Equality,
                            x => Evaluate(model, map, x, local, false) + x[k] - am,
                            x => LogPdf(eps, am - Evaluate(model, map, x, local, false)), eps);
                    }

                    // In logarithms the multiplicative error is additive, so the equality stays linear for lognormal sizes.
                    var lnAm = Math.Log(am);
                    return new EvidenceEvent(name, outcome, component.ComponentId, epochIndex, EvidenceEventKind.Equality,
                        x => SafeLog(Evaluate(model, map, x, local, false)) + Math.Log(x[k]) - lnAm,
                        x =>
                        {
                            var a = Evaluate(model, map, x, local, false);
                            return a > 0 ? LogPdf(eps, am / a) - Math.Log(a) : double.NegativeInfinity;
                        }, eps);
                }

            case SurvivedInService:
                return new EvidenceEvent("in service " + label, outcome, component.ComponentId, epochIndex, EvidenceEventKind.Inequality,
                    x => -Evaluate(model, map, x, local, true),
                    x => Evaluate(model, map, x, local, true) > 0 ? 0.0 : double.NegativeInfinity, null);

            default:
                throw new ArgumentException($"Unknown kind of finding '{outcome.GetType().Name}' ({outcome.Reference}).", nameof(outcome));
        }
    }

    private static InspectionMethod RequireMethod(InspectionMethod? method, InspectionOutcome outcome) =>
        method ?? throw new ArgumentException($"Finding '{outcome.Reference}' has no inspection method.", nameof(outcome));

    private static double SafeLog(double p) => p > 0 ? Math.Log(p) : double.NegativeInfinity;

    // Log densities in closed form where known, so a measurement far from the model does not underflow to −∞.
    private static double LogPdf(RandomVariable v, double x)
    {
        const double halfLog2Pi = 0.91893853320467274178;
        switch (v)
        {
            case NormalVariable n:
                {
                    var z = (x - n.Mean) / n.StandardDeviation;
                    return -0.5 * z * z - Math.Log(n.StandardDeviation) - halfLog2Pi;
                }

            case LognormalVariable l when x > 0:
                {
                    var lx = Math.Log(x);
                    var z = (lx - l.Lambda) / l.Zeta;
                    return -0.5 * z * z - Math.Log(l.Zeta) - lx - halfLog2Pi;
                }

            default:
                return SafeLog(v.Pdf(x));
        }
    }

    private static CorrelationMatrix? BuildCorrelation(int n, Dictionary<(int, int), double> entries)
    {
        if (entries.Count == 0) return null;
        var m = new double[n, n];
        for (var i = 0; i < n; i++) m[i, i] = 1;
        foreach (var ((a, b), rho) in entries)
        {
            m[a, b] = rho;
            m[b, a] = rho;
        }

        return new CorrelationMatrix(m, "augmented correlation");
    }

    private static void RequireSameMarginal(RandomVariable a, RandomVariable b, string componentId)
    {
        static bool Close(double x, double y) => Math.Abs(x - y) <= 1e-12 * Math.Max(1, Math.Max(Math.Abs(x), Math.Abs(y)));
        if (a.Family != b.Family || !Close(a.Mean, b.Mean) || !Close(a.StandardDeviation, b.StandardDeviation))
        {
            throw new ArgumentException(
                $"Shared input '{b.Name}' of component '{componentId}' is {b}, but another component has {a}; a shared input needs one marginal.",
                nameof(componentId));
        }
    }

    /// <summary>A copy of the variable under a new name (normal and lognormal rebuilt so the Nataf model recognizes them).</summary>
    private static RandomVariable Renamed(RandomVariable v, string name) => v.Name == name
        ? v
        : v switch
        {
            NormalVariable n => new NormalVariable(name, n.Mean, n.StandardDeviation),
            LognormalVariable l => LognormalVariable.FromLogParameters(name, l.Lambda, l.Zeta),
            _ => new RenamedVariable(name, v),
        };

    private sealed record Epoch(double StartYears, int[] Map, Repair? Repair);

    private sealed record Layout(IDegradationModel Model, Epoch[] Epochs)
    {
        public int EpochIndexAt(double t)
        {
            var k = 0;
            for (var i = 1; i < Epochs.Length; i++)
            {
                if (Epochs[i].StartYears < t) k = i;
            }

            return k;
        }

        public Epoch EpochAt(double t) => Epochs[EpochIndexAt(t)];
    }

    /// <summary>Delegates to another variable under a different name.</summary>
    private sealed class RenamedVariable(string name, RandomVariable inner) : RandomVariable(name)
    {
        public override string Family => inner.Family;

        public override double Mean => inner.Mean;

        public override double StandardDeviation => inner.StandardDeviation;

        public override bool IsDeterministic => inner.IsDeterministic;

        public override double Pdf(double x) => inner.Pdf(x);

        public override double Cdf(double x) => inner.Cdf(x);

        public override double Ccdf(double x) => inner.Ccdf(x);

        public override double InverseCdf(double p) => inner.InverseCdf(p);

        public override double InverseCcdf(double q) => inner.InverseCcdf(q);
    }
}
