using InspectionUpdate.Probability;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Inspection;

/// <summary>
/// Result of a hit/miss maximum-likelihood fit: PoD(a) = F(β₀ + β₁ ln a), a in mm, with the logit or probit link
/// (MIL-HDBK-1823A, 2009, hit/miss analysis).
/// </summary>
/// <param name="Link">Link function.</param>
/// <param name="Intercept">β₀.</param>
/// <param name="Slope">β₁ (per ln mm); a PoD that rises with size needs β₁ &gt; 0.</param>
/// <param name="Covariance">Inverse Fisher information of (β₀, β₁) at the estimate, parameters "beta0", "beta1".</param>
/// <param name="Estimate">The curve in (μ, σ) form with its covariance, a₉₀ and a₉₀/₉₅; null when not converged.</param>
/// <param name="LogLikelihood">Maximized log-likelihood.</param>
/// <param name="Count">Number of trials.</param>
/// <param name="Hits">Number of detections.</param>
/// <param name="Iterations">Newton (Fisher-scoring) iterations used.</param>
/// <param name="Converged">True when the estimate satisfies the convergence test and β₁ &gt; 0.</param>
/// <param name="Diagnostic">How the fit ended, in words.</param>
public sealed record HitMissFit(
    PodLink Link,
    double Intercept,
    double Slope,
    ParameterCovariance Covariance,
    PodEstimate? Estimate,
    double LogLikelihood,
    int Count,
    int Hits,
    int Iterations,
    bool Converged,
    string Diagnostic)
{
    /// <summary>The estimate, or an exception naming the reason when the fit did not converge.</summary>
    /// <exception cref="InvalidOperationException">The fit did not converge.</exception>
    public PodEstimate RequireEstimate() =>
        Estimate ?? throw new InvalidOperationException("The hit/miss fit did not converge: " + Diagnostic);
}

/// <summary>Maximum-likelihood fits of PoD curves from qualification data.</summary>
public static partial class PodFitting
{
    private const int MaxIterations = 200;

    /// <summary>
    /// Fits PoD(a) = F(β₀ + β₁ ln a) to hit/miss data by maximum likelihood with Fisher scoring (iteratively reweighted
    /// least squares, Newton–Raphson for the canonical logit link), step-halving when the likelihood does not rise.
    /// </summary>
    /// <param name="sizesMm">Defect sizes in mm, each finite and &gt; 0.</param>
    /// <param name="hits">Detected (true) or missed, one per size.</param>
    /// <param name="link">Logit (log-logistic curve) or probit (cumulative lognormal curve).</param>
    /// <returns>The fit; <see cref="HitMissFit.Converged"/> is false, with the reason, when the data are separated
    /// (every miss smaller than every hit: no finite estimate exists) or the iteration fails.</returns>
    /// <exception cref="ArgumentException">Lengths differ, fewer than 2 distinct sizes, or all trials hit or all miss.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A size is not finite and &gt; 0.</exception>
    public static HitMissFit FitHitMiss(IReadOnlyList<double> sizesMm, IReadOnlyList<bool> hits, PodLink link)
    {
        ArgumentNullException.ThrowIfNull(sizesMm);
        ArgumentNullException.ThrowIfNull(hits);
        if (sizesMm.Count != hits.Count)
        {
            throw new ArgumentException(FormattableString.Invariant($"{sizesMm.Count} sizes but {hits.Count} hit/miss results."), nameof(hits));
        }

        var n = sizesMm.Count;
        var x = new double[n];
        for (var i = 0; i < n; i++)
        {
            if (!double.IsFinite(sizesMm[i]) || sizesMm[i] <= 0)
            {
                throw new ArgumentOutOfRangeException(nameof(sizesMm), sizesMm[i], FormattableString.Invariant($"Size #{i} must be finite and > 0 mm."));
            }

            x[i] = Math.Log(sizesMm[i]);
        }

        if (x.Distinct().Count() < 2)
        {
            throw new ArgumentException("Hit/miss fitting needs at least two distinct sizes.", nameof(sizesMm));
        }

        var hitCount = hits.Count(h => h);
        if (hitCount == 0 || hitCount == n)
        {
            throw new ArgumentException(FormattableString.Invariant($"Hit/miss fitting needs both hits and misses; got {hitCount} hits in {n} trials."), nameof(hits));
        }

        double b0 = 0, b1 = 0;
        var logLik = HitMissLogLikelihood(x, hits, link, b0, b1);
        var converged = false;
        var iterations = 0;
        var diagnostic = "iteration limit reached";
        for (iterations = 1; iterations <= MaxIterations; iterations++)
        {
            var (g0, g1, i00, i01, i11) = ScoreAndInformation(x, hits, link, b0, b1);
            var det = i00 * i11 - i01 * i01;
            if (!(det > 0) || !double.IsFinite(det))
            {
                diagnostic = "Fisher information became singular";
                break;
            }

            var d0 = (i11 * g0 - i01 * g1) / det;
            var d1 = (i00 * g1 - i01 * g0) / det;
            var step = 1.0;
            double next0 = b0, next1 = b1, nextLik = logLik;
            for (var halving = 0; halving < 40; halving++)
            {
                next0 = b0 + step * d0;
                next1 = b1 + step * d1;
                nextLik = HitMissLogLikelihood(x, hits, link, next0, next1);
                if (nextLik >= logLik - 1e-12 * Math.Abs(logLik))
                {
                    break;
                }

                step /= 2;
            }

            var change = Math.Abs(next0 - b0) + Math.Abs(next1 - b1);
            b0 = next0;
            b1 = next1;
            logLik = nextLik;
            if (Math.Abs(b1) > 1e4 || logLik > -1e-9)
            {
                diagnostic = "the data are separated (misses and hits do not overlap in size): no finite maximum-likelihood estimate";
                break;
            }

            if (change < 1e-11 * (1 + Math.Abs(b0) + Math.Abs(b1)))
            {
                converged = true;
                diagnostic = FormattableString.Invariant($"converged in {iterations} Fisher-scoring iterations");
                break;
            }
        }

        var (_, _, f00, f01, f11) = ScoreAndInformation(x, hits, link, b0, b1);
        var fisher = Matrix<double>.Build.DenseOfArray(new[,] { { f00, f01 }, { f01, f11 } });
        var cov = fisher.Determinant() > 0 ? fisher.Inverse() : Matrix<double>.Build.Dense(2, 2, double.NaN);
        var betaCov = new ParameterCovariance(["beta0", "beta1"], cov.ToArray());

        if (converged && !(b1 > 0))
        {
            converged = false;
            diagnostic = FormattableString.Invariant($"the fitted slope β₁ = {b1:G6} is not positive: PoD would not rise with size");
        }

        PodEstimate? estimate = null;
        if (converged)
        {
            // μ = −β₀/β₁, σ = 1/β₁; Jacobian of (μ, σ) with respect to (β₀, β₁).
            var jac = new[,] { { -1 / b1, b0 / (b1 * b1) }, { 0, -1 / (b1 * b1) } };
            estimate = new PodEstimate(link, -b0 / b1, 1 / b1, betaCov.Transform(["mu", "sigma"], jac));
        }

        return new HitMissFit(link, b0, b1, betaCov, estimate, logLik, n, hitCount, Math.Min(iterations, MaxIterations), converged, diagnostic);
    }

