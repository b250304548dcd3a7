namespace InspectionUpdate.Probability;

/// <summary>
/// The standard normal distribution Φ, accurate in both tails.
/// </summary>
/// <remarks>
/// The CDF uses the complementary error function, so Φ(−38) and Q(38) keep full relative precision;
/// the inverse uses MathNet's erfc⁻¹, which is accurate for probabilities down to the smallest doubles.
/// </remarks>
public static class StandardNormal
{
    private const double InvSqrt2 = 0.70710678118654752440;
    private const double InvSqrt2Pi = 0.39894228040143267794;

    /// <summary>Density φ(u).</summary>
    public static double Pdf(double u) => InvSqrt2Pi * Math.Exp(-0.5 * u * u);

    /// <summary>Φ(u) = P(U ≤ u); Φ(−∞) = 0, Φ(+∞) = 1, NaN → NaN.</summary>
    public static double Cdf(double u) => 0.5 * CodyErfc.Erfc(-u * InvSqrt2);

    /// <summary>Q(u) = 1 − Φ(u) = Φ(−u), without cancellation for large u.</summary>
    public static double Ccdf(double u) => 0.5 * CodyErfc.Erfc(u * InvSqrt2);

    /// <summary>Φ⁻¹(p) for p in [0, 1]; returns −∞ at 0 and +∞ at 1.</summary>
    /// <exception cref="ArgumentOutOfRangeException">p is NaN or outside [0, 1].</exception>
    public static double InverseCdf(double p)
    {
        if (!(p >= 0 && p <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, "Probability must lie in [0, 1].");
        }

        if (p == 0) return double.NegativeInfinity;
        if (p == 1) return double.PositiveInfinity;
        return -Math.Sqrt(2) * MathNet.Numerics.SpecialFunctions.ErfcInv(2 * p);
    }

    /// <summary>Q⁻¹(q) = −Φ⁻¹(q): the u whose upper-tail probability is q, accurate for tiny q.</summary>
    public static double InverseCcdf(double q) => -InverseCdf(q);
}
