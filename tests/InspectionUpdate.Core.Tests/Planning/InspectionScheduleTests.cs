using InspectionUpdate.Degradation;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Updating;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

public class InspectionScheduleTests
{
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();
    private static readonly InspectionUpdate.Inspection.InspectionMethod Probit = ProbitLogPod.Method("probit-2mm", 2, 0.5);

    private static InspectionPlanner Planner() => new(new LogLinearGaussianUpdater());

    [Fact]
    [Reference("First date: closed-form prior root; second date: root of the exact bivariate-normal posterior ΔPf after a no indication at the first date (Plackett integral, MathNet quadrature and Brent in the test)")]
    public void The_first_two_dates_equal_the_independent_roots()
    {
        var schedule = Planner().Schedule(Request(Model, 1e-4), Probit);

        var t1 = schedule.Inspections[0].TimeYears;
        var prior = IndependentGaussian.FirstRoot(t => WorkedPriorIntervalPf(t) - 1e-4, 1, 40);
        Assert.InRange(t1, prior - 2e-3, prior);

        double Posterior(double t) => IndependentGaussian.PosteriorAfterOneNoIndication(Model, t1, Math.Log(2), 0.5, t).Pf;
        var second = IndependentGaussian.FirstRoot(t => Posterior(t) - Posterior(t - 1) - 1e-4, t1 + 0.01, 40, 0.05);
        Assert.InRange(schedule.Inspections[1].TimeYears, second - 2e-3, second);
        Assert.Equal(schedule.Inspections[1].TimeYears - t1, schedule.Inspections[1].IntervalYears, 1e-12);
    }

    [Fact]
    public void A_complete_schedule_covers_the_life_under_the_target_and_reports_its_largest_ratio()
    {
        var schedule = Planner().Schedule(Request(Model, 1e-4), Probit);

        Assert.Equal(ScheduleStatus.Complete, schedule.Status);
        Assert.True(schedule.Inspections.Count >= 2);
        Assert.True(schedule.Verification.WithinTarget);
        // Each due date is within the bisection tolerance of the crossing, so the largest ratio is close to 1.
        Assert.InRange(schedule.Verification.MaxRatio, 0.98, 1.0);
        Assert.All(schedule.Inspections, i => Assert.True(i.After.Value < i.Before.Value));
        Assert.Equal(schedule.Inspections.Select(i => i.TimeYears).Order(), schedule.Inspections.Select(i => i.TimeYears));
        Assert.True(schedule.Computation.AllConverged);
        Assert.Null(schedule.ExpectedRepairs);
        Assert.Contains(schedule.Assumptions, a => a.Contains("assumed to find nothing", StringComparison.Ordinal));
    }

    [Fact]
    [Reference("Common practice, no source: an inspection that hardly ever detects (median detectable depth 500 mm) cannot buy time")]
    public void A_useless_method_gives_a_degenerate_schedule_that_stops_and_explains()
    {
        var blind = ProbitLogPod.Method("blind", 500, 0.5);
        var schedule = Planner().Schedule(Request(Model, 1e-4), blind);

        Assert.Equal(ScheduleStatus.Degenerate, schedule.Status);
        Assert.Contains("minimum interval", schedule.Message, StringComparison.Ordinal);
        Assert.True(schedule.Verification.WithinTarget);
    }

    [Fact]
    public void An_inspection_that_leaves_the_measure_above_the_target_stops_the_schedule()
    {
        // A deliberately perverse updater: every "no indication" raises Pf, so the measure cannot come back down.
        var schedule = new InspectionPlanner(new PerverseUpdater(Model)).Schedule(Request(Model, 1e-4), Probit);

        Assert.Equal(ScheduleStatus.Degenerate, schedule.Status);
        Assert.Single(schedule.Inspections);
        Assert.Contains("cannot bring the failure probability back under the target", schedule.Message, StringComparison.Ordinal);
        Assert.Contains("rose", schedule.Message, StringComparison.Ordinal);
        Assert.Contains(schedule.Computation.Notes, n => n.Contains("suspect", StringComparison.Ordinal));
    }

