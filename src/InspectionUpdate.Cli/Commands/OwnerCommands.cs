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
