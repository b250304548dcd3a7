using InspectionUpdate.Probability.Numerics;
using MathNet.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// Beta distribution on [a, b] with shapes α, β: X = a + (b − a)Y, Y ~ Beta(α, β) on [0, 1].
/// </summary>
/// <remarks>
/// Mean a + (b − a)α/(α + β), variance (b − a)²αβ/((α + β)²(α + β + 1)) (Johnson, Kotz &amp; Balakrishnan, vol. 2,
/// ch. 25). F uses MathNet's regularized incomplete beta I_y(α, β); the upper tail is measured from b as
/// I_{(b − x)/(b − a)}(β, α), so both tails keep their precision. Inverses solve ln I = ln p in ln y (Brent), because
/// MathNet's inverse loses accuracy below about 1e−5.
/// </remarks>
public sealed class BetaVariable : RandomVariable
{
    private BetaVariable(string name, double shape1, double shape2, double lower, double upper) : base(name)
    {
        Shape1 = shape1;
        Shape2 = shape2;
        Lower = lower;
        Upper = upper;
    }

    /// <summary>Builds from shapes α &gt; 0, β &gt; 0 and finite bounds a &lt; b (default [0, 1]).</summary>
    public static BetaVariable FromParameters(string name, double shape1, double shape2, double lower = 0, double upper = 1)
    {
        DistributionParameterException.RequirePositive(name, nameof(shape1), shape1);
        DistributionParameterException.RequirePositive(name, nameof(shape2), shape2);
        DistributionParameterException.RequireFinite(name, nameof(lower), lower);
        DistributionParameterException.RequireFinite(name, nameof(upper), upper);
        DistributionParameterException.RequireOrdered(name, nameof(lower), lower, nameof(upper), upper);
        return new BetaVariable(name, shape1, shape2, lower, upper);
    }

    /// <summary>
    /// Builds from mean and standard deviation on the bounds [a, b] (default [0, 1]). With m = (μ − a)/(b − a) and
    /// v = σ²/(b − a)²: ν = m(1 − m)/v − 1, α = mν, β = (1 − m)ν. Requires a &lt; μ &lt; b and σ² &lt; (μ − a)(b − μ).
    /// </summary>
    public static BetaVariable FromMeanStd(string name, double mean, double standardDeviation, double lower = 0, double upper = 1)
    {
        DistributionParameterException.RequireFinite(name, nameof(lower), lower);
        DistributionParameterException.RequireFinite(name, nameof(upper), upper);
        DistributionParameterException.RequireOrdered(name, nameof(lower), lower, nameof(upper), upper);
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        if (!(mean > lower && mean < upper))
        {
            throw new DistributionParameterException(name, nameof(mean), mean,
                FormattableString.Invariant($"must lie strictly between the bounds {lower:R} and {upper:R}"));
        }

        var width = upper - lower;
        var m = (mean - lower) / width;
        var v = standardDeviation * standardDeviation / (width * width);
        if (!(v < m * (1 - m)))
        {
            throw new DistributionParameterException(name, nameof(standardDeviation), standardDeviation,
                FormattableString.Invariant($"must be below √((μ − a)(b − μ)) = {Math.Sqrt((mean - lower) * (upper - mean)):G6} for a beta distribution with this mean and bounds"));
        }

        var nu = m * (1 - m) / v - 1;
        return new BetaVariable(name, m * nu, (1 - m) * nu, lower, upper);
    }

