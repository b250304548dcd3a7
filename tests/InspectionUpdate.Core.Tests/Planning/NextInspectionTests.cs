using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

public class NextInspectionTests
{
    // The planner reports the last time still under the target; the bracket is ToleranceYears wide.
    private const double RootToleranceYears = 2e-3;
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();

    private static InspectionPlanner Planner() => new(new LogLinearGaussianUpdater());

    [Fact]
    [Reference("Closed form ΔPf(t) = Φ(h(t)) − Φ(h(t − 1)), h(t) = (ln 0.5 + 0.1t − ln 20)/√(0.25 + 0.0004t²), root by MathNet Brent in the test; docs/references.md worked case [derived]: first year with ΔPf > 1e-4 is 16")]
    public void Due_date_equals_the_analytical_root_of_the_annual_pf()
    {
        var root = IndependentGaussian.FirstRoot(t => WorkedPriorIntervalPf(t) - 1e-4, 1, 40);
        Assert.InRange(root, 15, 16);

        var next = Planner().NextInspection(Request(Model, 1e-4));

        Assert.Equal(NextInspectionStatus.Due, next.Status);
        Assert.InRange(next.TimeYears, root - RootToleranceYears, root);
        Assert.InRange(next.Date.DayNumber, ServiceTime.DateAt(InService, root).DayNumber - 1, ServiceTime.DateAt(InService, root).DayNumber);
        Assert.InRange(next.At.Value, 1e-4 * 0.99, 1e-4);
        Assert.Equal(StandardNormal.InverseCcdf(next.At.Value), next.At.AnnualBeta, 1e-12);
        Assert.Equal(WorkedPriorPf(next.TimeYears), next.At.CumulativePf, 1e-12);
        Assert.True(next.Computation.AllConverged);
        Assert.Contains(InspectionUpdate.Reliability.ComputationRoute.Exact, next.Computation.Routes);
        Assert.Contains(next.Assumptions, a => a.Contains("ΔPf(t) = Pf(t) − Pf(t − 1)", StringComparison.Ordinal));
        Assert.Contains(InspectionPlanner.Caution, next.Assumptions);
    }

    [Fact]
    [Reference("Closed form hazard ΔPf(t)/(1 − Pf(t − 1)) of the same model, root by MathNet Brent in the test")]
    public void Hazard_target_uses_the_hazard_and_is_due_no_later()
    {
        double Hazard(double t) => WorkedPriorIntervalPf(t) / (1 - WorkedPriorPf(t - 1));
        var root = IndependentGaussian.FirstRoot(t => Hazard(t) - 1e-3, 1, 40);

        var hazard = Planner().NextInspection(Request(Model, 1e-3, measure: AnnualMeasure.Hazard));
        var interval = Planner().NextInspection(Request(Model, 1e-3));

        Assert.InRange(hazard.TimeYears, root - RootToleranceYears, root);
        Assert.Equal(AnnualMeasure.Hazard, hazard.At.Measure);
        Assert.True(hazard.TimeYears <= interval.TimeYears);
    }

    [Fact]
    [Reference("Exact bivariate normal (Plackett integral, MathNet quadrature) for one no indication at year 10; docs/references.md worked case [derived]: first year with ΔPf > 1e-4 becomes 21")]
    public void After_a_no_indication_the_due_date_equals_the_bivariate_normal_root()
    {
        double Posterior(double t) => IndependentGaussian.PosteriorAfterOneNoIndication(Model, 10, Math.Log(2), 0.5, t).Pf;
        var root = IndependentGaussian.FirstRoot(t => Posterior(t) - Posterior(t - 1) - 1e-4, 11, 40, 0.05);
        Assert.InRange(root, 20, 21);

        var evidence = new InspectionOutcome[] { new NoIndication(10, "finding-1", ProbitLogPod.Method("probit", 2, 0.5)) };
        var next = Planner().NextInspection(Request(Model, 1e-4, evidence: evidence));

        Assert.Equal(NextInspectionStatus.Due, next.Status);
        Assert.Equal(10, next.FromYears);
        Assert.InRange(next.TimeYears, root - RootToleranceYears, root);
    }

    [Fact]
    [Reference("Closed form prior root as above: the crossing found backwards from year 25 is the forward root")]
    public void Already_exceeded_says_so_and_how_long_ago()
    {
        var root = IndependentGaussian.FirstRoot(t => WorkedPriorIntervalPf(t) - 1e-4, 1, 40);

        var next = Planner().NextInspection(Request(Model, 1e-4, start: 25));

        Assert.Equal(NextInspectionStatus.AlreadyExceeded, next.Status);
        Assert.Equal(25, next.TimeYears);
        Assert.NotNull(next.CrossedAtYears);
        Assert.InRange(next.CrossedAtYears.Value, root - RootToleranceYears, root + RootToleranceYears);
        Assert.Equal(25 - next.CrossedAtYears.Value, next.ExceededForYears!.Value, 1e-12);
        Assert.Equal(ServiceTime.DateAt(InService, next.CrossedAtYears.Value), next.CrossedDate);
        Assert.Contains("already exceeded", next.Message, StringComparison.Ordinal);
        Assert.Contains("Inspect now", next.Message, StringComparison.Ordinal);
        Assert.True(next.At.Value > 1e-4);
    }

    [Fact]
    [Reference("Closed form prior: ΔPf(12) < 1e-4 < ΔPf(16), and ΔPf increases over [1, 12]")]
    public void Not_reached_before_end_of_service_is_reported_as_such()
    {
        Assert.True(WorkedPriorIntervalPf(12) < 1e-4);
        var next = Planner().NextInspection(Request(Model, 1e-4, endYears: 12));
        Assert.Equal(NextInspectionStatus.NotReachedBeforeEndOfService, next.Status);
        Assert.Equal(12, next.TimeYears);
        Assert.Equal(WorkedPriorIntervalPf(12), next.At.IntervalPf, 1e-15);
    }

    [Fact]
    public void An_invalid_request_lists_every_problem()
    {
        var bad = Request(Model, 1e-4, endYears: double.NaN, start: -1);
        var e = Assert.Throws<ArgumentException>(() => Planner().NextInspection(bad));
        Assert.Equal("request", e.ParamName);
        Assert.Contains("EndOfServiceYears", e.Message, StringComparison.Ordinal);
        Assert.Contains("StartTimeYears", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_start_before_the_last_finding_or_unordered_evidence_is_refused()
    {
        var method = ProbitLogPod.Method("probit", 2, 0.5);
        var early = Request(Model, 1e-4, evidence: [new NoIndication(10, "f", method)], start: 5);
        Assert.Contains(early.Problems(), p => p.Contains("before the latest evidence", StringComparison.Ordinal));
        var unordered = Request(Model, 1e-4, evidence: [new NoIndication(10, "f", method), new NoIndication(8, "g", method)]);
        Assert.Contains(unordered.Problems(), p => p.Contains("time order", StringComparison.Ordinal));
        var badOptions = Request(Model, 1e-4, options: new PlanningOptions { ScanStepYears = 0, MaximumInspections = 0 });
        Assert.Contains(badOptions.Problems(), p => p.StartsWith("Options.ScanStepYears", StringComparison.Ordinal));
        Assert.Contains(badOptions.Problems(), p => p.StartsWith("Options.MaximumInspections", StringComparison.Ordinal));
    }
}
