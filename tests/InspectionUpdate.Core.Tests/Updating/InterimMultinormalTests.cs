using InspectionUpdate.Probability;
using InspectionUpdate.Updating.FirstOrder;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Updating;

public class InterimMultinormalTests
{
    /// <summary>
    /// Equicorrelated ρ ≥ 0: P(Z ≤ b) = ∫ φ(z) Πᵢ Φ((bᵢ − √ρ z)/√(1 − ρ)) dz (Dunnett &amp; Sobel 1955, from memory; the
    /// one-factor representation), integrated in the test with MathNet's Gauss–Kronrod rule.
    /// </summary>
    private static double OneFactor(double[] b, double rho) =>
        GaussKronrodRule.Integrate(
            z => StandardNormal.Pdf(z) * b.Aggregate(1.0, (p, bi) => p * StandardNormal.Cdf((bi - Math.Sqrt(rho) * z) / Math.Sqrt(1 - rho))),
            -12, 12, out _, out _, 1e-14, 20, 61);

    [Theory]
    [InlineData(new[] { -2.0, -1, 0, 1, 3 }, 0.3)]
    [InlineData(new[] { -3.0, -2.5, -2.0 }, 0.8)]
    [InlineData(new[] { -1.0, -1, -1, -1, -1, -1 }, 0.5)]
    [InlineData(new[] { -4.0, 0.5, 2, 9.5 }, 0.6)]
    [Reference("Dunnett & Sobel (1955) one-factor integral for equicorrelated normals (from memory), computed in the test")]
    public void Equicorrelated_orthant_probabilities_match_the_one_factor_integral_within_the_error_estimate(double[] b, double rho)
    {
        var r = new double[b.Length, b.Length];
        for (var i = 0; i < b.Length; i++)
            for (var j = 0; j < b.Length; j++) r[i, j] = i == j ? 1 : rho;
        var exact = OneFactor(b, rho);
        var (value, error) = InterimMultinormal.Cdf(b, r, relativeError: 1e-3);
        Assert.True(error <= 1e-3 * value * 1.0001 || error < 1e-12, $"error estimate {error:G3} against the target");
        // The error estimate is three standard errors of the shift means; allow twice that to keep the test robust.
        Assert.True(Math.Abs(value - exact) <= 2 * Math.Max(error, 1e-14), $"{value:R} ± {error:G3} against {exact:R}");
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.3)]
    [InlineData(0.95)]
    [InlineData(0.999999)]
    [Reference("Wichura (1988), AS 241: Φ⁻¹ by rational approximations; checked against Φ(Φ⁻¹(p)) = p")]
    public void Fast_inverse_normal_round_trips_through_the_normal_cdf(double p0)
    {
        foreach (var p in new[] { p0, 1e-300, 1e-20, 1e-5, 0.5 + p0 / 2 }.Where(v => v > 0 && v < 1))
        {
            var z = InterimMultinormal.FastInverseNormal(p);
            Assert.Equal(StandardNormal.InverseCdf(p), z, Math.Max(1e-13, 1e-13 * Math.Abs(z)));
        }
    }
}
