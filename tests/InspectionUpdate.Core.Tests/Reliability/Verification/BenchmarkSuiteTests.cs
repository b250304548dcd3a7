using System.Globalization;
using InspectionUpdate.Reliability.Verification;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Reliability.Verification;

public class BenchmarkSuiteTests(ITestOutputHelper output)
{
    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Reference Pf per problem from data/benchmarks/reference-pf.csv (quadrature and closed forms recomputed in BenchmarkReferenceTests; published values named there)")]
    public void Every_route_passes_or_is_flagged_on_every_problem()
    {
        var sw = System.Diagnostics.Stopwatch.StartNew();
        var rows = BenchmarkRunner.Run(BenchmarkProblems.All);
        foreach (var r in rows)
        {
            output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{r.Problem.Id,-9} {r.RouteName,-40} ref {r.Problem.ReferencePf,10:G4} got {r.Result?.FailureProbability,10:G4} ev {r.Result?.LimitStateEvaluations,8} conv {r.Result?.Converged,5} {r.Outcome,-18} {(r.Result is null ? "" : string.Join(" | ", r.Result.Flags))}"));
        }

        foreach (var s in BenchmarkRunner.Summarize(rows)) output.WriteLine(s.ToString());
        output.WriteLine("elapsed " + sw.Elapsed);
        // No route, on no problem, may be wrong and converged: every result outside its tolerance must be unconverged or
        // flagged by the engine's own diagnostics.
        var wrong = rows.Where(r => r.Outcome == BenchmarkOutcome.WrongAndConverged).Select(r => r.Problem.Id + " " + r.RouteName).ToArray();
        Assert.True(wrong.Length == 0, "Wrong and converged: " + string.Join("; ", wrong));
    }
}
