using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// Weibull distribution, two- or three-parameter: F(x) = 1 − exp(−((x − ε)/λ)^k) for x &gt; ε.
/// </summary>
/// <remarks>
/// Mean ε + λΓ(1 + 1/k), variance λ²[Γ(1 + 2/k) − Γ(1 + 1/k)²] (Johnson, Kotz &amp; Balakrishnan, vol. 1, ch. 21).
/// Built from mean and standard deviation, the shape k solves CoV(k)² = Γ(1 + 2/k)/Γ(1 + 1/k)² − 1 for the
/// coefficient of variation about the location, σ/(μ − ε); that function decreases in k, so the root is unique.
/// </remarks>
public sealed class WeibullVariable : RandomVariable
{
    private WeibullVariable(string name, double shape, double scale, double location) : base(name)
    {
        Shape = shape;
        Scale = scale;
        Location = location;
    }

    /// <summary>Builds from the native parameters: shape k &gt; 0, scale λ &gt; 0, location ε (finite, default 0).</summary>
    public static WeibullVariable FromParameters(string name, double shape, double scale, double location = 0)
    {
        DistributionParameterException.RequirePositive(name, nameof(shape), shape);
        DistributionParameterException.RequirePositive(name, nameof(scale), scale);
        DistributionParameterException.RequireFinite(name, nameof(location), location);
        return new WeibullVariable(name, shape, scale, location);
    }

    /// <summary>
    /// Builds from mean and standard deviation (&gt; 0), with an optional location ε (lower bound, default 0) that
    /// must lie below the mean. The attainable coefficient of variation σ/(μ − ε) is about 1e−4 to 1e3.
    /// </summary>
    public static WeibullVariable FromMeanStd(string name, double mean, double standardDeviation, double location = 0)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        DistributionParameterException.RequireFinite(name, nameof(location), location);
        DistributionParameterException.RequireOrdered(name, nameof(location), location, nameof(mean), mean);
        var cov = standardDeviation / (mean - location);
        var f = new CovResidual(Math.Log(cov));
        // Solve in ln k; CoV decreases in k, so the residual ln CoV(k) − ln target is decreasing: negate it.
        var lnK = RootFinder.SolveIncreasing(ref f, -Math.Log(cov) + 0.2, 1, Math.Log(0.02), Math.Log(1e5), 1e-15);
        if (double.IsNaN(lnK))
        {
            throw new DistributionParameterException(name, nameof(standardDeviation), standardDeviation,
                FormattableString.Invariant($"gives a coefficient of variation about the location of {cov:G6}, which no Weibull shape in [0.02, 1e5] attains"));
        }

        var k = Math.Exp(lnK);
        var scale = (mean - location) / MathNet.Numerics.SpecialFunctions.Gamma(1 + 1 / k);
        return new WeibullVariable(name, k, scale, location);
    }

    /// <summary>Builds from mean and coefficient of variation σ/|μ| (&gt; 0), optional location as in <see cref="FromMeanStd"/>.</summary>
    public static WeibullVariable FromMeanCov(string name, double mean, double coefficientOfVariation, double location = 0)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean), location);
    }

    /// <summary>Shape k &gt; 0.</summary>
    public double Shape { get; }

    /// <summary>Scale λ &gt; 0.</summary>
    public double Scale { get; }

    /// <summary>Location ε (lower bound of the support); 0 for the two-parameter form.</summary>
    public double Location { get; }

    /// <inheritdoc />
    public override string Family => "Weibull";

    /// <inheritdoc />
    public override double Mean => Location + Scale * MathNet.Numerics.SpecialFunctions.Gamma(1 + 1 / Shape);

    /// <inheritdoc />
    public override double StandardDeviation => Scale * Math.Exp(MathNet.Numerics.SpecialFunctions.GammaLn(1 + 1 / Shape)) * Math.Sqrt(CovSquared(Shape));

    /// <inheritdoc />
    public override double Pdf(double x)
    {
        if (x < Location) return 0;
        if (x == Location) return Shape < 1 ? double.PositiveInfinity : Shape == 1 ? 1 / Scale : 0;
        var z = (x - Location) / Scale;
        var zk = Math.Pow(z, Shape);
        return Shape / Scale * Math.Pow(z, Shape - 1) * Math.Exp(-zk);
    }

    /// <inheritdoc />
    public override double Cdf(double x) =>
        x <= Location ? 0 : -ElementaryFunctions.Expm1(-Math.Pow((x - Location) / Scale, Shape));

    /// <inheritdoc />
    public override double Ccdf(double x) =>
        x <= Location ? 1 : Math.Exp(-Math.Pow((x - Location) / Scale, Shape));

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 0) return Location;
        if (p == 1) return double.PositiveInfinity;
        return Location + Scale * Math.Pow(-ElementaryFunctions.Log1p(-p), 1 / Shape);
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return double.PositiveInfinity;
        if (q == 1) return Location;
        return Location + Scale * Math.Pow(-Math.Log(q), 1 / Shape);
    }

    /// <summary>Γ(1 + 2/k)/Γ(1 + 1/k)² − 1, by expm1 of log-gammas so it stays accurate for large k.</summary>
    internal static double CovSquared(double k) =>
        ElementaryFunctions.Expm1(
            MathNet.Numerics.SpecialFunctions.GammaLn(1 + 2 / k) - 2 * MathNet.Numerics.SpecialFunctions.GammaLn(1 + 1 / k));

    private readonly struct CovResidual(double lnTargetCov) : IScalarFunction
    {
        public double Evaluate(double lnK) => lnTargetCov - 0.5 * Math.Log(CovSquared(Math.Exp(lnK)));
    }
}
