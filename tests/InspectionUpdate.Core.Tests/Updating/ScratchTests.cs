using InspectionUpdate.Inspection;
using InspectionUpdate.Updating;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating;

public class ScratchTests(ITestOutputHelper output)
{
    [Fact]
    public void Scratch()
    {
        var ut = TestModels.Method(new ProbitPod(0, 0.4), SizingErrorKind.AdditiveNormal, 0, 0.25);
        var model = TestModels.LinearDepth(1.0, 0.3, 0.25, 0.08, 8);
        List<InspectionOutcome> ev = [new SizedIndication(5, "W-1", ut, 2.6), new SizedIndication(10, "W-2", ut, 4.1)];
        foreach (var route in new[] { UpdatingRoute.FirstOrder, UpdatingRoute.Simulation })
        {
            var r = new ReliabilityUpdater(new UpdatingOptions { Route = route }).Estimate(model, ev, 20);
            output.WriteLine($"{route}: {r.CumulativePf} beta {r.Beta} cov {r.CoefficientOfVariation} conv {r.Converged} {r.Note}");
        }
        var (m, c) = LinearGaussianUpdatingTests.ExactPosterior([(5, 2.6), (10, 4.1)]);
        output.WriteLine($"exact beta {LinearGaussianUpdatingTests.ExactBeta(m, c, 20)}");
        var s = new ReliabilityUpdater().Posterior(model, ev);
        foreach (var i in s.Inputs) output.WriteLine(i.ToString());
        output.WriteLine($"ESS {s.EffectiveSampleSize} {s.Samples} {s.Note}");
        var ni = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Auto }).Estimate(model, [new NoIndication(10, "x", ut)], 20);
        output.WriteLine($"NI: {ni.CumulativePf} {ni.Route} {ni.EvidenceProbability} {ni.Note}");
        var ni2 = new ReliabilityUpdater(new UpdatingOptions { Route = UpdatingRoute.Simulation }).Estimate(model, [new NoIndication(10, "x", ut)], 20);
        output.WriteLine($"NI sim: {ni2.CumulativePf} {ni2.CoefficientOfVariation} {ni2.EvidenceProbability} {ni2.Note}");
    }
}
