using MathNet.Numerics;

namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>
/// Moments of a two-parameter Weibull distribution of stress ranges, F(s) = 1 − exp(−(s/q)^h), as used for the
/// long-term stress-range distribution of offshore structures.
/// </summary>
public static class WeibullStressRanges
{
    /// <summary>E[Δσ^m] = q^m Γ(1 + m/h) (JCSS Probabilistic Model Code, Part 3, fatigue models).</summary>
    /// <param name="scaleMPa">Weibull scale q (MPa), &gt; 0.</param>
    /// <param name="shape">Weibull shape h, &gt; 0.</param>
    /// <param name="exponent">Exponent m, ≥ 0.</param>
    public static double Moment(double scaleMPa, double shape, double exponent)
    {
        Validate(scaleMPa, shape, exponent);
        return Math.Exp(exponent * Math.Log(scaleMPa) + SpecialFunctions.GammaLn(1 + exponent / shape));
    }

    /// <summary>Partial moment E[Δσ^m; Δσ &lt; s] = q^m γ(1 + m/h, (s/q)^h), γ the lower incomplete gamma function.</summary>
    public static double MomentBelow(double scaleMPa, double shape, double exponent, double thresholdMPa)
    {
        Validate(scaleMPa, shape, exponent);
        if (!(thresholdMPa > 0)) return 0;
        var z = Math.Pow(thresholdMPa / scaleMPa, shape);
        return Math.Pow(scaleMPa, exponent) * LowerIncomplete(1 + exponent / shape, z);
    }

    /// <summary>Partial moment E[Δσ^m; Δσ ≥ s] = q^m Γ(1 + m/h, (s/q)^h), Γ(·,·) the upper incomplete gamma function.</summary>
    public static double MomentAbove(double scaleMPa, double shape, double exponent, double thresholdMPa)
    {
        Validate(scaleMPa, shape, exponent);
        if (!(thresholdMPa > 0)) return Moment(scaleMPa, shape, exponent);
        var z = Math.Pow(thresholdMPa / scaleMPa, shape);
        return Math.Pow(scaleMPa, exponent) * UpperIncomplete(1 + exponent / shape, z);
    }

    /// <summary>γ(a, z) unregularized, 0 at z = 0.</summary>
    internal static double LowerIncomplete(double a, double z) =>
        z <= 0 ? 0 : double.IsPositiveInfinity(z) ? SpecialFunctions.Gamma(a) : SpecialFunctions.GammaLowerRegularized(a, z) * SpecialFunctions.Gamma(a);

    /// <summary>Γ(a, z) unregularized, Γ(a) at z = 0.</summary>
    internal static double UpperIncomplete(double a, double z) =>
        z <= 0 ? SpecialFunctions.Gamma(a) : double.IsPositiveInfinity(z) ? 0 : SpecialFunctions.GammaUpperRegularized(a, z) * SpecialFunctions.Gamma(a);

    private static void Validate(double scaleMPa, double shape, double exponent)
    {
        if (!(double.IsFinite(scaleMPa) && scaleMPa > 0)) throw new ArgumentOutOfRangeException(nameof(scaleMPa), scaleMPa, "The Weibull scale must be finite and > 0.");
        if (!(double.IsFinite(shape) && shape > 0)) throw new ArgumentOutOfRangeException(nameof(shape), shape, "The Weibull shape must be finite and > 0.");
        if (!(double.IsFinite(exponent) && exponent >= 0)) throw new ArgumentOutOfRangeException(nameof(exponent), exponent, "The exponent must be finite and ≥ 0.");
    }

    /// <summary>The scale q = Δσ₀/(ln n₀)^(1/h) of the Weibull distribution whose range Δσ₀ is exceeded once in n₀ cycles.</summary>
    public static double ScaleFromReferenceRange(double referenceRangeMPa, double cyclesInReferencePeriod, double shape)
    {
        if (!(double.IsFinite(referenceRangeMPa) && referenceRangeMPa > 0)) throw new ArgumentOutOfRangeException(nameof(referenceRangeMPa), referenceRangeMPa, "Must be finite and > 0.");
        if (!(cyclesInReferencePeriod > 1)) throw new ArgumentOutOfRangeException(nameof(cyclesInReferencePeriod), cyclesInReferencePeriod, "Must exceed 1.");
        if (!(double.IsFinite(shape) && shape > 0)) throw new ArgumentOutOfRangeException(nameof(shape), shape, "Must be finite and > 0.");
        return referenceRangeMPa / Math.Pow(Math.Log(cyclesInReferencePeriod), 1 / shape);
    }
}
