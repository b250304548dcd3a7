using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Verification;
using MathNet.Numerics;

namespace InspectionUpdate.Tests.Reliability.Verification;

public class ReliabilityVerificationTests
{
    private static ReliabilityProblem Product() =>
        new(new StochasticModel([new NormalVariable("X1", 40, 5), new NormalVariable("X2", 50, 2.5), new NormalVariable("X3", 1000, 200)]),
            new LimitState("X1X2-X3", x => x[0] * x[1] - x[2]));

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("docs/references.md derived case g = X1·X2 − X3; exact Pf recomputed in the test by 2-D Gauss–Legendre integration; simulations within 3 estimated standard errors")]
    public void Rows_come_side_by_side_and_simulations_bracket_the_exact_value()
    {
        var exact = Integrate.OnRectangle(
            (a, b) => StandardNormal.Pdf(a) * StandardNormal.Pdf(b) * StandardNormal.Ccdf(((40 + 5 * a) * (50 + 2.5 * b) - 1000) / 200),
            -9, 9, -9, 9, 128);
        var report = ReliabilityVerification.Run(Product(), new VerificationOptions
        {
            ImportanceSampling = new SamplingOptions { Seed = 3, TargetCoefficientOfVariation = 0.03, MaxSamples = 200_000 },
            Subset = new SubsetSimulationOptions { Seed = 3, SamplesPerLevel = 2000 },
        });

        Assert.Equal(
            [ComputationRoute.FirstOrder, ComputationRoute.SecondOrder, ComputationRoute.SecondOrder, ComputationRoute.SecondOrder, ComputationRoute.ImportanceSampling, ComputationRoute.SubsetSimulation],
            report.Rows.Select(r => r.Route));
        Assert.All(report.Rows, r => Assert.True(r.Converged, r.Method + ": " + r.Note));
        foreach (var row in report.Rows.Where(r => r.CoefficientOfVariation is not null))
        {
            var se = row.CoefficientOfVariation!.Value * row.FailureProbability;
            Assert.InRange(exact, row.FailureProbability - 3 * se, row.FailureProbability + 3 * se);
            Assert.True(row.Lower95 < row.FailureProbability && row.FailureProbability < row.Upper95);
        }

        Assert.NotNull(report.Reference);
        Assert.Equal(ComputationRoute.ImportanceSampling, report.Reference!.Route);
        Assert.Contains("engineering judgement", report.Caution, StringComparison.Ordinal);
    }

    [Fact]
    public void Simulations_can_be_left_out()
    {
        var report = ReliabilityVerification.Run(Product(), new VerificationOptions { IncludeImportanceSampling = false, IncludeSubsetSimulation = false });
        Assert.Equal(4, report.Rows.Count);
        Assert.Null(report.Reference);
        Assert.Empty(report.OutsideReferenceInterval);
    }
}
