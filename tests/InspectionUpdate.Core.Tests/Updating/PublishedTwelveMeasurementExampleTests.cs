using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Simulation;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// A second published updating case with equality information: the twelve-dimensional example of Betz, Papaioannou &amp;
/// Straub (2018), Bayesian inference with subset simulation: strategies and improvements, Computer Methods in Applied
/// Mechanics and Engineering 331, 72–93. Prior: twelve independent standard normals θ₁…θ₁₂; data: one measurement of
/// each, 0.462, with a normal error of standard deviation 0.6, so L(θ) = Π φ((θᵢ − 0.462)/0.6)/0.6. Published values (as
/// carried in the authors' group's example script, ERA-software 03_aBUS/main_example_2): posterior mean of θ₁ 0.34,
/// standard deviation 0.51, evidence 1e-6, maximum likelihood 7.47e-3. Closed forms (conjugate normal): mean
/// 0.462/1.36 = 0.339706, sd 0.6/√1.36 = 0.514496, evidence [φ(0.462/√1.36)/√1.36]¹² = 1.0017e-6, L_max = (0.6√(2π))⁻¹².
/// </summary>
/// <remarks>
/// The measurements enter as twelve sized indications: size(θ, t) = 10 mm + θ_k at t = k years (k = 1…12), measured
/// 10.462 mm with an additive normal sizing error of sd 0.6 mm, so that the likelihood is exactly the example's (the
/// offset keeps every size positive; the probability of detection at 10 mm is 1 to within 1e-9).
/// </remarks>
public class PublishedTwelveMeasurementExampleTests(ITestOutputHelper output)
{
    private const int Dimension = 12;
    private const double Offset = 10, Measured = 0.462, ErrorSd = 0.6;
    private static readonly double PosteriorMean = Measured / (1 + ErrorSd * ErrorSd);
    private static readonly double PosteriorSd = ErrorSd / Math.Sqrt(1 + ErrorSd * ErrorSd);
    private static readonly double Evidence = Math.Pow(StandardNormal.Pdf(Measured / Math.Sqrt(1 + ErrorSd * ErrorSd)) / Math.Sqrt(1 + ErrorSd * ErrorSd), Dimension);

    private static TestDegradationModel Model() =>
        new("twelve-measurement example (test)",
            new StochasticModel(Enumerable.Range(1, Dimension).Select(i => (RandomVariable)new NormalVariable("theta" + i, 0, 1)).ToArray()),
            (x, t) => Offset + x[Math.Clamp((int)Math.Round(t) - 1, 0, Dimension - 1)],
            (x, t) => 100 - Offset - x[0]);

    private static InspectionOutcome[] Findings()
    {
        var method = TestModels.Method(new CumulativeLognormalPod(Math.Log(1.0), 0.4), SizingErrorKind.AdditiveNormal, 0, ErrorSd);
        return Enumerable.Range(1, Dimension).Select(k => (InspectionOutcome)new SizedIndication(k, "M-" + k, method, Offset + Measured)).ToArray();
    }

    [Fact]
    [Reference("Betz, Papaioannou & Straub (2018), CMAME 331, 72–93, twelve-dimensional example: published posterior mean 0.34, sd 0.51, evidence 1e-6, maximum likelihood 7.47e-3 (as carried in ERA-software 03_aBUS/main_example_2)")]
    public void Closed_forms_reproduce_the_published_values_to_their_printed_digits()
    {
        Assert.Equal(0.34, PosteriorMean, 2);
        Assert.Equal(0.51, PosteriorSd, 2);
        Assert.Equal(1e-6, Evidence, 1e-8);
        Assert.Equal(7.47e-3, Math.Pow(1 / (ErrorSd * Math.Sqrt(2 * Math.PI)), Dimension), 1e-5);
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData(5)]
    [Reference("Betz, Papaioannou & Straub (2018), twelve-dimensional example: conjugate-normal posterior of θ₁, mean 0.339706 and sd 0.514496 (published 0.34 and 0.51)")]
    public void Simulation_route_posterior_of_every_input_matches_the_closed_form(int stream)
    {
        var summary = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = stream }).Posterior(Model(), Findings());
        Assert.True(summary.Converged, summary.Note);
        var n = summary.EffectiveSampleSize;
        output.WriteLine(FormattableString.Invariant($"ESS {n:F0}; θ1 mean {summary["theta1"].Mean:F4} (exact {PosteriorMean:F4}), sd {summary["theta1"].StandardDeviation:F4} (exact {PosteriorSd:F4})"));
        Assert.True(n > 500, $"ESS {n}");
        for (var i = 1; i <= Dimension; i++)
        {
            var theta = summary["theta" + i];
            // Weighted mean ± σ/√ESS and sd ± σ/√(2·ESS): four standard errors allowed on each of twelve inputs.
            Assert.True(Math.Abs(theta.Mean - PosteriorMean) <= 4 * PosteriorSd / Math.Sqrt(n), $"θ{i} mean {theta.Mean} against {PosteriorMean}");
            Assert.True(Math.Abs(theta.StandardDeviation - PosteriorSd) <= 4 * PosteriorSd / Math.Sqrt(2 * n), $"θ{i} sd {theta.StandardDeviation} against {PosteriorSd}");
        }
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData(5)]
    [Reference("Betz, Papaioannou & Straub (2018), twelve-dimensional example: evidence [φ(0.462/√1.36)/√1.36]¹² = 1.0017e-6 (published 1e-6)")]
    public void Simulation_route_evidence_matches_the_closed_form_within_four_standard_errors(int stream)
    {
        var model = EvidenceModel.Build(UpdatingCase.Single(Model(), Findings()));
        var evidence = new LikelihoodImportanceSampler(model, new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = stream }).Evidence().Evidence;
        Assert.True(evidence.Converged, evidence.Note);
        var se = evidence.CoefficientOfVariation * evidence.Value;
        output.WriteLine(FormattableString.Invariant($"evidence {evidence.Value:G5} ± {se:G2} (exact {Evidence:G5}), {evidence.Samples} samples"));
        Assert.True(Math.Abs(evidence.Value - Evidence) <= 4 * se, $"evidence {evidence.Value:G6} ± {se:G3} against {Evidence:G6}");
    }
}
