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
    public void A_fall_within_three_standard_deviations_of_simulated_estimates_is_noise_shown_as_zero()
    {
        // 1.00e-3 ± 5 % then 0.98e-3 ± 5 %: the fall 2e-5 is well inside 3·(5e-5 + 4.9e-5).
        var (interval, consistent, note) = ProfileIncrement.Of(0.98e-3, 0.05, 1.0e-3, 0.05);
        Assert.Equal(0, interval);
        Assert.True(consistent);
        Assert.Contains("shown as 0", note, StringComparison.Ordinal);
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

    [Fact]
    public void A_rounding_level_fall_of_deterministic_estimates_is_noise()
    {
        var (interval, consistent, _) = ProfileIncrement.Of(1e-4 - 1e-12, null, 1e-4, null);
        Assert.Equal(0, interval);
        Assert.True(consistent);
    }

    [Fact]
    public void A_fall_between_values_far_below_any_target_is_noise()
    {
        // 6.5e-15 then 9.3e-19 from a simulation: a fall of 6.5e-15 lies under the 1e-12 absolute floor.
        var (interval, consistent, _) = ProfileIncrement.Of(9.3e-19, 0.05, 6.5e-15, 0.05);
        Assert.Equal(0, interval);
        Assert.True(consistent);
    }

    [Fact]
    public void A_simulated_zero_after_a_tiny_value_is_noise_not_a_NaN_comparison()
    {
        // A zero estimate carries CoV ∞; ∞·0 must not turn the check into NaN (which flagged a fall of 1.4e-74).
        var (interval, consistent, _) = ProfileIncrement.Of(0, double.PositiveInfinity, 1.36e-74, 0.5);
        Assert.Equal(0, interval);
        Assert.True(consistent);
    }
}
