using System.Globalization;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Verification;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Reliability.Verification;

public class BenchmarkProblemTests(ITestOutputHelper output)
{
    private static readonly string DataFile = Path.Combine(AppContext.BaseDirectory, "data", "benchmarks", "reference-pf.csv");

    [Fact]
    [Reference("data/benchmarks/reference-pf.csv (sources per problem in its README)")]
    public void Core_references_equal_the_data_file_and_every_problem_is_listed()
    {
        var lines = File.ReadAllLines(DataFile).Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToArray();
        Assert.Equal(BenchmarkProblems.All.Count, lines.Length);
        foreach (var cells in lines)
        {
            var problem = BenchmarkProblems.Find(cells[0]);
            Assert.NotNull(problem);
            Assert.Equal(double.Parse(cells[1], CultureInfo.InvariantCulture), problem.ReferencePf);
        }
    }

    [Fact]
    public void The_suite_covers_what_the_collections_are_known_for()
    {
        var all = BenchmarkProblems.All;
        Assert.True(all.Count >= 20);
        Assert.Contains(all, p => p.Id == "4-branch" && p.Features.HasFlag(BenchmarkFeature.System));
        Assert.Contains(all, p => p.Dimension >= 100);
        Assert.True(all.Count(p => p.Features.HasFlag(BenchmarkFeature.UnusedInputs)) >= 2);
        Assert.True(all.Count(p => p.Features.HasFlag(BenchmarkFeature.FormKnownToFail)) >= 5);
        Assert.Equal(all.Count, all.Select(p => p.Id).Distinct().Count());
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("otbenchmark benchmark table 'Exact' 7.7285e-4 against the problem class's 7.52e-3: crude Monte Carlo in the test, 4·10⁶ samples")]
    public void RP14_reference_is_the_table_value_not_the_tenfold_one()
    {
        var rp14 = BenchmarkProblems.Find("RP14")!;
        var mc = CrudeMonteCarlo.Run(rp14.Problem, new SamplingOptions { Seed = 7, TargetCoefficientOfVariation = null, MaxSamples = 4_000_000 });
        output.WriteLine($"RP14 crude MC {mc.FailureProbability:G5} CoV {mc.CoefficientOfVariation:G3}");
        var se = mc.StandardError;
        Assert.InRange(rp14.ReferencePf, mc.FailureProbability - 3 * se, mc.FailureProbability + 3 * se);
        Assert.True(Math.Abs(7.52e-3 - mc.FailureProbability) > 100 * se);
    }
}
