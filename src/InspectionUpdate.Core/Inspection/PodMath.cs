namespace InspectionUpdate.Inspection;

/// <summary>Small numerical helpers shared by the PoD forms and the fits.</summary>
internal static class PodMath
{
    /// <summary>ln(1 + x) without cancellation for small |x| (Goldberg 1991, "What every computer scientist should know about floating-point arithmetic", Theorem 4).</summary>
    public static double Log1p(double x)
    {
        var u = 1.0 + x;
        return u == 1.0 ? x : Math.Log(u) * x / (u - 1.0);
    }

    /// <summary>e^x − 1 without cancellation for small |x| (Kahan's formula; MathNet's Expm1 loses about 1e−10 relative).</summary>
    public static double Expm1(double x)
    {
        var u = Math.Exp(x);
        if (u == 1.0)
        {
            return x;
        }

        var um1 = u - 1.0;
        return um1 == -1.0 ? -1.0 : um1 * x / Math.Log(u);
    }

    /// <summary>Λ(z) = 1/(1 + e^−z) without cancellation in either tail.</summary>
    public static double Logistic(double z) => z >= 0 ? 1 / (1 + Math.Exp(-z)) : Math.Exp(z) / (1 + Math.Exp(z));

    /// <summary>ln Φ(z), accurate for very negative z (asymptotic series where Φ underflows).</summary>
    public static double LogNormalCdf(double z)
    {
        if (z > -30)
        {
            return Math.Log(Probability.StandardNormal.Cdf(z));
        }

        // Φ(z) ≈ φ(z)/(−z)·(1 − 1/z² + 3/z⁴) for z → −∞ (Abramowitz & Stegun 26.2.12).
        var z2 = z * z;
        return -0.5 * z2 - 0.5 * Math.Log(2 * Math.PI) - Math.Log(-z) + Math.Log(1 - 1 / z2 + 3 / (z2 * z2));
    }

    /// <summary>Inverse Mills ratio φ(z)/Φ(z), stable for very negative z.</summary>
    public static double InverseMills(double z)
    {
        if (z > -30)
        {
            return Probability.StandardNormal.Pdf(z) / Probability.StandardNormal.Cdf(z);
        }

        var z2 = z * z;
        return -z / (1 - 1 / z2 + 3 / (z2 * z2));
    }
}
