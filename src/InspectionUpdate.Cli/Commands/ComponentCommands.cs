using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>component add</c>.</summary>
public sealed class ComponentAddSettings : RegisterSettings
{
    /// <summary>Component code.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short code of the component, e.g. WI-03.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Site code.</summary>
    [CommandOption("--site <SITE>")]
    [Description("Code of the site that holds it.")]
    public string? Site { get; init; }

    /// <summary>Name.</summary>
    [CommandOption("--name <NAME>")]
    [Description("Descriptive name.")]
    public string? Name { get; init; }

    /// <summary>Model file.</summary>
    [CommandOption("--model <FILE>")]
    [Description("Component model file (JSON, see docs/models.md §5); checked as assess checks it.")]
    public string? Model { get; init; }

    /// <summary>Model version.</summary>
    [CommandOption("--model-version <TEXT>")]
    [Description("Your version label of the model definition, e.g. corrosion-1.2 (default 1). The model file has no version field of its own (docs/schema/component-model.schema.json); its schemaVersion is the file format's.")]
    public string? ModelVersion { get; init; }

    /// <summary>Date of entry into service.</summary>
    [CommandOption("--in-service <DATE>")]
    [Description("Date the component entered service (ISO 8601, e.g. 2011-04-01): time zero of its profiles.")]
    public string? InService { get; init; }

    /// <summary>Nominal wall.</summary>
    [CommandOption("--wall-mm <MM>")]
    [Description("Nominal wall thickness in mm (needed for wall-thickness readings).")]
    public double? WallMm { get; init; }

    /// <summary>Shared-parameter group.</summary>
    [CommandOption("--group <NAME>")]
    [Description("Shared-parameter group (sister components whose findings inform one another's shared inputs).")]
    public string? Group { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }
}

/// <summary>Adds a component.</summary>
public sealed class ComponentAddCommand(CliHost host) : CliCommand<ComponentAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ComponentAddSettings settings, CancellationToken cancellation)
    {
        var modelPath = Host.Resolve(RegisterAccess.Text("--model", settings.Model));
        var json = ModelFiles.Read(modelPath);
        var version = settings.ModelVersion ?? ModelFiles.DefaultVersion;
        var installed = RegisterAccess.Date("--in-service", settings.InService);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var component = RegisterAccess.Require(store.AddComponent(
            new NewComponent(RegisterAccess.Text("--site", settings.Site), settings.Id, settings.Name ?? settings.Id, installed, settings.WallMm, json, version, settings.Group),
            RegisterAccess.Actor(settings.By)), "component add");
        if (settings.Json) WriteJson(ComponentRow.From(component, store.Sites()));
        else Line($"Added component {component.Code} ({component.Description}), model version {component.Model.ModelVersion}, in service {component.InstallDate:yyyy-MM-dd}.");
        return ExitCodes.Ok;
    }
}

/// <summary>A component in --json output.</summary>
public sealed record ComponentRow(long Id, string Code, string Site, string Name, DateOnly InServiceDate, double? WallThicknessMm, string? ParameterGroup,
    string ModelVersion, int ModelRevision, DateTimeOffset RecordedUtc, string RecordedBy)
{
    internal static ComponentRow From(InspectionUpdate.Register.Component c, IReadOnlyList<Site> sites) => new(c.Id, c.Code, sites.FirstOrDefault(s => s.Id == c.SiteId)?.Code ?? "?",
        c.Description, c.InstallDate, c.WallThicknessMm, c.ParameterGroup, c.Model.ModelVersion, c.Model.Revision, c.Recorded.RecordedUtc, c.Recorded.RecordedBy);
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
    protected override int Run(ComponentListSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var sites = store.Sites();
        if (settings.Site is not null && sites.All(s => s.Code != settings.Site)) throw CliException.BadInput("--site", settings.Site, "is not in the register.");
        var rows = store.Components().Select(c => ComponentRow.From(c, sites)).Where(r => settings.Site is null || r.Site == settings.Site).ToArray();
        if (settings.Json) WriteJson(new ComponentList(rows));
        else
        {
            Table(["component", "site", "name", "in service", "model version", "group"], rows.Select(r => (IReadOnlyList<string>)
                [r.Code, r.Site, r.Name, r.InServiceDate.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), $"{r.ModelVersion} (rev {r.ModelRevision})", r.ParameterGroup ?? "-"]));
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>component list</c>.</summary>
public sealed record ComponentList(IReadOnlyList<ComponentRow> Components);
