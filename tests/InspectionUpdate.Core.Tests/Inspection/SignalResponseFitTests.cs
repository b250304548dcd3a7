using InspectionUpdate.Inspection;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace InspectionUpdate.Tests.Inspection;

public class SignalResponseFitTests
{
    private const double TrueB0 = 1.0, TrueB1 = 1.2, TrueTau = 0.3;

    // ln â = β₀ + β₁ ln a + τε with sizes log-uniform over 0.2–6 mm; responses clipped at the censoring limits.
    private static (double[] Sizes, double[] Signals) Simulate(int n, SignalLimits limits, int seed)
    {
        var rng = new Random(seed);
        var sizes = new double[n];
        var signals = new double[n];
        for (var i = 0; i < n; i++)
        {
            sizes[i] = Math.Exp(Math.Log(0.2) + (Math.Log(6.0) - Math.Log(0.2)) * rng.NextDouble());
            var s = Math.Exp(TrueB0 + TrueB1 * Math.Log(sizes[i]) + TrueTau * Normal.Sample(rng, 0, 1));
            signals[i] = Math.Clamp(s, limits.RecordingThreshold, limits.Saturation);
        }

        return (sizes, signals);
    }

    [Fact]
    [Reference("Closed form for uncensored normal regression: β̂ = OLS, τ̂² = RSS/n, Cov β̂ = τ̂²(XᵀX)⁻¹, Var τ̂ = τ̂²/(2n) (observed information at the MLE)")]
    public void Without_censoring_the_fit_is_least_squares_with_the_normal_theory_covariance()
    {
        var (sizes, signals) = Simulate(60, new SignalLimits(1.0), 11);
        var fit = PodFitting.FitSignalResponse(sizes, signals, new SignalLimits(1.0));
        Assert.True(fit.Converged, fit.Diagnostic);

        var x = Matrix<double>.Build.Dense(sizes.Length, 2, (i, j) => j == 0 ? 1 : Math.Log(sizes[i]));
        var y = Vector<double>.Build.Dense(signals.Length, i => Math.Log(signals[i]));
        var xtxInv = (x.Transpose() * x).Inverse();
        var beta = xtxInv * x.Transpose() * y;
        var residual = y - x * beta;
        var tau2 = residual.DotProduct(residual) / sizes.Length;
        Assert.Equal(beta[0], fit.Intercept, 1e-9);
        Assert.Equal(beta[1], fit.Slope, 1e-9);
        Assert.Equal(Math.Sqrt(tau2), fit.Tau, 1e-9);
        Assert.Equal(tau2 * xtxInv[0, 0], fit.Covariance[0, 0], 1e-9);
        Assert.Equal(tau2 * xtxInv[0, 1], fit.Covariance[0, 1], 1e-9);
        Assert.Equal(tau2 * xtxInv[1, 1], fit.Covariance[1, 1], 1e-9);
        Assert.Equal(tau2 / (2 * sizes.Length), fit.Covariance[2, 2], 1e-9);
        Assert.Equal(0, fit.LeftCensored + fit.RightCensored);
    }

    private static double CensoredLogLikelihood(Vector<double> v, double[] a, double[] s, SignalLimits limits)
    {
        double b0 = v[0], b1 = v[1], tau = Math.Exp(v[2]);
        var sum = 0.0;
        for (var i = 0; i < a.Length; i++)
        {
            var m = b0 + b1 * Math.Log(a[i]);
            sum += s[i] <= limits.RecordingThreshold ? Math.Log(Normal.CDF(m, tau, Math.Log(limits.RecordingThreshold)))
                : s[i] >= limits.Saturation ? Math.Log(1 - Normal.CDF(m, tau, Math.Log(limits.Saturation)))
                : Normal.PDFLn(m, tau, Math.Log(s[i]));
        }

        return sum;
    }

    [Fact]
    [Reference("Independent computation in the test: Nelder–Mead (MathNet) on the censored-normal (Tobit) log-likelihood in (β₀, β₁, ln τ)")]
    public void Censored_fit_matches_an_independent_optimizer_of_the_tobit_likelihood()
    {
        var limits = new SignalLimits(DecisionThreshold: 2.0, RecordingThreshold: 1.0, Saturation: 12.0);
        var (sizes, signals) = Simulate(200, limits, 23);
        var fit = PodFitting.FitSignalResponse(sizes, signals, limits);
        Assert.True(fit.Converged, fit.Diagnostic);
        Assert.True(fit.LeftCensored > 10 && fit.RightCensored > 10, "the sample must exercise both censoring limits");

        var objective = ObjectiveFunction.Value(v => -CensoredLogLikelihood(v, sizes, signals, limits));
        var nm = NelderMeadSimplex.Minimum(objective, Vector<double>.Build.Dense([0.5, 1.0, Math.Log(0.5)]), 1e-15, 50000).MinimizingPoint;
        Assert.Equal(nm[0], fit.Intercept, 1e-5);
        Assert.Equal(nm[1], fit.Slope, 1e-5);
        Assert.Equal(Math.Exp(nm[2]), fit.Tau, 1e-5);
        Assert.Equal(-objective.Value, fit.LogLikelihood, 1e-7);
    }

