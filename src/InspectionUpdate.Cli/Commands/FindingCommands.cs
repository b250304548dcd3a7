using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>finding log</c>.</summary>
public sealed class FindingLogSettings : RegisterSettings
{
    /// <summary>Component.</summary>
    [CommandArgument(0, "<COMPONENT>")]
    [Description("Component identifier.")]
    public string Component { get; init; } = string.Empty;

    /// <summary>Inspection date.</summary>
    [CommandOption("--date <DATE>")]
    [Description("Inspection date (ISO 8601).")]
    public string? Date { get; init; }

    /// <summary>Method.</summary>
    [CommandOption("--method <METHOD>")]
    [Description("Inspection method identifier.")]
    public string? Method { get; init; }

    /// <summary>Outcome.</summary>
    [CommandOption("--outcome <OUTCOME>")]
    [Description(FindingText.OutcomeHelp)]
    public string? Outcome { get; init; }

    /// <summary>Measured size.</summary>
    [CommandOption("--size-mm <MM>")]
    [Description("Measured size in mm (crack depth or wall loss) for a sized indication.")]
    public double? SizeMm { get; init; }

    /// <summary>Remaining wall.</summary>
    [CommandOption("--remaining-wall-mm <MM>")]
    [Description("Remaining wall reading in mm (outcome wall).")]
    public double? RemainingWallMm { get; init; }

    /// <summary>Location.</summary>
    [CommandOption("--location <TEXT>")]
    [Description("Where on the component, e.g. \"weld 3, 6 o'clock\".")]
    public string? Location { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records the finding.")]
    public string? By { get; init; }

    /// <summary>Note.</summary>
    [CommandOption("--note <TEXT>")]
    [Description("Free note.")]
    public string? Note { get; init; }
}

/// <summary>Logs a finding.</summary>
public sealed class FindingLogCommand(CliHost host) : CliCommand<FindingLogSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(FindingLogSettings settings, CancellationToken cancellation)
    {
        var finding = new NewFinding(settings.Component, RegisterAccess.Date("--date", settings.Date), FindingText.Kind(RegisterAccess.Text("--outcome", settings.Outcome)),
            settings.Method, settings.SizeMm, settings.RemainingWallMm, settings.Location, settings.Note);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var stored = RegisterAccess.Require(store.AddFinding(finding, RegisterAccess.Actor(settings.By), "logged with finding log"), "finding log");
        if (settings.Json) WriteJson(FindingRow.From(stored));
        else Line($"Logged finding {stored.FindingId.ToString(CultureInfo.InvariantCulture)} on {stored.ComponentCode}: {RegisterStore.KindText(stored.Kind)} on {stored.InspectionDate:yyyy-MM-dd}.");
        return ExitCodes.Ok;
    }
}

/// <summary>Words for finding outcomes.</summary>
internal static class FindingText
{
    /// <summary>Help of --outcome (finding log and finding correct): every outcome <see cref="Kind"/> accepts.</summary>
    public const string OutcomeHelp =
        "none (no indication), indication (found, not sized), sized (give --size-mm), wall (remaining-wall reading: give --remaining-wall-mm) or in-service (in service, not failed); "
        + "the register's kind names no-indication, indication-not-sized, sized-indication, wall-thickness and in-service are accepted too.";

    /// <summary>The outcome words of the command line, in the order of the help.</summary>
    public static IReadOnlyList<string> Outcomes { get; } = ["none", "indication", "sized", "wall", "in-service"];

    /// <summary>The register's kind for a CLI outcome word (or the register's own kind text).</summary>
    public static FindingKind Kind(string outcome) => outcome switch
    {
        "none" => FindingKind.NoIndication,
        "indication" => FindingKind.IndicationNotSized,
        "sized" => FindingKind.SizedIndication,
        "wall" => FindingKind.WallThickness,
        "in-service" => FindingKind.InService,
        _ when RegisterStore.TryParseKind(outcome, out var k) => k,
        _ => throw CliException.BadInput("--outcome", outcome, "must be none, indication, sized, wall or in-service."),
    };

