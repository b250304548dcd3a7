using InspectionUpdate.Inspection;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace InspectionUpdate.Tests.Inspection;

public class HitMissFitTests
{
    // docs/references.md, "PoD" [derived]: the hit/miss fit check.
    private static readonly double[] CheckSizesMm = [0.5, 0.7, 1.0, 1.2, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0];
    private static readonly bool[] CheckHits = [false, false, false, true, false, true, false, true, true, true];

    private static double LogitLogLikelihood(double b0, double b1, double[] a, bool[] y)
    {
        var sum = 0.0;
        for (var i = 0; i < a.Length; i++)
        {
            var p = 1 / (1 + Math.Exp(-(b0 + b1 * Math.Log(a[i]))));
            sum += y[i] ? Math.Log(p) : Math.Log(1 - p);
        }

        return sum;
    }

    private static double ProbitLogLikelihood(double b0, double b1, double[] a, bool[] y)
    {
        var sum = 0.0;
        for (var i = 0; i < a.Length; i++)
        {
            var p = Normal.CDF(0, 1, b0 + b1 * Math.Log(a[i]));
            sum += y[i] ? Math.Log(p) : Math.Log(1 - p);
        }

        return sum;
    }

    // Independent maximization: BFGS on −ℓ with the logit score Σ (y − p)(1, ln a) written out here.
    private static Vector<double> IndependentLogitFit(double[] a, bool[] y)
    {
        var objective = ObjectiveFunction.Gradient(v =>
        {
            var g = Vector<double>.Build.Dense(2);
            for (var i = 0; i < a.Length; i++)
            {
                var x = Math.Log(a[i]);
                var r = (y[i] ? 1 : 0) - 1 / (1 + Math.Exp(-(v[0] + v[1] * x)));
                g[0] -= r;
                g[1] -= r * x;
            }

            return (-LogitLogLikelihood(v[0], v[1], a, y), g);
        });
        return new BfgsMinimizer(1e-12, 1e-12, 1e-14, 1000).FindMinimum(objective, Vector<double>.Build.Dense([0.0, 1.0])).MinimizingPoint;
    }

    [Fact]
    [Reference("docs/references.md, PoD fit check [derived]: logit in ln a gives β₀ = −1.509965, β₁ = 2.792681, a₉₀ = 3.771475 mm")]
    [Reference("Independent computation in the test: BFGS (MathNet) on the logit log-likelihood")]
    public void Logit_fit_of_the_check_data_matches_the_derived_values_and_an_independent_optimizer()
    {
        var fit = PodFitting.FitHitMiss(CheckSizesMm, CheckHits, PodLink.Logit);
        Assert.True(fit.Converged, fit.Diagnostic);
        Assert.Equal(-1.509965, fit.Intercept, 5e-6);
        Assert.Equal(2.792681, fit.Slope, 5e-6);
        Assert.Equal(3.771475, fit.RequireEstimate().A90Mm, 5e-6);

        var independent = IndependentLogitFit(CheckSizesMm, CheckHits);
        Assert.Equal(independent[0], fit.Intercept, 1e-6);
        Assert.Equal(independent[1], fit.Slope, 1e-6);
        Assert.Equal(LogitLogLikelihood(independent[0], independent[1], CheckSizesMm, CheckHits), fit.LogLikelihood, 1e-9);
    }

