using InspectionUpdate.Probability;

namespace InspectionUpdate.Inspection;

/// <summary>How a sizing error combines with the true size.</summary>
public enum SizingErrorKind
{
    /// <summary>a_m = a + ε, ε ~ N(bias, σ) in mm.</summary>
    AdditiveNormal,

    /// <summary>a_m = a·ε, ln ε ~ N(ln-bias, σ_ln) (dimensionless).</summary>
    MultiplicativeLognormal,
}

/// <summary>Sizing error of a method. For additive errors Bias and StandardDeviation are in mm; for multiplicative errors they are of ln ε.</summary>
public sealed record SizingError(SizingErrorKind Kind, double Bias, double StandardDeviation)
{
    /// <summary>Additive normal error a_m = a + ε, ε ~ N(biasMm, standardDeviationMm), validated.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The bias is not finite, or the standard deviation not finite and &gt; 0.</exception>
    public static SizingError AdditiveNormal(double biasMm, double standardDeviationMm)
    {
        Validate(biasMm, nameof(biasMm), standardDeviationMm, nameof(standardDeviationMm));
        return new SizingError(SizingErrorKind.AdditiveNormal, biasMm, standardDeviationMm);
    }

    /// <summary>Multiplicative lognormal error a_m = a·ε, ln ε ~ N(lnBias, lnStandardDeviation), validated; e^lnBias is the median ratio.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The bias is not finite, or the standard deviation not finite and &gt; 0.</exception>
    public static SizingError MultiplicativeLognormal(double lnBias, double lnStandardDeviation)
    {
        Validate(lnBias, nameof(lnBias), lnStandardDeviation, nameof(lnStandardDeviation));
        return new SizingError(SizingErrorKind.MultiplicativeLognormal, lnBias, lnStandardDeviation);
    }

    private static void Validate(double bias, string biasName, double sd, string sdName)
    {
        if (!double.IsFinite(bias))
        {
            throw new ArgumentOutOfRangeException(biasName, bias, "The sizing bias must be finite.");
        }

        if (!double.IsFinite(sd) || sd <= 0)
        {
            throw new ArgumentOutOfRangeException(sdName, sd, "The sizing standard deviation must be finite and > 0.");
        }
    }

    /// <summary>The error ε as a random variable named <paramref name="name"/>.</summary>
    public RandomVariable ErrorVariable(string name) => Kind == SizingErrorKind.AdditiveNormal
        ? new NormalVariable(name, Bias, StandardDeviation)
        : LognormalVariable.FromLogParameters(name, Bias, StandardDeviation);

    /// <summary>The measured size for a true size and an error value.</summary>
    public double Measured(double trueSizeMm, double error) =>
        Kind == SizingErrorKind.AdditiveNormal ? trueSizeMm + error : trueSizeMm * error;
}
