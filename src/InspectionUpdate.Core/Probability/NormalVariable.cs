namespace InspectionUpdate.Probability;

/// <summary>Normal (Gaussian) random variable N(μ, σ).</summary>
public sealed class NormalVariable : RandomVariable
{
    /// <summary>Creates N(mean, standardDeviation).</summary>
    /// <exception cref="DistributionParameterException">mean not finite, or standard deviation not finite and &gt; 0.</exception>
    public NormalVariable(string name, double mean, double standardDeviation) : base(name)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        Mean = mean;
        StandardDeviation = standardDeviation;
    }

    /// <summary>Creates N(μ, V·|μ|) from the mean (≠ 0) and the coefficient of variation V &gt; 0.</summary>
    /// <exception cref="DistributionParameterException">mean not finite or 0, or V not finite and &gt; 0.</exception>
    public static NormalVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return new NormalVariable(name, mean, coefficientOfVariation * Math.Abs(mean));
    }

    /// <inheritdoc />
    public override string Family => "Normal";

    /// <inheritdoc />
    public override double Mean { get; }

    /// <inheritdoc />
    public override double StandardDeviation { get; }

    /// <inheritdoc />
    public override double Pdf(double x) => StandardNormal.Pdf((x - Mean) / StandardDeviation) / StandardDeviation;

    /// <inheritdoc />
    public override double Cdf(double x) => StandardNormal.Cdf((x - Mean) / StandardDeviation);

    /// <inheritdoc />
    public override double Ccdf(double x) => StandardNormal.Ccdf((x - Mean) / StandardDeviation);

    /// <inheritdoc />
    /// <remarks>
    /// x = μ + σu directly where Φ(u) is representable (|u| ≤ 37); beyond, the base map's saturation to the
    /// distribution's ends is kept, so a search that runs far out behaves as before.
    /// </remarks>
    public override double FromStandardNormal(double u) => Math.Abs(u) <= 37 ? Mean + StandardDeviation * u : base.FromStandardNormal(u);

    /// <inheritdoc />
    public override double InverseCdf(double p) => Mean + StandardDeviation * StandardNormal.InverseCdf(p);

    /// <inheritdoc />
    public override double InverseCcdf(double q) => Mean + StandardDeviation * StandardNormal.InverseCcdf(q);
}
