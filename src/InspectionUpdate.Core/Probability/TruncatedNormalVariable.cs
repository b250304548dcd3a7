using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// Normal distribution N(μ, σ) truncated to [a, b] (either bound may be infinite, not both):
/// F(x) = [Φ(ξ) − Φ(α)]/Z with ξ = (x − μ)/σ, α = (a − μ)/σ, β = (b − μ)/σ, Z = Φ(β) − Φ(α).
/// </summary>
/// <remarks>
/// Mean μ + σ[φ(α) − φ(β)]/Z, variance σ²{1 + [αφ(α) − βφ(β)]/Z − ([φ(α) − φ(β)]/Z)²} (Johnson, Kotz &amp;
/// Balakrishnan, vol. 1, ch. 13). Probabilities are measured from the nearer bound as normal interval masses that
/// keep their relative precision (<see cref="NormalIntervalMass"/>), so F close to 0 at a and 1 − F close to 0 at b
/// stay accurate; the inverses solve for the distance from that bound by Brent's method. μ and σ are the parameters
/// of the parent normal, not the mean and standard deviation of the truncated variable.
/// </remarks>
public sealed class TruncatedNormalVariable : RandomVariable
{
    private readonly double _alpha;
    private readonly double _beta;
    private readonly double _mass;

    private TruncatedNormalVariable(string name, double mu, double sigma, double lower, double upper) : base(name)
    {
        Mu = mu;
        Sigma = sigma;
        Lower = lower;
        Upper = upper;
        _alpha = (lower - mu) / sigma;
        _beta = (upper - mu) / sigma;
        _mass = NormalIntervalMass.Between(_alpha, _beta);
        (Mean, StandardDeviation) = Moments(mu, sigma, _alpha, _beta, _mass);
    }

    /// <summary>
    /// Builds from the parent normal's μ (finite) and σ &gt; 0 and the bounds a &lt; b (use ±∞ for an open side; at
    /// least one bound finite). The interval must carry a representable probability under the parent (Z &gt; 1e−300).
    /// </summary>
    public static TruncatedNormalVariable FromParameters(string name, double mu, double sigma, double lower, double upper)
    {
        DistributionParameterException.RequireFinite(name, nameof(mu), mu);
        DistributionParameterException.RequirePositive(name, nameof(sigma), sigma);
        ValidateBounds(name, lower, upper);
        var mass = NormalIntervalMass.Between((lower - mu) / sigma, (upper - mu) / sigma);
        if (!(mass > 1e-300))
        {
            throw new DistributionParameterException(name, nameof(mu), mu,
                FormattableString.Invariant($"puts probability {mass:G3} on [{lower:R}, {upper:R}] with sigma {sigma:R}; the truncation interval must carry a representable probability"));
        }

        return new TruncatedNormalVariable(name, mu, sigma, lower, upper);
    }