    /// <summary>An outcome in words for reports.</summary>
    public static string Words(FindingKind kind) => FindingWords.Of(kind);
}

/// <summary>One revision of a finding in --json output.</summary>
public sealed record FindingRow(long FindingId, int Revision, string Component, DateOnly InspectionDate, string Kind, string? Method, double? MeasuredSizeMm,
    double? RemainingWallMm, string Location, string Note, bool Withdrawn, long? ImportBatchId, DateTimeOffset RecordedUtc, string RecordedBy, string Reason)
{
    internal static FindingRow From(FindingRevision f) => new(f.FindingId, f.Revision, f.ComponentCode, f.InspectionDate, RegisterStore.KindText(f.Kind), f.MethodName,
        f.MeasuredSizeMm, f.RemainingWallMm, f.Location, f.Note, f.Withdrawn, f.ImportBatchId, f.Recorded.RecordedUtc, f.Recorded.RecordedBy, f.Recorded.Reason);
}

/// <summary>Settings of <c>finding import</c>.</summary>
public sealed class FindingImportSettings : RegisterSettings
{
    /// <summary>CSV file.</summary>
    [CommandArgument(0, "<CSV>")]
    [Description("Findings file (CSV, UTF-8, see docs/register.md, \"CSV import of findings\").")]
    public string File { get; init; } = string.Empty;

    /// <summary>Who imports.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records the findings.")]
    public string? By { get; init; }
}

/// <summary>Imports findings.</summary>
public sealed class FindingImportCommand(CliHost host) : CliCommand<FindingImportSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(FindingImportSettings settings, CancellationToken cancellation)
    {
        var path = Host.Resolve(settings.File);
        if (!File.Exists(path)) throw CliException.BadInput("CSV", path, "does not exist.");
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var result = store.ImportFindingsCsv(path, RegisterAccess.Actor(settings.By), "imported from " + Path.GetFileName(path));
        if (!result.Succeeded) throw RegisterAccess.Problems("finding import of " + Path.GetFileName(path), result.Problems);
        var doc = new FindingsImported(path, result.ImportBatchId!.Value, result.Findings.Count, result.SourceSha256, result.Findings.Select(FindingRow.From).ToArray());
        if (settings.Json) WriteJson(doc);
        else Line($"Imported {doc.Findings} finding(s) from {Path.GetFileName(path)} as batch {doc.ImportBatchId.ToString(CultureInfo.InvariantCulture)} (SHA-256 {doc.SourceSha256[..12]}…).");
        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>finding import</c>.</summary>
public sealed record FindingsImported(string File, long ImportBatchId, int Findings, string SourceSha256, IReadOnlyList<FindingRow> Rows);

/// <summary>Settings of <c>finding correct</c>.</summary>
public sealed class FindingCorrectSettings : RegisterSettings
{
    /// <summary>Finding id.</summary>
    [CommandArgument(0, "<FINDING>")]
    [Description("Finding identifier (as shown by finding list).")]
    public string Finding { get; init; } = string.Empty;

    /// <summary>New date.</summary>
    [CommandOption("--date <DATE>")]
    [Description("Corrected inspection date.")]
    public string? Date { get; init; }

    /// <summary>New outcome.</summary>
    [CommandOption("--outcome <OUTCOME>")]
    [Description("Corrected outcome: " + FindingText.OutcomeHelp)]
    public string? Outcome { get; init; }

    /// <summary>New size.</summary>
    [CommandOption("--size-mm <MM>")]
    [Description("Corrected measured size in mm.")]
    public double? SizeMm { get; init; }

    /// <summary>New remaining wall.</summary>
    [CommandOption("--remaining-wall-mm <MM>")]
    [Description("Corrected remaining wall reading in mm.")]
    public double? RemainingWallMm { get; init; }

    /// <summary>The revision being corrected.</summary>
    [CommandOption("--of-revision <N>")]
    [Description("The revision you read and correct (default: the latest, read by this command). Refused, nothing written, when another user has superseded it meanwhile.")]
    public int? OfRevision { get; init; }

    /// <summary>Withdraw.</summary>
    [CommandOption("--withdraw")]
    [Description("Withdraw the finding (a new revision that marks it withdrawn; nothing is deleted).")]
    public bool Withdraw { get; init; }

    /// <summary>New method.</summary>
    [CommandOption("--method <METHOD>")]
    [Description("Corrected method.")]
    public string? Method { get; init; }

    /// <summary>Who.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who makes the correction.")]
    public string? By { get; init; }

    /// <summary>Why.</summary>
    [CommandOption("--reason <TEXT>")]
    [Description("Why the finding is corrected (required).")]
    public string? Reason { get; init; }
}

/// <summary>Corrects a finding.</summary>
public sealed class FindingCorrectCommand(CliHost host) : CliCommand<FindingCorrectSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(FindingCorrectSettings settings, CancellationToken cancellation)
    {
        if (!long.TryParse(settings.Finding, NumberStyles.None, CultureInfo.InvariantCulture, out var id)) throw CliException.BadInput("FINDING", settings.Finding, "is not a finding number (see finding list).");
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var current = store.GetFinding(id) ?? throw CliException.BadInput("FINDING", settings.Finding, "is not in the register.");
        var actor = RegisterAccess.Actor(settings.By);
        FindingRevision stored;
        if (settings.Withdraw)
        {
            stored = RegisterAccess.Require(store.WithdrawFinding(id, actor, reason), "finding correct");
        }
        else
        {
            var kind = settings.Outcome is null ? current.Kind : FindingText.Kind(settings.Outcome);
            var corrected = new NewFinding(current.ComponentCode, settings.Date is null ? current.InspectionDate : RegisterAccess.Date("--date", settings.Date), kind,
                settings.Method ?? current.MethodName,
                kind == FindingKind.SizedIndication ? settings.SizeMm ?? current.MeasuredSizeMm : null,
                kind == FindingKind.WallThickness ? settings.RemainingWallMm ?? current.RemainingWallMm : null,
                current.Location, current.Note);
            stored = RegisterAccess.Require(store.ReviseFinding(id, corrected, actor, reason, settings.OfRevision ?? current.Revision), "finding correct");
        }

        if (settings.Json) WriteJson(FindingRow.From(stored));
        else Line($"Finding {id.ToString(CultureInfo.InvariantCulture)} is now at revision {stored.Revision.ToString(CultureInfo.InvariantCulture)}{(stored.Withdrawn ? " (withdrawn)" : string.Empty)}; revision {current.Revision.ToString(CultureInfo.InvariantCulture)} is kept in the history.");
        return ExitCodes.Ok;
    }
}

