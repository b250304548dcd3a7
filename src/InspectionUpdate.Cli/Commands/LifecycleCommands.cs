using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Options of every lifecycle change: who and why (when is recorded by the register).</summary>
public class ChangeSettings : RegisterSettings
{
    /// <summary>Why.</summary>
    [CommandOption("--reason <TEXT>")]
    [Description("Why the change is made (required; kept with who and when).")]
    public string? Reason { get; init; }

    /// <summary>Who.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records the change (default: the user name).")]
    public string? By { get; init; }
}

/// <summary>Settings of <c>component revise</c>.</summary>
public sealed class ComponentReviseSettings : ChangeSettings
{
    /// <summary>Component code.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Component identifier.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Model file.</summary>
    [CommandOption("--model <FILE>")]
    [Description("The new component model file (JSON, see docs/models.md §5); checked as assess checks it.")]
    public string? Model { get; init; }

    /// <summary>Model version.</summary>
    [CommandOption("--model-version <TEXT>")]
    [Description("Your version label of the new model definition (default: the next revision number).")]
    public string? ModelVersion { get; init; }
}

/// <summary>Records a new revision of a component's model; findings keep their meaning and earlier results stay reproducible.</summary>
public sealed class ComponentReviseCommand(CliHost host) : CliCommand<ComponentReviseSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentReviseSettings settings, CancellationToken cancellation)
    {
        var json = ModelFiles.Read(Host.Resolve(RegisterAccess.Text("--model", settings.Model)));
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var current = RegisterAccess.Component(store, settings.Id);
        var version = settings.ModelVersion ?? (current.Model.Revision + 1).ToString(CultureInfo.InvariantCulture);
        var revision = RegisterAccess.Require(store.ReviseModel(settings.Id, json, version, RegisterAccess.Actor(settings.By), reason), "component revise");
        if (settings.Json) WriteJson(new ModelRevised(settings.Id, revision.Revision, revision.ModelVersion, revision.Recorded.RecordedUtc, revision.Recorded.RecordedBy, revision.Recorded.Reason));
        else Line($"Revised the model of {settings.Id}: revision {revision.Revision.ToString(CultureInfo.InvariantCulture)} (version {revision.ModelVersion}); revision {current.Model.Revision.ToString(CultureInfo.InvariantCulture)} stays readable with --known-on.");
        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>component revise</c>.</summary>
public sealed record ModelRevised(string Component, int ModelRevision, string ModelVersion, DateTimeOffset RecordedUtc, string RecordedBy, string Reason);

/// <summary>Settings of <c>component retire</c> and <c>component reinstate</c>.</summary>
public sealed class ComponentStatusSettings : ChangeSettings
{
    /// <summary>Component code.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Component identifier.")]
    public string Id { get; init; } = string.Empty;
}

/// <summary>Retires a component: it leaves reports and runs, and stays readable as of earlier dates.</summary>
public sealed class ComponentRetireCommand(CliHost host) : CliCommand<ComponentStatusSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentStatusSettings settings, CancellationToken cancellation) => Lifecycle.SetStatus(this, Host, settings, retired: true);

    internal void Emit(ComponentStatusSettings s, ComponentStatusChange c) => Lifecycle.Emit(s, c, WriteJson, Line);
}

/// <summary>Reinstates a retired component.</summary>
public sealed class ComponentReinstateCommand(CliHost host) : CliCommand<ComponentStatusSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentStatusSettings settings, CancellationToken cancellation) => Lifecycle.SetStatus(this, Host, settings, retired: false);

    internal void Emit(ComponentStatusSettings s, ComponentStatusChange c) => Lifecycle.Emit(s, c, WriteJson, Line);
}

/// <summary>--json of <c>component retire</c> / <c>reinstate</c>.</summary>
public sealed record ComponentStatusRow(string Component, string Status, DateTimeOffset RecordedUtc, string RecordedBy, string Reason);

/// <summary>Shared work of the lifecycle commands.</summary>
internal static class Lifecycle
{
    public static int SetStatus(object command, CliHost host, ComponentStatusSettings settings, bool retired)
    {
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        using var store = RegisterAccess.Open(host, settings.RegisterPath(host));
        var change = RegisterAccess.Require(store.SetRetired(settings.Id, retired, RegisterAccess.Actor(settings.By), reason), retired ? "component retire" : "component reinstate");
        if (command is ComponentRetireCommand r) r.Emit(settings, change);
        else ((ComponentReinstateCommand)command).Emit(settings, change);
        return ExitCodes.Ok;
    }

    public static void Emit(ComponentStatusSettings s, ComponentStatusChange c, Action<object> json, Action<string> line)
    {
        if (s.Json) json(new ComponentStatusRow(c.ComponentCode, c.Status, c.Recorded.RecordedUtc, c.Recorded.RecordedBy, c.Recorded.Reason));
        else line(c.Status == "retired"
            ? $"Retired {c.ComponentCode}: it leaves reports and runs from now on; earlier dates still show it (--known-on)."
            : $"Reinstated {c.ComponentCode}: it is in service again.");
    }

    public static RepairRow Row(RepairRevision r) =>
        new(r.RepairId, r.Revision, r.ComponentCode, r.RepairDate, r.Description, r.PostRepairPriorJson, r.Recorded.RecordedUtc, r.Recorded.RecordedBy)
        {
            Withdrawn = r.Withdrawn,
            Reason = r.Recorded.Reason,
        };

