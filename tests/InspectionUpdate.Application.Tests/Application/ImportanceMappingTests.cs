using InspectionUpdate.Application;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Application;

public sealed class ImportanceMappingTests
{
    private static ProfilePoint Point(double t, double beta, double[] alpha) => new()
    {
        TimeYears = t,
        Beta = beta,
        CumulativePf = InspectionUpdate.Probability.StandardNormal.Cdf(-beta),
        IntervalPf = 0,
        Hazard = 0,
        Route = ComputationRoute.FirstOrder,
        Converged = true,
        Alpha = alpha,
    };

    [Fact]
    [Reference("FORM: α is a unit vector, so the α² of all variables sum to 1 (docs/methods-form.md)")]
    public void Importance_is_taken_near_the_wanted_time_at_a_point_that_weighs_the_models_inputs_named_with_units()
    {
        // At 5 years every weight sits on the inspection event's detectable size; at 10 and 30 years on the inputs.
        var profile = new ReliabilityProfile
        {
            Label = "updated",
            VariableNames = ["rate_mmPerYear", "wall_mm", "A_d #3 finding 3 rev 1"],
            Points =
            [
                Point(5, 4.0, [0, 0, 1]),
                Point(10, 3.5, [0.8, -0.36, Math.Sqrt(1 - 0.64 - 0.1296)]),
                Point(30, 2.0, [0.6, -0.8, 0]),
                Point(40, double.PositiveInfinity, [1, 0, 0]),
            ],
        };
        var importance = ReportMapping.Importance(profile, 6, "updated", ["rate_mmPerYear", "wall_mm"], new DateOnly(2010, 1, 1));
        Assert.NotNull(importance);
        Assert.Equal(10, importance.TimeYears);
        Assert.Equal(["rate_mmPerYear (mm/year)", "wall_mm (mm)", "inspection outcomes (detectable size, sizing error)"], importance.Names);
        Assert.DoesNotContain(importance.Names, n => n.Contains("A_d", StringComparison.Ordinal));
        Assert.All(importance.Values, v => Assert.InRange(v, 0, 1));
        Assert.Equal(1, importance.Values.Sum(), 12);
        Assert.Contains("2020-01-01", importance.Label, StringComparison.Ordinal);
    }
}
