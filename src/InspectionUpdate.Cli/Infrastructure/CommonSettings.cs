using System.ComponentModel;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>Options every command takes.</summary>
public class CommonSettings : CommandSettings
{
    /// <summary>Write one JSON document to standard output instead of tables.</summary>
    [CommandOption("--json")]
    [Description("Write one JSON document (stable snake_case field names, see docs/cli.md) instead of tables.")]
    public bool Json { get; init; }

    /// <summary>Show the stack trace of an error.</summary>
    [CommandOption("--verbose")]
    [Description("On error, also print the technical detail (stack trace).")]
    public bool Verbose { get; init; }
}

/// <summary>Options of commands that work on a register.</summary>
public class RegisterSettings : CommonSettings
{
    /// <summary>Name of the environment variable that gives the register when --register is not used.</summary>
    public const string EnvironmentVariable = "INSPECTION_UPDATE_REGISTER";

    /// <summary>The register file.</summary>
    [CommandOption("-r|--register <FILE>")]
    [Description("The register: a SQLite file, or a PostgreSQL URI postgresql://user@host:port/database (password from PGPASSWORD or ~/.pgpass, never here). Defaults to the INSPECTION_UPDATE_REGISTER environment variable.")]
    public string? Register { get; init; }

    /// <summary>The register path, resolved, or a bad-input error when none was given.</summary>
    public string RegisterPath(CliHost host)
    {
        ArgumentNullException.ThrowIfNull(host);
        var path = Register ?? Environment.GetEnvironmentVariable(EnvironmentVariable);
        if (string.IsNullOrWhiteSpace(path))
        {
            throw new CliException("--register is missing: name the register file (or a postgresql:// URI) with --register FILE or set INSPECTION_UPDATE_REGISTER.");
        }

        // A URI from the environment may carry its password (the environment is not shown by ps); one given with -r may not.
        return Register is null && RegisterLocation.IsPostgres(path) ? path : host.Resolve(path);
    }
}
