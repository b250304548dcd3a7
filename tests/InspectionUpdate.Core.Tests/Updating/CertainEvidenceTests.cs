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
}
