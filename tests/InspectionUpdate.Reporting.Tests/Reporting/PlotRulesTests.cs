using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting.Plots;

namespace InspectionUpdate.Tests.Reporting;

public sealed class PlotRulesTests
{
    [Theory]
    [Reference("A probability lies in [0, 1]; the report draws values below 1e-12 at 1e-12 (docs/formats.md): the axis stays in [1e-12, 1]")]
    [InlineData(-20, 0, 0.5)]
    [InlineData(-3, 0.7, 0.5)]
    [InlineData(-12, -12, 0.5)]
    [InlineData(-0.1, 0, 0.5)]
    [InlineData(-7.3, -2.2, 0.5)]
    public void A_probability_axis_never_runs_below_1e_12_nor_above_1(double yMin, double yMax, double pad)
    {
        var (bottom, top) = ReportCharts.ProbabilityAxis(yMin, yMax, pad);
        Assert.InRange(bottom, -12, 0);
        Assert.InRange(top, -12, 0);
        Assert.True(top > bottom);
        // Where the data fit inside, the axis holds them.
        if (yMin >= -12) Assert.True(bottom <= yMin);
        if (yMax <= 0) Assert.True(top >= yMax);
    }

    [Fact]
    public void Every_rise_of_beta_is_marked_as_noise_or_as_a_repair()
    {
        // Pf(t) = 1e-5·t² with one fall at t = 4 (noise) and a restart at a repair at t = 6.5 (Pf from 0 again).
        // β = −Φ⁻¹(Pf) falls wherever Pf rises: a rise of β is exactly a fall of Pf (the closed form's monotonicity).
        double[] pf = [1e-5, 4e-5, 9e-5, 8e-5, 2.5e-4, 3.6e-4, 1e-6, 4e-6];
        var points = pf.Select((p, i) => new ProfilePoint
        {
            TimeYears = i + 1,
            Beta = -InspectionUpdate.Probability.StandardNormal.InverseCdf(p),
            CumulativePf = p,
            IntervalPf = 0,
            Hazard = 0,
            Route = ComputationRoute.ImportanceSampling,
            Converged = true,
        }).ToArray();
        var (noise, atRepair) = ReportCharts.BetaRises(points, [6.5]);
        Assert.Equal([4.0], noise.Select(p => p.TimeYears));
        Assert.Equal([7.0], atRepair.Select(p => p.TimeYears));
    }
}
