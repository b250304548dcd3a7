using System.Runtime.CompilerServices;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// The vector forms of <see cref="FastNormal"/>'s Φ and Φ⁻¹, with the exponential and logarithm they need, for any
/// vector width (<see cref="IVectorLanes{TV}"/>); every lane gets the same operations whatever the width, so the same
/// numbers.
/// </summary>
/// <typeparam name="TV">The vector type.</typeparam>
/// <typeparam name="TL">Its operations.</typeparam>
internal static class FastNormalLanes<TV, TL>
    where TV : struct
    where TL : struct, IVectorLanes<TV>
{
    /// <summary>e^−25: below it AS 241 switches to its second tail form (r = √(−ln p) &gt; 5).</summary>
    private const double FirstTailFormFloor = 1.3887943864964021e-11;

    private static uint AllLanes => (1u << TL.Count) - 1;

    /// <summary>
    /// Φ in every lane: Hart's form above −<see cref="FastNormal.Cutoff"/>, the scalar
    /// <see cref="FastNormal.Cdf(double)"/> for the lanes at or below it (0 at or below −<paramref name="bound"/>).
    /// </summary>
    public static TV Cdf(TV z, double bound)
    {
        // Capped so that z = ±∞ gives exp(−∞)·(finite) = 0 rather than 0·∞/∞.
        var x = TL.Min(TL.Abs(z), TL.Broadcast(40.0));
        var e = Exp(TL.Multiply(TL.Multiply(TL.Broadcast(-0.5), x), x));
        var numerator = Polynomial(x, 0.03526249659989109, 0.7003830644436881, 6.373962203531650, 33.91286607838300, 112.0792914978709, 221.2135961699311, 220.2068679123761);
        var denominator = Polynomial(x, 0.08838834764831844, 1.755667163182642, 16.06417757920695, 86.78073220294608, 296.5642487796737, 637.3336333788311, 793.8265125199484, 440.4137358247522);
        var tail = TL.Divide(TL.Multiply(e, numerator), denominator);
        var result = TL.Select(TL.GreaterThan(z, TL.Broadcast(0.0)), TL.Subtract(TL.Broadcast(1.0), tail), tail);
        // Only the lower tail needs the erfc form: above +Cutoff, Φ = 1 − tail and Hart's absolute error (~1e-15)
        // is all that matters.
        var far = TL.MaskBits(TL.LessThanOrEqual(z, TL.Broadcast(-FastNormal.Cutoff)));
        if (far == 0) return result;
        for (var i = 0; i < TL.Count; i++)
        {
            if ((far & (1u << i)) == 0) continue;
            var zi = TL.Get(z, i);
            result = TL.With(result, i, zi <= -bound ? 0 : zi >= bound ? 1 : FastNormal.Cdf(zi));
        }

        return result;
    }

    /// <summary>
    /// Φ⁻¹ in every lane: AS 241's central and first tail forms in the vector lanes, the scalar
    /// <see cref="FastNormal.InverseCdf(double)"/> for the far tails, all clamped to [−<paramref name="bound"/>,
    /// <paramref name="bound"/>]; p ≤ 0 and p ≥ 1 give ∓bound.
    /// </summary>
    /// <remarks>
    /// Only probabilities below e^−25 ≈ 1.4e-11 or above 1 − e^−25, and invalid ones, go to the scalar code: the
    /// first tail form needs a logarithm, which <see cref="Log"/> takes in the lanes.
    /// </remarks>
    public static TV InverseCdf(TV p, double bound)
    {
        var q = TL.Subtract(p, TL.Broadcast(0.5));
        var r = TL.Subtract(TL.Broadcast(0.180625), TL.Multiply(q, q));
        var central = TL.Divide(
            TL.Multiply(q, Polynomial(r, 2.5090809287301226727e3, 3.3430575583588128105e4, 6.7265770927008700853e4, 4.5921953931549871457e4, 1.3731693765509461125e4, 1.9715909503065514427e3, 1.3314166789178437745e2, 3.3871328727963666080e0)),
            Polynomial(r, 5.2264952788528545610e3, 2.8729085735721942674e4, 3.9307895800092710610e4, 2.1213794301586595867e4, 5.3941960214247511077e3, 6.8718700749205790830e2, 4.2313330701600911252e1, 1.0));
        var lowest = TL.Broadcast(-bound);
        var highest = TL.Broadcast(bound);
        var isCentral = TL.LessThanOrEqual(TL.Abs(q), TL.Broadcast(0.425));
        if (TL.MaskBits(isCentral) == AllLanes) return TL.Min(TL.Max(central, lowest), highest);

        // AS 241's first tail form, r = √(−ln min(p, 1 − p)) ≤ 5, i.e. min(p, 1 − p) ≥ e^−25 ≈ 1.4e-11, in the vector
        // lanes. Central lanes take a harmless argument (0.25) so that no NaN is formed.
        var lower = TL.LessThan(q, TL.Broadcast(0.0));
        var tailProbability = TL.Select(lower, p, TL.Subtract(TL.Broadcast(1.0), p));
        var inTailForm = TL.AndNot(TL.GreaterThanOrEqual(tailProbability, TL.Broadcast(FirstTailFormFloor)), isCentral);
        tailProbability = TL.Select(inTailForm, tailProbability, TL.Broadcast(0.25));
        var t = TL.Subtract(TL.Sqrt(TL.Negate(Log(tailProbability))), TL.Broadcast(1.6));
        var magnitude = TL.Divide(
            Polynomial(t, 7.74545014278341407640e-4, 2.27238449892691845833e-2, 2.41780725177450611770e-1, 1.27045825245236838258e0, 3.64784832476320460504e0, 5.76949722146069140550e0, 4.63033784615654529590e0, 1.42343711074968357734e0),
            Polynomial(t, 1.05075007164441684324e-9, 5.47593808499534494600e-4, 1.51986665636164571966e-2, 1.48103976427480074590e-1, 6.89767334985100004550e-1, 1.67638483018380384940e0, 2.05319162663775882187e0, 1.0));
        var tail = TL.Select(lower, TL.Negate(magnitude), magnitude);
        var result = TL.Min(TL.Max(TL.Select(isCentral, central, tail), lowest), highest);

        // The far tails, p ≤ 0, p ≥ 1 and NaN (all comparisons false) go to the scalar code.
        var scalar = ~TL.MaskBits(TL.Or(isCentral, inTailForm)) & AllLanes;
        if (scalar == 0) return result;
        for (var i = 0; i < TL.Count; i++)
        {
            if ((scalar & (1u << i)) == 0) continue;
            var pi = TL.Get(p, i);
            result = TL.With(result, i, !(pi > 0) ? -bound : !(pi < 1) ? bound : Math.Clamp(FastNormal.InverseCdf(pi), -bound, bound));
        }

        return result;
    }

    /// <summary>
    /// e^x for x ≥ −708 (smaller x are taken as −708, e^−708 ≈ 3e-308), relative error below 5e-16 (checked against
    /// <see cref="Math.Exp"/> in the tests).
    /// </summary>
    /// <remarks>
    /// Cody &amp; Waite's argument reduction, x = n·ln 2 + r with |r| ≤ ln 2 / 2 and ln 2 split in two parts so that
    /// n·ln 2 is exact; e^r by its Taylor polynomial of degree 13 (remainder below r¹⁴/14! ≈ 2e-18), evaluated by
    /// Estrin's scheme for a short dependency chain; then 2^n put into the exponent bits. A little faster than .NET's
    /// vector exponential, which handles the full range and special values this integrand never produces (4.1 against
    /// 5.7 ns per four lanes, 16 against 20 ns along a dependency chain; measured on the benchmark machine).
    /// </remarks>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static TV Exp(TV x)
    {
        x = TL.Max(x, TL.Broadcast(-708.0));
        var n = TL.Round(TL.Multiply(x, TL.Broadcast(1.4426950408889634)));
        var r = TL.MultiplyAdd(n, TL.Broadcast(-6.93147180369123816490e-01), x);
        r = TL.MultiplyAdd(n, TL.Broadcast(-1.90821492927058770002e-10), r);
        var r2 = TL.Multiply(r, r);
        var r4 = TL.Multiply(r2, r2);
        var c01 = TL.Add(r, TL.Broadcast(1.0));
        var c23 = Polynomial(r, 1.0 / 6, 0.5);
        var c45 = Polynomial(r, 1.0 / 120, 1.0 / 24);
        var c67 = Polynomial(r, 1.0 / 5040, 1.0 / 720);
        var c89 = Polynomial(r, 1.0 / 362880, 1.0 / 40320);
        var c1011 = Polynomial(r, 1.0 / 39916800, 1.0 / 3628800);
        var c1213 = Polynomial(r, 1.0 / 6227020800, 1.0 / 479001600);
        var c03 = TL.MultiplyAdd(r2, c23, c01);
        var c47 = TL.MultiplyAdd(r2, c67, c45);
        var c811 = TL.MultiplyAdd(r2, c1011, c89);
        var c07 = TL.MultiplyAdd(r4, c47, c03);
        var c813 = TL.MultiplyAdd(r4, c1213, c811);
        var polynomial = TL.MultiplyAdd(TL.Multiply(r4, r4), c813, c07);
        // n ≥ −1022 after the clamp, so 2^n is a normal number.
        return TL.Multiply(polynomial, TL.TwoToThe(n));
    }

    /// <summary>
    /// ln x for positive normal x (other arguments give meaningless values, which the callers mask out), relative error
    /// about 2e-16 (checked against <see cref="Math.Log(double)"/> in the tests).
    /// </summary>
    /// <remarks>
    /// x = 2^e·m with m in [√½, √2); ln m = 2 atanh(s), s = (m − 1)/(m + 1), |s| ≤ 0.172, by its series to s²¹
    /// (remainder below s²³/23 ≈ 2e-19 relative); ln x = e·ln 2 + ln m with ln 2 in two parts.
    /// </remarks>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static TV Log(TV x)
    {
        var exponent = TL.SplitExponent(x, out var mantissa);
        var high = TL.GreaterThan(mantissa, TL.Broadcast(1.4142135623730951));
        mantissa = TL.Select(high, TL.Multiply(mantissa, TL.Broadcast(0.5)), mantissa);
        var e = TL.Add(exponent, TL.And(high, TL.Broadcast(1.0)));
        var s = TL.Divide(TL.Subtract(mantissa, TL.Broadcast(1.0)), TL.Add(mantissa, TL.Broadcast(1.0)));
        var z = TL.Multiply(s, s);
        var z2 = TL.Multiply(z, z);
        var z4 = TL.Multiply(z2, z2);
        // Coefficients 1/(2k + 1), k = 0 … 10.
        var c01 = Polynomial(z, 1.0 / 3, 1.0);
        var c23 = Polynomial(z, 1.0 / 7, 1.0 / 5);
        var c45 = Polynomial(z, 1.0 / 11, 1.0 / 9);
        var c67 = Polynomial(z, 1.0 / 15, 1.0 / 13);
        var c89 = Polynomial(z, 1.0 / 19, 1.0 / 17);
        var c03 = TL.MultiplyAdd(z2, c23, c01);
        var c47 = TL.MultiplyAdd(z2, c67, c45);
        var c8 = TL.MultiplyAdd(z2, TL.Broadcast(1.0 / 21), c89);
        var series = TL.MultiplyAdd(TL.Multiply(z4, z4), c8, TL.MultiplyAdd(z4, c47, c03));
        var lnM = TL.Multiply(TL.Multiply(TL.Broadcast(2.0), s), series);
        return TL.MultiplyAdd(e, TL.Broadcast(6.93147180369123816490e-01), TL.MultiplyAdd(e, TL.Broadcast(1.90821492927058770002e-10), lnM));
    }

    /// <summary>c₁·x + c₀ (coefficients from the highest power down).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c1, double c0) => TL.MultiplyAdd(x, TL.Broadcast(c1), TL.Broadcast(c0));

    /// <summary>Horner's scheme for a polynomial of degree 6, coefficients from the highest power down.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c6, double c5, double c4, double c3, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c6, c5, c4, c3, c2, c1), x, TL.Broadcast(c0));

    /// <summary>Horner's scheme for a polynomial of degree 7, coefficients from the highest power down.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c7, double c6, double c5, double c4, double c3, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c7, c6, c5, c4, c3, c2, c1), x, TL.Broadcast(c0));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c5, double c4, double c3, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c5, c4, c3, c2, c1), x, TL.Broadcast(c0));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c4, double c3, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c4, c3, c2, c1), x, TL.Broadcast(c0));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c3, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c3, c2, c1), x, TL.Broadcast(c0));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static TV Polynomial(TV x, double c2, double c1, double c0) =>
        TL.MultiplyAdd(Polynomial(x, c2, c1), x, TL.Broadcast(c0));
}
