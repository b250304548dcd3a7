using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;
using MathNet.Numerics;

namespace InspectionUpdate.Tests.Reliability.Multinormal;

public class BivariateNormalTests
{
    /// <summary>
    /// Independent check: Plackett's (1954) identity as written by Drezner &amp; Wesolowsky (1990),
    /// Φ₂(h,k;ρ) = Φ(h)Φ(k) + (1/2π)∫₀^ρ (1−r²)^(−1/2) exp(−(h²−2rhk+k²)/(2(1−r²))) dr, with r = sin θ so the
    /// integrand is smooth, integrated by MathNet's double-exponential rule.
    /// </summary>
    internal static double PlackettIntegral(double h, double k, double rho)
    {
        double F(double theta)
        {
            var s = Math.Sin(theta);
            var c2 = Math.Cos(theta) * Math.Cos(theta);
            return Math.Exp(-(h * h - 2 * s * h * k + k * k) / (2 * c2));
        }

        var integral = Integrate.DoubleExponential(F, 0, Math.Asin(rho), 1e-17);
        return StandardNormal.Cdf(h) * StandardNormal.Cdf(k) + integral / (2 * Math.PI);
    }

    [Theory]
    [Reference("Sheppard (1899), Phil. Trans. R. Soc. A 192: P(X1 ≤ 0, X2 ≤ 0) = 1/4 + asin(ρ)/(2π)")]
    [InlineData(-1.0)]
    [InlineData(-0.9999999)]
    [InlineData(-0.95)]
    [InlineData(-0.5)]
    [InlineData(0.0)]
    [InlineData(0.2999)]
    [InlineData(0.3)]
    [InlineData(0.74)]
    [InlineData(0.75)]
    [InlineData(0.924)]
    [InlineData(0.925)]
    [InlineData(0.999999999)]
    [InlineData(1.0)]
    public void Quadrant_probability_matches_Sheppard_formula(double rho)
    {
        var expected = 0.25 + Math.Asin(rho) / (2 * Math.PI);
        Assert.Equal(expected, BivariateNormal.Cdf(0, 0, rho), 1e-15);
    }

    /// <summary>
    /// (h, k, ρ, Φ₂(h, k; ρ)) from Burkardt's test_values collection, BIVARIATE_NORMAL_CDF_VALUES (computed with
    /// Mathematica; reference: NBS Applied Mathematics Series 50, Tables of the Bivariate Normal Distribution, 1959),
    /// as printed in its C# port (github.com/philstopford/DesignLibs_GPL, TestValues/Bivariate.cs).
    /// </summary>
    public static TheoryData<double, double, double, double> PublishedBivariateValues { get; } = new()
    {
        { -2.0, 1.0, 0.500, 0.02260327218569867 },
        { -1.0, 1.0, 0.500, 0.1548729518584100 },
        { 0.0, 1.0, 0.500, 0.4687428083352184 },
        { 1.0, 1.0, 0.500, 0.7452035868929476 },
        { 2.0, 1.0, 0.500, 0.8318608306874188 },
        { 3.0, 1.0, 0.500, 0.8410314261134202 },
        { -0.2, 0.5, -0.900, 0.1377019384919464 },
        { -0.2, 0.5, -0.800, 0.1621749501739030 },
        { -0.2, 0.5, -0.700, 0.1827411243233119 },
        { -0.2, 0.5, -0.600, 0.2010067421506235 },
        { -0.2, 0.5, -0.500, 0.2177751155265290 },
        { -0.2, 0.5, -0.400, 0.2335088436446962 },
        { -0.2, 0.5, -0.300, 0.2485057781834286 },
        { -0.2, 0.5, -0.200, 0.2629747825154868 },
        { -0.2, 0.5, -0.100, 0.2770729823404738 },
        { -0.2, 0.5, 0.000, 0.2909261168683812 },
        { -0.2, 0.5, 0.100, 0.3046406378726738 },
        { -0.2, 0.5, 0.200, 0.3183113449213638 },
        { -0.2, 0.5, 0.300, 0.3320262544108028 },
        { -0.2, 0.5, 0.400, 0.3458686754647614 },
        { -0.2, 0.5, 0.500, 0.3599150462310668 },
        { -0.2, 0.5, 0.600, 0.3742210899871168 },
        { -0.2, 0.5, 0.700, 0.3887706405282320 },
        { -0.2, 0.5, 0.800, 0.4032765198361344 },
        { -0.2, 0.5, 0.900, 0.4162100291953678 },
        { 1.0, 0.5, 0.673, 0.6508271498838664 },
        { 2.0, 1.0, 0.500, 0.8318608306874188 },
        { 0.0, 0.0, -1.000, 0.0 },
        { 0.0, 0.0, -0.500, 0.1666666666539970 },
        { 0.0, 0.0, 0.000, 0.25 },
        { 0.0, 0.0, 0.500, 0.3333333333328906 },
        { 0.0, 0.0, 1.000, 0.5 },
        { 1.0, 1.0, 0.500, 0.7452035868929476 },
        { 1.0, -1.0, 0.500, 0.1548729518584100 },
        { -1.0, 1.0, 0.500, 0.1548729518584100 },
        { -1.0, -1.0, 0.500, 0.06251409470431653 },
        { 1.0, 1.0, 0.500, 0.7452035868929476 },
        { 1.0, -1.0, 0.500, 0.1548729518584100 },
        { -1.0, 1.0, 0.500, 0.1548729518584100 },
        { -1.0, -1.0, 0.500, 0.06251409470431653 },
        { 0.7071067811865475, 0.7071067811865475, 0.500, 0.6337020457912916 },
    };

