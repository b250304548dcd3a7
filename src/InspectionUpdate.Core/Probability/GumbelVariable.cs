using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// Gumbel (type I extreme value) distribution of largest values: F(x) = exp(−exp(−(x − u)/β)).
/// </summary>
/// <remarks>
/// Mean u + γβ (γ = 0.5772156649…, Euler's constant), standard deviation πβ/√6 (Johnson, Kotz &amp; Balakrishnan,
/// Continuous Univariate Distributions, vol. 2, ch. 22). Both tails use expm1/log1p forms, so F and 1 − F keep their
/// relative precision down to the smallest doubles.
/// </remarks>
public sealed class GumbelVariable : RandomVariable
{
    /// <summary>Euler–Mascheroni constant γ.</summary>
    internal const double EulerGamma = 0.57721566490153286061;

    private GumbelVariable(string name, double location, double scale) : base(name)
    {
        Location = location;
        Scale = scale;
    }

    /// <summary>Builds from the native parameters: location u (the mode, finite) and scale β (&gt; 0).</summary>
    /// <exception cref="DistributionParameterException">location not finite, or scale not finite and &gt; 0.</exception>
    public static GumbelVariable FromParameters(string name, double location, double scale)
    {
        DistributionParameterException.RequireFinite(name, nameof(location), location);
        DistributionParameterException.RequirePositive(name, nameof(scale), scale);
        return new GumbelVariable(name, location, scale);
    }

    /// <summary>Builds from mean (finite) and standard deviation (&gt; 0): β = σ√6/π, u = μ − γβ.</summary>
    public static GumbelVariable FromMeanStd(string name, double mean, double standardDeviation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        var scale = standardDeviation * Math.Sqrt(6) / Math.PI;
        return new GumbelVariable(name, mean - EulerGamma * scale, scale);
    }

    /// <summary>Builds from mean (finite, ≠ 0) and coefficient of variation (&gt; 0): σ = V·|μ|.</summary>
    public static GumbelVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean));
    }

    /// <summary>Location u (the mode).</summary>
    public double Location { get; }

    /// <summary>Scale β &gt; 0.</summary>
    public double Scale { get; }

    /// <inheritdoc />
    public override string Family => "Gumbel";

    /// <inheritdoc />
    public override double Mean => Location + EulerGamma * Scale;

    /// <inheritdoc />
    public override double StandardDeviation => Math.PI * Scale / Math.Sqrt(6);

    /// <inheritdoc />
    public override double Pdf(double x)
    {
        var y = (x - Location) / Scale;
        if (y < -700) return 0; // exp(−y) overflows; the density is exp(−y − e^{−y}) = 0 there.
        var e = Math.Exp(-y);
        return Math.Exp(-y - e) / Scale;
    }

    /// <inheritdoc />
    public override double Cdf(double x) => Math.Exp(-Math.Exp(-(x - Location) / Scale));

    /// <inheritdoc />
    public override double Ccdf(double x) => -ElementaryFunctions.Expm1(-Math.Exp(-(x - Location) / Scale));

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 0) return double.NegativeInfinity;
        if (p == 1) return double.PositiveInfinity;
        if (p > 0.5) return InverseCcdf(1 - p);
        return Location - Scale * Math.Log(-Math.Log(p));
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return double.PositiveInfinity;
        if (q == 1) return double.NegativeInfinity;
        if (q > 0.5) return InverseCdf(1 - q);
        return Location - Scale * Math.Log(-ElementaryFunctions.Log1p(-q));
    }
}
