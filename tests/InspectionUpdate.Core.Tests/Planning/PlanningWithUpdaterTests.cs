using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Updating;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

/// <summary>The planner on the project's own updater and degradation models.</summary>
public class PlanningWithUpdaterTests
{
    private static readonly LogLinearGrowthModel Worked = LogLinearGrowthModel.WorkedCase();
    private static readonly InspectionMethod Probit2 =
        new("probit-2mm", new CumulativeLognormalPod(Math.Log(2), 0.5), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.5));

    private static ReliabilityUpdater FirstOrder() => new(new UpdatingOptions { Route = UpdatingRoute.FirstOrder });

    /// <summary>A one-stage Paris-law crack under Weibull stress ranges (invented component; JCSS PMC Part 3 initial depth).</summary>
    internal static CrackGrowthModel Crack() => new(new StochasticModel([
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

    [Fact]
    [Reference("Exact bivariate normal (Plackett integral) for one no indication at year 10 of the docs/references.md worked case; first order is exact here because every event surface is a hyperplane in u")]
    public void With_the_first_order_updater_the_due_date_equals_the_exact_root()
    {
        double Posterior(double t) => IndependentGaussian.PosteriorAfterOneNoIndication(Worked, 10, Math.Log(2), 0.5, t).Pf;
        var root = IndependentGaussian.FirstRoot(t => Posterior(t) - Posterior(t - 1) - 1e-4, 11, 40, 0.05);

        var next = new InspectionPlanner(FirstOrder()).NextInspection(Request(Worked, 1e-4, evidence: [new NoIndication(10, "finding-1", Probit2)]));

        Assert.InRange(next.TimeYears, root - 3e-3, root + 1e-3);
        Assert.Equal([InspectionUpdate.Reliability.ComputationRoute.FirstOrder], next.Computation.Routes);
        Assert.True(next.Computation.AllConverged);
    }

    [Fact]
    [Reference("Exact double (two-dimensional quadrature, checked against the bivariate normal) as the reference for the first two planned dates")]
    public void The_first_two_planned_dates_agree_with_the_exact_double()
    {
        // End of service half a year after the second date: estimates with two findings are slow on the first-order route.
        var request = Request(Worked, 1e-4, endYears: 24);
        var exact = new InspectionPlanner(new LogLinearGaussianUpdater()).Schedule(request, Probit2);
        var real = new InspectionPlanner(FirstOrder()).Schedule(request, Probit2);

        Assert.Equal(2, exact.Inspections.Count);
        Assert.Equal(exact.Inspections.Count, real.Inspections.Count);
        for (var i = 0; i < 2; i++) Assert.Equal(exact.Inspections[i].TimeYears, real.Inspections[i].TimeYears, 3e-3);
        Assert.Equal(exact.Status, real.Status);
    }

    [Fact]
    [Reference("Exact double as the reference for the third planned date")]
    public void The_third_planned_date_agrees_with_the_exact_double()
    {
        var request = Request(Worked, 1e-4, endYears: 34);
        var exact = new InspectionPlanner(new LogLinearGaussianUpdater()).Schedule(request, Probit2);
        var real = new InspectionPlanner(FirstOrder()).Schedule(request, Probit2);
        Assert.Equal(exact.Inspections[2].TimeYears, real.Inspections[2].TimeYears, 3e-3);
    }

    [Fact]
    [Reference("Independent code path: the updater's own yearly profile (ReliabilityUpdater.Profile), whose IntervalPf in year n is Pf(n) − Pf(n − 1)")]
    public void On_a_crack_growth_model_the_due_date_lies_in_the_first_year_the_profile_exceeds_the_target()
    {
        var updater = FirstOrder();
        var model = Crack();
        var profile = updater.Profile(model, [], Enumerable.Range(1, 40).Select(i => (double)i).ToArray(), "prior");
        var firstYear = profile.Points.First(p => p.IntervalPf >= 1e-4).TimeYears;

        var next = new InspectionPlanner(updater).NextInspection(Request(model, 1e-4));

        Assert.Equal(NextInspectionStatus.Due, next.Status);
        Assert.InRange(next.TimeYears, firstYear - 1, firstYear);
        Assert.InRange(next.At.IntervalPf, 0.99e-4, 1e-4);
        Assert.True(next.Computation.AllConverged, string.Join("; ", next.Computation.Notes));
    }

    [Fact]
    public void On_a_crack_growth_model_a_no_indication_with_a_good_method_buys_time()
    {
        var good = new InspectionMethod("good", new CumulativeLognormalPod(Math.Log(1.0), 0.5), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.5));
        var planner = new InspectionPlanner(FirstOrder());
        var request = Request(Crack(), 1e-4);
        var first = planner.NextInspection(request);

        var after = planner.NextInspection(request with { Evidence = [new NoIndication(first.TimeYears, "planned-1", good)] });

        Assert.True(after.Status == NextInspectionStatus.Due, after.Message + " :: " + string.Join("; ", after.Computation.Notes));
        Assert.True(after.TimeYears > first.TimeYears + 1, $"due {after.TimeYears:F3} after an inspection at {first.TimeYears:F3}");
    }
}
