using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Reliability;

/// <summary>The monotonicity check of profile increments: F(t − 1) ⊂ F(t) for monotone degradation (DESIGN §3).</summary>
[Reference("Closed form: for monotone degradation F(t_prev) ⊂ F(t), so the exact cumulative Pf never decreases between renewals")]
public class ProfileIncrementTests
{
    [Fact]
    public void A_rise_is_kept_as_it_is()
    {
        var (interval, consistent, note) = ProfileIncrement.Of(2e-4, null, 1e-4, null);
        Assert.Equal(1e-4, interval, 1e-18);
        Assert.True(consistent);
        Assert.Null(note);
    }

    [Fact]
    public void A_large_fall_of_deterministic_estimates_is_inconsistent_and_kept_visible()
    {
        // First-order values 0.015 then 4.5e-10: a fall by 0.015 against a 1e-3 relative allowance.
        var (interval, consistent, note) = ProfileIncrement.Of(4.5e-10, null, 0.015, null);
        Assert.True(interval < -0.0149);
        Assert.False(consistent);
        Assert.Contains("impossible for monotone degradation", note, StringComparison.Ordinal);
    }

    // NaN in a CoV column stands for a deterministic estimate (no CoV).
    [Theory]
    [InlineData(0.98e-3, 0.05, 1.0e-3, 0.05)] // 1.00e-3 ± 5 % then 0.98e-3 ± 5 %: a fall of 2e-5 inside 3·(5e-5 + 4.9e-5)
    [InlineData(1e-4 - 1e-12, double.NaN, 1e-4, double.NaN)] // deterministic, rounding-level fall
    [InlineData(9.3e-19, 0.05, 6.5e-15, 0.05)] // simulated, a fall under the 1e-12 absolute floor
    [InlineData(0, double.PositiveInfinity, 1.36e-74, 0.5)] // a simulated 0 (CoV ∞): ∞·0 must not make the check NaN
    public void A_fall_within_the_estimates_uncertainty_is_noise_shown_as_zero(double pf, double cov, double previousPf, double previousCov)
    {
        var (interval, consistent, note) = ProfileIncrement.Of(pf, double.IsNaN(cov) ? null : cov, previousPf, double.IsNaN(previousCov) ? null : previousCov);
        Assert.Equal(0, interval);
        Assert.True(consistent);
        Assert.Contains("shown as 0", note, StringComparison.Ordinal);
    }
}
