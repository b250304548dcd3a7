using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Multinormal;
using InspectionUpdate.Updating;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// depth = D0 + R·t (normal) and a no-indication finding at year 10 with a lognormal detectable size (median 1 mm,
/// σ_ln 0.4), while the prior depth at year 10 is about 3.5 mm: failure at year 20 after such a miss needs a large A_d,
/// far in its tail, where the individual linearizations mislead. The exact value is a one-dimensional integral over
/// A_d of bivariate-normal probabilities, computed in the test.
/// </summary>
[Reference("Independent computation in the test: ∫ f_Ad(a)·P(D(20) > 8, D(10) < a) da / ∫ f_Ad(a)·P(D(10) < a) da, bivariate normal by BivariateNormal (Genz 2004), integrated with MathNet's Gauss–Kronrod rule")]
public class AutoRouteTests
{
    private static readonly InspectionMethod Method = TestModels.Method(new CumulativeLognormalPod(0, 0.4));

    private static double Exact()
    {
        // D(20) ~ N(6, √2.65), D(10) ~ N(3.5, √0.73), cov 1.37 (D0 ~ N(1, 0.3), R ~ N(0.25, 0.08)).
        var s20 = Math.Sqrt(0.09 + 400 * 0.0064);
        var s10 = Math.Sqrt(0.09 + 100 * 0.0064);
        var rho = (0.09 + 200 * 0.0064) / (s20 * s10);
        var h = (8 - 6) / s20;
        double K(double z) => (Math.Exp(0.4 * z) - 3.5) / s10; // A_d = exp(0.4 z)
        var joint = GaussKronrodRule.Integrate(z => StandardNormal.Pdf(z) * BivariateNormal.Cdf(-h, K(z), -rho), -9, 9, out _, out _, 1e-10, 10, 61);
        var evidence = GaussKronrodRule.Integrate(z => StandardNormal.Pdf(z) * StandardNormal.Cdf(K(z)), -9, 9, out _, out _, 1e-10, 10, 61);
        return joint / evidence;
    }

    [Fact]
    [Trait("Category", "Statistical")]
    public void Auto_route_replaces_a_misleading_first_order_result_by_simulation_within_four_standard_errors()
    {
        var model = TestModels.LinearDepth(1.0, 0.3, 0.25, 0.08, 8);
        var evidence = new[] { new NoIndication(10, "N-10", Method) };
        var expected = Exact();

        var fo = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.FirstOrder }).Estimate(model, evidence, 20);
        Assert.Equal(ComputationRoute.FirstOrder, fo.Route);
        Assert.NotNull(fo.Note);
        Assert.True(fo.Note.Contains("disagree", StringComparison.Ordinal) || fo.Note.Contains("departs", StringComparison.Ordinal), fo.Note);

        var auto = new ReliabilityUpdater(new UpdatingOptions { Seed = 4 }).Estimate(model, evidence, 20);
        Assert.Equal(ComputationRoute.ImportanceSampling, auto.Route);
        Assert.True(auto.Converged, auto.Note);
        var se = auto.CoefficientOfVariation!.Value * auto.CumulativePf;
        Assert.True(Math.Abs(auto.CumulativePf - expected) <= 4 * se, $"{auto.CumulativePf:G5} ± {se:G3} against exact {expected:G5}");
    }
}
