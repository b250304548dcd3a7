using System.Globalization;
using System.Text;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Verification;

namespace InspectionUpdate.Cli.Verification;

/// <summary>Which benchmark problems <c>verify</c> runs.</summary>
public enum BenchmarkSet
{
    /// <summary>Every problem of <see cref="BenchmarkProblems.All"/>.</summary>
    All,

    /// <summary><see cref="BenchmarkTable.QuickProblemIds"/>: a few seconds, one problem of each kind of trouble.</summary>
    Quick,

    /// <summary>No benchmark problems (only the verification cases).</summary>
    None,
}

/// <summary>Formats the benchmark-collection rows and per-route summaries of <c>verify</c> as text and Markdown.</summary>
public static class BenchmarkTable
{
    /// <summary>
    /// The quick subset: RP107 (linear, every route passes), RP22 (curved: FORM off, SORM right), RP14 (FORM and SORM
    /// off with their own checks passed: the simulation check flags them), RP57 (design point of the wrong branch: not
    /// confirmed), RP110 (series system of kinked branches) and the four-branch series system (several design points).
    /// </summary>
    public static IReadOnlyList<string> QuickProblemIds { get; } = ["RP107", "RP22", "RP14", "RP57", "RP110", "4-branch"];

    /// <summary>Column headers of the problem table, in order.</summary>
    public static IReadOnlyList<string> Headers { get; } = ["problem", "source", "route", "reference", "obtained", "evaluations", "converged", "pass", "flagged by"];

    /// <summary>Column headers of the per-route summary, in order.</summary>
    public static IReadOnlyList<string> SummaryHeaders { get; } =
        ["route", "passed", "flagged (cross-check only)", "wrong and converged", "not run", "median evaluations", "median check evaluations"];

    /// <summary>The problems of a set.</summary>
    public static IReadOnlyList<BenchmarkProblem> Problems(BenchmarkSet set) => set switch
    {
        BenchmarkSet.All => BenchmarkProblems.All,
        BenchmarkSet.Quick => QuickProblemIds.Select(id => BenchmarkProblems.Find(id)!).ToArray(),
        _ => [],
    };

    /// <summary>The pass cell: pass, flagged, WRONG (wrong and converged) or not run.</summary>
    public static string Outcome(BenchmarkOutcome outcome) => outcome switch
    {
        BenchmarkOutcome.Passed => "pass",
        BenchmarkOutcome.Flagged => "flagged",
        BenchmarkOutcome.WrongAndConverged => "WRONG",
        _ => "not run",
    };

    /// <summary>
    /// The diagnostics that flagged a result, named briefly (full texts in --json): not converged, multiple design
    /// points, curvature, second-order model, simulation check, cross-check; empty when none.
    /// </summary>
    public static string FlaggedBy(BenchmarkRouteResult? result)
    {
        if (result is null) return "";
        var kinds = new List<string>();
        if (!result.Converged) kinds.Add("not converged");
        foreach (var f in result.Flags)
        {
            var kind = f.StartsWith(BenchmarkRunner.CrossCheckFlag, StringComparison.Ordinal) ? "cross-check"
                : f.StartsWith(DesignPointSimulationCheckResult.FlagPrefix, StringComparison.Ordinal) ? "simulation check"
                : f.StartsWith("multiple design points", StringComparison.Ordinal) || f.StartsWith("centred at one of several", StringComparison.Ordinal) ? "multiple design points"
                : f.StartsWith("Curvatures unstable", StringComparison.Ordinal) ? "curvature"
                : f.StartsWith("The second-order model", StringComparison.Ordinal) ? "second-order model"
                : "other";
            if (!kinds.Contains(kind)) kinds.Add(kind);
        }

        return string.Join(", ", kinds);
    }

    /// <summary>The cells of one problem row, formatted invariantly.</summary>
    public static IReadOnlyList<string> Cells(BenchmarkRow row)
    {
        ArgumentNullException.ThrowIfNull(row);
        var r = row.Result;
        return
        [
            row.Problem.Id, row.Problem.ReferenceSource, row.RouteName, G(row.Problem.ReferencePf),
            r is null ? "" : G(r.FailureProbability),
            r is null ? "" : r.LimitStateEvaluations.ToString("N0", CultureInfo.InvariantCulture),
            r is null ? "" : r.Converged ? "yes" : "no",
            Outcome(row.Outcome), FlaggedBy(r),
        ];
    }

    /// <summary>The cells of one summary row.</summary>
    public static IReadOnlyList<string> SummaryCells(BenchmarkRouteSummary s)
    {
        ArgumentNullException.ThrowIfNull(s);
        return
        [
            s.Route, I(s.Passed), I(s.Flagged) + " (" + I(s.FlaggedOnlyByCrossCheck) + ")", I(s.WrongAndConverged), I(s.NotRun),
            N(s.MedianEvaluations), N(s.MedianCheckEvaluations),
        ];
    }

