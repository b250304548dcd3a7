using InspectionUpdate.Tests.Updating;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// The failure-time search says when its time is T_f itself beyond the horizon (a sample set then reads bounds past a
/// period's end from it) and when +∞ only means "not by the horizon".
/// </summary>
[Reference("Closed forms: leak corrosion T_f = T₀ + f·w/r; a linear depth D0 + R·t reaching a critical depth at t = (d_c − D0)/R")]
public class FailureTimeSearchTests
{
    [Fact]
    public void A_closed_form_time_past_the_horizon_is_exact()
    {
        // Wall 10 mm, leak at 80 % of it, initiation 6 y, rate 0.22 mm/y: T_f = 6 + 8/0.22 = 42.36 y, past a 20-year horizon.
        var model = CorrosionLeakQuadrature.Model();
        double[] x = [CorrosionLeakQuadrature.Wall, 6, 0.22];
        var t = FailureTimeSearch.Find(model, x, 20, 4, out _, out var exact);
        Assert.Equal(6 + 0.8 * 10 / 0.22, t, 9);
        Assert.True(exact);
    }

    [Theory]
    [InlineData(20, 10, true)] // the search's root within the horizon: T_f itself
    [InlineData(8, double.PositiveInfinity, false)] // g still positive at the horizon: +∞ says only "not by 8 y"
    public void A_searched_time_is_exact_only_when_the_search_found_the_root(double horizonYears, double expected, bool expectedExact)
    {
        // depth 1 + 0.5·t reaches 6 mm at t = 10 y (a model without a closed form: the search's root).
        var model = TestModels.LinearDepth(1, 0.1, 0.5, 0.05, 6);
        double[] x = [1, 0.5];
        var t = FailureTimeSearch.Find(model, x, horizonYears, 4, out _, out var exact);
        Assert.Equal(expected, t, 5);
        Assert.Equal(expectedExact, exact);
    }
}
