using InspectionUpdate.Probability.Numerics;
using MathNet.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>Gamma distribution with shape k and rate r: f(x) = r^k x^(k−1) e^(−rx)/Γ(k), x &gt; 0.</summary>
/// <remarks>
/// Mean k/r, standard deviation √k/r. F(x) = P(k, rx) and 1 − F(x) = Q(k, rx), the regularized incomplete gamma
/// functions (series below the mean, MathNet's continued fraction above, see <see cref="IncompleteGamma"/>), each
/// used on its own tail. MathNet's inverse loses accuracy below about 1e−5, so the
/// inverses here solve ln P(k, y) = ln p (or ln Q(k, y) = ln q) in ln y by Brent's method, which keeps the
/// relative accuracy of the tail probability.
/// </remarks>
public sealed class GammaVariable : RandomVariable
{
    private readonly IncompleteGamma _incomplete;

    private GammaVariable(string name, double shape, double rate) : base(name)
    {
        Shape = shape;
        Rate = rate;
        _incomplete = new IncompleteGamma(shape);
    }

    /// <summary>Builds from shape k &gt; 0 and rate r &gt; 0 (1/units of x).</summary>
    public static GammaVariable FromShapeRate(string name, double shape, double rate)
    {
        DistributionParameterException.RequirePositive(name, nameof(shape), shape);
        DistributionParameterException.RequirePositive(name, nameof(rate), rate);
        return new GammaVariable(name, shape, rate);
    }

    /// <summary>Builds from shape k &gt; 0 and scale θ = 1/r &gt; 0 (units of x).</summary>
    public static GammaVariable FromShapeScale(string name, double shape, double scale)
    {
        DistributionParameterException.RequirePositive(name, nameof(shape), shape);
        DistributionParameterException.RequirePositive(name, nameof(scale), scale);
        return new GammaVariable(name, shape, 1 / scale);
    }

    /// <summary>Builds from mean &gt; 0 and standard deviation &gt; 0: k = (μ/σ)², r = μ/σ².</summary>
    public static GammaVariable FromMeanStd(string name, double mean, double standardDeviation)
    {
        DistributionParameterException.RequirePositive(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        var v = standardDeviation / mean;
        return new GammaVariable(name, 1 / (v * v), mean / (standardDeviation * standardDeviation));
    }

    /// <summary>Builds from mean &gt; 0 and coefficient of variation V &gt; 0: k = 1/V².</summary>
    public static GammaVariable FromMeanCov(string name, double mean, double coefficientOfVariation)
    {
        DistributionParameterException.RequirePositive(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        return FromMeanStd(name, mean, coefficientOfVariation * mean);
    }

    /// <summary>Shape k.</summary>
    public double Shape { get; }

    /// <summary>Rate r (1/units of x).</summary>
    public double Rate { get; }

    /// <inheritdoc />
    public override string Family => "Gamma";

    /// <inheritdoc />
    public override double Mean => Shape / Rate;

    /// <inheritdoc />
    public override double StandardDeviation => Math.Sqrt(Shape) / Rate;

    /// <inheritdoc />
    public override double Pdf(double x)
    {
        if (x < 0) return 0;
        if (x == 0) return Shape < 1 ? double.PositiveInfinity : (Shape == 1 ? Rate : 0);
        var y = Rate * x;
        return Rate * _incomplete.ScaledDensity(y) / y;
    }

    /// <inheritdoc />
    public override double Cdf(double x) => x <= 0 ? 0 : _incomplete.Lower(Rate * x);

    /// <inheritdoc />
    public override double Ccdf(double x) => x <= 0 ? 1 : _incomplete.Upper(Rate * x);

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 0) return 0;
        if (p == 1) return double.PositiveInfinity;
        if (p > 0.5) return InverseCcdf(1 - p);

        // P(k, y) ≤ y^k/Γ(k + 1) for all y, so this y₀ lies at or below the root: a safe start, improved by the
        // Wilson–Hilferty approximation where that is larger (it is good away from the far lower tail).
        var lnY0 = (Math.Log(p) + _incomplete.LnGammaA + Math.Log(Shape)) / Shape;
        var lnMedianBound = Math.Log(Shape + 1); // the median lies below k + 1 for every shape
        if (lnY0 < -740) return Math.Exp(lnY0) / Rate; // below the smallest double: P(k, y) = y^k/Γ(k + 1) there
        var wh = WilsonHilferty(StandardNormal.InverseCdf(p));
        var guess = Math.Min(double.IsNaN(wh) ? lnY0 : Math.Max(lnY0, wh), lnMedianBound);
        var f = new LowerTail(_incomplete, Math.Log(p));
        var lnY = RootFinder.NewtonIncreasing(ref f, guess, 0.5, -745, lnMedianBound, 1e-15);
        return Converged(lnY, p) / Rate;
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return double.PositiveInfinity;
        if (q == 1) return 0;
        if (q > 0.5) return InverseCdf(1 - q);

        // The median exceeds k − 1/3 for k ≥ 1 and is positive always; start at the mean and search outward.
        var f = new UpperTail(_incomplete, Math.Log(q));
        var wh = WilsonHilferty(StandardNormal.InverseCcdf(q));
        var lnY = RootFinder.NewtonIncreasing(ref f, double.IsFinite(wh) ? Math.Max(wh, Math.Log(Shape) - 1) : Math.Log(Shape), 0.5, -745, 709, 1e-15);
        return Converged(lnY, q) / Rate;
    }

    private double Converged(double lnY, double probability) => double.IsNaN(lnY)
        ? throw new InvalidOperationException(FormattableString.Invariant(
            $"Variable '{Name}': the inverse of the gamma distribution (shape {Shape:R}) found no root for probability {probability:R}."))
        : Math.Exp(lnY);

    /// <summary>
    /// ln y of the Wilson–Hilferty approximation y ≈ k(1 − 1/(9k) + z/(3√k))³ (Wilson &amp; Hilferty 1931) for the
    /// standard normal quantile z; NaN where the cube is not positive. Only a starting point for Newton's method.
    /// </summary>
    private double WilsonHilferty(double z)
    {
        var c = 1 - 1 / (9 * Shape) + z / (3 * Math.Sqrt(Shape));
        return c > 0 ? Math.Log(Shape) + 3 * Math.Log(c) : double.NaN;
    }

    /// <summary>ln P(k, e^t) − ln p: increasing in t, with derivative y·f(y)/P, f the unit-rate density.</summary>
    private readonly struct LowerTail(IncompleteGamma incomplete, double lnP) : IDifferentiableFunction
    {
        public double Evaluate(double t, out double derivative)
        {
            var y = Math.Exp(t);
            var p = incomplete.Lower(y);
            derivative = incomplete.ScaledDensity(y) / p;
            return Math.Log(p) - lnP;
        }
    }

    /// <summary>ln q − ln Q(k, e^t): increasing in t, with derivative y·f(y)/Q.</summary>
    private readonly struct UpperTail(IncompleteGamma incomplete, double lnQ) : IDifferentiableFunction
    {
        public double Evaluate(double t, out double derivative)
        {
            var y = Math.Exp(t);
            var q = incomplete.Upper(y);
            derivative = incomplete.ScaledDensity(y) / q;
            return lnQ - Math.Log(q);
        }
    }
}
