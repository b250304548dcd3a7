using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using InspectionUpdate.Degradation;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// Life-cycle schedule over 40 years for a crack-growth component with a good method, target annual ΔPf 1e-4, on the
/// project's updater (first-order route). Target: median ≤ 0.5 s. Two components: the docs/references.md worked case
/// (log-linear crack growth, median detectable depth 2 mm; every event surface is a hyperplane in u) and a
/// one-stage Paris-law crack under Weibull stress ranges (median detectable depth 1 mm).
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

    /// <summary>Which component.</summary>
    [Params("log-linear worked case", "Paris crack")]
    public string Component { get; set; } = "";

    [GlobalSetup]
    public void Setup()
    {
        IDegradationModel model;
        if (Component == "Paris crack")
        {
            // An invented component: JCSS PMC Part 3 initial depth, BS 7910 simplified Paris constants (from memory),
            // narrow distributions where a value is practically fixed (the core has no point-mass variable yet).
            model = new CrackGrowthModel(new StochasticModel([
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
            _good = Method("good (median 1 mm)", 1.0);
        }
        else
        {
            model = new LogLinearCrack();
            _good = Method("good (median 2 mm)", 2.0);
        }

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
        new InspectionPlanner(new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.FirstOrder })).Schedule(_request, _good);

    private static InspectionMethod Method(string name, double medianMm) =>
        new(name, new CumulativeLognormalPod(Math.Log(medianMm), 0.5), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.5));

    /// <summary>ln a(t) = X₁ + X₂t, X₁ ~ N(ln 0.5, 0.5), X₂ ~ N(0.10, 0.02), failure at a ≥ 20 mm (docs/references.md worked case).</summary>
    private sealed class LogLinearCrack : IDegradationModel
    {
        public string Name => "log-linear crack growth (worked case)";

        public StochasticModel Inputs { get; } = new([new NormalVariable("lnInitialDepth", Math.Log(0.5), 0.5), new NormalVariable("lnRate_perYear", 0.10, 0.02)]);

        public string SizeQuantity => "depth_mm";

        public IReadOnlyList<string> RenewedOnRepair { get; } = ["lnInitialDepth"];

        public string? AnnualMaximumInput => null;

        public double MaximumSizeMm => double.PositiveInfinity;

        public double Size(ReadOnlySpan<double> x, double timeYears) => Math.Exp(x[0] + x[1] * timeYears);

        public double Margin(ReadOnlySpan<double> x, double timeYears) => 20 - Size(x, timeYears);
    }
}
