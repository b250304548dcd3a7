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

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form of the model: the crack grows monotonically, so F(t − 1) ⊂ F(t) and the exact updated Pf(t) never decreases; ΔPf against likelihood-weighted Monte Carlo of P(F(t) \\ F(t − 1) | no indication) done in the test")]
    public void A_simulated_profile_never_decreases_and_its_annual_increments_match_Monte_Carlo()
    {
        const int samples = 400_000;
        var model = TestModels.ParisCrack();
        var t = new NatafTransformation(model.Inputs);
        var rng = new Random(31);
        var u = new double[3];
        var x = new double[3];
        double sw = 0, swd = 0, swd2 = 0;
        for (var i = 0; i < samples; i++)
        {
            for (var k = 0; k < 3; k++) u[k] = StandardNormal.InverseCdf(rng.NextDouble());
            t.ToPhysical(u, x);
            var w = 1 - Pod.Evaluate(model.Size(x, InspectionYears));
            sw += w;
            if (model.Margin(x, AssessYears) <= 0 && model.Margin(x, AssessYears - 1) > 0)
            {
                swd += w;
                swd2 += w * w;
            }
        }

        var exactDelta = swd / sw;
        // Ratio estimator standard error, Var(w·(1_D − p)) ≈ E[w²1_D](1 − 2p) + p²E[w²] ≤ E[w²1_D] + p²; p is small here.
        var seDelta = Math.Sqrt(swd2 / samples + exactDelta * exactDelta) / Math.Sqrt(samples) / (sw / samples);

        var profile = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = 5 })
            .Profile(model, [new NoIndication(InspectionYears, "N-10", TestModels.Method(Pod))], Enumerable.Range(0, 41).Select(i => 15 + 0.25 * i).ToArray(), "updated");

        // Common random numbers across times: on this quarter-year grid, independent estimates at the 5 % CoV target
        // give negative increments.
        for (var i = 1; i < profile.Points.Count; i++)
        {
            Assert.True(profile.Points[i].CumulativePf >= profile.Points[i - 1].CumulativePf,
                $"Pf({profile.Points[i].TimeYears}) = {profile.Points[i].CumulativePf:G5} < Pf({profile.Points[i - 1].TimeYears}) = {profile.Points[i - 1].CumulativePf:G5}");
        }

        var at = profile.Points.Single(p => p.TimeYears == AssessYears);
        var before = profile.Points.Single(p => p.TimeYears == AssessYears - 1);
        var delta = at.CumulativePf - before.CumulativePf;
        // Without a covariance of the two estimates, their standard deviations add (the worst case for a difference).
        var sdDelta = at.CoefficientOfVariation!.Value * at.CumulativePf + before.CoefficientOfVariation!.Value * before.CumulativePf;
        Assert.True(Math.Abs(delta - exactDelta) <= 3 * sdDelta + 4 * seDelta,
            $"ΔPf(20) {delta:G5} (sd ≤ {sdDelta:G3}) against Monte Carlo {exactDelta:G5} ± {seDelta:G3}");
    }

    [Fact]
    public void The_automatic_route_does_not_switch_back_to_first_order_later_in_a_renewal_period()
    {
        // Behaviour, no published value: once first order is flagged at some time, later times are simulated, so
        // no ΔPf of the profile mixes the two approximations.
        var profile = new ReliabilityUpdater().Profile(TestModels.ParisCrack(), [new NoIndication(InspectionYears, "N-10", TestModels.Method(Pod))],
            Enumerable.Range(11, 15).Select(i => (double)i).ToArray(), "updated");
        var routes = profile.Points.Select(p => p.Route).ToArray();
        var firstSimulated = Array.IndexOf(routes, ComputationRoute.ImportanceSampling);
        Assert.True(firstSimulated >= 0, "first order is flagged on this case (see the test above), so some time is simulated");
        Assert.All(routes[firstSimulated..], r => Assert.Equal(ComputationRoute.ImportanceSampling, r));
    }
}
