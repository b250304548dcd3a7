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

    [Fact]
    public void A_root_found_within_the_horizon_is_exact()
    {
        // depth 1 + 0.5·t reaches 6 mm at t = 10 y (no closed form: the search's root).
        var model = TestModels.LinearDepth(1, 0.1, 0.5, 0.05, 6);
        double[] x = [1, 0.5];
        var t = FailureTimeSearch.Find(model, x, 20, 4, out _, out var exact);
        Assert.Equal(10, t, 5);
        Assert.True(exact);
    }

    [Fact]
    public void A_search_that_reaches_the_horizon_with_a_positive_margin_is_not_exact()
    {
        // The same depth reaches 6 mm at 10 y, after a 8-year horizon: +∞ says only "not by 8 y".
        var model = TestModels.LinearDepth(1, 0.1, 0.5, 0.05, 6);
        double[] x = [1, 0.5];
        var t = FailureTimeSearch.Find(model, x, 8, 4, out _, out var exact);
        Assert.Equal(double.PositiveInfinity, t);
        Assert.False(exact);
    }
}