/// <summary>Settings of the list commands of revised records (findings, repairs): a component filter and the history switch.</summary>
public abstract class RevisedListSettings : RegisterSettings
{
    /// <summary>Component filter.</summary>
    [CommandArgument(0, "[COMPONENT]")]
    [Description("Only this component (default: every component).")]
    public string? Component { get; init; }

    /// <summary>Show superseded revisions.</summary>
    [CommandOption("--all-revisions")]
    [Description("Also show superseded revisions (corrections and withdrawals), not only the current one.")]
    public bool AllRevisions { get; init; }
}

/// <summary>Settings of <c>finding list</c>.</summary>
public sealed class FindingListSettings : RevisedListSettings;

/// <summary>Lists findings.</summary>
public sealed class FindingListCommand(CliHost host) : CliCommand<FindingListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(FindingListSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var components = settings.Component is null ? store.Components() : [RegisterAccess.Component(store, settings.Component)];
        var rows = new List<FindingRow>();
        foreach (var c in components)
        {
            foreach (var f in store.Findings(c.Id, includeWithdrawn: settings.AllRevisions))
            {
                if (settings.AllRevisions) rows.AddRange(store.FindingHistory(f.FindingId).Select(FindingRow.From));
                else rows.Add(FindingRow.From(f));
            }
        }

        if (settings.Json) WriteJson(new FindingList(rows));
        else
        {
            Table(["finding", "rev", "component", "date", "kind", "method", "size (mm)", "wall (mm)", "location", "note", "recorded by", "reason"], rows.Select(r => (IReadOnlyList<string>)
            [
                r.FindingId.ToString(CultureInfo.InvariantCulture), r.Revision.ToString(CultureInfo.InvariantCulture) + (r.Withdrawn ? " withdrawn" : string.Empty), r.Component,
                r.InspectionDate.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r.Kind, r.Method ?? "-", N(r.MeasuredSizeMm), N(r.RemainingWallMm),
                Text(r.Location), Text(r.Note), r.RecordedBy, r.Reason,
            ]));
        }

        return ExitCodes.Ok;
    }

    private static string N(double? v) => v is { } x ? x.ToString("0.###", CultureInfo.InvariantCulture) : "-";

    private static string Text(string text) => string.IsNullOrWhiteSpace(text) ? "-" : text;
}