    [Fact]
    [Reference("Independent computation in the test: inverse of the central-difference Hessian of −ℓ (logit: observed = expected information)")]
    public void Logit_covariance_is_the_inverse_information()
    {
        var fit = PodFitting.FitHitMiss(CheckSizesMm, CheckHits, PodLink.Logit);
        double b0 = fit.Intercept, b1 = fit.Slope, h = 1e-4;
        double F(double x0, double x1) => -LogitLogLikelihood(x0, x1, CheckSizesMm, CheckHits);
        var h00 = (F(b0 + h, b1) - 2 * F(b0, b1) + F(b0 - h, b1)) / (h * h);
        var h11 = (F(b0, b1 + h) - 2 * F(b0, b1) + F(b0, b1 - h)) / (h * h);
        var h01 = (F(b0 + h, b1 + h) - F(b0 + h, b1 - h) - F(b0 - h, b1 + h) + F(b0 - h, b1 - h)) / (4 * h * h);
        var inv = Matrix<double>.Build.DenseOfArray(new[,] { { h00, h01 }, { h01, h11 } }).Inverse();
        Assert.Equal(inv[0, 0], fit.Covariance[0, 0], 1e-5 * inv[0, 0]);
        Assert.Equal(inv[0, 1], fit.Covariance[0, 1], 1e-5 * Math.Abs(inv[0, 1]));
        Assert.Equal(inv[1, 1], fit.Covariance[1, 1], 1e-5 * inv[1, 1]);
    }

    [Fact]
    [Reference("Delta method (MIL-HDBK-1823A): ln a_p = (z_p − β₀)/β₁, ∇ = (−1/β₁, −(z_p − β₀)/β₁²), a₉₀/₉₅ = exp(ln a₉₀ + 1.644854·se); written out in the test")]
    public void A90_95_is_the_delta_method_bound_computed_from_the_coefficient_covariance()
    {
        var fit = PodFitting.FitHitMiss(CheckSizesMm, CheckHits, PodLink.Logit);
        var z = Math.Log(9.0);
        double b0 = fit.Intercept, b1 = fit.Slope;
        var g0 = -1 / b1;
        var g1 = -(z - b0) / (b1 * b1);
        var variance = g0 * g0 * fit.Covariance[0, 0] + 2 * g0 * g1 * fit.Covariance[0, 1] + g1 * g1 * fit.Covariance[1, 1];
        var expected = Math.Exp((z - b0) / b1 + Normal.InvCDF(0, 1, 0.95) * Math.Sqrt(variance));
        var estimate = fit.RequireEstimate();
        Assert.Equal(expected, estimate.A90At95Mm, 1e-9 * expected);
        Assert.True(estimate.A90At95Mm > estimate.A90Mm);
    }

    [Fact]
    [Reference("Independent computation in the test: Nelder–Mead (MathNet) on the probit log-likelihood")]
    public void Probit_fit_matches_an_independent_optimizer()
    {
        var fit = PodFitting.FitHitMiss(CheckSizesMm, CheckHits, PodLink.Probit);
        Assert.True(fit.Converged, fit.Diagnostic);
        var objective = ObjectiveFunction.Value(v => -ProbitLogLikelihood(v[0], v[1], CheckSizesMm, CheckHits));
        var nm = NelderMeadSimplex.Minimum(objective, Vector<double>.Build.Dense([0.0, 1.0]), 1e-14, 20000).MinimizingPoint;
        Assert.Equal(nm[0], fit.Intercept, 1e-5);
        Assert.Equal(nm[1], fit.Slope, 1e-5);
        Assert.IsType<CumulativeLognormalPod>(fit.RequireEstimate().ToCurve());
    }

    [Fact]
    [Reference("Known property of logistic regression: completely separated data have no finite MLE (Albert & Anderson 1984, from memory)")]
    public void Separated_data_are_reported_as_not_converged()
    {
        var fit = PodFitting.FitHitMiss([0.5, 0.7, 1.0, 2.0, 3.0, 4.0], [false, false, false, true, true, true], PodLink.Logit);
        Assert.False(fit.Converged);
        Assert.Null(fit.Estimate);
        Assert.Contains("separated", fit.Diagnostic, StringComparison.Ordinal);
        Assert.Throws<InvalidOperationException>(() => fit.RequireEstimate());
    }

