using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>component add</c>.</summary>
public sealed class ComponentAddSettings : RegisterSettings
{
    /// <summary>Component identifier.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short identifier of the component, e.g. WI-03.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Site identifier.</summary>
    [CommandOption("--site <SITE>")]
    [Description("Identifier of the site that holds it.")]
    public string? Site { get; init; }

    /// <summary>Name.</summary>
    [CommandOption("--name <NAME>")]
    [Description("Descriptive name.")]
    public string? Name { get; init; }

    /// <summary>Model file.</summary>
    [CommandOption("--model <FILE>")]
    [Description("Component model file (JSON, see docs/formats.md).")]
    public string? Model { get; init; }

    /// <summary>Date of entry into service.</summary>
    [CommandOption("--in-service <DATE>")]
    [Description("Date the component entered service (ISO 8601, e.g. 2011-04-01): time zero of its profiles.")]
    public string? InService { get; init; }
}

/// <summary>Adds a component.</summary>
public sealed class ComponentAddCommand(CliHost host) : CliCommand<ComponentAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentAddSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>component list</c>.</summary>
public sealed class ComponentListSettings : RegisterSettings
{
    /// <summary>Only this site.</summary>
    [CommandOption("--site <SITE>")]
    [Description("Only the components of this site.")]
    public string? Site { get; init; }
}

/// <summary>Lists components.</summary>
public sealed class ComponentListCommand(CliHost host) : CliCommand<ComponentListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentListSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}
