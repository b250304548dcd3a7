using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>verify</c>.</summary>
public sealed class VerifySettings : CommonSettings
{
    /// <summary>Write the table as Markdown.</summary>
    [CommandOption("--write-doc <FILE>")]
    [Description("Also write the table as Markdown to FILE (the project keeps it in docs/verification.md).")]
    public string? WriteDoc { get; init; }
}

/// <summary>Runs the verification cases.</summary>
public sealed class VerifyCommand(CliHost host) : CliCommand<VerifySettings>(host)
{
    /// <inheritdoc />
    protected override int Run(VerifySettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("the verification cases (Reliability/Verification, issue 3) have not landed.");
}
