using InspectionUpdate.Probability;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Inspection;

/// <summary>
/// Result of an â-versus-a fit: ln â = β₀ + β₁ ln a + ε, ε ~ N(0, τ), by maximum likelihood with censoring (a Tobit
/// model: signals at or below the recording threshold are left-censored, at or above saturation right-censored).
/// The PoD is P(â &gt; â_dec) = Φ((ln a − μ)/σ) with μ = (ln â_dec − β₀)/β₁ and σ = τ/β₁ (MIL-HDBK-1823A, 2009,
/// â-versus-a analysis).
/// </summary>
/// <param name="Intercept">β₀ (in ln signal units).</param>
/// <param name="Slope">β₁ (ln signal per ln mm).</param>
/// <param name="Tau">τ, the residual standard deviation of ln â.</param>
/// <param name="Covariance">Inverse observed information of (β₀, β₁, τ), named "beta0", "beta1", "tau".</param>
/// <param name="DecisionThreshold">â_dec in signal units.</param>
/// <param name="Estimate">The PoD curve with the covariance of (μ, σ), a₉₀ and a₉₀/₉₅; null when not converged.</param>
/// <param name="LogLikelihood">Maximized log-likelihood (of ln â).</param>
/// <param name="Count">Number of observations.</param>
/// <param name="LeftCensored">Observations at or below the recording threshold.</param>
/// <param name="RightCensored">Observations at or above saturation.</param>
/// <param name="Iterations">Newton iterations used.</param>
/// <param name="Converged">True when the Newton iteration met its test and β₁ &gt; 0.</param>
/// <param name="Diagnostic">How the fit ended, in words.</param>
public sealed record SignalResponseFit(
    double Intercept,
    double Slope,
    double Tau,
    ParameterCovariance Covariance,
    double DecisionThreshold,
    PodEstimate? Estimate,
    double LogLikelihood,
    int Count,
    int LeftCensored,
    int RightCensored,
    int Iterations,
    bool Converged,
    string Diagnostic)
{
    /// <summary>The estimate, or an exception naming the reason when the fit did not converge.</summary>
    /// <exception cref="InvalidOperationException">The fit did not converge.</exception>
    public PodEstimate RequireEstimate() =>
        Estimate ?? throw new InvalidOperationException("The â-versus-a fit did not converge: " + Diagnostic);
}

/// <summary>Censoring limits and the decision threshold of an â-versus-a data set, in signal units.</summary>
/// <param name="DecisionThreshold">â_dec: an indication is called at signals above it; &gt; 0.</param>
/// <param name="RecordingThreshold">Signals at or below it are only known to be at or below it (left-censored); 0 for none.</param>
/// <param name="Saturation">Signals at or above it are only known to be at or above it (right-censored); +∞ for none.</param>
public sealed record SignalLimits(double DecisionThreshold, double RecordingThreshold = 0, double Saturation = double.PositiveInfinity);

