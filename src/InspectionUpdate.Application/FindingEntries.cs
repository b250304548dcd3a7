using System.Globalization;
using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>
/// A finding as typed into a form: every field as text, so that a value that is not a date or a number is reported
/// against its field like any other problem. Field names are the register's (docs/register.md).
/// </summary>
/// <param name="ComponentCode">component_code.</param>
/// <param name="InspectionDate">inspection_date, yyyy-MM-dd.</param>
/// <param name="Kind">kind: no-indication, indication-not-sized, sized-indication, wall-thickness or in-service.</param>
/// <param name="Method">method name (none for in-service).</param>
/// <param name="MeasuredSizeMm">measured_size_mm (sized-indication only).</param>
/// <param name="RemainingWallMm">remaining_wall_mm (wall-thickness only).</param>
/// <param name="Location">location (part of the duplicate key).</param>
/// <param name="Note">note.</param>
public sealed record FindingInput(string ComponentCode, string? InspectionDate, string? Kind, string? Method, string? MeasuredSizeMm = null,
    string? RemainingWallMm = null, string? Location = null, string? Note = null)
{
    /// <summary>The form of a stored revision (for a correction form).</summary>
    public static FindingInput From(FindingRevision f)
    {
        ArgumentNullException.ThrowIfNull(f);
        return new(f.ComponentCode, f.InspectionDate.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), RegisterStore.KindText(f.Kind), f.MethodName,
            f.MeasuredSizeMm?.ToString("R", CultureInfo.InvariantCulture), f.RemainingWallMm?.ToString("R", CultureInfo.InvariantCulture), f.Location, f.Note);
    }
}

/// <summary>The revision written, or every problem (each naming its field) with nothing written.</summary>
public sealed record FindingWrite(FindingRevision? Stored, IReadOnlyList<ValidationProblem> Problems)
{
    /// <summary>True when the revision was written.</summary>
    public bool Succeeded => Stored is not null;
}

/// <summary>
/// Logging, correcting, withdrawing and importing findings for a front end that works on text fields (the web view):
/// parsing problems and the register's own validation come back together, per field; nothing is written on any problem.
/// </summary>
public static class FindingEntries
{
    /// <summary>The register's finding kinds as stored text, in a sensible order for a form.</summary>
    public static IReadOnlyList<string> Kinds { get; } = Enum.GetValues<FindingKind>().Select(RegisterStore.KindText).ToArray();

    /// <summary>The columns of the register's CSV import of findings, in order.</summary>
    public static IReadOnlyList<string> CsvColumns => RegisterStore.FindingCsvColumns;

    /// <summary>A kind's stored text in words (the text itself when it is not a kind).</summary>
    public static string Words(string kindText) => RegisterStore.TryParseKind(kindText, out var kind) ? FindingWords.Of(kind) : kindText;

    /// <summary>The stored text of a kind.</summary>
    public static string Text(FindingKind kind) => RegisterStore.KindText(kind);

    /// <summary>Logs a new finding, recorded by <paramref name="actor"/>.</summary>
    public static FindingWrite Log(IRegister store, FindingInput input, string actor)
    {
        ArgumentNullException.ThrowIfNull(store);
        var (finding, problems) = Parse(input);
        if (finding is null) return Merge(store, problems, input);
        if (problems.Count > 0) return Merge(store, problems, input, finding);
        var written = store.AddFinding(finding, actor, "logged in the web view");
        return new FindingWrite(written.Value, written.Problems);
    }

    /// <summary>Corrects a finding: a new revision with who and why; the old one is kept.</summary>
    public static FindingWrite Correct(IRegister store, long findingId, FindingInput input, string actor, string? reason)
    {
        ArgumentNullException.ThrowIfNull(store);
        var (finding, problems) = Parse(input);
        if (string.IsNullOrWhiteSpace(reason)) problems.Add(new ValidationProblem("reason", reason, "a correction needs a reason"));
        if (finding is null || problems.Count > 0) return Merge(store, problems, input, finding, findingId);
        var written = store.ReviseFinding(findingId, finding, actor, reason!.Trim());
        return new FindingWrite(written.Value, written.Problems);
    }