    /// <summary>The Markdown section of docs/verification.md for a benchmark run.</summary>
    public static string Markdown(IReadOnlyList<BenchmarkRow> rows, IReadOnlyList<BenchmarkRouteSummary> summaries, BenchmarkSet set)
    {
        ArgumentNullException.ThrowIfNull(rows);
        ArgumentNullException.ThrowIfNull(summaries);
        var problems = rows.Select(r => r.Problem.Id).Distinct().Count();
        var s = new StringBuilder();
        s.Append("## Benchmark collections\n\n")
            .Append(I(problems)).Append(set == BenchmarkSet.Quick ? " problems (the quick subset, `--benchmarks quick`)" : " problems")
            .Append(" of the reliability problem repository (RP numbers, also used in the 2019 black-box reliability challenge), the four-branch ")
            .Append("series system (Waarts 2000) and RP22 with eight unused inputs, each written by this project from its published description ")
            .Append("(`src/InspectionUpdate.Core/Reliability/Verification/BenchmarkProblems.cs`; reference values, their sources and where sources ")
            .Append("disagree in `tests/InspectionUpdate.Core.Tests/data/benchmarks/`). Every route of the engine runs on every problem.\n\n")
            .Append("A result passes when it says it converged and lies within 5 % of the reference (FORM, SORM) or within three combined standard ")
            .Append("errors of it (simulation). A result outside that is *flagged* when it says it did not converge or one of the engine's own ")
            .Append("diagnostics flags it (multiple design points from multi-start FORM, unstable curvatures, the second-order model check, the ")
            .Append("simulation check of FORM and SORM at their design point, the cross-check between routes); otherwise it is *wrong and converged*, ")
            .Append("the failure this suite exists to catch: `verify` fails when there is one.\n\n")
            .Append("The simulation check runs importance sampling at the FORM design point to a CoV of 0.01 (at most 200 000 samples) and flags ")
            .Append("a FORM or SORM estimate that differs from it by more than three standard errors plus 2 %, or every estimate when the ")
            .Append("sampling cannot reach its CoV (the design point then does not describe the failure domain). Its evaluations are counted apart ")
            .Append("(last column): FORM and SORM stay cheap where no check is wanted.\n\n")
            .Append("The sample-set route (`sample set (automatic route)`, the route behind `assess`, `plan` and `report`) runs on each problem ")
            .Append("as a degradation model whose margin does not change with time and that has no findings; its first-order fallback is off, ")
            .Append("so a number it cannot resolve (fewer than 30 effective failure samples) is reported not converged. It is not run on problems ")
            .Append("with more than 20 random inputs (RP63 has 100): it is built for component models with a few inputs, and on RP63 it spent ")
            .Append("minutes to end not converged.\n\n")
            .Append("### Where the sources disagree on a reference value\n\n")
            .Append("The reference values and every other published value are in `tests/InspectionUpdate.Core.Tests/data/benchmarks/reference-pf.csv`; ")
            .Append("the README there gives the details. The largest disagreements, and the value used:\n\n")
            .Append("- **RP14**: OpenTURNS' problem class (otbenchmark) gives 7.52e-3, its benchmark table 7.7285e-4. A crude Monte Carlo of the ")
            .Append("problem as described (10⁷ samples, in the tests) agrees with the table within its standard error; the table value is used.\n")
            .Append("- **RP25, RP31, RP55**: the problem-class values (6.14e-6, 1.8e-4, 0.36) are far from quadrature (4.1498e-5, 3.2267e-3, ")
            .Append("0.56001), which the table matches to four digits; the quadrature is used.\n")
            .Append("- **RP107**: problem class 2.806e-7, table 2.92e-7, closed form Φ(−5) = 2.8665e-7; the closed form is used.\n")
            .Append("- **Four-branch series system**: the problem class takes β = 2.85 from Waarts (2000), Pf = 2.186e-3; quadrature and the ")
            .Append("table give 2.2228e-3; the quadrature is used (β = 2.85 is a two-digit rounding).\n\n")
            .Append("Rule: a closed form or this project's quadrature wherever one exists; otherwise the repository's published value with a ")
            .Append("1 % relative uncertainty combined with the simulation's standard error.\n\n");
        s.Append("| ").Append(string.Join(" | ", SummaryHeaders)).Append(" |\n|").Append(string.Concat(SummaryHeaders.Select(_ => "---|"))).Append('\n');
        foreach (var r in summaries) s.Append("| ").Append(string.Join(" | ", SummaryCells(r).Select(Escape))).Append(" |\n");
        s.Append('\n');
        if (set == BenchmarkSet.All)
        {
            s.Append("For comparison, OpenTURNS' own table for the same collection (otbenchmark, `reliability_benchmark_table-output.csv`) ")
                .Append("gives FORM 0 on RP25, RP55, RP57, RP75 and the four-branch system and 0.99999 on RP63 with no sign of trouble in that ")
                .Append("table; here each of those is flagged (see the rows below).\n\n");
        }

        s.Append("| ").Append(string.Join(" | ", Headers)).Append(" |\n|").Append(string.Concat(Headers.Select(_ => "---|"))).Append('\n');
        foreach (var r in rows) s.Append("| ").Append(string.Join(" | ", Cells(r).Select(Escape))).Append(" |\n");
        var wrong = rows.Count(r => r.Outcome == BenchmarkOutcome.WrongAndConverged);
        s.Append('\n').Append(I(wrong)).Append(" results wrong and converged.\n");
        return s.ToString();
    }

    private static string Escape(string c) => c.Replace("|", "\\|", StringComparison.Ordinal);

    private static string I(int v) => v.ToString(CultureInfo.InvariantCulture);

    private static string N(double v) => double.IsFinite(v) ? v.ToString("N0", CultureInfo.InvariantCulture) : "–";

    private static string G(double v) => double.IsNaN(v) ? "none" : v.ToString("G4", CultureInfo.InvariantCulture);
}