public static partial class PodFitting
{
    /// <summary>
    /// Fits ln â = β₀ + β₁ ln a + ε by censored-normal maximum likelihood. Newton's method runs in Olsen's (1978)
    /// reparametrization (γ = β/τ, θ = 1/τ), where the Tobit log-likelihood is globally concave; the covariance of
    /// (β₀, β₁, τ) is the inverse observed information carried back by the delta method.
    /// </summary>
    /// <param name="sizesMm">Defect sizes in mm, finite and &gt; 0.</param>
    /// <param name="signals">Responses â (signal units), finite and &gt; 0; values at the limits count as censored.</param>
    /// <param name="limits">Decision threshold and censoring limits.</param>
    /// <exception cref="ArgumentException">Lengths differ, limits inconsistent, or fewer than three uncensored points at two sizes.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A size or signal is not finite and &gt; 0.</exception>
    public static SignalResponseFit FitSignalResponse(IReadOnlyList<double> sizesMm, IReadOnlyList<double> signals, SignalLimits limits)
    {
        ArgumentNullException.ThrowIfNull(sizesMm);
        ArgumentNullException.ThrowIfNull(signals);
        ArgumentNullException.ThrowIfNull(limits);
        ValidateLimits(limits);
        if (sizesMm.Count != signals.Count)
        {
            throw new ArgumentException(FormattableString.Invariant($"{sizesMm.Count} sizes but {signals.Count} signals."), nameof(signals));
        }

        var n = sizesMm.Count;
        var x = new double[n];
        var y = new double[n];
        var censoring = new int[n];
        var lnLow = limits.RecordingThreshold > 0 ? Math.Log(limits.RecordingThreshold) : double.NegativeInfinity;
        var lnHigh = Math.Log(limits.Saturation);
        for (var i = 0; i < n; i++)
        {
            if (!double.IsFinite(sizesMm[i]) || sizesMm[i] <= 0)
            {
                throw new ArgumentOutOfRangeException(nameof(sizesMm), sizesMm[i], FormattableString.Invariant($"Size #{i} must be finite and > 0 mm."));
            }

            if (!double.IsFinite(signals[i]) || signals[i] <= 0)
            {
                throw new ArgumentOutOfRangeException(nameof(signals), signals[i], FormattableString.Invariant($"Signal #{i} must be finite and > 0."));
            }

            x[i] = Math.Log(sizesMm[i]);
            y[i] = Math.Log(signals[i]);
            censoring[i] = signals[i] <= limits.RecordingThreshold ? -1 : signals[i] >= limits.Saturation ? 1 : 0;
        }

        var uncensored = Enumerable.Range(0, n).Where(i => censoring[i] == 0).ToArray();
        if (uncensored.Length < 3 || uncensored.Select(i => x[i]).Distinct().Count() < 2)
        {
            throw new ArgumentException("â-versus-a fitting needs at least three uncensored signals at two or more sizes.", nameof(signals));
        }

        // Start from least squares on the uncensored points.
        var mx = uncensored.Average(i => x[i]);
        var my = uncensored.Average(i => y[i]);
        var sxx = uncensored.Sum(i => (x[i] - mx) * (x[i] - mx));
        var sxy = uncensored.Sum(i => (x[i] - mx) * (y[i] - my));
        var slope0 = sxy / sxx;
        var intercept0 = my - slope0 * mx;
        var rss = uncensored.Sum(i => Math.Pow(y[i] - intercept0 - slope0 * x[i], 2));
        var tau0 = Math.Max(Math.Sqrt(rss / uncensored.Length), 1e-6);
        var p = Vector<double>.Build.DenseOfArray([intercept0 / tau0, slope0 / tau0, 1 / tau0]);

        var lik = TobitLogLikelihood(x, y, censoring, lnLow, lnHigh, p);
        var converged = false;
        var iterations = 0;
        var diagnostic = "iteration limit reached";
        for (iterations = 1; iterations <= MaxIterations; iterations++)
        {
            var (g, h) = TobitDerivatives(x, y, censoring, lnLow, lnHigh, p);
            var step = h.Solve(-g);
            if (!step.All(double.IsFinite))
            {
                diagnostic = "the Hessian became singular";
                break;
            }

            var t = 1.0;
            var next = p;
            var nextLik = lik;
            for (var halving = 0; halving < 40; halving++)
            {
                next = p + t * step;
                if (next[2] > 0)
                {
                    nextLik = TobitLogLikelihood(x, y, censoring, lnLow, lnHigh, next);
                    if (nextLik >= lik - 1e-12 * Math.Abs(lik))
                    {
                        break;
                    }
                }

                t /= 2;
            }

            var change = (next - p).L1Norm();
            p = next;
            lik = nextLik;
            if (change < 1e-11 * (1 + p.L1Norm()))
            {
                converged = true;
                diagnostic = FormattableString.Invariant($"converged in {iterations} Newton iterations");
                break;
            }
        }

        var (_, hessian) = TobitDerivatives(x, y, censoring, lnLow, lnHigh, p);
        var olsenCov = new ParameterCovariance(["gamma0", "gamma1", "theta"], (-hessian).Inverse().ToArray());
        double g0 = p[0], g1 = p[1], th = p[2];
        var b0 = g0 / th;
        var b1 = g1 / th;
        var tau = 1 / th;
        var jac = new[,]
        {
            { 1 / th, 0, -g0 / (th * th) },
            { 0, 1 / th, -g1 / (th * th) },
            { 0, 0, -1 / (th * th) },
        };
        var cov = olsenCov.Transform(["beta0", "beta1", "tau"], jac);

        if (converged && !(b1 > 0))
        {
            converged = false;
            diagnostic = FormattableString.Invariant($"the fitted slope β₁ = {b1:G6} is not positive: the signal does not rise with size");
        }

        PodEstimate? estimate = null;
        if (converged)
        {
            var lnDec = Math.Log(limits.DecisionThreshold);
            var mu = (lnDec - b0) / b1;
            var sigma = tau / b1;
            var muSigmaJac = new[,]
            {
                { -1 / b1, -mu / b1, 0 },
                { 0, -sigma / b1, 1 / b1 },
            };
            estimate = new PodEstimate(PodLink.Probit, mu, sigma, cov.Transform(["mu", "sigma"], muSigmaJac));
        }

        return new SignalResponseFit(
            b0, b1, tau, cov, limits.DecisionThreshold, estimate, lik, n,
            censoring.Count(c => c < 0), censoring.Count(c => c > 0), Math.Min(iterations, MaxIterations), converged, diagnostic);
    }