    [Fact]
    [Reference("Validation at the public boundary (STYLE.md)")]
    public void Invalid_hit_miss_data_are_refused_naming_the_argument()
    {
        Assert.Throws<ArgumentException>("hits", () => PodFitting.FitHitMiss([1.0, 2.0], [true], PodLink.Logit));
        Assert.Throws<ArgumentOutOfRangeException>("sizesMm", () => PodFitting.FitHitMiss([1.0, -2.0], [true, false], PodLink.Logit));
        Assert.Throws<ArgumentException>("hits", () => PodFitting.FitHitMiss([1.0, 2.0], [true, true], PodLink.Logit));
    }

    private static (double[] Sizes, bool[] Hits) Simulate(int n, double mu, double sigma, PodLink link, Random rng)
    {
        var sizes = new double[n];
        var hits = new bool[n];
        for (var i = 0; i < n; i++)
        {
            // Sizes log-uniform over 0.3–8 mm, the spread of a qualification block.
            sizes[i] = Math.Exp(Math.Log(0.3) + (Math.Log(8.0) - Math.Log(0.3)) * rng.NextDouble());
            var z = (Math.Log(sizes[i]) - mu) / sigma;
            var p = link == PodLink.Logit ? 1 / (1 + Math.Exp(-z)) : Normal.CDF(0, 1, z);
            hits[i] = rng.NextDouble() < p;
        }

        return (sizes, hits);
    }

    [Theory]
    [InlineData(PodLink.Logit)]
    [InlineData(PodLink.Probit)]
    [Reference("Simulation in the test (seed 20261202): asymptotic normality of the MLE; each estimate and ln a₉₀ within 4 standard errors of the truth (a 3-SE band fails for 0.3 % of seeds; the Wald SE of ln a₉₀ runs about 8 % small at n = 600)")]
    public void Fit_recovers_known_parameters_from_simulated_data_within_four_standard_errors(PodLink link)
    {
        const double mu = 0.4, sigma = 0.35;
        var (sizes, hits) = Simulate(600, mu, sigma, link, new Random(20261202));
        var fit = PodFitting.FitHitMiss(sizes, hits, link);
        var estimate = fit.RequireEstimate();
        Assert.InRange(estimate.MuLnMm, mu - 4 * estimate.Covariance.StandardError("mu"), mu + 4 * estimate.Covariance.StandardError("mu"));
        Assert.InRange(estimate.SigmaLn, sigma - 4 * estimate.Covariance.StandardError("sigma"), sigma + 4 * estimate.Covariance.StandardError("sigma"));
        var trueA90 = Math.Exp(mu + PodEstimate.LinkQuantile(link, 0.9) * sigma);
        // se(ln a₉₀) recovered from the one-sided 95 % bound: ln a₉₀/₉₅ − ln a₉₀ = Φ⁻¹(0.95)·se.
        var seLnA90 = (Math.Log(estimate.A90At95Mm) - Math.Log(estimate.A90Mm)) / Normal.InvCDF(0, 1, 0.95);
        Assert.InRange(Math.Log(trueA90), Math.Log(estimate.A90Mm) - 4 * seLnA90, Math.Log(estimate.A90Mm) + 4 * seLnA90);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Simulation in the test (seed 7): the one-sided 95 % delta-method bound covers the true a₉₀ in 95 % of replications, within 3.5 binomial standard errors")]
    public void A90_95_bound_covers_the_true_a90_at_the_nominal_rate()
    {
        const double mu = 0.4, sigma = 0.35;
        const int replications = 400;
        var rng = new Random(7);
        var trueA90 = Math.Exp(mu + Math.Log(9.0) * sigma);
        var covered = 0;
        for (var r = 0; r < replications; r++)
        {
            var (sizes, hits) = Simulate(300, mu, sigma, PodLink.Logit, rng);
            if (trueA90 <= PodFitting.FitHitMiss(sizes, hits, PodLink.Logit).RequireEstimate().A90At95Mm)
            {
                covered++;
            }
        }

        var rate = (double)covered / replications;
        var se = Math.Sqrt(0.95 * 0.05 / replications);
        Assert.InRange(rate, 0.95 - 3.5 * se, 0.95 + 3.5 * se);
    }
}
