using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>Lognormal random variable: ln X ~ N(λ, ζ).</summary>
public sealed class LognormalVariable : RandomVariable
{
    private LognormalVariable(string name, double lambda, double zeta) : base(name)
    {
        Lambda = lambda;
        Zeta = zeta;
    }

    /// <summary>Builds from mean and standard deviation of X (both &gt; 0): ζ² = ln(1 + V²), λ = ln μ − ζ²/2.</summary>
    public static LognormalVariable FromMeanStd(string name, double mean, double standardDeviation)
    {
        DistributionParameterException.RequirePositive(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        var v = standardDeviation / mean;
        var zeta2 = ElementaryFunctions.Log1p(v * v); // ln(1 + V²) without losing V² to rounding for small V
        return new LognormalVariable(name, Math.Log(mean) - 0.5 * zeta2, Math.Sqrt(zeta2));
    }

    /// <summary>Builds from the mean and coefficient of variation of X.</summary>
    public static LognormalVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequirePositive(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        return FromMeanStd(name, mean, mean * coefficientOfVariation);
    }

    /// <summary>Builds from the parameters of ln X: λ (mean of ln X) and ζ (standard deviation of ln X, &gt; 0).</summary>
    public static LognormalVariable FromLogParameters(string name, double lambda, double zeta)
    {
        DistributionParameterException.RequireFinite(name, nameof(lambda), lambda);
        DistributionParameterException.RequirePositive(name, nameof(zeta), zeta);
        return new LognormalVariable(name, lambda, zeta);
    }

    /// <summary>Mean of ln X.</summary>
    public double Lambda { get; }

    /// <summary>Standard deviation of ln X.</summary>
    public double Zeta { get; }

    /// <inheritdoc />
    public override string Family => "Lognormal";

    /// <inheritdoc />
    public override double Mean => Math.Exp(Lambda + 0.5 * Zeta * Zeta);

    /// <inheritdoc />
    public override double StandardDeviation => Mean * Math.Sqrt(ElementaryFunctions.Expm1(Zeta * Zeta));

    /// <inheritdoc />
    public override double Pdf(double x) =>
        x <= 0 ? 0 : StandardNormal.Pdf((Math.Log(x) - Lambda) / Zeta) / (Zeta * x);

    /// <inheritdoc />
    public override double Cdf(double x) => x <= 0 ? 0 : StandardNormal.Cdf((Math.Log(x) - Lambda) / Zeta);

    /// <inheritdoc />
    public override double Ccdf(double x) => x <= 0 ? 1 : StandardNormal.Ccdf((Math.Log(x) - Lambda) / Zeta);

    /// <inheritdoc />
    /// <remarks>
    /// x = exp(λ + ζu) directly where Φ(u) is representable (|u| ≤ 37); beyond, the base map's saturation to the
    /// distribution's ends is kept, so a search that runs far out behaves as before.
    /// </remarks>
    public override double FromStandardNormal(double u) => Math.Abs(u) <= 37 ? Math.Exp(Lambda + Zeta * u) : base.FromStandardNormal(u);

    /// <inheritdoc />
    public override double InverseCdf(double p) => Math.Exp(Lambda + Zeta * StandardNormal.InverseCdf(p));

    /// <inheritdoc />
    public override double InverseCcdf(double q) => Math.Exp(Lambda + Zeta * StandardNormal.InverseCcdf(q));
}