    /// <summary>
    /// Builds from the mean and standard deviation of the truncated variable and its bounds: the parent μ and σ
    /// are found by a damped Newton iteration on the two moment equations. Throws when the pair is not attainable
    /// (e.g. for a one-sided bound a, (μ − a)/σ must exceed 1, the limit of an exponential tail).
    /// </summary>
    public static TruncatedNormalVariable FromMeanStd(string name, double mean, double standardDeviation, double lower, double upper)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(standardDeviation), standardDeviation);
        ValidateBounds(name, lower, upper);
        if (!(mean > lower && mean < upper))
        {
            throw new DistributionParameterException(name, nameof(mean), mean,
                FormattableString.Invariant($"must lie strictly between the bounds {lower:R} and {upper:R}"));
        }

        if (!SolveParent(mean, standardDeviation, lower, upper, out var mu, out var sigma))
        {
            throw new DistributionParameterException(name, nameof(standardDeviation), standardDeviation,
                FormattableString.Invariant($"cannot be reached by a normal truncated to [{lower:R}, {upper:R}] with mean {mean:R}"));
        }

        return new TruncatedNormalVariable(name, mu, sigma, lower, upper);
    }

    /// <summary>Builds from mean (≠ 0) and coefficient of variation V &gt; 0 (σ = V|μ|) of the truncated variable.</summary>
    public static TruncatedNormalVariable FromMeanCov(string name, double mean, double coefficientOfVariation, double lower, double upper)
    {
        DistributionParameterException.RequireFinite(name, nameof(mean), mean);
        DistributionParameterException.RequirePositive(name, nameof(coefficientOfVariation), coefficientOfVariation);
        DistributionParameterException.RequirePositive(name, "|mean|", Math.Abs(mean));
        return FromMeanStd(name, mean, coefficientOfVariation * Math.Abs(mean), lower, upper);
    }

    /// <summary>Mean μ of the parent normal.</summary>
    public double Mu { get; }

    /// <summary>Standard deviation σ of the parent normal.</summary>
    public double Sigma { get; }

    /// <summary>Lower bound a (may be −∞).</summary>
    public double Lower { get; }

    /// <summary>Upper bound b (may be +∞).</summary>
    public double Upper { get; }

    /// <summary>Z = Φ(β) − Φ(α): the parent's probability of [a, b].</summary>
    public double ParentProbability => _mass;

    /// <inheritdoc />
    public override string Family => "TruncatedNormal";

    /// <inheritdoc />
    public override double Mean { get; }

    /// <inheritdoc />
    public override double StandardDeviation { get; }

    /// <inheritdoc />
    public override double Pdf(double x) =>
        x < Lower || x > Upper ? 0 : StandardNormal.Pdf((x - Mu) / Sigma) / (Sigma * _mass);

    /// <inheritdoc />
    public override double Cdf(double x)
    {
        if (x <= Lower) return 0;
        if (x >= Upper) return 1;
        var m = double.IsFinite(Lower)
            ? NormalIntervalMass.FromLower(_alpha, (x - Lower) / Sigma)
            : NormalIntervalMass.Between(double.NegativeInfinity, (x - Mu) / Sigma);
        return Math.Min(1, m / _mass);
    }

    /// <inheritdoc />
    public override double Ccdf(double x)
    {
        if (x <= Lower) return 1;
        if (x >= Upper) return 0;
        var m = double.IsFinite(Upper)
            ? NormalIntervalMass.ToUpper(_beta, (Upper - x) / Sigma)
            : NormalIntervalMass.Between((x - Mu) / Sigma, double.PositiveInfinity);
        return Math.Min(1, m / _mass);
    }

    /// <inheritdoc />
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        if (p == 0) return Lower;
        if (p == 1) return Upper;
        if (p > 0.5) return InverseCcdf(1 - p);
        if (!double.IsFinite(Lower)) return Math.Min(Upper, Mu + Sigma * StandardNormal.InverseCdf(p * _mass));

        var f = new MassFromLower(_alpha, Math.Log(p * _mass));
        var width = _beta - _alpha;
        var guess = Math.Log(p * _mass / Math.Max(StandardNormal.Pdf(_alpha), 1e-300));
        var lnD = RootFinder.NewtonIncreasing(ref f, guess, 1, -745, double.IsFinite(width) ? Math.Log(width) : OpenSideLimit(Math.Abs(_alpha)), 1e-15);
        return Math.Min(Upper, Lower + Sigma * Converged(lnD, p));
    }

    /// <inheritdoc />
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        if (q == 0) return Upper;
        if (q == 1) return Lower;
        if (q > 0.5) return InverseCdf(1 - q);
        if (!double.IsFinite(Upper)) return Math.Max(Lower, Mu + Sigma * StandardNormal.InverseCcdf(q * _mass));

        var f = new MassToUpper(_beta, Math.Log(q * _mass));
        var width = _beta - _alpha;
        var guess = Math.Log(q * _mass / Math.Max(StandardNormal.Pdf(_beta), 1e-300));
        var lnD = RootFinder.NewtonIncreasing(ref f, guess, 1, -745, double.IsFinite(width) ? Math.Log(width) : OpenSideLimit(Math.Abs(_beta)), 1e-15);
        return Math.Max(Lower, Upper - Sigma * Converged(lnD, q));
    }

    /// <summary>ln of a distance from the finite bound beyond which less than 1e−300 of the mass remains.</summary>
    private static double OpenSideLimit(double distanceToParentMean) => Math.Log(distanceToParentMean + 40);

    private double Converged(double lnDistance, double probability) => double.IsNaN(lnDistance)
        ? throw new InvalidOperationException(FormattableString.Invariant(
            $"Variable '{Name}': the inverse of the truncated normal found no root for probability {probability:R}."))
        : Math.Exp(lnDistance);

    private static void ValidateBounds(string name, double lower, double upper)
    {
        DistributionParameterException.RequireNotNaN(name, nameof(lower), lower);
        DistributionParameterException.RequireNotNaN(name, nameof(upper), upper);
        if (lower == double.PositiveInfinity)
        {
            throw new DistributionParameterException(name, nameof(lower), lower, "must be finite or -infinity");
        }

        if (upper == double.NegativeInfinity)
        {
            throw new DistributionParameterException(name, nameof(upper), upper, "must be finite or +infinity");
        }

        DistributionParameterException.RequireOrdered(name, nameof(lower), lower, nameof(upper), upper);
        if (!double.IsFinite(lower) && !double.IsFinite(upper))
        {
            throw new DistributionParameterException(name, nameof(upper), upper,
                "must be finite when the lower bound is -infinity (a truncated normal needs at least one finite bound; use a normal variable otherwise)");
        }
    }

    private static (double Mean, double Sd) Moments(double mu, double sigma, double alpha, double beta, double mass)
    {
        var pa = double.IsFinite(alpha) ? StandardNormal.Pdf(alpha) : 0;
        var pb = double.IsFinite(beta) ? StandardNormal.Pdf(beta) : 0;
        var apa = double.IsFinite(alpha) ? alpha * pa : 0;
        var bpb = double.IsFinite(beta) ? beta * pb : 0;
        var d = (pa - pb) / mass;
        var variance = 1 + (apa - bpb) / mass - d * d;
        return (mu + sigma * d, sigma * Math.Sqrt(Math.Max(variance, 0)));
    }

    /// <summary>Residuals of the moment equations, scaled by the target standard deviation.</summary>
    private static bool Residual(double mu, double lnSigma, double mean, double sd, double lower, double upper, out double r1, out double r2)
    {
        var sigma = Math.Exp(lnSigma);
        var alpha = (lower - mu) / sigma;
        var beta = (upper - mu) / sigma;
        var mass = NormalIntervalMass.Between(alpha, beta);
        var (m, s) = Moments(mu, sigma, alpha, beta, mass);
        r1 = (m - mean) / sd;
        r2 = Math.Log(s / sd);
        return mass > 1e-280 && double.IsFinite(r1) && double.IsFinite(r2);
    }

    private static bool SolveParent(double mean, double sd, double lower, double upper, out double mu, out double sigma)
    {
        // Damped Newton in (μ, ln σ) with a forward-difference Jacobian, from the untruncated guess (mean, sd).
        var x1 = mean;
        var x2 = Math.Log(sd);
        if (!Residual(x1, x2, mean, sd, lower, upper, out var r1, out var r2))
        {
            mu = sigma = double.NaN;
            return false;
        }

        for (var iteration = 0; iteration < 200; iteration++)
        {
            var norm = Math.Sqrt(r1 * r1 + r2 * r2);
            if (norm < 1e-13)
            {
                mu = x1;
                sigma = Math.Exp(x2);
                return true;
            }

            var h1 = 1e-7 * Math.Max(sd, Math.Abs(x1));
            const double h2 = 1e-7;
            if (!Residual(x1 + h1, x2, mean, sd, lower, upper, out var a1, out var a2) ||
                !Residual(x1, x2 + h2, mean, sd, lower, upper, out var b1, out var b2))
            {
                break;
            }

            var j11 = (a1 - r1) / h1;
            var j21 = (a2 - r2) / h1;
            var j12 = (b1 - r1) / h2;
            var j22 = (b2 - r2) / h2;
            var det = j11 * j22 - j12 * j21;
            if (!(Math.Abs(det) > 0)) break;
            var d1 = -(j22 * r1 - j12 * r2) / det;
            var d2 = -(-j21 * r1 + j11 * r2) / det;

            // Keep a step in ln σ below 1 and halve until the residual norm falls.
            var scale = Math.Min(1, 1 / Math.Max(Math.Abs(d2), 1e-300));
            var accepted = false;
            for (var halving = 0; halving < 40; halving++, scale *= 0.5)
            {
                if (Residual(x1 + scale * d1, x2 + scale * d2, mean, sd, lower, upper, out var n1, out var n2) &&
                    Math.Sqrt(n1 * n1 + n2 * n2) < norm)
                {
                    x1 += scale * d1;
                    x2 += scale * d2;
                    r1 = n1;
                    r2 = n2;
                    accepted = true;
                    break;
                }
            }

            if (!accepted) break;
        }

        // A stalled iteration is accepted only at rounding level of the moment formulas.
        var final = Math.Sqrt(r1 * r1 + r2 * r2);
        mu = final < 1e-9 ? x1 : double.NaN;
        sigma = final < 1e-9 ? Math.Exp(x2) : double.NaN;
        return final < 1e-9;
    }

    /// <summary>ln ∫_α^{α + e^t} φ − ln target: increasing in t, with derivative δφ(α + δ)/M.</summary>
    private readonly struct MassFromLower(double alpha, double lnTarget) : IDifferentiableFunction
    {
        public double Evaluate(double t, out double derivative)
        {
            var d = Math.Exp(t);
            var m = NormalIntervalMass.FromLower(alpha, d);
            derivative = d * StandardNormal.Pdf(alpha + d) / m;
            return Math.Log(m) - lnTarget;
        }
    }

    /// <summary>ln ∫_{β − e^t}^{β} φ − ln target: increasing in t, with derivative δφ(β − δ)/M.</summary>
    private readonly struct MassToUpper(double beta, double lnTarget) : IDifferentiableFunction
    {
        public double Evaluate(double t, out double derivative)
        {
            var d = Math.Exp(t);
            var m = NormalIntervalMass.ToUpper(beta, d);
            derivative = d * StandardNormal.Pdf(beta - d) / m;
            return Math.Log(m) - lnTarget;
        }
    }
}
