using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// Life-cycle schedule over 40 years for a one-stage Paris-law crack under Weibull stress ranges with a good method
/// (median detectable depth 1 mm), target annual ΔPf 1e-4. Target: median ≤ 0.5 s.
/// </summary>
/// <remarks>
/// Each invocation builds a new planner and updater, so no estimate is cached between invocations. One invocation
/// per iteration: a schedule takes long enough to time on its own.
/// </remarks>
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 1, iterationCount: 5, invocationCount: 1)]
[MemoryDiagnoser]
public class PlanningBenchmarks
{
    private PlanningRequest _request = null!;
    private InspectionMethod _good = null!;

    /// <summary>The updating route the planner's updater uses.</summary>
    [Params(UpdatingRoute.FirstOrder, UpdatingRoute.Auto)]
    public UpdatingRoute Route { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        // An invented component: JCSS PMC Part 3 initial depth, BS 7910 simplified Paris constants (from memory),
        // narrow distributions where a value is practically fixed (the core has no point-mass variable yet).
        var model = new CrackGrowthModel(new StochasticModel([
            LognormalVariable.FromMeanCov("initialDepth_mm", 0.15, 0.66),
            new NormalVariable("criticalDepth_mm", 20, 1),
            LognormalVariable.FromMeanCov("thickness_mm", 25, 0.01),
            LognormalVariable.FromMeanCov("geometryFactor", 1.12, 0.1),
            LognormalVariable.FromMeanCov("weibullScale_MPa", 5, 0.2),
            LognormalVariable.FromMeanCov("weibullShape", 0.9, 0.01),
            LognormalVariable.FromMeanCov("cyclesPerYear", 5e6, 0.1),
            LognormalVariable.FromMeanCov("parisC", 5.21e-13, 0.6),
            LognormalVariable.FromMeanCov("parisM", 3, 0.01),
        ]));
        _good = new InspectionMethod("good (median 1 mm)", new CumulativeLognormalPod(Math.Log(1.0), 0.5),
            new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.5));
        _request = new PlanningRequest
        {
            Model = model,
            InServiceDate = new DateOnly(2000, 1, 1),
            Target = AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf),
            EndOfServiceYears = 40,
        };
    }

    [Benchmark]
    public InspectionSchedule Schedule40Years() =>
        new InspectionPlanner(new ReliabilityUpdater(new UpdatingOptions { Route = Route })).Schedule(_request, _good);
}
