using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Verification;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Verification;

public class BenchmarkReferenceTests
{
    private static double Reference(string id) => BenchmarkProblems.Find(id)!.ReferencePf;

    [Theory]
    [Reference("Independent quadrature in the test (BenchmarkQuadrature.TwoInputs) of the problems as described by the reliability problem repository and otbenchmark")]
    [InlineData("RP22")]
    [InlineData("RP24")]
    [InlineData("RP25")]
    [InlineData("RP28")]
    [InlineData("RP31")]
    [InlineData("RP35")]
    [InlineData("RP53")]
    [InlineData("RP55")]
    [InlineData("RP57")]
    [InlineData("RP75")]
    [InlineData("RP89")]
    [InlineData("RP111")]
    [InlineData("4-branch")]
    public void Two_input_references_match_quadrature(string id)
    {
        var exact = BenchmarkQuadrature.TwoInputs(BenchmarkProblems.Find(id)!.Problem);
        Assert.Equal(Reference(id), exact, 1e-3 * exact);
    }

    [Fact]
    [Reference("Closed form 2Φ(−3) − P(Z1 ≥ 3, Z2 ≥ 3) with correlation 1/√3 between the two planes' normals, the bivariate tail by a 1-D integral in the test")]
    public void RP33_is_two_planes_at_beta_3()
    {
        var rho = 1 / Math.Sqrt(3);
        var both = BenchmarkQuadrature.Composite(z => StandardNormal.Pdf(z) * StandardNormal.Ccdf((3 - rho * z) / Math.Sqrt(1 - rho * rho)), 3, 13, 200);
        var exact = 2 * StandardNormal.Ccdf(3) - both;
        Assert.Equal(Reference("RP33"), exact, 1e-3 * exact);
    }

    [Fact]
    [Reference("Closed form: a sum of 20 unit exponentials is Gamma(20, 1); Pf = its CDF at 8.951 (MathNet's regularized incomplete gamma)")]
    public void RP54_is_a_gamma_cdf()
    {
        var exact = new Gamma(20, 1).CumulativeDistribution(8.951);
        Assert.Equal(Reference("RP54"), exact, 1e-3 * exact);
    }

    [Fact]
    [Reference("Exact: Pf = E[Φ(4.5 − 0.1·T)], T ~ χ²(99), by a composite Gauss–Legendre integral in the test")]
    public void RP63_is_a_chi_square_integral()
    {
        var chi = new ChiSquared(99);
        var exact = BenchmarkQuadrature.Composite(t => chi.Density(t) * StandardNormal.Cdf(4.5 - 0.1 * t), 0, 400, 800);
        Assert.Equal(Reference("RP63"), exact, 1e-3 * exact);
    }

    [Fact]
    [Reference("Exact: X1 − X2 ~ N(10, √1.25); Pf = ∫_{x3 ≤ 5} φ₃Φ((x3 − 10)/√1.25) + ∫_{x3 > 5} φ₃Φ(−x3), X3 ~ N(4, 1), by quadrature in the test")]
    public void RP77_is_a_one_dimensional_integral()
    {
        double Phi3(double x) => StandardNormal.Pdf(x - 4);
        var exact = BenchmarkQuadrature.Composite(x => Phi3(x) * StandardNormal.Cdf((x - 10) / Math.Sqrt(1.25)), -10, 5, 400)
            + BenchmarkQuadrature.Composite(x => Phi3(x) * StandardNormal.Ccdf(x), 5, 20, 400);
        Assert.Equal(Reference("RP77"), exact, 1e-3 * exact);
    }

    [Fact]
    [Reference("Closed forms: RP107 a hyperplane at β = 5 (Φ(−5)); RP110 two independent branches beyond 4 and 5 (Φ(−4) + Φ(−5) − Φ(−4)Φ(−5))")]
    public void RP107_and_RP110_closed_forms()
    {
        Assert.Equal(Reference("RP107"), StandardNormal.Ccdf(5), 1e-5 * StandardNormal.Ccdf(5));
        var p110 = StandardNormal.Ccdf(4) + StandardNormal.Ccdf(5) - StandardNormal.Ccdf(4) * StandardNormal.Ccdf(5);
        Assert.Equal(Reference("RP110"), p110, 1e-5 * p110);
    }
}
