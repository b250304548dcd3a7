using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// depth = D0 + R·t with normal D0, R and normal measurement errors: every event is linear in Gaussians, so the
/// posterior is the conjugate Gaussian one and the updated Pf is exact (computed in the test by Gaussian conditioning).
/// </summary>
public class LinearGaussianUpdatingTests
{
    private const double D0Mean = 1.0, D0Sd = 0.3, RMean = 0.25, RSd = 0.08, CriticalMm = 8.0, ErrorSd = 0.25;
    private static readonly (double T, double Mm)[] Readings = [(5, 2.6), (10, 4.1)];

    private static readonly InspectionMethod Ut = TestModels.Method(new CumulativeLognormalPod(Math.Log(1.0), 0.4), SizingErrorKind.AdditiveNormal, 0, ErrorSd);

    private static List<InspectionOutcome> Evidence() =>
        Readings.Select((r, i) => (InspectionOutcome)new SizedIndication(r.T, $"W-{i + 1}", Ut, r.Mm)).ToList();

    /// <summary>
    /// Conjugate posterior of θ = (D0, R) given y_k = D0 + R·t_k + e_k, e_k ~ N(0, σ²):
    /// Σ = (Σ₀⁻¹ + HᵀH/σ²)⁻¹, μ = Σ(Σ₀⁻¹μ₀ + Hᵀy/σ²) (standard Gaussian conditioning, e.g. Gelman et al., Bayesian
    /// Data Analysis, linear regression with known variance).
    /// </summary>
    internal static (double[] Mean, double[,] Cov) ExactPosterior((double T, double Mm)[] readings)
    {
        // Precision matrix and information vector, 2 × 2 by hand.
        var p00 = 1 / (D0Sd * D0Sd);
        var p11 = 1 / (RSd * RSd);
        var p01 = 0.0;
        var b0 = D0Mean * p00;
        var b1 = RMean * p11;
        foreach (var (t, y) in readings)
        {
            var w = 1 / (ErrorSd * ErrorSd);
            p00 += w;
            p01 += w * t;
            p11 += w * t * t;
            b0 += w * y;
            b1 += w * t * y;
        }

        var det = p00 * p11 - p01 * p01;
        var cov = new[,] { { p11 / det, -p01 / det }, { -p01 / det, p00 / det } };
        var mean = new[] { cov[0, 0] * b0 + cov[0, 1] * b1, cov[1, 0] * b0 + cov[1, 1] * b1 };
        return (mean, cov);
    }

    /// <summary>Pf(t) = Φ(−(d_c − μ_D(t))/σ_D(t)) with D(t) = D0 + R·t Gaussian.</summary>
    internal static double ExactBeta(double[] mean, double[,] cov, double t)
    {
        var mu = mean[0] + mean[1] * t;
        var variance = cov[0, 0] + 2 * t * cov[0, 1] + t * t * cov[1, 1];
        return (CriticalMm - mu) / Math.Sqrt(variance);
    }

    private static TestDegradationModel Model() => TestModels.LinearDepth(D0Mean, D0Sd, RMean, RSd, CriticalMm);