    [Fact]
    [Reference("Simulation in the test (seed 5): each fitted parameter within 4 standard errors (inverse observed information) of the truth")]
    public void Censored_fit_recovers_known_parameters_within_four_standard_errors()
    {
        var limits = new SignalLimits(DecisionThreshold: 2.0, RecordingThreshold: 1.0, Saturation: 12.0);
        var (sizes, signals) = Simulate(400, limits, 5);
        var fit = PodFitting.FitSignalResponse(sizes, signals, limits);
        Assert.InRange(fit.Intercept, TrueB0 - 4 * fit.Covariance.StandardError("beta0"), TrueB0 + 4 * fit.Covariance.StandardError("beta0"));
        Assert.InRange(fit.Slope, TrueB1 - 4 * fit.Covariance.StandardError("beta1"), TrueB1 + 4 * fit.Covariance.StandardError("beta1"));
        Assert.InRange(fit.Tau, TrueTau - 4 * fit.Covariance.StandardError("tau"), TrueTau + 4 * fit.Covariance.StandardError("tau"));
    }

    [Fact]
    [Reference("MIL-HDBK-1823A â-versus-a: PoD(a) = P(ln â > ln â_dec) = Φ((β₀ + β₁ ln a − ln â_dec)/τ); μ = (ln â_dec − β₀)/β₁, σ = τ/β₁")]
    public void Pod_follows_from_the_regression_and_the_decision_threshold()
    {
        var limits = new SignalLimits(DecisionThreshold: 2.0, RecordingThreshold: 1.0, Saturation: 12.0);
        var (sizes, signals) = Simulate(200, limits, 23);
        var fit = PodFitting.FitSignalResponse(sizes, signals, limits);
        var estimate = fit.RequireEstimate();
        var curve = estimate.ToCurve();
        foreach (var a in new[] { 0.3, 0.8, 1.5, 3.0 })
        {
            var expected = Normal.CDF(0, 1, (fit.Intercept + fit.Slope * Math.Log(a) - Math.Log(2.0)) / fit.Tau);
            Assert.Equal(expected, curve.Evaluate(a), 1e-12);
        }

        Assert.Equal(Math.Exp((Math.Log(2.0) - fit.Intercept) / fit.Slope + 1.281551565544601 * fit.Tau / fit.Slope), estimate.A90Mm, 1e-9);
    }

    [Fact]
    [Reference("Delta method written out in the test with a central-difference gradient of ln a₉₀(β₀, β₁, τ) = (ln â_dec − β₀ + z₉₀τ)/β₁")]
    public void A90_95_is_the_delta_method_bound_from_the_regression_covariance()
    {
        var limits = new SignalLimits(DecisionThreshold: 2.0, RecordingThreshold: 1.0, Saturation: 12.0);
        var (sizes, signals) = Simulate(200, limits, 23);
        var fit = PodFitting.FitSignalResponse(sizes, signals, limits);
        var z90 = Normal.InvCDF(0, 1, 0.9);
        double LnA90(double b0, double b1, double tau) => (Math.Log(2.0) - b0 + z90 * tau) / b1;
        const double h = 1e-6;
        double[] g =
        [
            (LnA90(fit.Intercept + h, fit.Slope, fit.Tau) - LnA90(fit.Intercept - h, fit.Slope, fit.Tau)) / (2 * h),
            (LnA90(fit.Intercept, fit.Slope + h, fit.Tau) - LnA90(fit.Intercept, fit.Slope - h, fit.Tau)) / (2 * h),
            (LnA90(fit.Intercept, fit.Slope, fit.Tau + h) - LnA90(fit.Intercept, fit.Slope, fit.Tau - h)) / (2 * h),
        ];
        var variance = 0.0;
        for (var i = 0; i < 3; i++)
        {
            for (var j = 0; j < 3; j++)
            {
                variance += g[i] * fit.Covariance[i, j] * g[j];
            }
        }

        var expected = Math.Exp(LnA90(fit.Intercept, fit.Slope, fit.Tau) + Normal.InvCDF(0, 1, 0.95) * Math.Sqrt(variance));
        Assert.Equal(expected, fit.RequireEstimate().A90At95Mm, 1e-7 * expected);
    }

    [Fact]
    [Reference("Validation at the public boundary (STYLE.md)")]
    public void Inconsistent_limits_are_refused()
    {
        double[] a = [1, 2, 3, 4];
        double[] s = [1, 2, 3, 4];
        Assert.Throws<ArgumentOutOfRangeException>("limits", () => PodFitting.FitSignalResponse(a, s, new SignalLimits(2.0, RecordingThreshold: 3.0)));
        Assert.Throws<ArgumentOutOfRangeException>("limits", () => PodFitting.FitSignalResponse(a, s, new SignalLimits(2.0, Saturation: 1.5)));
        Assert.Throws<ArgumentException>("signals", () => PodFitting.FitSignalResponse(a, [1, 1, 1, 1], new SignalLimits(2.0, RecordingThreshold: 1.0)));
    }
}