    [Theory]
    [Reference("Burkardt, test_values BIVARIATE_NORMAL_CDF_VALUES (41 values; NBS AMS 50, 1959), to the table's own accuracy (about 1e-7)")]
    [MemberData(nameof(PublishedBivariateValues))]
    public void Matches_a_published_table_of_bivariate_values(double h, double k, double rho, double published)
    {
        // The table is accurate to about 1e-7, not to its 16 printed digits: at (0, 1, 0.5) it gives 0.4687428083352184
        // where a 30-digit evaluation of Plackett's integral (mpmath, computed once while writing this test) gives
        // 0.46874295264516808, as ours does to 1e-16; at (0, 0, −0.5) it gives 0.1666666666539970 where Sheppard's
        // closed form gives 1/6. The 1e-14 accuracy is checked against the independent quadrature below; this test
        // guards against gross errors (sign of ρ, swapped limits) on a table we did not compute. Hence 2e-7 absolute.
        Assert.Equal(published, BivariateNormal.Cdf(h, k, rho), 2e-7);
    }

    [Fact]
    [Reference("GAUSS Language Reference (Aptech), cdfBvn2e, Example 1: rectangle 0 ≤ X1, X2 ≤ 1, ρ = 0.5, printed 1.4105101488974692e-001 with error estimate 2e-14")]
    public void Rectangle_matches_a_published_example()
    {
        var result = MultivariateNormal.Probability([0.0, 0.0], [1.0, 1.0], new double[,] { { 1, 0.5 }, { 0.5, 1 } });
        Assert.Equal(0.14105101488974692, result.Value, 2e-14);
    }

    [Theory]
    [Reference("docs/references.md derived values (Drezner & Wesolowsky 1990 integral), recomputed here by the Plackett integral with MathNet double-exponential quadrature")]
    [InlineData(-1.0, -1.0, 0.5, 0.06251409470966383)]
    [InlineData(-2.0, -2.0, 0.9, 0.01336125612701929)]
    [InlineData(-3.0, -3.0, 0.99, 1.101519998620623e-3)]
    [InlineData(-4.0, -4.0, 0.5, 4.870547622838424e-7)]
    [InlineData(-0.5, -0.5, -0.95, 2.716165637214261e-5)]
    public void Matches_derived_check_values_and_an_independent_quadrature(double h, double k, double rho, double derived)
    {
        var independent = PlackettIntegral(h, k, rho);
        var actual = BivariateNormal.Cdf(h, k, rho);
        Assert.Equal(independent, actual, 1e-14);
        Assert.Equal(derived, actual, 1e-14);
    }

