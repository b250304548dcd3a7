using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>Continuous uniform distribution on [a, b].</summary>
/// <remarks>Mean (a + b)/2, standard deviation (b − a)/√12. The upper tail is measured from b, so 1 − F keeps its precision.</remarks>
public sealed class UniformVariable : RandomVariable
{
    private UniformVariable(string name, double lower, double upper) : base(name)
    {
        Lower = lower;
        Upper = upper;
    }

    /// <summary>Builds from finite bounds a &lt; b.</summary>
    public static UniformVariable FromBounds(string name, double lower, double upper)
    {
        DistributionParameterException.RequireFinite(name, nameof(lower), lower);
        DistributionParameterException.RequireFinite(name, nameof(upper), upper);
        DistributionParameterException.RequireOrdered(name, nameof(lower), lower, nameof(upper), upper);
        return new UniformVariable(name, lower, upper);
    }

    /// <summary>Builds from mean (finite) and standard deviation &gt; 0: a, b = μ ∓ √3σ.</summary>
    public static UniformVariable FromMeanStd(string name, double mean, double standardDeviation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        var h = Math.Sqrt(3) * standardDeviation;
        return new UniformVariable(name, mean - h, mean + h);
    }

    /// <summary>Builds from mean (≠ 0) and coefficient of variation V &gt; 0: σ = V|μ|.</summary>
    public static UniformVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean));
    }

    /// <summary>Lower bound a.</summary>
    public double Lower { get; }

    /// <summary>Upper bound b.</summary>
    public double Upper { get; }

    /// <inheritdoc />
    public override string Family => "Uniform";

    /// <inheritdoc />
    public override double Mean => 0.5 * (Lower + Upper);

    /// <inheritdoc />
    public override double StandardDeviation => (Upper - Lower) / Math.Sqrt(12);

    /// <inheritdoc />
    public override double Pdf(double x) => x < Lower || x > Upper ? 0 : 1 / (Upper - Lower);

    /// <inheritdoc />
    public override double Cdf(double x) => x <= Lower ? 0 : x >= Upper ? 1 : (x - Lower) / (Upper - Lower);

    /// <inheritdoc />
    public override double Ccdf(double x) => x <= Lower ? 1 : x >= Upper ? 0 : (Upper - x) / (Upper - Lower);

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        return p <= 0.5 ? Lower + p * (Upper - Lower) : Upper - (1 - p) * (Upper - Lower);
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        return q <= 0.5 ? Upper - q * (Upper - Lower) : Lower + (1 - q) * (Upper - Lower);
    }
}
