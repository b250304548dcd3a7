namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Regularized incomplete gamma functions P(a, y) and Q(a, y) with relative accuracy in both tails, for a shape
/// whose ln Γ(a) is computed once by the caller.
/// </summary>
/// <remarks>
/// Below y = a + 1 the power series P(a, y) = y^a e^(−y)/Γ(a + 1) · Σₙ yⁿ/((a + 1)…(a + n))
/// (Abramowitz &amp; Stegun 6.5.29) converges with ratio y/(a + n) &lt; 1; above it the continued fraction
/// Q(a, y) = y^a e^(−y)/Γ(a) · 1/(y + 1 − a − 1(1 − a)/(y + 3 − a − 2(2 − a)/(y + 5 − a − …))) (A&amp;S 6.5.31, Legendre's
/// form) is evaluated by the modified Lentz method (Lentz 1976; Thompson &amp; Barnett 1986). Each is used on the side
/// where it is the smaller tail, so neither cancels. MathNet.Numerics 5.0.0 is not used here because its P(a, y)
/// returns 0 for every y below about 5e−15 (P(0.4, 1e−15) ≈ 1.1e−6) and because it recomputes ln Γ(a) on every call.
/// </remarks>
internal readonly struct IncompleteGamma
{
    private readonly double _a;
    private readonly double _lnGammaA;

    /// <summary>Prepares the functions for shape a &gt; 0.</summary>
    public IncompleteGamma(double a)
    {
        _a = a;
        _lnGammaA = MathNet.Numerics.SpecialFunctions.GammaLn(a);
    }

    /// <summary>ln Γ(a).</summary>
    public double LnGammaA => _lnGammaA;

    /// <summary>P(a, y) for y ≥ 0.</summary>
    public double Lower(double y)
    {
        if (y <= 0) return 0;
        if (double.IsPositiveInfinity(y)) return 1;
        return y < _a + 1 ? Series(y) : 1 - ContinuedFraction(y);
    }

    /// <summary>Q(a, y) = 1 − P(a, y) for y ≥ 0.</summary>
    public double Upper(double y)
    {
        if (y <= 0) return 1;
        if (double.IsPositiveInfinity(y)) return 0;
        return y < _a + 1 ? 1 - Series(y) : ContinuedFraction(y);
    }

    /// <summary>y^a e^(−y)/Γ(a): y times the unit-rate gamma density at y.</summary>
    public double ScaledDensity(double y) => Math.Exp(_a * Math.Log(y) - y - _lnGammaA);

    private double Series(double y)
    {
        var sum = 1.0;
        var term = 1.0;
        for (var n = 1; n < 100_000; n++)
        {
            term *= y / (_a + n);
            sum += term;
            if (term < sum * 1e-17) break;
        }

        // 1/Γ(a + 1) = 1/(a Γ(a)).
        return Math.Exp(_a * Math.Log(y) - y - _lnGammaA) / _a * sum;
    }

    private double ContinuedFraction(double y)
    {
        const double tiny = 1e-300;
        var b = y + 1 - _a;
        var c = 1 / tiny;
        var d = 1 / b;
        var h = d;
        for (var i = 1; i < 100_000; i++)
        {
            var an = -i * (i - _a);
            b += 2;
            d = an * d + b;
            if (Math.Abs(d) < tiny) d = tiny;
            c = b + an / c;
            if (Math.Abs(c) < tiny) c = tiny;
            d = 1 / d;
            var delta = d * c;
            h *= delta;
            if (Math.Abs(delta - 1) < 1e-16) break;
        }

        return Math.Exp(_a * Math.Log(y) - y - _lnGammaA) * h;
    }
}
