using InspectionUpdate.Probability.Numerics;
using MathNet.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>Exponential distribution, optionally shifted: F(x) = 1 − exp(−r(x − x₀)) for x ≥ x₀.</summary>
/// <remarks>Mean x₀ + 1/r, standard deviation 1/r. Closed forms with expm1/log1p in both tails.</remarks>
public sealed class ExponentialVariable : RandomVariable
{
    private ExponentialVariable(string name, double rate, double location) : base(name)
    {
        Rate = rate;
        Location = location;
    }

    /// <summary>Builds from rate r &gt; 0 (1/units of x) and location (shift) x₀ (finite, default 0).</summary>
    public static ExponentialVariable FromParameters(string name, double rate, double location = 0)
    {
        DistributionParameterException.RequirePositive(name, nameof(rate), rate);
        DistributionParameterException.RequireFinite(name, nameof(location), location);
        return new ExponentialVariable(name, rate, location);
    }

    /// <summary>The unshifted exponential with mean μ &gt; 0 (r = 1/μ, x₀ = 0).</summary>
    public static ExponentialVariable FromMean(string name, double mean)
    {
        DistributionParameterException.RequirePositive(name, nameof(mean), mean);
        return new ExponentialVariable(name, 1 / mean, 0);
    }

    /// <summary>The shifted exponential with mean μ (finite) and standard deviation σ &gt; 0: r = 1/σ, x₀ = μ − σ.</summary>
    public static ExponentialVariable FromMeanStd(string name, double mean, double standardDeviation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        return new ExponentialVariable(name, 1 / standardDeviation, mean - standardDeviation);
    }

    /// <summary>The shifted exponential with mean μ (≠ 0) and coefficient of variation V &gt; 0: σ = V|μ| (V = 1 and μ &gt; 0 give no shift).</summary>
    public static ExponentialVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean));
    }

    /// <summary>Rate r (1/units of x).</summary>
    public double Rate { get; }

    /// <summary>Location x₀ (lower bound of the support).</summary>
    public double Location { get; }

    /// <inheritdoc />
    public override string Family => "Exponential";

    /// <inheritdoc />
    public override double Mean => Location + 1 / Rate;

    /// <inheritdoc />
    public override double StandardDeviation => 1 / Rate;

    /// <inheritdoc />
    public override double Pdf(double x) => x < Location ? 0 : Rate * Math.Exp(-Rate * (x - Location));

    /// <inheritdoc />
    public override double Cdf(double x) => x <= Location ? 0 : -ElementaryFunctions.Expm1(-Rate * (x - Location));

    /// <inheritdoc />
    public override double Ccdf(double x) => x <= Location ? 1 : Math.Exp(-Rate * (x - Location));

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 1) return double.PositiveInfinity;
        return Location - ElementaryFunctions.Log1p(-p) / Rate;
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return double.PositiveInfinity;
        return Location - Math.Log(q) / Rate;
    }
}
