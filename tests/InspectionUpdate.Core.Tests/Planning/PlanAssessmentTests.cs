using InspectionUpdate.Planning;
using InspectionUpdate.Tests.Planning.Doubles;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

public class PlanAssessmentTests
{
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();
    private static readonly InspectionUpdate.Inspection.InspectionMethod Probit = ProbitLogPod.Method("probit-2mm", 2, 0.5);

    private static InspectionPlanner Planner() => new(new LogLinearGaussianUpdater());

    [Fact]
    [Reference("Closed form: without inspections the failure probability over (5, 40] is Pf(40) − Pf(5) of the prior, written out in the test")]
    public void A_plan_without_inspections_fails_with_the_prior_probability_and_costs_only_failures()
    {
        var costs = new CostModel { InspectionCost = 10, RepairCost = 100, FailureCost = 1e6 };
        var plan = Planner().AssessPlan(Request(Model, 1e-4, start: 5), Probit, [], costs, "none");

        var expected = WorkedPriorPf(40) - WorkedPriorPf(5);
        Assert.Equal(expected, plan.FailureProbabilityBeforeIndication!.Value, expected * 1e-9);
        Assert.Equal(1e6 * expected, plan.Costs!.Failures, 1e6 * expected * 1e-9);
        Assert.Equal(0, plan.Costs.Inspections);
        Assert.Equal(0, plan.Costs.Repairs);
        Assert.False(plan.Verification.WithinTarget);
        Assert.Equal(1, plan.ProbabilityNothingFound);
    }

    [Fact]
    [Reference("Event-tree identity (JCSS PMC Part 1, Annex B): the first-indication probabilities of a plan are the schedule's repair-branch path probabilities; discounting Σ C_I (1 + r)^−(t_k − t_0) written out in the test")]
    public void Assessing_the_schedules_own_dates_reproduces_the_schedule()
    {
        var request = Request(Model, 1e-4, options: new PlanningOptions { RepairBranchDepth = 1 });
        var schedule = Planner().Schedule(request, Probit);
        var times = schedule.Inspections.Select(i => i.TimeYears).ToArray();
        var costs = new CostModel { InspectionCost = 10, RepairCost = 0, FailureCost = 0, DiscountRatePerYear = 0.03 };

        var plan = Planner().AssessPlan(request, Probit, times, costs, "threshold");

        Assert.Equal(schedule.Verification.MaxRatio, plan.Verification.MaxRatio, 1e-12);
        Assert.Equal(schedule.Inspections.Select(i => i.Repair!.PathProbability), plan.FirstIndicationProbabilities);
        Assert.Equal(schedule.ProbabilityNothingFound!.Value, plan.ProbabilityNothingFound!.Value, 1e-15);
        Assert.Equal(times.Sum(t => 10 * Math.Pow(1.03, -t)), plan.Costs!.Inspections, 1e-12);
        Assert.Equal(ServiceTime(times[0]), plan.Dates[0]);
    }

    [Fact]
    public void Comparison_finds_the_threshold_plan_within_target_and_a_plan_without_inspection_not()
    {
        var costs = new CostModel { InspectionCost = 1, RepairCost = 5, FailureCost = 1e5, DiscountRatePerYear = 0.02 };
        var comparison = Planner().ComparePlans(Request(Model, 1e-4), Probit, costs, [3, 100]);

        Assert.True(comparison.Threshold.Verification.WithinTarget);
        Assert.Equal(2, comparison.FixedIntervals.Count);
        Assert.True(comparison.FixedIntervals[0].Verification.WithinTarget);
        Assert.Empty(comparison.FixedIntervals[1].InspectionTimesYears);
        Assert.False(comparison.FixedIntervals[1].Verification.WithinTarget);
        // Every 3 years inspects more often than the threshold plan, so it costs more in inspections.
        Assert.True(comparison.FixedIntervals[0].Costs!.Inspections > comparison.Threshold.Costs!.Inspections);
        Assert.NotNull(comparison.CheapestWithinTarget);
        Assert.NotEqual("every 100 years", comparison.CheapestWithinTarget);
    }

    [Fact]
    public void Invalid_plans_and_costs_are_refused_naming_the_parameter()
    {
        var request = Request(Model, 1e-4);
        Assert.Equal("inspectionTimesYears", Assert.Throws<ArgumentException>(() => Planner().AssessPlan(request, Probit, [10, 8])).ParamName);
        Assert.Equal("inspectionTimesYears", Assert.Throws<ArgumentException>(() => Planner().AssessPlan(request, Probit, [50])).ParamName);
        var negative = new CostModel { InspectionCost = -1, RepairCost = 0, FailureCost = 0, DiscountRatePerYear = 1 };
        Assert.Equal(2, negative.Problems().Count);
        Assert.Equal("costs", Assert.Throws<ArgumentException>(() => Planner().AssessPlan(request, Probit, [10], negative)).ParamName);
        Assert.Equal("fixedIntervalsYears", Assert.Throws<ArgumentException>(() =>
            Planner().ComparePlans(request, Probit, new CostModel { InspectionCost = 1, RepairCost = 1, FailureCost = 1 }, [0])).ParamName);
    }

    private static DateOnly ServiceTime(double t) => InspectionUpdate.Time.ServiceTime.DateAt(InService, t);
}