    public static long RepairId(string text) =>
        long.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out var id) && id > 0 ? id : throw CliException.BadInput("repair", text, "is not a repair id (a positive whole number, as shown by repair list).");
}

/// <summary>Settings of <c>repair list</c>.</summary>
public sealed class RepairListSettings : RevisedListSettings;

/// <summary>Lists repairs.</summary>
public sealed class RepairListCommand(CliHost host) : CliCommand<RepairListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RepairListSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var components = settings.Component is null ? store.Components() : [RegisterAccess.Component(store, settings.Component)];
        var rows = components.SelectMany(c => store.Repairs(c.Id, includeWithdrawn: settings.AllRevisions))
            .SelectMany(r => settings.AllRevisions ? store.RepairHistory(r.RepairId) : [r])
            .Select(Lifecycle.Row).ToArray();
        if (settings.Json) WriteJson(new RepairList(rows));
        else Table(["repair", "rev", "component", "date", "description", "withdrawn", "recorded (UTC)", "by", "reason"],
            rows.Select(r => (IReadOnlyList<string>)[r.RepairId.ToString(CultureInfo.InvariantCulture), r.Revision.ToString(CultureInfo.InvariantCulture), r.Component,
                r.RepairDate.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r.Description, r.Withdrawn ? "yes" : "", r.RecordedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture), r.RecordedBy, r.Reason]));
        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>repair list</c>.</summary>
public sealed record RepairList(IReadOnlyList<RepairRow> Repairs);

/// <summary>Settings of <c>repair correct</c>.</summary>
public sealed class RepairCorrectSettings : ChangeSettings
{
    /// <summary>Repair id.</summary>
    [CommandArgument(0, "<REPAIR>")]
    [Description("Repair identifier (as shown by repair list).")]
    public string Repair { get; init; } = string.Empty;

    /// <summary>New date.</summary>
    [CommandOption("--date <DATE>")]
    [Description("Corrected repair date (ISO 8601).")]
    public string? Date { get; init; }

    /// <summary>New description.</summary>
    [CommandOption("--description <TEXT>")]
    [Description("Corrected description.")]
    public string? Description { get; init; }

    /// <summary>New post-repair prior.</summary>
    [CommandOption("--post-repair-prior <FILE>")]
    [Description("Corrected post-repair prior (JSON file, docs/register.md, section Post-repair prior).")]
    public string? PostRepairPrior { get; init; }
}

/// <summary>Corrects a repair: a new revision with who and why; the old one is kept.</summary>
public sealed class RepairCorrectCommand(CliHost host) : CliCommand<RepairCorrectSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RepairCorrectSettings settings, CancellationToken cancellation)
    {
        var id = Lifecycle.RepairId(settings.Repair);
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        if (settings.Date is null && settings.Description is null && settings.PostRepairPrior is null)
            throw new CliException("Nothing to correct: give --date, --description or --post-repair-prior (or use repair withdraw).");
        string? prior = null;
        if (settings.PostRepairPrior is not null)
        {
            var path = Host.Resolve(settings.PostRepairPrior);
            if (!File.Exists(path)) throw CliException.BadInput("--post-repair-prior", path, "does not exist.");
            prior = File.ReadAllText(path);
        }

        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var history = store.RepairHistory(id);
        var latest = history.Count > 0 ? history[^1] : throw CliException.BadInput("repair", settings.Repair, "is not in the register.");
        var corrected = new NewRepair(latest.ComponentCode, settings.Date is null ? latest.RepairDate : RegisterAccess.Date("--date", settings.Date),
            settings.Description ?? latest.Description, prior ?? latest.PostRepairPriorJson);
        var stored = RegisterAccess.Require(store.ReviseRepair(id, corrected, RegisterAccess.Actor(settings.By), reason), "repair correct");
        if (settings.Json) WriteJson(Lifecycle.Row(stored));
        else Line($"Corrected repair {id.ToString(CultureInfo.InvariantCulture)}: revision {stored.Revision.ToString(CultureInfo.InvariantCulture)}; earlier revisions are kept (repair list --all-revisions).");
        return ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>repair withdraw</c>.</summary>
public sealed class RepairWithdrawSettings : ChangeSettings
{
    /// <summary>Repair id.</summary>
    [CommandArgument(0, "<REPAIR>")]
    [Description("Repair identifier (as shown by repair list).")]
    public string Repair { get; init; } = string.Empty;
}

/// <summary>Withdraws a repair logged in error (a revision marked withdrawn; nothing is deleted).</summary>
public sealed class RepairWithdrawCommand(CliHost host) : CliCommand<RepairWithdrawSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RepairWithdrawSettings settings, CancellationToken cancellation)
    {
        var id = Lifecycle.RepairId(settings.Repair);
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var stored = RegisterAccess.Require(store.WithdrawRepair(id, RegisterAccess.Actor(settings.By), reason), "repair withdraw");
        if (settings.Json) WriteJson(Lifecycle.Row(stored));
        else Line($"Withdrew repair {id.ToString(CultureInfo.InvariantCulture)} (revision {stored.Revision.ToString(CultureInfo.InvariantCulture)}); it no longer counts, and its history is kept.");
        return ExitCodes.Ok;
    }
}