    private static void ValidateLimits(SignalLimits limits)
    {
        if (!double.IsFinite(limits.DecisionThreshold) || limits.DecisionThreshold <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(limits), limits.DecisionThreshold, "The decision threshold â_dec must be finite and > 0.");
        }

        if (!double.IsFinite(limits.RecordingThreshold) || limits.RecordingThreshold < 0 || limits.RecordingThreshold > limits.DecisionThreshold)
        {
            throw new ArgumentOutOfRangeException(nameof(limits), limits.RecordingThreshold, "The recording threshold must be finite, ≥ 0 and not above the decision threshold.");
        }

        if (double.IsNaN(limits.Saturation) || limits.Saturation <= limits.DecisionThreshold)
        {
            throw new ArgumentOutOfRangeException(nameof(limits), limits.Saturation, "The saturation level must lie above the decision threshold (+∞ for none).");
        }
    }

    /// <summary>Censored-normal log-likelihood of ln â in Olsen's parameters p = (γ₀, γ₁, θ).</summary>
    internal static double TobitLogLikelihood(double[] x, double[] y, int[] censoring, double lnLow, double lnHigh, Vector<double> p)
    {
        double g0 = p[0], g1 = p[1], th = p[2];
        var sum = 0.0;
        for (var i = 0; i < x.Length; i++)
        {
            var xg = g0 + g1 * x[i];
            sum += censoring[i] switch
            {
                0 => Math.Log(th) - 0.5 * Math.Pow(th * y[i] - xg, 2) - 0.5 * Math.Log(2 * Math.PI),
                < 0 => PodMath.LogNormalCdf(th * lnLow - xg),
                _ => PodMath.LogNormalCdf(xg - th * lnHigh),
            };
        }

        return sum;
    }

    // Gradient and Hessian in Olsen's parameters. Uncensored: e = θy − xᵀγ, ℓ = ln θ − e²/2. Censored: ℓ = ln Φ(d)
    // with d linear in the parameters, ℓ' = λ(d) = φ(d)/Φ(d), ℓ'' = −λ(d)(d + λ(d)).
    private static (Vector<double> Gradient, Matrix<double> Hessian) TobitDerivatives(
        double[] x, double[] y, int[] censoring, double lnLow, double lnHigh, Vector<double> p)
    {
        double g0 = p[0], g1 = p[1], th = p[2];
        var grad = Vector<double>.Build.Dense(3);
        var hess = Matrix<double>.Build.Dense(3, 3);
        var v = new double[3];
        for (var i = 0; i < x.Length; i++)
        {
            var xg = g0 + g1 * x[i];
            if (censoring[i] == 0)
            {
                var e = th * y[i] - xg;
                grad[0] += e;
                grad[1] += e * x[i];
                grad[2] += 1 / th - e * y[i];
                hess[0, 0] -= 1;
                hess[0, 1] -= x[i];
                hess[1, 1] -= x[i] * x[i];
                hess[0, 2] += y[i];
                hess[1, 2] += y[i] * x[i];
                hess[2, 2] -= 1 / (th * th) + y[i] * y[i];
                continue;
            }

            double d;
            if (censoring[i] < 0)
            {
                d = th * lnLow - xg;
                v[0] = -1;
                v[1] = -x[i];
                v[2] = lnLow;
            }
            else
            {
                d = xg - th * lnHigh;
                v[0] = 1;
                v[1] = x[i];
                v[2] = -lnHigh;
            }

            var lambda = PodMath.InverseMills(d);
            var curvature = -lambda * (d + lambda);
            for (var a = 0; a < 3; a++)
            {
                grad[a] += lambda * v[a];
                for (var b = a; b < 3; b++)
                {
                    hess[a, b] += curvature * v[a] * v[b];
                }
            }
        }

        hess[1, 0] = hess[0, 1];
        hess[2, 0] = hess[0, 2];
        hess[2, 1] = hess[1, 2];
        return (grad, hess);
    }
}
