using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>method add</c>.</summary>
public sealed class MethodAddSettings : RegisterSettings
{
    /// <summary>Method identifier.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short identifier of the method, e.g. UT-AUTO.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Method file.</summary>
    [CommandOption("--file <FILE>")]
    [Description("Method file (JSON: PoD curve and sizing error, see docs/formats.md).")]
    public string? File { get; init; }
}

/// <summary>Adds a method.</summary>
public sealed class MethodAddCommand(CliHost host) : CliCommand<MethodAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodAddSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>method fit</c>.</summary>
public sealed class MethodFitSettings : RegisterSettings
{
    /// <summary>Method identifier.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Identifier of the method to create.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Qualification data.</summary>
    [CommandOption("--data <FILE>")]
    [Description("Qualification data (CSV): size_mm,detected for hit/miss; size_mm,response for signal response.")]
    public string? Data { get; init; }

    /// <summary>Kind of data.</summary>
    [CommandOption("--kind <KIND>")]
    [Description("hit-miss or signal-response.")]
    [DefaultValue("hit-miss")]
    public string Kind { get; init; } = "hit-miss";

    /// <summary>Decision threshold.</summary>
    [CommandOption("--threshold <VALUE>")]
    [Description("Decision threshold of the signal response (signal-response only).")]
    public double? Threshold { get; init; }
}

/// <summary>Fits a method from qualification data.</summary>
public sealed class MethodFitCommand(CliHost host) : CliCommand<MethodFitSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodFitSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("PoD fitting from qualification data and the register (issue 5) have not landed.");
}

/// <summary>Settings of <c>method list</c>.</summary>
public sealed class MethodListSettings : RegisterSettings
{
}

/// <summary>Lists methods.</summary>
public sealed class MethodListCommand(CliHost host) : CliCommand<MethodListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodListSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}
