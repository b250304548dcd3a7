using MathNet.Numerics;

namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Regularized incomplete gamma functions P(a, y) and Q(a, y) with relative accuracy in both tails.
/// </summary>
/// <remarks>
/// MathNet.Numerics 5.0.0 returns P(a, y) = 0 for y below about 5e−15 whatever a is (so P(0.4, 1e−15) ≈ 1.1e−6
/// comes out as 0). Below y = a + 1 this class sums the power series
/// P(a, y) = y^a e^(−y)/Γ(a + 1) · Σₙ yⁿ/((a + 1)…(a + n)) (Abramowitz &amp; Stegun 6.5.29), which converges
/// there with ratio y/(a + n) &lt; 1; above it uses MathNet's continued fraction for Q, which is accurate in the
/// upper tail.
/// </remarks>
internal static class IncompleteGamma
{
    /// <summary>P(a, y) for a &gt; 0, y ≥ 0.</summary>
    public static double Lower(double a, double y)
    {
        if (y <= 0) return 0;
        if (double.IsPositiveInfinity(y)) return 1;
        return y < a + 1 ? Series(a, y) : 1 - SpecialFunctions.GammaUpperRegularized(a, y);
    }

    /// <summary>Q(a, y) = 1 − P(a, y) for a &gt; 0, y ≥ 0.</summary>
    public static double Upper(double a, double y)
    {
        if (y <= 0) return 1;
        if (double.IsPositiveInfinity(y)) return 0;
        return y < a + 1 ? 1 - Series(a, y) : SpecialFunctions.GammaUpperRegularized(a, y);
    }

    private static double Series(double a, double y)
    {
        var sum = 1.0;
        var term = 1.0;
        for (var n = 1; n < 100_000; n++)
        {
            term *= y / (a + n);
            sum += term;
            if (term < sum * 1e-17) break;
        }

        return Math.Exp(a * Math.Log(y) - y - SpecialFunctions.GammaLn(a + 1)) * sum;
    }
}
