using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>register document</c>.</summary>
public sealed class RegisterDocumentSettings : RegisterSettings
{
    /// <summary>Report title.</summary>
    [CommandOption("--title <TEXT>")]
    [Description("Report title of the owner's choosing.")]
    public string? Title { get; init; }

    /// <summary>Owner.</summary>
    [CommandOption("--owner <WHO>")]
    [Description("Owner (duty holder) the reports are issued for.")]
    public string? Owner { get; init; }

    /// <summary>Author.</summary>
    [CommandOption("--author <WHO>")]
    [Description("Who prepares the reports.")]
    public string? Author { get; init; }

    /// <summary>Checker.</summary>
    [CommandOption("--checker <WHO>")]
    [Description("Who checks them.")]
    public string? Checker { get; init; }

    /// <summary>Approver.</summary>
    [CommandOption("--approver <WHO>")]
    [Description("Who approves them.")]
    public string? Approver { get; init; }

    /// <summary>Revision.</summary>
    [CommandOption("--revision <REV>")]
    [Description("Revision number or letter.")]
    public string? Revision { get; init; }

    /// <summary>Revision date.</summary>
    [CommandOption("--revision-date <DATE>")]
    [Description("Date of the revision (yyyy-MM-dd).")]
    public string? RevisionDate { get; init; }

    /// <summary>Target source.</summary>
    [CommandOption("--target-source <TEXT>")]
    [Description("Where the target comes from (the owner's justification).")]
    public string? TargetSource { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }

    /// <summary>Why.</summary>
    [CommandOption("--reason <TEXT>")]
    [Description("Why (kept in the history).")]
    public string? Reason { get; init; }
}

/// <summary>
/// Records the document control of the register's reports (the given fields replace those in force, an empty value
/// clears one); without a field, prints the document control in force and its history.
/// </summary>
public sealed class RegisterDocumentCommand(CliHost host) : CliCommand<RegisterDocumentSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterDocumentSettings settings, CancellationToken cancellation)
    {
        var change = new DocumentControlChange(settings.Title, settings.Owner, settings.Author, settings.Checker, settings.Approver, settings.Revision,
            settings.RevisionDate is null ? null : RegisterAccess.Date("--revision-date", settings.RevisionDate), settings.TargetSource);
        var any = change != new DocumentControlChange();
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), any ? RegisterOpenMode.OpenExisting : RegisterOpenMode.OpenExistingToRead);
        if (any)
        {
            if (string.IsNullOrWhiteSpace(settings.Reason)) throw CliException.BadInput("--reason", settings.Reason ?? string.Empty, "is needed: say why the document control changes (kept in the history).");
            RegisterAccess.Require(store.SetDocumentControl(change, RegisterAccess.Actor(settings.By), settings.Reason), "register document");
        }

        var history = store.DocumentControlHistory();
        if (settings.Json) WriteJson(new DocumentControlList(store.DocumentControl(), history));
        else if (history.Count == 0) Line("No document control recorded.");
        else
        {
            Table(["recorded", "by", "title", "owner", "author", "checker", "approver", "revision", "revision date", "target source", "reason"],
                history.Select(d => (IReadOnlyList<string>)
                [
                    d.Recorded.RecordedUtc.ToString("yyyy-MM-dd HH:mm", System.Globalization.CultureInfo.InvariantCulture), d.Recorded.RecordedBy, d.Title ?? "-", d.Owner ?? "-",
                    d.Author ?? "-", d.Checker ?? "-", d.Approver ?? "-", d.Revision ?? "-", d.RevisionDate?.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture) ?? "-",
                    d.TargetSource ?? "-", d.Recorded.Reason,
                ]));
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>register document</c>: the record in force and the history, oldest first.</summary>
public sealed record DocumentControlList(DocumentControlRecord? Current, IReadOnlyList<DocumentControlRecord> History);

/// <summary>Settings of <c>register consequence-class</c>.</summary>
public sealed class ConsequenceClassSettings : RegisterSettings
{
    /// <summary>Class number.</summary>
    [CommandArgument(0, "<CLASS>")]
    [Description("Consequence class, 1 (least severe) to 5 (most severe).")]
    public int Class { get; init; }

    /// <summary>Meaning.</summary>
    [CommandOption("--meaning <TEXT>")]
    [Description("What the class means, in the owner's words.")]
    public string? Meaning { get; init; }

    /// <summary>Target preset.</summary>
    [CommandOption("--target-preset <KEY>")]
    [Description("Target preset the class chooses: jcss-{large|normal|small}-{minor|moderate|large} or pipeline-{low|medium|high} (default: the run's target).")]
    public string? TargetPreset { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }

    /// <summary>Why.</summary>
    [CommandOption("--reason <TEXT>")]
    [Description("Why (kept in the history).")]
    public string? Reason { get; init; }
}

/// <summary>Records the meaning and target preset of one of the owner's consequence classes.</summary>
public sealed class ConsequenceClassCommand(CliHost host) : CliCommand<ConsequenceClassSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ConsequenceClassSettings settings, CancellationToken cancellation)
    {
        if (settings.TargetPreset is { } key && !Application.TargetPresetKeys.All.ContainsKey(key.Trim().ToLowerInvariant()))
        {
            throw CliException.BadInput("--target-preset", key, "is not a target preset; known: " + string.Join(", ", Application.TargetPresetKeys.All.Keys) + ".");
        }

        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var record = RegisterAccess.Require(store.SetConsequenceClass(settings.Class, settings.Meaning ?? string.Empty, settings.TargetPreset?.Trim().ToLowerInvariant(),
            RegisterAccess.Actor(settings.By), settings.Reason ?? string.Empty), "register consequence-class");
        if (settings.Json) WriteJson(record);
        else Line($"Class {record.Class}: {record.Meaning} (target: {record.TargetPreset ?? "the run's"}).");
        return ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>component consequence</c>.</summary>
public sealed class ComponentConsequenceSettings : RegisterSettings
{
    /// <summary>Component code.</summary>
    [CommandArgument(0, "<COMPONENT>")]
    [Description("Component code.")]
    public string Component { get; init; } = string.Empty;

    /// <summary>Class.</summary>
    [CommandOption("--class <CLASS>")]
    [Description("Consequence class 1–5 (the owner's scale; see register consequence-class).")]
    public int Class { get; init; }

    /// <summary>Cost of failure.</summary>
    [CommandOption("--cost-of-failure <AMOUNT>")]
    [Description("Cost of failure in the owner's currency (optional, ≥ 0).")]
    public double? CostOfFailure { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }

    /// <summary>Why.</summary>
    [CommandOption("--reason <TEXT>")]
    [Description("Why (kept in the history).")]
    public string? Reason { get; init; }
}

/// <summary>Sets a component's consequence class and optional cost of failure.</summary>
public sealed class ComponentConsequenceCommand(CliHost host) : CliCommand<ComponentConsequenceSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentConsequenceSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var record = RegisterAccess.Require(store.SetComponentConsequence(settings.Component, settings.Class, settings.CostOfFailure,
            RegisterAccess.Actor(settings.By), settings.Reason ?? string.Empty), "component consequence");
        if (settings.Json) WriteJson(record);
        else Line($"{record.ComponentCode}: consequence class {record.Class}" + (record.CostOfFailure is { } c ? $", cost of failure {c.ToString("R", System.Globalization.CultureInfo.InvariantCulture)}" : string.Empty) + ".");
        return ExitCodes.Ok;
    }
}
