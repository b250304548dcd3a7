using System.Globalization;
using System.Text;

namespace InspectionUpdate.Cli.Verification;

/// <summary>One verification case as the verify table shows it.</summary>
/// <param name="Case">Short name of the case.</param>
/// <param name="Source">Published source of the expected value (book and table, paper and example, closed form).</param>
/// <param name="Quantity">What is compared, e.g. "Pf" or "β".</param>
/// <param name="Expected">Expected value.</param>
/// <param name="Obtained">Value computed on this installation.</param>
/// <param name="Tolerance">Allowed relative difference.</param>
/// <param name="Method">Engine route that computed it, e.g. "FORM", "SORM (Breitung)", "subset simulation".</param>
/// <param name="Note">Anything else (e.g. the CoV of a simulated value), or null.</param>
public sealed record VerificationTableRow(string Case, string Source, string Quantity, double Expected, double Obtained, double Tolerance, string Method, string? Note)
{
    /// <summary>|obtained − expected| / |expected| (absolute difference when expected is 0).</summary>
    public double RelativeDifference => Expected == 0 ? Math.Abs(Obtained) : Math.Abs(Obtained - Expected) / Math.Abs(Expected);

    /// <summary>True when the relative difference is within the tolerance (and the obtained value is finite).</summary>
    public bool Pass => double.IsFinite(Obtained) && RelativeDifference <= Tolerance;
}

/// <summary>Formats verification rows as text and Markdown.</summary>
public static class VerificationTable
{
    /// <summary>Column headers, in order.</summary>
    public static IReadOnlyList<string> Headers { get; } = ["case", "source", "quantity", "method", "expected", "obtained", "relative difference", "tolerance", "pass"];

    /// <summary>The cells of one row, formatted invariantly.</summary>
    public static IReadOnlyList<string> Cells(VerificationTableRow row)
    {
        ArgumentNullException.ThrowIfNull(row);
        return
        [
            row.Case, row.Source, row.Quantity, row.Method, G(row.Expected), G(row.Obtained),
            row.RelativeDifference.ToString("0.0e0", CultureInfo.InvariantCulture), row.Tolerance.ToString("0.0e0", CultureInfo.InvariantCulture),
            row.Pass ? "pass" : "FAIL",
        ];
    }

    /// <summary>The Markdown page docs/verification.md.</summary>
    /// <param name="rows">The verification cases.</param>
    /// <param name="toolVersion">The tool's version.</param>
    /// <param name="date">The date of the run.</param>
    /// <param name="benchmarkSection">The Markdown section of the benchmark collections (<see cref="BenchmarkTable.Markdown"/>), or null.</param>
    public static string Markdown(IReadOnlyList<VerificationTableRow> rows, string toolVersion, DateOnly date, string? benchmarkSection = null)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var s = new StringBuilder();
        s.Append("# Verification\n\n")
            .Append("Written by `inspection-update verify --write-doc docs/verification.md` (InspectionUpdate ").Append(toolVersion)
            .Append(", ").Append(date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)).Append(").\n\n")
            .Append("Each case compares a number computed by the engine on this installation with a published value or a closed form. ")
            .Append("The relative difference is |obtained − expected| / |expected|; a case passes when it is within its tolerance, ")
            .Append("chosen per case from the accuracy of the method (tight for closed forms, a few standard errors for simulation).\n\n")
            .Append("Run `inspection-update verify` to repeat the check on your own installation.\n\n");
        s.Append("| ").Append(string.Join(" | ", Headers)).Append(" |\n|").Append(string.Concat(Headers.Select(_ => "---|"))).Append('\n');
        foreach (var r in rows)
        {
            s.Append("| ").Append(string.Join(" | ", Cells(r).Select(c => c.Replace("|", "\\|", StringComparison.Ordinal)))).Append(" |\n");
        }

        var passed = rows.Count(r => r.Pass);
        s.Append('\n').Append(passed.ToString(CultureInfo.InvariantCulture)).Append(" of ").Append(rows.Count.ToString(CultureInfo.InvariantCulture))
            .Append(" cases pass.\n\n");
        if (benchmarkSection is not null) s.Append(benchmarkSection).Append('\n');
        s.Append("These checks show that the engine reproduces known results on this installation; they do not validate a model for a ")
            .Append("particular asset. Results support, and never replace, engineering judgement; defer to the applicable codes and licensed practice.\n");
        return s.ToString();
    }

    private static string G(double v) => v.ToString("G7", CultureInfo.InvariantCulture);
}
