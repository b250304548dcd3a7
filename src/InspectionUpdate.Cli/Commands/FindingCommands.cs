using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
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
    [Description("none (no indication), indication (found, not sized) or sized (found and sized: give --size-mm).")]
    public string? Outcome { get; init; }

    /// <summary>Measured size.</summary>
    [CommandOption("--size-mm <MM>")]
    [Description("Measured size in mm (crack depth or wall loss) for a sized indication.")]
    public double? SizeMm { get; init; }

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
    protected override int Run(FindingLogSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>finding import</c>.</summary>
public sealed class FindingImportSettings : RegisterSettings
{
    /// <summary>CSV file.</summary>
    [CommandArgument(0, "<CSV>")]
    [Description("Findings file (CSV, see docs/formats.md).")]
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
    protected override int Run(FindingImportSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

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
    [Description("Corrected outcome: none, indication or sized.")]
    public string? Outcome { get; init; }

    /// <summary>New size.</summary>
    [CommandOption("--size-mm <MM>")]
    [Description("Corrected measured size in mm.")]
    public double? SizeMm { get; init; }

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
    protected override int Run(FindingCorrectSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>finding list</c>.</summary>
public sealed class FindingListSettings : RegisterSettings
{
    /// <summary>Component filter.</summary>
    [CommandArgument(0, "[COMPONENT]")]
    [Description("Only this component.")]
    public string? Component { get; init; }

    /// <summary>Show superseded revisions.</summary>
    [CommandOption("--all-revisions")]
    [Description("Also show superseded revisions.")]
    public bool AllRevisions { get; init; }
}

/// <summary>Lists findings.</summary>
public sealed class FindingListCommand(CliHost host) : CliCommand<FindingListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(FindingListSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

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

    /// <summary>Who.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records the repair.")]
    public string? By { get; init; }
}

/// <summary>Logs a repair.</summary>
public sealed class RepairLogCommand(CliHost host) : CliCommand<RepairLogSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RepairLogSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}
