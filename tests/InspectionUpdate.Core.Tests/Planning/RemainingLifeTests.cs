using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Tests.Planning.Doubles;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

public class RemainingLifeTests
{
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();

    [Fact]
    [Reference("Closed form: Pf(t) = Φ(h(t)) = p ⇔ (d + m₂t)² = z²(s₁² + s₂²t²), d = m₁ − ln a_c, z = Φ⁻¹(p): the quadratic (m₂² − z²s₂²)t² + 2dm₂t + d² − z²s₁² = 0 solved in the test")]
    public void Cumulative_limit_is_reached_at_the_quadratic_root()
    {
        const double limit = 1e-3;
        double m1 = Math.Log(0.5), s1 = 0.5, m2 = 0.10, s2 = 0.02, d = m1 - Math.Log(20);
        var z = StandardNormal.InverseCdf(limit);
        double a = m2 * m2 - z * z * s2 * s2, b = 2 * d * m2, c = d * d - z * z * s1 * s1;
        var disc = Math.Sqrt(b * b - 4 * a * c);
        // The root on the branch d + m₂t < 0 (same sign as z).
        var root = new[] { (-b - disc) / (2 * a), (-b + disc) / (2 * a) }.Where(t => t > 0 && d + m2 * t < 0).Min();
        Assert.Equal(limit, WorkedPriorPf(root), 1e-12);

        var life = new InspectionPlanner(new LogLinearGaussianUpdater()).RemainingLife(Request(Model, 1e-4, start: 5), limit);

        var cumulative = life.UntilCumulativeLimit!;
        Assert.True(cumulative.Reached);
        Assert.InRange(cumulative.TimeYears, root - 2e-3, root);
        Assert.Equal(cumulative.TimeYears - 5, cumulative.RemainingYears, 1e-12);
        Assert.Equal(limit, life.CumulativePfLimit);
    }

    [Fact]
    [Reference("Closed form prior ΔPf root by MathNet Brent in the test")]
    public void Annual_remaining_life_runs_to_the_first_crossing()
    {
        var root = IndependentGaussian.FirstRoot(t => WorkedPriorIntervalPf(t) - 1e-4, 1, 40);
        var life = new InspectionPlanner(new LogLinearGaussianUpdater()).RemainingLife(Request(Model, 1e-4, start: 5));
        Assert.True(life.UntilAnnualTarget.Reached);
        Assert.InRange(life.UntilAnnualTarget.RemainingYears, root - 5 - 2e-3, root - 5);
        Assert.Null(life.UntilCumulativeLimit);
        Assert.Contains("reached on", life.Message, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("Closed form prior: ΔPf(10) < 1e-4 and Pf(10) < 0.5")]
    public void Limits_not_reached_within_the_horizon_give_a_lower_bound()
    {
        var life = new InspectionPlanner(new LogLinearGaussianUpdater()).RemainingLife(Request(Model, 1e-4), 0.5, horizonYears: 10);
        Assert.False(life.UntilAnnualTarget.Reached);
        Assert.False(life.UntilCumulativeLimit!.Reached);
        Assert.Equal(10, life.UntilAnnualTarget.RemainingYears);
        Assert.Contains("at least", life.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(1.0)]
    [InlineData(double.NaN)]
    public void A_cumulative_limit_outside_zero_one_is_refused(double limit)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() =>
            new InspectionPlanner(new LogLinearGaussianUpdater()).RemainingLife(Request(Model, 1e-4), limit));
        Assert.Equal("cumulativePfLimit", e.ParamName);
    }
}
