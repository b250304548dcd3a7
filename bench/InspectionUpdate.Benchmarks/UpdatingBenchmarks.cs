using BenchmarkDotNet.Attributes;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// Updated 50-year profile (yearly grid) of a Paris-law crack with five findings of mixed kinds, first-order route:
/// target median ≤ 50 ms (issue 5). The evidence is linearized once per profile; every year runs FORM on g(t), the
/// joint design-point search of F ∩ findings, and the conditioned multinormal probabilities.
/// </summary>
[MemoryDiagnoser]
public class UpdatingBenchmarks
{
    private CrackGrowthModel _model = null!;
    private InspectionOutcome[] _evidence = null!;
    private double[] _years = null!;
    private UpdatingOptions _options = null!;

    /// <summary>An invented weld-toe crack: one-stage Paris law, constant amplitude, closed form.</summary>
    public static CrackGrowthModel CrackModel() => new(new StochasticModel([
        LognormalVariable.FromMeanCov(CrackGrowthModel.InitialDepth, 0.5, 0.4),
        new Fixed(CrackGrowthModel.Thickness, 25),
        new Fixed(CrackGrowthModel.GeometryFactor, 1.12),
        new Fixed(CrackGrowthModel.CyclesPerYear, 1e6),
        LognormalVariable.FromMeanCov(CrackGrowthModel.StressRange, 30, 0.15),
        LognormalVariable.FromMeanCov(CrackGrowthModel.ParisC, 2.0e-13, 0.25),
        new Fixed(CrackGrowthModel.ParisM, 3),
    ]), new CrackGrowthSettings { StressRanges = StressRangeModel.ConstantAmplitude }, "weld-toe crack (benchmark)");

    /// <summary>Five findings: two without indication, one indication not sized, one sized, one survival record.</summary>
    public static InspectionOutcome[] Findings()
    {
        var mpi = new InspectionMethod("MPI (benchmark)", new CumulativeLognormalPod(Math.Log(1.5), 0.5),
            new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
        var ut = new InspectionMethod("UT (benchmark)", new CumulativeLognormalPod(Math.Log(1.0), 0.4),
            new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
        return
        [
            new NoIndication(5, "F-1", mpi),
            new NoIndication(10, "F-2", mpi),
            new IndicationNotSized(15, "F-3", mpi),
            new SizedIndication(15.5, "F-4", ut, 1.6),
            new SurvivedInService(18, "F-5"),
        ];
    }

    [GlobalSetup]
    public void Setup()
    {
        _model = CrackModel();
        _evidence = Findings();
        _years = Enumerable.Range(1, 50).Select(y => (double)y).ToArray();
        _options = new UpdatingOptions { Route = UpdatingRoute.FirstOrder };
    }

    /// <summary>The whole updated profile, evidence linearization included (a new updater, so no cached session).</summary>
    [Benchmark]
    public ReliabilityProfile UpdatedProfile50YearsFirstOrder() => new ReliabilityUpdater(_options).Profile(_model, _evidence, _years, "updated");

    /// <summary>A point mass, for the fixed inputs of the benchmark model.</summary>
    private sealed class Fixed(string name, double value) : RandomVariable(name)
    {
        public override string Family => "Fixed";

        public override double Mean => value;

        public override double StandardDeviation => 0;

        public override bool IsDeterministic => true;

        public override double Pdf(double x) => x == value ? double.PositiveInfinity : 0;

        public override double Cdf(double x) => x < value ? 0 : 1;

        public override double InverseCdf(double p) => value;
    }
}
