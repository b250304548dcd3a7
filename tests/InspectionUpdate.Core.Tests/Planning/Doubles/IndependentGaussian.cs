using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Planning.Doubles;

/// <summary>
/// Independent computations for the tests, written from the published formulas and not shared with the planner or
/// the updater double.
/// </summary>
internal static class IndependentGaussian
{
    /// <summary>
    /// Φ₂(h, k; ρ) by the Plackett / Drezner–Wesolowsky (1990) integral
    /// Φ(h)Φ(k) + (1/2π)∫₀^ρ (1 − r²)^(−1/2) exp(−(h² − 2rhk + k²)/(2(1 − r²))) dr, by MathNet adaptive quadrature.
    /// </summary>
    public static double BivariateCdf(double h, double k, double rho)
    {
        double Integrand(double r) => Math.Exp(-(h * h - 2 * r * h * k + k * k) / (2 * (1 - r * r))) / Math.Sqrt(1 - r * r);
        var integral = MathNet.Numerics.Integrate.DoubleExponential(Integrand, 0, rho, 1e-14);
        return StandardNormal.Cdf(h) * StandardNormal.Cdf(k) + integral / (2 * Math.PI);
    }

    /// <summary>
    /// Exact P(F(t) | no indication at t_k) for the log-linear model with a probit-in-ln-a PoD (ln A_d ~ N(μ, σ)):
    /// U = X₁ + X₂t, V = X₁ + X₂t_k − ln A_d are jointly normal, P(F ∩ E) = P(U ≥ ln a_c, V ≤ 0), P(E) = P(V ≤ 0).
    /// </summary>
    public static (double Pf, double EvidenceProbability) PosteriorAfterOneNoIndication(
        LogLinearGrowthModel m, double inspectionYears, double podMu, double podSigma, double timeYears)
    {
        var c = Math.Log(m.CriticalDepthMm);
        var meanU = m.MeanLogInitialDepth + m.MeanRate * timeYears;
        var sdU = Math.Sqrt(Sq(m.SdLogInitialDepth) + Sq(m.SdRate * timeYears));
        var meanV = m.MeanLogInitialDepth + m.MeanRate * inspectionYears - podMu;
        var sdV = Math.Sqrt(Sq(m.SdLogInitialDepth) + Sq(m.SdRate * inspectionYears) + Sq(podSigma));
        var cov = Sq(m.SdLogInitialDepth) + Sq(m.SdRate) * timeYears * inspectionYears;
        // P(−U ≤ −c, V ≤ 0) with corr(−U, V) = −cov/(sdU·sdV).
        var h = (meanU - c) / sdU;
        var k = -meanV / sdV;
        var joint = BivariateCdf(h, k, -cov / (sdU * sdV));
        var pe = StandardNormal.Cdf(k);
        return (joint / pe, pe);
    }

    /// <summary>First root of f in [lower, upper] by a fine scan then MathNet's Brent, to 1e-10 years.</summary>
    public static double FirstRoot(Func<double, double> f, double lower, double upper, double scanStep = 0.01)
    {
        var a = lower;
        var fa = f(a);
        if (fa >= 0) throw new InvalidOperationException("Already at or above the level at the lower end.");
        for (var b = lower + scanStep; b <= upper + 1e-12; b += scanStep)
        {
            var fb = f(b);
            if (fb >= 0) return MathNet.Numerics.RootFinding.Brent.FindRoot(f, a, b, 1e-10, 200);
            a = b;
        }

        throw new InvalidOperationException("No root in the window.");
    }

    private static double Sq(double x) => x * x;
}