/// <summary>--json of <c>finding list</c>.</summary>
public sealed record FindingList(IReadOnlyList<FindingRow> Findings);

/// <summary>Settings of <c>repair log</c>.</summary>
public sealed class RepairLogSettings : RegisterSettings
{
    /// <summary>Component.</summary>
    [CommandArgument(0, "<COMPONENT>")]
    [Description("Component identifier.")]
    public string Component { get; init; } = string.Empty;

    /// <summary>Date.</summary>
    [CommandOption("--date <DATE>")]
    [Description("Repair date (ISO 8601).")]
    public string? Date { get; init; }

    /// <summary>What was done.</summary>
    [CommandOption("--description <TEXT>")]
    [Description("What was done.")]
    public string? Description { get; init; }

    /// <summary>Post-repair prior.</summary>
    [CommandOption("--post-repair-prior <FILE>")]
    [Description("JSON file with the distributions of the inputs the repair renews (docs/register.md, section Post-repair prior); default: the renewed inputs restart with their original prior.")]
    public string? PostRepairPrior { get; init; }

    /// <summary>Who.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records the repair.")]
    public string? By { get; init; }
}

/// <summary>Logs a repair.</summary>
public sealed class RepairLogCommand(CliHost host) : CliCommand<RepairLogSettings>(host)
{
    /// <summary>The post-repair prior that renews nothing beyond the model's own renewed inputs (which restart with their original prior).</summary>
    public const string OriginalPrior = Registers.OriginalPostRepairPrior;

    /// <inheritdoc />
    protected override int Run(RepairLogSettings settings, CancellationToken cancellation)
    {
        var prior = OriginalPrior;
        if (settings.PostRepairPrior is not null)
        {
            var path = Host.Resolve(settings.PostRepairPrior);
            if (!File.Exists(path)) throw CliException.BadInput("--post-repair-prior", path, "does not exist.");
            prior = File.ReadAllText(path);
        }

        var repair = new NewRepair(settings.Component, RegisterAccess.Date("--date", settings.Date), RegisterAccess.Text("--description", settings.Description), prior);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var stored = RegisterAccess.Require(store.AddRepair(repair, RegisterAccess.Actor(settings.By), "logged with repair log"), "repair log");
        var doc = new RepairRow(stored.RepairId, stored.Revision, stored.ComponentCode, stored.RepairDate, stored.Description, stored.PostRepairPriorJson, stored.Recorded.RecordedUtc, stored.Recorded.RecordedBy);
        if (settings.Json) WriteJson(doc);
        else Line($"Logged repair {stored.RepairId.ToString(CultureInfo.InvariantCulture)} on {stored.ComponentCode} on {stored.RepairDate:yyyy-MM-dd}: {stored.Description}.");
        return ExitCodes.Ok;
    }
}

/// <summary>A repair in --json output.</summary>
public sealed record RepairRow(long RepairId, int Revision, string Component, DateOnly RepairDate, string Description, string PostRepairPriorJson, DateTimeOffset RecordedUtc, string RecordedBy)
{
    /// <summary>Whether this revision withdraws the repair.</summary>
    public bool Withdrawn { get; init; }

    /// <summary>Why this revision was recorded.</summary>
    public string Reason { get; init; } = string.Empty;
}