    /// <summary>Builds from mean (≠ 0) and coefficient of variation V &gt; 0 (σ = V|μ|) on the bounds [a, b].</summary>
    public static BetaVariable FromMeanCov(string name, double mean, double coefficientOfVariation, double lower = 0, double upper = 1)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean), lower, upper);
    }

    /// <summary>First shape α (exponent at the lower bound).</summary>
    public double Shape1 { get; }

    /// <summary>Second shape β (exponent at the upper bound).</summary>
    public double Shape2 { get; }

    /// <summary>Lower bound a.</summary>
    public double Lower { get; }

    /// <summary>Upper bound b.</summary>
    public double Upper { get; }

    /// <inheritdoc />
    public override string Family => "Beta";

    /// <inheritdoc />
    public override double Mean => Lower + (Upper - Lower) * Shape1 / (Shape1 + Shape2);

    /// <inheritdoc />
    public override double StandardDeviation
    {
        get
        {
            var s = Shape1 + Shape2;
            return (Upper - Lower) * Math.Sqrt(Shape1 * Shape2 / (s * s * (s + 1)));
        }
    }

    /// <inheritdoc />
    public override double Pdf(double x)
    {
        if (x < Lower || x > Upper) return 0;
        var width = Upper - Lower;
        var y = (x - Lower) / width;
        var w = (Upper - x) / width;
        if (y == 0) return Shape1 < 1 ? double.PositiveInfinity : Shape1 == 1 ? Shape2 / width : 0;
        if (w == 0) return Shape2 < 1 ? double.PositiveInfinity : Shape2 == 1 ? Shape1 / width : 0;
        return Math.Exp((Shape1 - 1) * Math.Log(y) + (Shape2 - 1) * Math.Log(w) - SpecialFunctions.BetaLn(Shape1, Shape2)) / width;
    }

    /// <inheritdoc />
    public override double Cdf(double x)
    {
        if (x <= Lower) return 0;
        if (x >= Upper) return 1;
        var width = Upper - Lower;
        var y = (x - Lower) / width;
        return y <= 0.5 ? SpecialFunctions.BetaRegularized(Shape1, Shape2, y) : 1 - SpecialFunctions.BetaRegularized(Shape2, Shape1, (Upper - x) / width);
    }

    /// <inheritdoc />
    public override double Ccdf(double x)
    {
        if (x <= Lower) return 1;
        if (x >= Upper) return 0;
        var width = Upper - Lower;
        var w = (Upper - x) / width;
        return w <= 0.5 ? SpecialFunctions.BetaRegularized(Shape2, Shape1, w) : 1 - SpecialFunctions.BetaRegularized(Shape1, Shape2, (x - Lower) / width);
    }

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 0) return Lower;
        if (p == 1) return Upper;
        if (p > 0.5) return Upper - (Upper - Lower) * StandardLowerInverse(Shape2, Shape1, 1 - p);
        return Lower + (Upper - Lower) * StandardLowerInverse(Shape1, Shape2, p);
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return Upper;
        if (q == 1) return Lower;
        if (q > 0.5) return Lower + (Upper - Lower) * StandardLowerInverse(Shape1, Shape2, 1 - q);
        return Upper - (Upper - Lower) * StandardLowerInverse(Shape2, Shape1, q);
    }

    /// <summary>The y in (0, 1) with I_y(a, b) = p, for p ≤ 0.5 (so y lies at or below the median).</summary>
    private double StandardLowerInverse(double a, double b, double p)
    {
        // Near 0, I_y(a, b) ≈ y^a/(a·B(a, b)): the start; the bracket search covers the rest.
        var lnY0 = Math.Min((Math.Log(p) + Math.Log(a) + SpecialFunctions.BetaLn(a, b)) / a, -1e-3);
        if (lnY0 < -740) return Math.Exp(lnY0);
        var f = new LowerTail(a, b, Math.Log(p));
        var lnY = RootFinder.NewtonIncreasing(ref f, lnY0, 0.5, -745, 0, 1e-15);
        return double.IsNaN(lnY)
            ? throw new InvalidOperationException(FormattableString.Invariant(
                $"Variable '{Name}': the inverse of the beta distribution (shapes {a:R}, {b:R}) found no root for probability {p:R}."))
            : Math.Exp(lnY);
    }

    /// <summary>ln I_{e^t}(a, b) − ln p: increasing in t, with derivative y^a(1 − y)^(b−1)/(B(a, b)·I).</summary>
    private readonly struct LowerTail(double a, double b, double lnP) : IDifferentiableFunction
    {
        private readonly double _lnBeta = SpecialFunctions.BetaLn(a, b);

        public double Evaluate(double t, out double derivative)
        {
            var y = Math.Exp(t);
            var i = SpecialFunctions.BetaRegularized(a, b, y);
            derivative = Math.Exp(a * t + (b - 1) * ElementaryFunctions.Log1p(-y) - _lnBeta) / i;
            return Math.Log(i) - lnP;
        }
    }
}