    [Theory]
    [InlineData(12.0)]
    [InlineData(20.0)]
    [InlineData(30.0)]
    [Reference("Closed form: Gaussian conditioning of the conjugate linear-Gaussian model, computed in the test")]
    public void First_order_route_matches_the_exact_conjugate_result_to_1e_6_in_beta(double t)
    {
        var (mean, cov) = ExactPosterior(Readings);
        var expected = ExactBeta(mean, cov, t);
        var updater = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.FirstOrder });
        var result = updater.Estimate(Model(), Evidence(), t);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.True(double.IsNaN(result.EvidenceProbability), "with equalities the evidence is a density, not a probability");
        Assert.True(Math.Abs(result.Beta - expected) <= 1e-6 * Math.Abs(expected), $"β {result.Beta:R} against exact {expected:R}");
    }

    [Fact]
    [Reference("Closed form: prior D(t) ~ N(μ_D0 + μ_R t, √(σ_D0² + t²σ_R²)) (Cornell 1969 for a linear margin)")]
    public void Without_findings_the_prior_Pf_is_returned()
    {
        var t = 20.0;
        var expected = (CriticalMm - (D0Mean + RMean * t)) / Math.Sqrt(D0Sd * D0Sd + t * t * RSd * RSd);
        var result = new ReliabilityUpdater().Estimate(Model(), [], t);
        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.Equal(1.0, result.EvidenceProbability);
        Assert.Equal(expected, result.Beta, 1e-7);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: Gaussian conditioning of the conjugate linear-Gaussian model, computed in the test")]
    public void Simulation_route_matches_the_exact_conjugate_Pf_within_four_standard_errors()
    {
        var t = 20.0;
        var (mean, cov) = ExactPosterior(Readings);
        var expected = StandardNormal.Cdf(-ExactBeta(mean, cov, t));
        var updater = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = 11 });
        var result = updater.Estimate(Model(), Evidence(), t);
        Assert.Equal(ComputationRoute.ImportanceSampling, result.Route);
        Assert.True(result.Converged, result.Note);
        var se = result.CoefficientOfVariation!.Value * result.CumulativePf;
        Assert.True(Math.Abs(result.CumulativePf - expected) <= 4 * se, $"Pf {result.CumulativePf:G6} ± {se:G3} against exact {expected:G6}");
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: conjugate Gaussian posterior of (D0, R), computed in the test; normal quantiles μ ± 1.644854σ")]
    public void Posterior_summary_of_the_rate_matches_the_conjugate_posterior()
    {
        var (mean, cov) = ExactPosterior(Readings);
        var updater = new ReliabilityUpdater(new UpdatingOptions { Seed = 5 });
        var summary = updater.Posterior(Model(), Evidence());
        var rate = summary["R_mmPerYear"];
        var sd = Math.Sqrt(cov[1, 1]);
        Assert.True(summary.Converged, summary.Note);
        Assert.True(summary.EffectiveSampleSize > 1000, $"ESS {summary.EffectiveSampleSize}");
        // Standard error of a weighted mean ≈ σ/√ESS; of the sd ≈ σ/√(2·ESS); of a 5 % quantile ≈ 2.1σ/√ESS.
        var n = summary.EffectiveSampleSize;
        Assert.True(Math.Abs(rate.Mean - mean[1]) <= 4 * sd / Math.Sqrt(n), $"mean {rate.Mean} against {mean[1]}");
        Assert.True(Math.Abs(rate.StandardDeviation - sd) <= 4 * sd / Math.Sqrt(2 * n), $"sd {rate.StandardDeviation} against {sd}");
        Assert.True(Math.Abs(rate.Quantile05 - (mean[1] - 1.6448536269514722 * sd)) <= 4 * 2.1 * sd / Math.Sqrt(n));
        Assert.True(Math.Abs(rate.Quantile50 - mean[1]) <= 4 * 1.26 * sd / Math.Sqrt(n));
        Assert.True(Math.Abs(rate.Quantile95 - (mean[1] + 1.6448536269514722 * sd)) <= 4 * 2.1 * sd / Math.Sqrt(n));
        Assert.Equal(RMean, rate.PriorMean, 12);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: conjugate Gaussian posterior of (D0, R), computed in the test; the prior N(RMean, RSd) of the model")]
    public void Posterior_draws_for_histograms_follow_the_prior_and_the_conjugate_posterior()
    {
        var (mean, cov) = ExactPosterior(Readings);
        var session = new ReliabilityUpdater(new UpdatingOptions { Seed = 5 }).Prepare(Model(), Evidence());
        var summary = session.Posterior();
        var rate = session.PosteriorSamples(4000).Single(s => s.Name == "R_mmPerYear");
        static (double Mean, double Sd) Moments(IReadOnlyList<double> v)
        {
            var m = v.Average();
            return (m, Math.Sqrt(v.Sum(x => (x - m) * (x - m)) / (v.Count - 1)));
        }

        // Prior: 4000 independent draws, so the mean lies within 4σ/√4000 of the prior mean.
        var (priorMean, priorSd) = Moments(rate.Prior);
        Assert.True(Math.Abs(priorMean - RMean) <= 4 * RSd / Math.Sqrt(4000), $"prior mean {priorMean}");
        Assert.True(Math.Abs(priorSd - RSd) <= 4 * RSd / Math.Sqrt(2 * 4000), $"prior sd {priorSd}");
        // Posterior: resampled importance samples carry no more information than the effective sample size.
        var sd = Math.Sqrt(cov[1, 1]);
        var n = Math.Min(summary.EffectiveSampleSize, 4000);
        var (postMean, postSd) = Moments(rate.Posterior);
        Assert.True(Math.Abs(postMean - mean[1]) <= 5 * sd / Math.Sqrt(n), $"posterior mean {postMean} against {mean[1]}");
        Assert.True(Math.Abs(postSd - sd) <= 5 * sd / Math.Sqrt(2 * n), $"posterior sd {postSd} against {sd}");
    }

    [Fact]
    [Reference("Madsen (1987), one equality: P(F | H = 0) = Φ(−(β_F − ρβ_H)/√(1 − ρ²)) (from memory), exact for linear Gaussian events")]
    public void One_sized_reading_reproduces_Madsens_single_equality_formula()
    {
        // Linear events in u = (u_D0, u_R, u_ε): g = d_c − D0 − R t; h = D0 + R t_k + ε − a_m.
        var t = 20.0;
        var (tk, am) = Readings[1];
        double[] gradG = [-D0Sd, -RSd * t, 0];
        var g0 = CriticalMm - D0Mean - RMean * t;
        double[] gradH = [D0Sd, RSd * tk, ErrorSd];
        var h0 = D0Mean + RMean * tk - am;
        var nG = Math.Sqrt(gradG.Sum(v => v * v));
        var nH = Math.Sqrt(gradH.Sum(v => v * v));
        var betaF = g0 / nG;
        var betaH = h0 / nH;
        var rho = gradG.Zip(gradH, (a, b) => a * b).Sum() / (nG * nH);
        var madsen = StandardNormal.Cdf(-(betaF - rho * betaH) / Math.Sqrt(1 - rho * rho));

        var (mean, cov) = ExactPosterior([Readings[1]]);
        var exact = StandardNormal.Cdf(-ExactBeta(mean, cov, t));
        Assert.Equal(1.0, madsen / exact, 10); // the formula is exact here: the two checks agree

        var result = new ReliabilityUpdater().Estimate(Model(), [new SizedIndication(tk, "W-2", Ut, am)], t);
        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.Equal(1.0, result.CumulativePf / madsen, 6);
    }

    [Fact]
    [Reference("Independent computation in the test: the same result for every order of logging")]
    public void The_order_in_which_findings_are_logged_does_not_change_the_result()
    {
        var ni = new NoIndication(3, "N-1", Ut);
        var s1 = new SizedIndication(5, "W-1", Ut, 2.6);
        var s2 = new SizedIndication(10, "W-2", Ut, 4.1);
        var updater = new ReliabilityUpdater();
        var a = updater.Estimate(Model(), [ni, s1, s2], 20);
        var b = updater.Estimate(Model(), [s2, ni, s1], 20);
        var c = updater.Estimate(Model(), [s1, s2, ni], 20);
        Assert.True(a.Converged, a.Note);
        Assert.Equal(a.CumulativePf, b.CumulativePf, 14);
        Assert.Equal(a.CumulativePf, c.CumulativePf, 14);
        // The no-indication finding must matter, or the check above would be empty.
        var without = updater.Estimate(Model(), [s1, s2], 20);
        Assert.NotEqual(without.CumulativePf, a.CumulativePf);
    }

    [Fact]
    [Reference("Independent computation in the test: a fresh updater and a reused one give the same number")]
    public void Repeated_estimates_on_equal_findings_reuse_the_session_and_agree_with_a_fresh_updater()
    {
        var updater = new ReliabilityUpdater();
        var first = updater.Estimate(Model(), Evidence(), 20);
        var again = updater.Estimate(Model(), Evidence(), 20); // new list and model instance: a new session
        var model = Model();
        var evidence = Evidence();
        var a = updater.Estimate(model, evidence, 18);
        var b = updater.Estimate(model, evidence.ToList(), 20); // same model instance, equal findings: cached
        Assert.Equal(first.CumulativePf, again.CumulativePf, 12);
        Assert.Equal(first.CumulativePf, b.CumulativePf, 9);
        Assert.True(a.CumulativePf < b.CumulativePf);
    }
}
