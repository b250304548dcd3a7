using BenchmarkDotNet.Attributes;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// The sample-set route on the weld-toe crack of <see cref="UpdatingBenchmarks"/> with its five findings (engine issue
/// targets: updated 50-year profile ≤ 20 ms, assess and plan with a 40-year schedule ≤ 100 ms, one core), against the
/// peer an engineer would otherwise script: likelihood-weighted crude Monte Carlo over the prior, g evaluated at each
/// year for each sample. The peer runs 100,000 samples here; its cost is linear in the sample count, so the 1e8
/// samples it needs for CoV 0.1 on annual increments near 1e-6 cost 1,000 times the measured figure.
/// </summary>
[MemoryDiagnoser]
[SimpleJob(warmupCount: 2, iterationCount: 7)]
public class SampleSetBenchmarks
{
    private CrackGrowthModel _model = null!;
    private InspectionOutcome[] _evidence = null!;
    private double[] _years = null!;
    private InspectionMethod _method = null!;

    [GlobalSetup]
    public void Setup()
    {
        _model = UpdatingBenchmarks.CrackModel();
        _evidence = UpdatingBenchmarks.Findings();
        _years = Enumerable.Range(1, 50).Select(y => (double)y).ToArray();
        _method = new InspectionMethod("UT (benchmark)", new CumulativeLognormalPod(Math.Log(1.0), 0.4), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
    }

    /// <summary>The updated profile by the automatic route (sample set plus the first-order cross-check of every step); a new updater, nothing cached.</summary>
    [Benchmark]
    public ReliabilityProfile UpdatedProfile50YearsAuto() => new SampleSetUpdater().Profile(_model, _evidence, _years, "updated");

    /// <summary>
    /// Eight updated profiles by the automatic route, seeds 1–8: a set's size depends on its stream (most seeds need
    /// 27,000 samples on this crack, a few twice that), so the mean over seeds is the figure to compare; divide by 8.
    /// </summary>
    [Benchmark]
    public int UpdatedProfile50YearsAutoSeeds1To8()
    {
        var points = 0;
        for (var seed = 1; seed <= 8; seed++) points += new SampleSetUpdater(SampleSetOptions.Default with { Seed = seed }).Profile(_model, _evidence, _years, "updated").Points.Count;
        return points;
    }

    /// <summary>The updated profile from the sample set alone.</summary>
    [Benchmark]
    public ReliabilityProfile UpdatedProfile50YearsSampleSetOnly() =>
        new SampleSetUpdater(SampleSetOptions.Default with { FirstOrderBelowResolution = false }).Profile(_model, _evidence, _years, "updated");

    /// <summary>Prior and updated profiles, next inspection, remaining life and a 40-year schedule on one updater (as assess and plan do).</summary>
    [Benchmark]
    public InspectionSchedule AssessAndPlan40Years()
    {
        var updater = new SampleSetUpdater(SampleSetOptions.Default with { HorizonYears = 40 });
        var years = _years.Take(40).ToArray();
        updater.Profile(_model, [], years, "prior");
        updater.Profile(_model, _evidence, years, "updated");
        var planner = new InspectionPlanner(updater);
        var request = new PlanningRequest
        {
            Model = _model,
            Evidence = _evidence,
            InServiceDate = new DateOnly(2000, 1, 1),
            Target = AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf),
            EndOfServiceYears = 40,
            StartTimeYears = 18,
        };
        planner.NextInspection(request);
        planner.RemainingLife(request);
        return planner.Schedule(request, _method);
    }

    /// <summary>The peer: likelihood-weighted crude Monte Carlo of the same updated profile, 100,000 prior samples, g at every year.</summary>
    [Benchmark]
    public double[] CrudeMonteCarlo100kSamples() => CrudeProfile(_model, _evidence, _years, 100_000, 5);

    /// <summary>Weighted Pf(t) on the grid by crude Monte Carlo: prior draws, weight Π L_k(x), failure by t read off g(x, t) at each grid time.</summary>
    public static double[] CrudeProfile(CrackGrowthModel model, IReadOnlyList<InspectionOutcome> evidence, double[] years, int samples, int seed)
    {
        var events = EvidenceModel.Build(UpdatingCase.Single(model, evidence)).Events;
        var t = new NatafTransformation(model.Inputs);
        var rng = new Random(seed);
        var u = new double[t.StandardDimension];
        var x = new double[t.PhysicalDimension];
        var failedWeight = new double[years.Length];
        var total = 0.0;
        for (var s = 0; s < samples; s++)
        {
            for (var i = 0; i < u.Length; i++) u[i] = StandardNormal.InverseCdf(1 - rng.NextDouble());
            t.ToPhysical(u, x);
            var logW = 0.0;
            foreach (var e in events) logW += e.LogLikelihood(x);
            var w = Math.Exp(logW);
            total += w;
            if (w == 0) continue;
            for (var k = 0; k < years.Length; k++)
            {
                if (model.Margin(x, years[k]) <= 0) failedWeight[k] += w;
            }
        }

        return failedWeight.Select(f => f / total).ToArray();
    }
}
