using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Planning;

/// <summary>The planner's exact test double is itself checked against closed forms and independent integrals.</summary>
public class LogLinearGaussianUpdaterTests
{
    private static readonly LogLinearGrowthModel Model = LogLinearGrowthModel.WorkedCase();

    [Fact]
    [Reference("Drezner & Wesolowsky (1990) check values in docs/references.md [derived]: Φ₂(−1,−1;0.5) = 0.06251409470966383, Φ₂(−2,−2;0.9) = 0.01336125612701929")]
    public void Independent_bivariate_normal_reproduces_the_check_values()
    {
        Assert.Equal(0.06251409470966383, IndependentGaussian.BivariateCdf(-1, -1, 0.5), 1e-13);
        Assert.Equal(0.01336125612701929, IndependentGaussian.BivariateCdf(-2, -2, 0.9), 1e-13);
    }

    [Fact]
    [Reference("docs/references.md worked updating case [derived]: prior Pf(20) = 4.174915e-3")]
    public void Prior_matches_the_worked_case()
    {
        var e = new LogLinearGaussianUpdater().Estimate(Model, [], 20);
        Assert.Equal(4.174915e-3, e.CumulativePf, 4.174915e-3 * 1e-6);
    }

    [Fact]
    [Reference("docs/references.md worked updating case [derived]: no detection at year 10, PoD Φ((ln a − ln 2)/0.5): P(no detection) = 0.700445, posterior Pf(20) = 1.071037e-4")]
    public void One_no_indication_matches_the_worked_case_and_the_bivariate_normal()
    {
        var method = ProbitLogPod.Method("probit", 2, 0.5);
        var e = new LogLinearGaussianUpdater().Estimate(Model, [new NoIndication(10, "f1", method)], 20);
        Assert.Equal(0.700445, e.EvidenceProbability, 1e-6);
        Assert.Equal(1.071037e-4, e.CumulativePf, 1.071037e-4 * 1e-6);
        foreach (var t in new[] { 10.0, 12.5, 20, 35 })
        {
            var exact = IndependentGaussian.PosteriorAfterOneNoIndication(Model, 10, Math.Log(2), 0.5, t);
            var q = new LogLinearGaussianUpdater().Estimate(Model, [new NoIndication(10, "f1", method)], t);
            // 1e-7 relative: at t = 10 (Pf ≈ 4e-13) the Plackett integral cancels against Φ(h)Φ(k) in its last digits.
            Assert.Equal(exact.Pf, q.CumulativePf, exact.Pf * 1e-7);
        }
    }

    [Fact]
    [Reference("Independent computation in the test: doubling the quadrature orders (64/48 → 128/96) changes Pf by < 1e-8 relative")]
    public void Quadrature_has_converged_with_several_findings()
    {
        var method = ProbitLogPod.Method("probit", 1.5, 0.3);
        IReadOnlyList<InspectionOutcome> evidence = [new NoIndication(8, "a", method), new NoIndication(14, "b", method), new NoIndication(19, "c", method)];
        var coarse = new LogLinearGaussianUpdater().Estimate(Model, evidence, 30).CumulativePf;
        var fine = new LogLinearGaussianUpdater(128, 96).Estimate(Model, evidence, 30).CumulativePf;
        Assert.Equal(fine, coarse, fine * 1e-8);
    }
}
