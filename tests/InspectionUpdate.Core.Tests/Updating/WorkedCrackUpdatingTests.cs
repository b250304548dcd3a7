using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Updating;

/// <summary>
/// The worked updating case: ln a(t) = X₁ + X₂t, X₁ ~ N(ln 0.5, 0.5), X₂ ~ N(0.10, 0.02), a_c = 20 mm; probit PoD
/// Φ((ln a − ln 2)/0.5); sizing error lognormal with ln ε ~ N(0, 0.25). Every event is linear in Gaussians after
/// taking logarithms, so the exact values follow from bivariate-normal probabilities computed in the test.
/// </summary>
[Reference("Worked case of the project's reference sheet (derived values: exact, every event linear in Gaussians); recomputed in the test")]
public class WorkedCrackUpdatingTests
{
    private static readonly double Ln05 = Math.Log(0.5), Ln2 = Math.Log(2), Ln20 = Math.Log(20);
    private static readonly InspectionMethod Mpi = TestModels.Method(new CumulativeLognormalPod(Math.Log(2), 0.5), SizingErrorKind.MultiplicativeLognormal, 0, 0.25);

    // Y = ln a(t) − ln a_c (failure when > 0), W = ln a(10) − ln A_d (no detection when < 0).
    private static (double MuY, double SdY) Failure(double t) => (Ln05 + 0.10 * t - Ln20, Math.Sqrt(0.25 + t * t * 0.0004));

    private static double PriorPf(double t)
    {
        var (mu, sd) = Failure(t);
        return StandardNormal.Cdf(mu / sd);
    }

    private static double NoDetectionProbability()
    {
        var muW = Ln05 + 1.0 - Ln2;
        var sdW = Math.Sqrt(0.25 + 100 * 0.0004 + 0.25);
        return StandardNormal.Cdf(-muW / sdW);
    }

    private static double PosteriorPfAfterNoDetection(double t)
    {
        var (muY, sdY) = Failure(t);
        var muW = Ln05 + 1.0 - Ln2;
        var sdW = Math.Sqrt(0.25 + 100 * 0.0004 + 0.25);
        var cov = 0.25 + 10 * t * 0.0004;
        // P(Y > 0, W < 0) = Φ₂(μ_Y/σ_Y, −μ_W/σ_W; −ρ_YW).
        var joint = TestModels.Bivariate(muY / sdY, -muW / sdW, -cov / (sdY * sdW));
        return joint / NoDetectionProbability();
    }

    private static double PosteriorPfAfterSizing(double t, double measuredMm)
    {
        var (muY, sdY) = Failure(t);
        var muM = Ln05 + 1.0;
        var varM = 0.25 + 100 * 0.0004 + 0.25 * 0.25;
        var cov = 0.25 + 10 * t * 0.0004;
        var mu = muY + cov / varM * (Math.Log(measuredMm) - muM);
        var sd = Math.Sqrt(sdY * sdY - cov * cov / varM);
        return StandardNormal.Cdf(mu / sd);
    }

    [Fact]
    public void Test_side_exact_values_agree_with_the_reference_sheet()
    {
        // The sheet's [derived] values: a second, independent check of the test's own closed forms.
        Assert.Equal(4.174915e-3, PriorPf(20), 6e-9);
        Assert.Equal(0.700445, NoDetectionProbability(), 1e-6);
        Assert.Equal(1.071037e-4, PosteriorPfAfterNoDetection(20), 1e-9);
        Assert.Equal(2.628171e-3, PosteriorPfAfterSizing(20, 3.2), 1e-9);
    }

    [Fact]
    public void No_detection_at_year_10_updates_Pf_at_year_20_exactly_by_first_order()
    {
        var result = new ReliabilityUpdater().Estimate(TestModels.LogLinearCrack(), [new NoIndication(10, "I-10", Mpi)], 20);
        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(1.0, result.CumulativePf / PosteriorPfAfterNoDetection(20), 6);
        Assert.Equal(1.0, result.EvidenceProbability / NoDetectionProbability(), 6);
    }

    [Fact]
    public void A_crack_sized_at_year_10_updates_Pf_at_year_20_exactly_by_first_order()
    {
        var result = new ReliabilityUpdater().Estimate(TestModels.LogLinearCrack(), [new SizedIndication(10, "S-10", Mpi, 3.2)], 20);
        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(1.0, result.CumulativePf / PosteriorPfAfterSizing(20, 3.2), 6);
    }

    [Fact]
    public void The_first_year_with_annual_Pf_above_1e_4_moves_from_16_to_21_after_no_detection()
    {
        var years = Enumerable.Range(1, 30).Select(y => (double)y).ToArray();
        var updater = new ReliabilityUpdater();
        var prior = updater.Profile(TestModels.LogLinearCrack(), [], years, "prior");
        var updated = updater.Profile(TestModels.LogLinearCrack(), [new NoIndication(10, "I-10", Mpi)], years, "updated");
        static int FirstAbove(IEnumerable<(double T, double D)> steps) => (int)steps.First(s => s.D > 1e-4).T;
        var exactPrior = FirstAbove(years.Select(t => (t, PriorPf(t) - PriorPf(t - 1))));
        var exactUpdated = FirstAbove(years.Select(t => (t, PosteriorPfAfterNoDetection(t) - (t > 1 ? PosteriorPfAfterNoDetection(t - 1) : 0))));
        Assert.Equal(16, exactPrior);
        Assert.Equal(21, exactUpdated);
        Assert.Equal(exactPrior, FirstAbove(prior.Points.Select(p => (p.TimeYears, p.IntervalPf))));
        Assert.Equal(exactUpdated, FirstAbove(updated.Points.Select(p => (p.TimeYears, p.IntervalPf))));
        Assert.True(updated.AllConverged);
        Assert.All(updated.Points, p => Assert.Equal(ComputationRoute.FirstOrder, p.Route));
        // ΔPf and hazard follow their definitions point by point.
        for (var i = 1; i < updated.Points.Count; i++)
        {
            var (a, b) = (updated.Points[i - 1], updated.Points[i]);
            Assert.Equal(b.CumulativePf - a.CumulativePf, b.IntervalPf, 15);
            Assert.Equal(b.IntervalPf / (1 - a.CumulativePf), b.Hazard, 15);
        }
    }

    [Fact]
    [Trait("Category", "Statistical")]
    public void Simulation_route_matches_the_exact_no_detection_result_within_four_standard_errors()
    {
        var updater = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation, Seed = 3 });
        var result = updater.Estimate(TestModels.LogLinearCrack(), [new NoIndication(10, "I-10", Mpi)], 20);
        var expected = PosteriorPfAfterNoDetection(20);
        Assert.True(result.Converged, result.Note);
        var se = result.CoefficientOfVariation!.Value * result.CumulativePf;
        Assert.True(Math.Abs(result.CumulativePf - expected) <= 4 * se, $"{result.CumulativePf:G6} ± {se:G3} against {expected:G6}");
    }
}
