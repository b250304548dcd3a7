namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// exp(x) − 1 and ln(1 + x) with full relative precision near x = 0.
/// </summary>
/// <remarks>
/// MathNet.Numerics 5.0.0's Expm1 truncates its series (Expm1(ln 1.01) = 0.009999999999186, a relative error of
/// 8e−11), and .NET's double.ExpM1/LogP1 compute exp(x) − 1 and ln(1 + x) directly. These use Kahan's
/// compensations (Goldberg 1991, "What every computer scientist should know about floating-point arithmetic",
/// Theorem 4 for ln(1 + x); the analogous form for exp(x) − 1), accurate to a few ulps.
/// </remarks>
internal static class ElementaryFunctions
{
    /// <summary>exp(x) − 1.</summary>
    public static double Expm1(double x)
    {
        if (Math.Abs(x) > 0.5) return Math.Exp(x) - 1;
        var u = Math.Exp(x);
        if (u == 1) return x;
        var um1 = u - 1;
        return um1 * x / Math.Log(u);
    }

    /// <summary>ln(1 + x) for x &gt; −1.</summary>
    public static double Log1p(double x)
    {
        var u = 1 + x;
        if (u == 1) return x;
        return Math.Abs(x) > 0.5 ? Math.Log(u) : Math.Log(u) * x / (u - 1);
    }
}