    /// <summary>Log-likelihood Σ y ln F(η) + (1 − y) ln F(−η), η = β₀ + β₁ ln a, for symmetric links.</summary>
    internal static double HitMissLogLikelihood(IReadOnlyList<double> lnSizes, IReadOnlyList<bool> hits, PodLink link, double b0, double b1)
    {
        var sum = 0.0;
        for (var i = 0; i < lnSizes.Count; i++)
        {
            var eta = b0 + b1 * lnSizes[i];
            sum += LogLinkCdf(link, hits[i] ? eta : -eta);
        }

        return sum;
    }

    private static double LogLinkCdf(PodLink link, double eta) =>
        link == PodLink.Logit
            ? (eta < 0 ? eta - PodMath.Log1p(Math.Exp(eta)) : -PodMath.Log1p(Math.Exp(-eta)))
            : PodMath.LogNormalCdf(eta);

    // Score and expected (Fisher) information of (β₀, β₁). For the logit link the weight is p(1 − p) and the
    // score (y − p)x; for the probit link the weight is φ²/(p(1 − p)) and the score (y − p)φ/(p(1 − p))·x.
    private static (double G0, double G1, double I00, double I01, double I11) ScoreAndInformation(
        double[] x, IReadOnlyList<bool> hits, PodLink link, double b0, double b1)
    {
        double g0 = 0, g1 = 0, i00 = 0, i01 = 0, i11 = 0;
        for (var i = 0; i < x.Length; i++)
        {
            var eta = b0 + b1 * x[i];
            var y = hits[i] ? 1.0 : 0.0;
            double scoreFactor, weight;
            if (link == PodLink.Logit)
            {
                var p = PodMath.Logistic(eta);
                var q = PodMath.Logistic(-eta);
                scoreFactor = y - p;
                weight = p * q;
            }
            else
            {
                var phi = StandardNormal.Pdf(eta);
                // y = 1: d/dη ln Φ(η) = φ/Φ(η); y = 0: d/dη ln Φ(−η) = −φ/Φ(−η) (inverse Mills ratios, stable in the tails).
                scoreFactor = hits[i] ? PodMath.InverseMills(eta) : -PodMath.InverseMills(-eta);
                var p = StandardNormal.Cdf(eta);
                var q = StandardNormal.Ccdf(eta);
                weight = p * q > 0 ? phi * phi / (p * q) : 0;
            }

            g0 += scoreFactor;
            g1 += scoreFactor * x[i];
            i00 += weight;
            i01 += weight * x[i];
            i11 += weight * x[i] * x[i];
        }

        return (g0, g1, i00, i01, i11);
    }
}
