using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Columns;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Reports;
using BenchmarkDotNet.Running;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.TimeVariant;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// 50-year yearly reliability profile of a crack-growth model with 6 random inputs (a₀, a_c, Y, Weibull scale q,
/// cycles per year, Paris C; thickness, Weibull shape and m fixed). Targets: median ≤ 5 ms per profile; average
/// limit-state evaluations per step ≤ 3·(n + 1) = 21 thanks to warm starts.
/// Run: dotnet run -c Release --project bench/InspectionUpdate.Benchmarks -- --filter '*DegradationBenchmarks*' --job short
/// </summary>
[MemoryDiagnoser]
[MedianColumn]
[Config(typeof(Config))]
public class DegradationBenchmarks
{
    private static readonly TimeGrid Grid = TimeGrid.Yearly(50);
    private CrackGrowthModel _model = null!;

    /// <summary>Gradient route: analytic (closed form) or forward differences.</summary>
    [Params(GradientMethod.Automatic, GradientMethod.ForwardDifference)]
    public GradientMethod Gradient { get; set; }

    /// <summary>Whether the backward sweep runs after the forward sweep (the default).</summary>
    [Params(true, false)]
    public bool BackwardSweep { get; set; }

    [GlobalSetup]
    public void Setup() => _model = Model();

    /// <summary>One 50-year yearly profile.</summary>
    [Benchmark]
    public ReliabilityProfile Profile_50_years() => TimeVariantReliability.Profile(_model, Grid, Options(Gradient, BackwardSweep));

    private static ProfileOptions Options(GradientMethod gradient, bool backward) =>
        new() { Form = FormOptions.Default with { Gradient = gradient }, BackwardSweep = backward };

    internal static CrackGrowthModel Model() => new(new StochasticModel(
    [
        LognormalVariable.FromMeanCov("initialDepth_mm", 0.15, 0.66),
        new NormalVariable("criticalDepth_mm", 20, 1),
        new DeterministicVariable("thickness_mm", 25),
        LognormalVariable.FromMeanCov("geometryFactor", 1.12, 0.1),
        LognormalVariable.FromMeanCov("weibullScale_MPa", 8, 0.2),
        new DeterministicVariable("weibullShape", 0.9),
        LognormalVariable.FromMeanCov("cyclesPerYear", 5e6, 0.1),
        LognormalVariable.FromMeanCov("parisC", 5.21e-13, 0.6),
        new DeterministicVariable("parisM", 3),
    ]));

    private sealed class Config : ManualConfig
    {
        public Config() => AddColumn(new EvaluationsColumn());
    }

    /// <summary>Average limit-state evaluations per time step (deterministic, computed once per case).</summary>
    private sealed class EvaluationsColumn : IColumn
    {
        public string Id => nameof(EvaluationsColumn);

        public string ColumnName => "Evaluations per step";

        public bool AlwaysShow => true;

        public ColumnCategory Category => ColumnCategory.Custom;

        public int PriorityInCategory => 0;

        public bool IsNumeric => true;

        public UnitType UnitType => UnitType.Dimensionless;

        public string Legend => "Average limit-state evaluations per yearly step over the 50-year profile (target ≤ 21)";

        public string GetValue(Summary summary, BenchmarkCase benchmarkCase)
        {
            var gradient = (GradientMethod)benchmarkCase.Parameters["Gradient"];
            var backward = (bool)benchmarkCase.Parameters["BackwardSweep"];
            var result = TimeVariantReliability.Run(Model(), Grid, Options(gradient, backward));
            return FormattableString.Invariant($"{result.TotalEvaluations / (double)Grid.TimesYears.Count:F1}");
        }

        public string GetValue(Summary summary, BenchmarkCase benchmarkCase, SummaryStyle style) => GetValue(summary, benchmarkCase);

        public bool IsDefault(Summary summary, BenchmarkCase benchmarkCase) => false;

        public bool IsAvailable(Summary summary) => true;
    }
}
