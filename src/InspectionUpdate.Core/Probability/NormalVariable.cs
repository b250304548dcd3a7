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
    public override double InverseCdf(double p) => Mean + StandardDeviation * StandardNormal.InverseCdf(p);

    /// <inheritdoc />
    public override double InverseCcdf(double q) => Mean + StandardDeviation * StandardNormal.InverseCcdf(q);
}
