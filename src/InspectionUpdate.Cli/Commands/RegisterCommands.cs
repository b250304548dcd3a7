using System.ComponentModel;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
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
    protected override int Run(RegisterCreateSettings settings, CancellationToken cancellation)
    {
        var path = Host.Resolve(settings.File);
        using var store = RegisterAccess.Open(Host, path, RegisterOpenMode.CreateNew);
        var result = new RegisterCreated(store.Path, store.SchemaVersion);
        if (settings.Json) WriteJson(result);
        else Line($"Created register {store.Path} (schema {store.SchemaVersion}).");
        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>register create</c>.</summary>
public sealed record RegisterCreated(string Register, int SchemaVersion);

/// <summary>Settings of <c>register check</c>.</summary>
public sealed class RegisterCheckSettings : RegisterSettings
{
}

/// <summary>Checks a register.</summary>
public sealed class RegisterCheckCommand(CliHost host) : CliCommand<RegisterCheckSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCheckSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var check = store.Check();
        var now = Host.Clock.GetUtcNow();
        var result = new RegisterChecked(store.Path, check.SchemaVersion, check.IsHealthy, check.IntegrityCheck, check.ForeignKeyViolations,
            check.InvariantViolations, check.InvalidModels, store.Fingerprint(now), store.Sites().Count, store.Components().Count, store.Methods().Count);
        if (settings.Json) WriteJson(result);
        else
        {
            Table(["check", "result"],
            [
                ["schema version", check.SchemaVersion.ToString(System.Globalization.CultureInfo.InvariantCulture)],
                ["SQLite integrity", string.Join("; ", check.IntegrityCheck)],
                ["foreign keys", check.ForeignKeyViolations.Count == 0 ? "ok" : string.Join("; ", check.ForeignKeyViolations)],
                ["register invariants", check.InvariantViolations.Count == 0 ? "ok" : string.Join("; ", check.InvariantViolations)],
                ["component models", check.InvalidModels.Count == 0 ? "ok" : $"{check.InvalidModels.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)} do not pass (listed below)"],
                ["sites / components / methods", $"{result.Sites} / {result.Components} / {result.Methods}"],
                ["fingerprint", result.Fingerprint],
            ]);
            foreach (var m in check.InvalidModels) Line("model does not pass: " + m);
            if (check.InvalidModels.Count > 0) Line("Components with these models cannot be assessed until their model is revised (component revise).");
            Line(check.IsHealthy ? "The register is healthy." : "The register FAILED its check.");
        }

        return check.IsHealthy ? ExitCodes.Ok : ExitCodes.RegisterError;
    }
}

/// <summary>--json of <c>register check</c>.</summary>
public sealed record RegisterChecked(string Register, int SchemaVersion, bool Healthy, IReadOnlyList<string> IntegrityCheck,
    IReadOnlyList<string> ForeignKeyViolations, IReadOnlyList<string> InvariantViolations, IReadOnlyList<string> InvalidModels, string Fingerprint, int Sites, int Components, int Methods);