    /// <summary>Withdraws a finding logged in error: a new revision marked withdrawn, with who and why.</summary>
    public static FindingWrite Withdraw(IRegister store, long findingId, string actor, string? reason)
    {
        ArgumentNullException.ThrowIfNull(store);
        if (string.IsNullOrWhiteSpace(reason)) return new FindingWrite(null, [new ValidationProblem("reason", reason, "a withdrawal needs a reason")]);
        var written = store.WithdrawFinding(findingId, actor, reason.Trim());
        return new FindingWrite(written.Value, written.Problems);
    }

    /// <summary>Imports a CSV of findings (the register's import: all rows or none, every problem with its line).</summary>
    public static ImportResult Import(IRegister store, TextReader csv, string sourceName, string actor)
    {
        ArgumentNullException.ThrowIfNull(store);
        return store.ImportFindingsCsv(csv, sourceName, actor, "imported in the web view from " + sourceName);
    }

    /// <summary>Parses the text fields; the finding is null when the date or the kind could not be read.</summary>
    public static (NewFinding? Finding, List<ValidationProblem> Problems) Parse(FindingInput input)
    {
        ArgumentNullException.ThrowIfNull(input);
        var problems = new List<ValidationProblem>();
        DateOnly? date = null;
        if (string.IsNullOrWhiteSpace(input.InspectionDate)) problems.Add(new("inspection_date", null, "the inspection date is required (yyyy-MM-dd)"));
        else if (DateOnly.TryParseExact(input.InspectionDate.Trim(), "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var d)) date = d;
        else problems.Add(new("inspection_date", input.InspectionDate, "is not an ISO 8601 date (yyyy-MM-dd)"));

        FindingKind? kind = null;
        if (RegisterStore.TryParseKind(input.Kind, out var k)) kind = k;
        else problems.Add(new("kind", input.Kind, "must be one of " + string.Join(", ", Kinds)));

        var size = Number("measured_size_mm", input.MeasuredSizeMm, problems);
        var wall = Number("remaining_wall_mm", input.RemainingWallMm, problems);
        var method = string.IsNullOrWhiteSpace(input.Method) ? null : input.Method.Trim();
        var finding = date is { } dd && kind is { } kk
            ? new NewFinding(input.ComponentCode, dd, kk, method, size, wall, Blank(input.Location), Blank(input.Note))
            : null;
        return (finding, problems);
    }

    private static string? Blank(string? s) => string.IsNullOrWhiteSpace(s) ? null : s.Trim();

    private static double? Number(string field, string? text, List<ValidationProblem> problems)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        if (double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && double.IsFinite(v)) return v;
        problems.Add(new(field, text, "is not a number in mm (use a point for decimals)"));
        return null;
    }

    /// <summary>Parsing problems plus the register's own problems on the fields that did parse; nothing is written.</summary>
    private static FindingWrite Merge(IRegister store, List<ValidationProblem> problems, FindingInput input, NewFinding? finding = null, long? self = null)
    {
        if (finding is null)
        {
            // Date or kind unreadable: still name an unknown component or method, as the register would.
            var probe = new NewFinding(input.ComponentCode, DateOnly.MinValue, FindingKind.NoIndication, string.IsNullOrWhiteSpace(input.Method) ? null : input.Method.Trim());
            finding = probe;
        }

        var failed = problems.Select(p => p.Field).ToHashSet(StringComparer.Ordinal);
        foreach (var p in store.ValidateFinding(finding))
        {
            if (failed.Contains(p.Field)) continue;
            if (p.Field == "inspection_date" && finding.InspectionDate == DateOnly.MinValue) continue;
            if (self is not null && p.Message.StartsWith("duplicate", StringComparison.Ordinal)) continue;
            if (RegisterStore.TryParseKind(input.Kind, out _) is false && p.Field is "method" or "measured_size_mm" or "remaining_wall_mm") continue;
            problems.Add(p);
        }

        return new FindingWrite(null, problems);
    }
}
