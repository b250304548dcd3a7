namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Standard normal probability of an interval, ∫ φ over [a, b], with full relative precision even when the
/// interval is narrow or lies far in a tail.
/// </summary>
/// <remarks>
/// A difference Φ(b) − Φ(a) cancels when b is close to a; there the integral is done directly by 16-point
/// Gauss–Legendre quadrature (φ varies by at most a factor e^1.5 over such an interval, so the rule is exact to
/// rounding). Otherwise the difference is taken of the tail that is smaller on that side (Q for a ≥ 0, Φ for
/// b ≤ 0), so neither term is close to 1.
/// </remarks>
internal static class NormalIntervalMass
{
    private static readonly double[] Nodes;
    private static readonly double[] Weights;

    static NormalIntervalMass()
    {
        var rule = new MathNet.Numerics.Integration.GaussLegendreRule(-1, 1, 16);
        Nodes = rule.Abscissas;
        Weights = rule.Weights;
    }

    /// <summary>∫ φ over [a, a + width] for a finite a and width ≥ 0.</summary>
    public static double FromLower(double a, double width)
    {
        var b = a + width;
        return IsNarrow(a, b, width) ? Quadrature(a, width) : Between(a, b);
    }

    /// <summary>∫ φ over [b − width, b], width ≥ 0.</summary>
    public static double ToUpper(double b, double width)
    {
        var a = b - width;
        return IsNarrow(a, b, width) ? Quadrature(a, width) : Between(a, b);
    }

    /// <summary>∫ φ over [a, b] for a ≤ b (either may be infinite).</summary>
    public static double Between(double a, double b)
    {
        if (!(b > a)) return 0;
        var width = b - a;
        if (IsNarrow(a, b, width)) return Quadrature(a, width);
        if (a >= 0) return StandardNormal.Ccdf(a) - StandardNormal.Ccdf(b);
        if (b <= 0) return StandardNormal.Cdf(b) - StandardNormal.Cdf(a);
        return 1 - StandardNormal.Cdf(a) - StandardNormal.Ccdf(b);
    }

    private static bool IsNarrow(double a, double b, double width) =>
        double.IsFinite(width) && width * Math.Max(1, Math.Max(Math.Abs(a), Math.Abs(b))) <= 1;

    private static double Quadrature(double a, double width)
    {
        var half = 0.5 * width;
        var mid = a + half;
        var s = 0.0;
        for (var i = 0; i < Nodes.Length; i++) s += Weights[i] * StandardNormal.Pdf(mid + half * Nodes[i]);
        return s * half;
    }
}