    public static TheoryData<double, double, double> Grid()
    {
        var data = new TheoryData<double, double, double>();
        double[] bounds = [-5.5, -2.3, -0.7, 0.0, 1.1, 3.4];
        double[] rhos = [-0.99, -0.93, -0.8, -0.4, 0.1, 0.29, 0.31, 0.6, 0.76, 0.92, 0.93, 0.97, 0.995];
        foreach (var h in bounds)
            foreach (var k in bounds)
                foreach (var r in rhos)
                {
                    if (h <= k) data.Add(h, k, r);
                }

        return data;
    }

    [Theory]
    [MemberData(nameof(Grid))]
    [Reference("Independent computation in the test: Plackett integral (Drezner & Wesolowsky 1990) by MathNet quadrature")]
    public void Matches_the_Plackett_integral_over_a_grid_of_bounds_and_correlations(double h, double k, double rho)
    {
        Assert.Equal(PlackettIntegral(h, k, rho), BivariateNormal.Cdf(h, k, rho), 2e-14);
    }

    [Theory]
    [Reference("Closed form: X2 = X1 a.s. for ρ = 1 gives Φ(min(h, k)); X2 = −X1 for ρ = −1 gives max(0, Φ(h) + Φ(k) − 1)")]
    [InlineData(-1.3, 0.4)]
    [InlineData(2.0, -2.0)]
    [InlineData(-6.0, -6.5)]
    [InlineData(0.7, 0.7)]
    public void Perfect_correlation_is_exact(double h, double k)
    {
        Assert.Equal(StandardNormal.Cdf(Math.Min(h, k)), BivariateNormal.Cdf(h, k, 1), 1e-16);
        var expected = Math.Max(0, StandardNormal.Cdf(h) - StandardNormal.Cdf(-k));
        Assert.Equal(expected, BivariateNormal.Cdf(h, k, -1), 1e-16);
    }

    [Theory]
    [Reference("Closed form: Φ₂ is continuous in ρ, so ρ = ±(1 − 1e-12) lies within ~1e-6 of the ρ = ±1 limits")]
    [InlineData(-1.0, 0.5)]
    [InlineData(0.3, 0.3)]
    public void Correlation_near_one_approaches_the_perfectly_correlated_limit(double h, double k)
    {
        Assert.Equal(BivariateNormal.Cdf(h, k, 1), BivariateNormal.Cdf(h, k, 1 - 1e-12), 1e-6);
        Assert.Equal(BivariateNormal.Cdf(h, k, -1), BivariateNormal.Cdf(h, k, -1 + 1e-12), 1e-6);
    }

    [Theory]
    [Reference("Closed form: P(X1 ≤ h, X2 ≤ k) + P(X1 ≤ h, X2 > k) = Φ(h), and P(X1 ≤ h, X2 > k; ρ) = Φ₂(h, −k; −ρ)")]
    [InlineData(-1.2, 0.8, 0.95)]
    [InlineData(2.5, -3.0, -0.97)]
    [InlineData(0.1, 0.2, 0.5)]
    public void Complementary_events_sum_to_the_marginal(double h, double k, double rho)
    {
        var sum = BivariateNormal.Cdf(h, k, rho) + BivariateNormal.Cdf(h, -k, -rho);
        Assert.Equal(StandardNormal.Cdf(h), sum, 1e-15);
    }

    [Fact]
    [Reference("Closed form: an infinite bound leaves the other marginal Φ(k); a bound at −∞ gives 0")]
    public void Infinite_bounds_reduce_to_the_marginal()
    {
        Assert.Equal(StandardNormal.Cdf(-0.3), BivariateNormal.Cdf(double.PositiveInfinity, -0.3, 0.7), 1e-16);
        Assert.Equal(StandardNormal.Cdf(1.7), BivariateNormal.Cdf(1.7, double.PositiveInfinity, -0.99), 1e-16);
        Assert.Equal(0, BivariateNormal.Cdf(double.NegativeInfinity, 3, 0.2));
        Assert.True(double.IsNaN(BivariateNormal.Cdf(double.NaN, 3, 0.2)));
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(1.0000001)]
    [InlineData(-2.0)]
    public void Rejects_a_correlation_outside_minus_one_to_one(double rho)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => BivariateNormal.Cdf(0, 0, rho));
        Assert.Equal("rho", e.ParamName);
    }
}
