using InspectionUpdate.Probability;

namespace InspectionUpdate.Inspection;

/// <summary>Link function of a PoD model in ln a.</summary>
public enum PodLink
{
    /// <summary>Log-odds: PoD = Λ((ln a − μ)/σ), the log-logistic curve.</summary>
    Logit,

    /// <summary>Probit: PoD = Φ((ln a − μ)/σ), the cumulative lognormal curve.</summary>
    Probit,
}

/// <summary>
/// A fitted PoD curve PoD(a) = F((ln a − μ)/σ) with the first-order covariance of (μ, σ), and the sizes a_p and their
/// one-sided upper confidence bounds by the delta method (Wald), the approach of MIL-HDBK-1823A (2009).
/// </summary>
/// <param name="Link">Link F: logistic or standard normal.</param>
/// <param name="MuLnMm">μ, in ln mm.</param>
/// <param name="SigmaLn">σ, in ln a.</param>
/// <param name="Covariance">Covariance of (μ, σ), parameters named "mu" and "sigma".</param>
public sealed record PodEstimate(PodLink Link, double MuLnMm, double SigmaLn, ParameterCovariance Covariance)
{
    /// <summary>z_p = F⁻¹(p) of the link.</summary>
    public static double LinkQuantile(PodLink link, double p) =>
        link == PodLink.Logit ? Math.Log(p) - PodMath.Log1p(-p) : StandardNormal.InverseCdf(p);

    /// <summary>a_p = exp(μ + z_p σ) in mm, the size detected with probability p.</summary>
    /// <exception cref="ArgumentOutOfRangeException">p not in (0, 1).</exception>
    public double SizeAtPod(double p)
    {
        RequireOpenUnit(p, nameof(p));
        return Math.Exp(MuLnMm + LinkQuantile(Link, p) * SigmaLn);
    }

    /// <summary>
    /// One-sided upper confidence bound of a_p (mm): exp(ln a_p + Φ⁻¹(confidence)·se(ln a_p)) with
    /// Var(ln a_p) = Var μ + 2 z_p Cov(μ, σ) + z_p² Var σ; a₉₀/₉₅ for p = 0.9, confidence 0.95.
    /// </summary>
    public double SizeAtPodUpperBound(double p, double confidence)
    {
        RequireOpenUnit(p, nameof(p));
        RequireOpenUnit(confidence, nameof(confidence));
        var z = LinkQuantile(Link, p);
        var variance = Covariance.QuadraticForm([1.0, z]);
        return Math.Exp(MuLnMm + z * SigmaLn + StandardNormal.InverseCdf(confidence) * Math.Sqrt(Math.Max(0, variance)));
    }

    /// <summary>a₉₀ in mm.</summary>
    public double A90Mm => SizeAtPod(0.9);

    /// <summary>a₉₀/₉₅ in mm: the 95 % upper confidence bound of a₉₀.</summary>
    public double A90At95Mm => SizeAtPodUpperBound(0.9, 0.95);

    /// <summary>The fitted curve as a PoD form (log-logistic for logit, cumulative lognormal for probit).</summary>
    public ParametricPod ToCurve(double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0) =>
        Link == PodLink.Logit
            ? new LogLogisticPod(MuLnMm, SigmaLn, lowerLimitMm, maxPod, falseCallProbability)
            : new CumulativeLognormalPod(MuLnMm, SigmaLn, lowerLimitMm, maxPod, falseCallProbability);

    private static void RequireOpenUnit(double p, string name)
    {
        if (!(p > 0 && p < 1))
        {
            throw new ArgumentOutOfRangeException(name, p, "The probability must lie in (0, 1).");
        }
    }
}
