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
        var estimate = _updater.Estimate(_model, Evidence, timeYears)
            ?? throw new InvalidOperationException("The updater returned no estimate.");
        _log.Add(estimate, timeYears);
        _cache[key] = estimate;
        return estimate;
    }

    /// <summary>The annual measure the target applies to; NaN propagates so that a failed estimate is never read as "below target".</summary>
    public double Value(double timeYears)
    {
        var (interval, hazard, _, _) = Parts(timeYears);
        return _measure == AnnualMeasure.Hazard ? hazard : interval;
    }

    public AnnualValue Point(double timeYears)
    {
        var (interval, hazard, start, now) = Parts(timeYears);
        var before = Cumulative(start);
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
            Converged = now.Converged && before.Converged && double.IsFinite(interval),
            CoefficientOfVariation = now.CoefficientOfVariation,
        };
    }

    // Scan points reached by repeated addition and t − 1 differ in the last bits; 1e-8 years (0.3 s) is one key.
    private static long Key(double timeYears) => (long)Math.Round(timeYears * 1e8);

    private (double Interval, double Hazard, double Start, UpdatedEstimate Now) Parts(double timeYears)
    {
        var start = Math.Max(timeYears - 1, RenewalAtOrBefore(timeYears));
        var now = Cumulative(timeYears);
        if (start >= timeYears) return (0, 0, start, now);
        var before = Cumulative(start);
        var interval = now.CumulativePf - before.CumulativePf;
        var hazard = interval / (1 - before.CumulativePf);
        return (interval, hazard, start, now);
    }
}
