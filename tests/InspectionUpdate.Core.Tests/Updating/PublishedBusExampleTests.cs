using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Simulation;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// The one-dimensional example of Straub &amp; Papaioannou (2015), Bayesian updating with structural reliability
/// methods, J. Eng. Mech. 141(3), 04014134: prior θ ~ N(0, 1), likelihood L(θ) = φ((θ − 5)/0.2)/0.2 of one
/// measurement (set-up from memory). Posterior and evidence are conjugate-normal closed forms:
/// mean 5/(1 + 0.2²) = 4.807692, sd 0.2/√(1 + 0.2²) = 0.196116, evidence c = φ(5/√1.04)/√1.04 = 2.3578e-6 (the
/// density of the measurement, N(0, 1.04) at 5; the paper's printed evidence was not checked against this value).
/// </summary>
/// <remarks>
/// The simulation updating route represents the example with a sized measurement: size = 10 mm + θ (the offset keeps
/// every size positive: P(θ ≤ −10) ≈ 8·10⁻²⁴), measured 15 mm, additive normal sizing error with zero bias and
/// sd 0.2 mm. A sized indication enters as the density of the sizing error at (measured − size), so the likelihood is
/// exactly the example's. The route is likelihood-weighted importance sampling (a Laplace-fitted mixture), not BUS's
/// rejection-sampling formulation: it is checked against the example's answers, not its algorithm.
/// </remarks>
public class PublishedBusExampleTests(ITestOutputHelper output)
{
    private const double Offset = 10, Measured = 15, ErrorSd = 0.2;
    private static readonly double PosteriorMean = 5 / (1 + ErrorSd * ErrorSd);
    private static readonly double PosteriorSd = ErrorSd / Math.Sqrt(1 + ErrorSd * ErrorSd);
    private static readonly double Evidence = StandardNormal.Pdf(5 / Math.Sqrt(1 + ErrorSd * ErrorSd)) / Math.Sqrt(1 + ErrorSd * ErrorSd);

    private static TestDegradationModel Model() =>
        new("one-dimensional example (test)", new StochasticModel([new NormalVariable("theta", 0, 1)]),
            (x, t) => Offset + x[0],
            (x, t) => 100 - (Offset + x[0]));

    private static InspectionOutcome[] Finding() =>
        [new SizedIndication(1, "M-1", TestModels.Method(new CumulativeLognormalPod(Math.Log(1.0), 0.4), SizingErrorKind.AdditiveNormal, 0, ErrorSd), Measured)];

    [Fact]
    public void Closed_form_values_are_the_conjugate_normal_ones()
    {
        // Guards the constants above against a slip: 125/26, √(1/26), and the N(0, 1.04) density at 5.
        Assert.Equal(125.0 / 26, PosteriorMean, 12);
        Assert.Equal(Math.Sqrt(1.0 / 26), PosteriorSd, 12);
        Assert.Equal(1, Evidence / (Math.Exp(-25 / 2.08) / Math.Sqrt(2 * Math.PI * 1.04)), 12);
        Assert.Equal(2.3578e-6, Evidence, 1e-10);
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData(3)]
    [InlineData(17)]
    [Reference("Straub & Papaioannou (2015), J. Eng. Mech. 141(3), 04014134, one-dimensional example (prior N(0, 1), likelihood N(5, 0.2²); from memory): closed-form posterior mean 4.807692 and sd 0.196116")]
    public void Simulation_route_posterior_mean_and_sd_match_the_closed_form(int seed)
    {
        var summary = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = seed }).Posterior(Model(), Finding());
        Assert.True(summary.Converged, summary.Note);
        var theta = summary["theta"];
        var n = summary.EffectiveSampleSize;
        output.WriteLine(FormattableString.Invariant($"seed {seed}: mean {theta.Mean:F5} (exact {PosteriorMean:F5}), sd {theta.StandardDeviation:F5} (exact {PosteriorSd:F5}), ESS {n:F0}"));
        Assert.True(n > 1000, $"ESS {n}");
        // Standard errors of a weighted mean ≈ σ/√ESS and of its sd ≈ σ/√(2·ESS); four of them allowed.
        Assert.True(Math.Abs(theta.Mean - PosteriorMean) <= 4 * PosteriorSd / Math.Sqrt(n), $"mean {theta.Mean} against {PosteriorMean}");
        Assert.True(Math.Abs(theta.StandardDeviation - PosteriorSd) <= 4 * PosteriorSd / Math.Sqrt(2 * n), $"sd {theta.StandardDeviation} against {PosteriorSd}");
        Assert.Equal(0.0, theta.PriorMean, 12);
        Assert.Equal(1.0, theta.PriorStandardDeviation, 12);
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData(3)]
    [InlineData(17)]
    [Reference("Straub & Papaioannou (2015), one-dimensional example (from memory): evidence = density of the measurement, closed form φ(5/√1.04)/√1.04 = 2.3578e-6")]
    public void Simulation_route_evidence_matches_the_closed_form_within_four_standard_errors(int seed)
    {
        var model = EvidenceModel.Build(UpdatingCase.Single(Model(), Finding()));
        var evidence = new LikelihoodImportanceSampler(model, new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = seed }).Evidence().Evidence;
        Assert.True(evidence.Converged, evidence.Note);
        var se = evidence.CoefficientOfVariation * evidence.Value;
        output.WriteLine(FormattableString.Invariant($"seed {seed}: evidence {evidence.Value:G5} ± {se:G2} (exact {Evidence:G5}), {evidence.Samples} samples"));
        Assert.True(Math.Abs(evidence.Value - Evidence) <= 4 * se, $"evidence {evidence.Value:G6} ± {se:G3} against {Evidence:G6}");
    }
}
