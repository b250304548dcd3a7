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
    /// <summary>The error ε as a random variable named <paramref name="name"/>.</summary>
    public RandomVariable ErrorVariable(string name) => Kind == SizingErrorKind.AdditiveNormal
        ? new NormalVariable(name, Bias, StandardDeviation)
        : LognormalVariable.FromLogParameters(name, Bias, StandardDeviation);

    /// <summary>The measured size for a true size and an error value.</summary>
    public double Measured(double trueSizeMm, double error) =>
        Kind == SizingErrorKind.AdditiveNormal ? trueSizeMm + error : trueSizeMm * error;
}
