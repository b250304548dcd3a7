using InspectionUpdate.Degradation;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>
/// The updated annual measure t ↦ ΔPf(t) or hazard for one fixed body of evidence, with Pf(t) cached so that a
/// scan whose step divides one year reuses Pf(t − 1). Not thread-safe.
/// </summary>
internal sealed class AnnualMeasureCurve
{
    private readonly IReliabilityUpdater _updater;
    private readonly IDegradationModel _model;
    private readonly DateOnly _inService;
    private readonly AnnualMeasure _measure;
    private readonly EstimateLog _log;
    private readonly double[] _renewals;
    private readonly Dictionary<long, UpdatedEstimate> _cache = [];
    private UpdatingSession? _session;

    public AnnualMeasureCurve(IReliabilityUpdater updater, IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence,
        DateOnly inService, AnnualMeasure measure, EstimateLog log)
    {
        _updater = updater;
        _model = model;
        Evidence = evidence;
        _inService = inService;
        _measure = measure;
        _log = log;
        _renewals = evidence.OfType<Repair>().Select(r => r.TimeYears).Order().ToArray();
    }

    public IReadOnlyList<InspectionOutcome> Evidence { get; }

    /// <summary>Latest entry into service or repair at or before t: the annual window never looks past it.</summary>
    public double RenewalAtOrBefore(double timeYears)
    {
        var r = 0.0;
        foreach (var t in _renewals)
        {
            if (t <= timeYears) r = t;
        }

        return r;
    }

    public UpdatedEstimate Cumulative(double timeYears)
    {
        var key = Key(timeYears);
        if (_cache.TryGetValue(key, out var cached)) return cached;
        UpdatedEstimate? estimate;
        if (_updater is ReliabilityUpdater prepared)
        {
            // The project's updater builds the events of one body of evidence once per session, and a curve
            // asks for many times with the same evidence.
            _session ??= prepared.Prepare(_model, Evidence);
            estimate = _session.Estimate(UpdatingCase.SingleComponentId, timeYears);
        }
        else
        {
            estimate = _updater.Estimate(_model, Evidence, timeYears);
        }

        if (estimate is null) throw new InvalidOperationException("The updater returned no estimate.");
        _log.Add(estimate, timeYears);
        _cache[key] = estimate;
        return estimate;
    }

    /// <summary>
    /// P(E) of this curve's evidence (independent of t): 1 without findings, else from any estimate already made,
    /// else from one at <paramref name="hintYears"/> (a year later when that is a renewal, where FORM may not run).
    /// </summary>
    public double EvidenceProbability(double hintYears)
    {
        if (Evidence.All(e => e is Repair)) return 1;
        foreach (var e in _cache.Values) return e.EvidenceProbability;
        return Cumulative(RenewalAtOrBefore(hintYears) == hintYears ? hintYears + 1 : hintYears).EvidenceProbability;
    }

    /// <summary>Pf(t), or 0 at entry into service and at a repair (the window convention of <see cref="Value"/>).</summary>
    public double CumulativeFromRenewal(double timeYears) =>
        RenewalAtOrBefore(timeYears) == timeYears ? 0 : Cumulative(timeYears).CumulativePf;

    /// <summary>The annual measure the target applies to; NaN propagates so that a failed estimate is never read as "below target".</summary>
    public double Value(double timeYears)
    {
        // At entry into service or a repair the window is empty: no estimate is needed (nor may FORM run there).
        if (RenewalAtOrBefore(timeYears) == timeYears) return 0;
        var (interval, hazard, _, _, _) = Parts(timeYears);
        return _measure == AnnualMeasure.Hazard ? hazard : interval;
    }

    public AnnualValue Point(double timeYears)
    {
        var (interval, hazard, start, now, before) = Parts(timeYears);
        return new AnnualValue
        {
            TimeYears = timeYears,
            Date = ServiceTime.DateAt(_inService, timeYears),
            WindowStartYears = start,
            IntervalPf = interval,
            Hazard = hazard,
            Measure = _measure,
            CumulativePf = now.CumulativePf,
            CumulativeBeta = now.Beta,
            Route = now.Route,
            Converged = now.Converged && (before?.Converged ?? true) && double.IsFinite(interval),
            CoefficientOfVariation = now.CoefficientOfVariation,
            IntervalPfCoefficientOfVariation = IntervalCov(interval, now, before),
        };
    }

    private static double? IntervalCov(double interval, UpdatedEstimate now, UpdatedEstimate? before)
    {
        if (now.CoefficientOfVariation is null && before?.CoefficientOfVariation is null) return null;
        var a = (now.CoefficientOfVariation ?? 0) * now.CumulativePf;
        var b = before is null ? 0 : (before.CoefficientOfVariation ?? 0) * before.CumulativePf;
        return interval == 0 ? double.PositiveInfinity : Math.Sqrt(a * a + b * b) / Math.Abs(interval);
    }

    // Scan points reached by repeated addition and t − 1 differ in the last bits; 1e-8 years (0.3 s) is one key.
    private static long Key(double timeYears) => (long)Math.Round(timeYears * 1e8);

    private (double Interval, double Hazard, double Start, UpdatedEstimate Now, UpdatedEstimate? Before) Parts(double timeYears)
    {
        var renewal = RenewalAtOrBefore(timeYears);
        var start = Math.Max(timeYears - 1, renewal);
        var now = Cumulative(timeYears);
        if (start >= timeYears) return (0, 0, start, now, null);

        // A window that starts at entry into service or at a repair counts from Pf = 0 there, as the updater's
        // profile does after a renewal; it also spares a FORM run at a time when the limit state cannot be reached.
        if (start == renewal) return (now.CumulativePf, now.CumulativePf, start, now, null);
        var before = Cumulative(start);
        var interval = now.CumulativePf - before.CumulativePf;
        var hazard = interval / (1 - before.CumulativePf);
        return (interval, hazard, start, now, before);
    }
}
