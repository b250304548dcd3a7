using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>site add</c>.</summary>
public sealed class SiteAddSettings : RegisterSettings
{
    /// <summary>Site code.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short code of the site, e.g. NORTH-BAY.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Descriptive name.</summary>
    [CommandOption("--name <NAME>")]
    [Description("Descriptive name.")]
    public string? Name { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }
}

/// <summary>Adds a site.</summary>
public sealed class SiteAddCommand(CliHost host) : CliCommand<SiteAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(SiteAddSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var site = RegisterAccess.Require(store.AddSite(new NewSite(settings.Id, settings.Name ?? settings.Id), RegisterAccess.Actor(settings.By)), "site add");
        if (settings.Json) WriteJson(SiteRow.From(site));
        else Line($"Added site {site.Code} ({site.Name}).");
        return ExitCodes.Ok;
    }
}

/// <summary>A site in --json output.</summary>
public sealed record SiteRow(long Id, string Code, string Name, DateTimeOffset RecordedUtc, string RecordedBy)
{
    internal static SiteRow From(Site s) => new(s.Id, s.Code, s.Name, s.Recorded.RecordedUtc, s.Recorded.RecordedBy);
}

/// <summary>Settings of <c>site list</c>.</summary>
public sealed class SiteListSettings : RegisterSettings
{
}

/// <summary>Lists sites.</summary>
public sealed class SiteListCommand(CliHost host) : CliCommand<SiteListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(SiteListSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var sites = store.Sites();
        var components = store.Components();
        if (settings.Json) WriteJson(new SiteList(sites.Select(SiteRow.From).ToArray()));
        else
        {
            Table(["site", "name", "components", "recorded"], sites.Select(s => (IReadOnlyList<string>)
                [s.Code, s.Name, components.Count(c => c.SiteId == s.Id).ToString(CultureInfo.InvariantCulture), s.Recorded.RecordedUtc.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)]));
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>site list</c>.</summary>
public sealed record SiteList(IReadOnlyList<SiteRow> Sites);
