using InspectionUpdate.Planning;
using InspectionUpdate.Tests.Planning.Doubles;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

public class MethodComparisonTests
{
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();

    [Fact]
    public void Rows_follow_the_given_order_and_carry_each_schedules_first_three_dates()
    {
        var methods = new[] { ProbitLogPod.Method("fine", 1, 0.4), ProbitLogPod.Method("middling", 2, 0.4), ProbitLogPod.Method("coarse", 4, 0.4) };
        var comparison = new InspectionPlanner(new LogLinearGaussianUpdater()).CompareMethods(Request(Model, 1e-4), methods);

        Assert.Equal(["fine", "middling", "coarse"], comparison.Rows.Select(r => r.MethodName));
        foreach (var row in comparison.Rows)
        {
            Assert.Equal(row.Schedule.Inspections.Count, row.InspectionCount);
            Assert.Equal(row.Schedule.Inspections.Take(3).Select(i => i.Date), row.FirstDates);
            Assert.Equal(row.Schedule.Inspections.Take(3).Select(i => i.TimeYears), row.FirstTimesYears);
        }

        // Same first date: the first crossing depends on the prior only.
        Assert.Single(comparison.Rows.Select(r => r.FirstDates[0]).Distinct());
        Assert.True(comparison.Rows[0].InspectionCount <= comparison.Rows[1].InspectionCount);
        Assert.True(comparison.Rows[1].InspectionCount <= comparison.Rows[2].InspectionCount);
        Assert.Equal(comparison.Rows.Sum(r => r.Schedule.Computation.Estimates), comparison.Computation.Estimates);
    }

    [Fact]
    public void Two_methods_with_one_name_or_none_at_all_are_refused()
    {
        var planner = new InspectionPlanner(new LogLinearGaussianUpdater());
        var m = ProbitLogPod.Method("same", 1, 0.4);
        Assert.Equal("methods", Assert.Throws<ArgumentException>(() => planner.CompareMethods(Request(Model, 1e-4), [m, m])).ParamName);
        Assert.Equal("methods", Assert.Throws<ArgumentException>(() => planner.CompareMethods(Request(Model, 1e-4), [])).ParamName);
    }
}
