using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>site add</c>.</summary>
public sealed class SiteAddSettings : RegisterSettings
{
    /// <summary>Site identifier.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short identifier of the site, e.g. NORTH-BAY.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Descriptive name.</summary>
    [CommandOption("--name <NAME>")]
    [Description("Descriptive name.")]
    public string? Name { get; init; }

    /// <summary>Where the site is.</summary>
    [CommandOption("--location <TEXT>")]
    [Description("Where the site is (free text).")]
    public string? Location { get; init; }
}

/// <summary>Adds a site.</summary>
public sealed class SiteAddCommand(CliHost host) : CliCommand<SiteAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(SiteAddSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>site list</c>.</summary>
public sealed class SiteListSettings : RegisterSettings
{
}

/// <summary>Lists sites.</summary>
public sealed class SiteListCommand(CliHost host) : CliCommand<SiteListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(SiteListSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}