    [Fact]
    [Reference("P(indication at the first inspection) = 1 − Φ(−μ_V/σ_V), V = X₁ + X₂t₁ − ln A_d normal (closed form in the test); event-tree identity Σ_k P(first indication at k) + P(nothing found) = 1 (JCSS PMC Part 1, Annex B event tree)")]
    public void Repair_branch_probabilities_follow_the_event_tree()
    {
        var options = new PlanningOptions { RepairBranchDepth = 1 };
        var schedule = Planner().Schedule(Request(Model, 1e-4, options: options), Probit);

        var t1 = schedule.Inspections[0].TimeYears;
        var (_, noIndication) = IndependentGaussian.PosteriorAfterOneNoIndication(Model, t1, Math.Log(2), 0.5, t1);
        Assert.Equal(1 - noIndication, schedule.Inspections[0].Repair!.ConditionalProbability, 1e-9);
        Assert.Equal(1 - noIndication, schedule.Inspections[0].Repair!.PathProbability, 1e-9);

        var total = schedule.Inspections.Sum(i => i.Repair!.PathProbability) + schedule.ProbabilityNothingFound!.Value;
        Assert.Equal(1, total, 1e-12);
        Assert.Equal(1 - schedule.ProbabilityNothingFound!.Value, schedule.ExpectedRepairs!.Value, 1e-12);
        Assert.True(schedule.ExpectedRepairsTruncated);
    }

    [Fact]
    public void A_deeper_repair_branch_plans_after_each_repair_and_counts_more_repairs()
    {
        var shallow = Planner().Schedule(Request(Model, 1e-4, endYears: 30, options: new PlanningOptions { RepairBranchDepth = 1 }), Probit);
        var deep = Planner().Schedule(Request(Model, 1e-4, endYears: 30, options: new PlanningOptions { RepairBranchDepth = 2 }), Probit);

        var after = deep.Inspections[0].Repair!.AfterRepair!;
        Assert.Equal(deep.Inspections[0].TimeYears, after.FromYears);
        Assert.All(after.Inspections, i => Assert.True(i.TimeYears > after.FromYears));
        Assert.True(deep.ExpectedRepairs >= shallow.ExpectedRepairs);
        Assert.Equal(shallow.Inspections.Select(i => i.TimeYears), deep.Inspections.Select(i => i.TimeYears));
    }

    [Fact]
    public void Overdue_at_the_start_puts_the_first_inspection_at_the_start()
    {
        var schedule = Planner().Schedule(Request(Model, 1e-4, start: 25), Probit);
        Assert.True(schedule.OverdueAtStart);
        Assert.Equal(25, schedule.Inspections[0].TimeYears);
        Assert.Contains("already exceeded", schedule.Message, StringComparison.Ordinal);
    }

    /// <summary>Closed-form prior multiplied by (1 + number of no-indication findings): wrong on purpose.</summary>
    private sealed class PerverseUpdater(LogLinearGrowthModel model) : IReliabilityUpdater
    {
        public UpdatedEstimate Estimate(IDegradationModel m, IReadOnlyList<InspectionOutcome> evidence, double timeYears)
        {
            var pf = Math.Min(1, model.PriorPf(timeYears) * (1 + evidence.Count(e => e is NoIndication)));
            return new UpdatedEstimate { CumulativePf = pf, Beta = -StandardNormal.InverseCdf(pf), EvidenceProbability = 1, Route = ComputationRoute.Exact, Converged = true };
        }

        public ReliabilityProfile Profile(IDegradationModel m, IReadOnlyList<InspectionOutcome> evidence, IReadOnlyList<double> timesYears, string label) =>
            throw new NotSupportedException();
    }
}
