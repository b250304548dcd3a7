using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>report</c>.</summary>
public sealed class ReportSettings : RegisterSettings
{
    /// <summary>Only this component.</summary>
    [CommandArgument(0, "[COMPONENT]")]
    [Description("Only this component (default: every component and the register report).")]
    public string? Component { get; init; }

    /// <summary>Output folder.</summary>
    [CommandOption("-o|--out <DIR>")]
    [Description("Folder for the reports and exports (created if missing).")]
    [DefaultValue("reports")]
    public string Out { get; init; } = "reports";

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description("Use findings up to this date (ISO 8601); default today.")]
    public string? AsOf { get; init; }

    /// <summary>Target.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability for plans and ranking.")]
    [DefaultValue(1e-4)]
    public double TargetAnnualPf { get; init; } = 1e-4;
}

/// <summary>Writes reports.</summary>
public sealed class ReportCommand(CliHost host) : CliCommand<ReportSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ReportSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5), component models (issue 4) and the updater (issue 5) have not landed.");
}
