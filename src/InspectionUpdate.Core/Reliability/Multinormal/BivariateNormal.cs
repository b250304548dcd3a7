using InspectionUpdate.Probability;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// The standard bivariate normal distribution function Φ₂(h, k; ρ) = P(X₁ ≤ h, X₂ ≤ k) for standard normal X₁, X₂
/// with correlation ρ.
/// </summary>
/// <remarks>
/// Genz (2004), "Numerical computation of rectangular bivariate and trivariate normal and t probabilities",
/// Statistics and Computing 14:151–160, following Drezner &amp; Wesolowsky (1990): for |ρ| &lt; 0.925 Gauss–Legendre
/// quadrature (6, 12 or 20 points by |ρ|) of Plackett's integral over θ = arcsin r; for |ρ| ≥ 0.925 the singularity at
/// |r| = 1 is removed by subtracting a Taylor expansion of the integrand in √(1 − r²) and integrating the smooth
/// remainder. The absolute error is about 1e-15 over the whole range; |ρ| = 1 is exact
/// (Φ(min(h, k)) for ρ = 1 and max(0, Φ(h) + Φ(k) − 1) for ρ = −1).
/// </remarks>
public static class BivariateNormal
{
    private const double TwoPi = 2 * Math.PI;
    private static readonly double[][] Nodes = [Rule(6).Nodes, Rule(12).Nodes, Rule(20).Nodes];
    private static readonly double[][] Weights = [Rule(6).Weights, Rule(12).Weights, Rule(20).Weights];

    /// <summary>Φ₂(h, k; ρ) = P(X₁ ≤ h, X₂ ≤ k).</summary>
    /// <param name="h">Upper bound of X₁; ±∞ allowed; NaN gives NaN.</param>
    /// <param name="k">Upper bound of X₂; ±∞ allowed; NaN gives NaN.</param>
    /// <param name="rho">Correlation in [−1, 1].</param>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="rho"/> is NaN or outside [−1, 1].</exception>
    public static double Cdf(double h, double k, double rho)
    {
        if (!(rho >= -1 && rho <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(rho), rho, "Correlation must lie in [-1, 1].");
        }

        if (double.IsNaN(h) || double.IsNaN(k)) return double.NaN;
        if (h == double.NegativeInfinity || k == double.NegativeInfinity) return 0;
        if (h == double.PositiveInfinity) return StandardNormal.Cdf(k);
        if (k == double.PositiveInfinity) return StandardNormal.Cdf(h);
        return UpperOrthant(-h, -k, rho);
    }

    /// <summary>P(X₁ &gt; h, X₂ &gt; k) = Φ₂(−h, −k; ρ).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="rho"/> is NaN or outside [−1, 1].</exception>
    public static double UpperCdf(double h, double k, double rho) => Cdf(-h, -k, rho);

    /// <summary>The density φ₂(h, k; ρ) for |ρ| &lt; 1.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="rho"/> is NaN or not strictly inside (−1, 1).</exception>
    public static double Pdf(double h, double k, double rho)
    {
        if (!(rho > -1 && rho < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(rho), rho, "The density needs a correlation strictly between -1 and 1.");
        }

        var s = 1 - rho * rho;
        return Math.Exp(-(h * h - 2 * rho * h * k + k * k) / (2 * s)) / (TwoPi * Math.Sqrt(s));
    }

    /// <summary>Genz's BVND: P(X₁ &gt; dh, X₂ &gt; dk) for finite dh, dk.</summary>
    private static double UpperOrthant(double dh, double dk, double r)
    {
        var absR = Math.Abs(r);
        var ng = absR < 0.3 ? 0 : absR < 0.75 ? 1 : 2;
        var x = Nodes[ng];
        var w = Weights[ng];
        var h = dh;
        var k = dk;
        var hk = h * k;
        var bvn = 0.0;

        if (absR < 0.925)
        {
            var hs = (h * h + k * k) / 2;
            var asr = Math.Asin(r);
            // Plackett's integral over θ in [0, asin r], nodes mapped from [0, 1].
            for (var i = 0; i < x.Length; i++)
            {
                var sn = Math.Sin(asr * x[i]);
                bvn += w[i] * Math.Exp((sn * hk - hs) / (1 - sn * sn));
            }

            return bvn * asr / TwoPi + StandardNormal.Ccdf(h) * StandardNormal.Ccdf(k);
        }

        if (r < 0)
        {
            k = -k;
            hk = -hk;
        }

        if (absR < 1)
        {
            var aS = (1 - r) * (1 + r);
            var a = Math.Sqrt(aS);
            var bs = (h - k) * (h - k);
            var c = (4 - hk) / 8;
            var d = (12 - hk) / 16;
            bvn = a * Math.Exp(-(bs / aS + hk) / 2) * (1 - c * (bs - aS) * (1 - d * bs / 5) / 3 + c * d * aS * aS / 5);
            if (hk > -160)
            {
                var b = Math.Sqrt(bs);
                bvn -= Math.Exp(-hk / 2) * Math.Sqrt(TwoPi) * StandardNormal.Cdf(-b / a) * b * (1 - c * bs * (1 - d * bs / 5) / 3);
            }

            // Remainder integrated over x in [0, a] (x = √(1 − r'²)), nodes mapped from [0, 1].
            for (var i = 0; i < x.Length; i++)
            {
                var xs = a * x[i] * (a * x[i]);
                var rs = Math.Sqrt(1 - xs);
                var exponent = -(bs / xs + hk) / 2;
                if (exponent > -100)
                {
                    bvn += a * w[i] * Math.Exp(exponent) * (Math.Exp(-hk * (1 - rs) / (2 * (1 + rs))) / rs - (1 + c * xs * (1 + d * xs)));
                }
            }

            bvn = -bvn / TwoPi;
        }

        if (r > 0)
        {
            return Math.Max(0, bvn + StandardNormal.Ccdf(Math.Max(h, k)));
        }

        bvn = -bvn;
        if (k > h)
        {
            // P(h < X < k) written to avoid cancellation in either tail.
            bvn += h < 0 ? StandardNormal.Cdf(k) - StandardNormal.Cdf(h) : StandardNormal.Ccdf(h) - StandardNormal.Ccdf(k);
        }

        return Math.Max(0, bvn);
    }

    private static (double[] Nodes, double[] Weights) Rule(int order)
    {
        // Gauss–Legendre on [0, 1]; Genz's half-rules with ± nodes are the same full rule.
        var rule = new GaussLegendreRule(0, 1, order);
        return (rule.Abscissas.ToArray(), rule.Weights.ToArray());
    }
}
