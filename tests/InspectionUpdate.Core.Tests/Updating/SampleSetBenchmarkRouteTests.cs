using InspectionUpdate.Reliability.Verification;
using InspectionUpdate.Updating.Verification;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating;

/// <summary>The sample-set route on benchmark-collection problems, judged by the suite's own pass rule against the collection's reference values.</summary>
public class SampleSetBenchmarkRouteTests(ITestOutputHelper output)
{
    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData("RP22")]
    [InlineData("RP8")]
    [InlineData("4-branch")]
    [InlineData("RP107")]
    [Reference("Reference Pf of each problem: tests/InspectionUpdate.Core.Tests/data/benchmarks/reference-pf.csv (quadrature, closed form or the collection's published value, per the README there)")]
    public void The_sample_set_route_passes_or_says_it_did_not_converge(string id)
    {
        var problem = BenchmarkProblems.Find(id)!;
        var row = Assert.Single(BenchmarkRunner.Run([problem], BenchmarkOptions.Default, [new SampleSetBenchmarkRoute()]));
        var r = row.Result!;
        output.WriteLine(FormattableString.Invariant(
            $"{id}: reference {problem.ReferencePf:E3}, sample set {r.FailureProbability:E3} (CoV {r.CoefficientOfVariation}), converged {r.Converged}, {r.LimitStateEvaluations} evaluations, outcome {row.Outcome}; {r.Note}"));
        Assert.NotEqual(BenchmarkOutcome.WrongAndConverged, row.Outcome);
    }

    [Fact]
    [Reference("Design of the route: component models have a few inputs (SampleSetBenchmarkRoute.MaximumInputs)")]
    public void The_route_is_not_run_on_the_100_input_problem_and_says_so_in_the_table()
    {
        var row = Assert.Single(BenchmarkRunner.Run([BenchmarkProblems.Find("RP63")!], BenchmarkOptions.Default, [new SampleSetBenchmarkRoute()]));
        Assert.Null(row.Result);
        Assert.Equal(BenchmarkOutcome.NotRun, row.Outcome);
    }
}
