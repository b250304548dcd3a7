using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Updating;

/// <summary>A finding of nothing made before corrosion can start: the event holds surely and must not change Pf.</summary>
public class CertainEvidenceTests
{
    [Fact]
    [Reference("Closed form: leak margin 0.8·10 − r·(t − 5) with r lognormal (mean 0.2, CoV 0.5), so Pf(20) = P(r ≥ 8/15); a no indication at 3 years (depth 0, PoD(0) = 0) holds surely and leaves Pf unchanged")]
    public void A_no_indication_before_initiation_leaves_the_first_order_result_at_the_prior()
    {
        var model = new CorrosionModel(Model(D("wallThickness_mm", 10), D("initiationTime_years", 5), Ln("rate_mmPerYear", 0.2, 0.5)));
        var sigma = Math.Sqrt(Math.Log(1 + 0.25));
        var mu = Math.Log(0.2) - 0.5 * sigma * sigma;
        var exact = StandardNormal.Ccdf((Math.Log(8.0 / 15.0) - mu) / sigma);

        var result = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.FirstOrder })
            .Estimate(model, [new NoIndication(3, "N-3", TestModels.Method(new CumulativeLognormalPod(Math.Log(1.5), 0.5)))], 20);

        Assert.Equal(ComputationRoute.FirstOrder, result.Route);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(exact, result.CumulativePf, exact * 1e-6);
        Assert.Contains("carries no information", result.Note, StringComparison.Ordinal);
    }

    [Theory]
    [Reference("Set identity: wall loss never decreases, so failure by t lies inside failure by 7.2 years, which the in-service record at 7.2 years excludes; P(F(t) | data) = 0 exactly for t ≤ 7.2")]
    [InlineData(1.0)]
    [InlineData(2.0)]
    [InlineData(7.0)]
    public void Failure_before_an_in_service_record_is_simulated_as_impossible_and_converged(double t)
    {
        // At 1 and 2 years the median point lies before initiation (T₀ ≈ 4.6 y), where every FORM search from the
        // origin runs off along the wall thickness: the sampler must still find the failure region (by continuation
        // from later times) and see that every failure there contradicts the record, instead of drawing no failure
        // in 400 000 samples around the posterior mode and reporting "not converged".
        var model = new CorrosionModel(Model(N("wallThickness_mm", 9.5, 0.2), Ln("initiationTime_years", 5, 0.4), Ln("rate_mmPerYear", 0.2, 0.5)),
            new CorrosionSettings { FailureMode = CorrosionFailureMode.Leak, LeakFraction = 0.8 });
        var ut = TestModels.Method(new CumulativeLognormalPod(Math.Log(1.5), 0.5), sd: 0.5);
        InspectionOutcome[] findings = [new SurvivedInService(7.2, "S-1"), new SizedIndication(12.5, "W-1", ut, 2.3)];

        var result = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation }).Estimate(model, findings, t);

        Assert.True(result.Converged, result.Note);
        Assert.Equal(0, result.CumulativePf);
        Assert.Contains("contradict the findings", result.Note, StringComparison.Ordinal);
    }
}
