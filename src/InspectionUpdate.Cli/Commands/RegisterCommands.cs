using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>register create</c>.</summary>
public sealed class RegisterCreateSettings : CommonSettings
{
    /// <summary>File to create.</summary>
    [CommandArgument(0, "<FILE>")]
    [Description("The register file to create (must not exist).")]
    public string File { get; init; } = string.Empty;
}

/// <summary>Creates an empty register.</summary>
public sealed class RegisterCreateCommand(CliHost host) : CliCommand<RegisterCreateSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCreateSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}

/// <summary>Settings of <c>register check</c>.</summary>
public sealed class RegisterCheckSettings : RegisterSettings
{
}

/// <summary>Checks a register.</summary>
public sealed class RegisterCheckCommand(CliHost host) : CliCommand<RegisterCheckSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCheckSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the register (issue 5) has not landed.");
}
