using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// A no-indication finding at year 10 on a Paris-law-like crack (nonlinear in every input), checked against a
/// likelihood-weighted Monte Carlo done in the test: P(F | no indication) = E[1_F·(1 − PoD(a(10)))] / E[1 − PoD(a(10))]
/// over prior samples, with the delta-method standard error of the ratio.
/// </summary>
[Reference("Independent computation in the test: likelihood-weighted crude Monte Carlo over the prior (JCSS PMC Part 1 Annex B: no detection ⇔ a < A_d, A_d ~ PoD)")]
public class CrackGrowthNoIndicationTests
{
    private const double InspectionYears = 10, AssessYears = 20;
    private static readonly CumulativeLognormalPod Pod = new(Math.Log(1.5), 0.5);

    private static (double P, double Se, double Evidence) LikelihoodWeightedMonteCarlo(int samples, int seed)
    {
        var model = TestModels.ParisCrack();
        var t = new NatafTransformation(model.Inputs);
        var rng = new Random(seed);
        var u = new double[3];
        var x = new double[3];
        double sw = 0, swf = 0;
        var w = new double[samples];
        var f = new bool[samples];
        for (var i = 0; i < samples; i++)
        {
            for (var k = 0; k < 3; k++) u[k] = StandardNormal.InverseCdf(rng.NextDouble());
            t.ToPhysical(u, x);
            w[i] = 1 - Pod.Evaluate(model.Size(x, InspectionYears));
            f[i] = model.Margin(x, AssessYears) <= 0;
            sw += w[i];
            if (f[i]) swf += w[i];
        }

        var p = swf / sw;
        var meanW = sw / samples;
        // Ratio estimator: Var(p̂) ≈ Var(w·(1_F − p)) / (n·E[w]²).
        var s2 = 0.0;
        for (var i = 0; i < samples; i++)
        {
            var r = w[i] * ((f[i] ? 1 : 0) - p);
            s2 += r * r;
        }

        var se = Math.Sqrt(s2 / (samples - 1) / samples) / meanW;
        return (p, se, meanW);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    public void Simulation_route_agrees_with_likelihood_weighted_Monte_Carlo_within_four_standard_errors()
    {
        var (p, se, _) = LikelihoodWeightedMonteCarlo(400_000, 17);
        var result = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = 9 })
            .Estimate(TestModels.ParisCrack(), [new NoIndication(InspectionYears, "N-10", TestModels.Method(Pod))], AssessYears);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(ComputationRoute.ImportanceSampling, result.Route);
        var seIs = result.CoefficientOfVariation!.Value * result.CumulativePf;
        var combined = Math.Sqrt(se * se + seIs * seIs);
        Assert.True(Math.Abs(result.CumulativePf - p) <= 4 * combined, $"IS {result.CumulativePf:G5} ± {seIs:G3} against MC {p:G5} ± {se:G3}");
    }

    [Fact]
    [Trait("Category", "Statistical")]
    public void First_order_route_is_within_its_approximation_error_and_is_flagged_so_auto_simulates()
    {
        var (p, se, evidence) = LikelihoodWeightedMonteCarlo(400_000, 23);
        var evidenceList = new[] { new NoIndication(InspectionYears, "N-10", TestModels.Method(Pod)) };
        var fo = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.FirstOrder })
            .Estimate(TestModels.ParisCrack(), evidenceList, AssessYears);
        Assert.True(fo.Converged, fo.Note);
        Assert.Equal(ComputationRoute.FirstOrder, fo.Route);
        // First order is an approximation for this strongly nonlinear growth law: 15 % relative is the tolerance
        // chosen (observed about 9 %), plus four standard errors of the Monte Carlo reference.
        Assert.True(Math.Abs(fo.CumulativePf - p) <= 0.15 * p + 4 * se, $"FO {fo.CumulativePf:G5} against MC {p:G5} ± {se:G3}");
        Assert.True(Math.Abs(fo.EvidenceProbability - evidence) <= 0.05 * evidence, $"P(no indication) {fo.EvidenceProbability:G5} against {evidence:G5}");
        Assert.Contains("departs from its linearization", fo.Note, StringComparison.Ordinal);

        var auto = new ReliabilityUpdater().Estimate(TestModels.ParisCrack(), evidenceList, AssessYears);
        Assert.Equal(ComputationRoute.ImportanceSampling, auto.Route);
        Assert.Contains("first order flagged unreliable", auto.Note, StringComparison.Ordinal);
    }
}
