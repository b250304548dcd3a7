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

/// <summary>A site in --json output (<c>revision</c> 1 as first recorded; <c>reason</c> empty except on corrections).</summary>
public sealed record SiteRow(long Id, string Code, string Name, DateTimeOffset RecordedUtc, string RecordedBy)
{
    /// <summary>Revision of the name (1: as first recorded).</summary>
    public int Revision { get; init; } = 1;

    /// <summary>Why the revision was recorded (corrections only).</summary>
    public string Reason { get; init; } = string.Empty;

    internal static SiteRow From(Site s) => new(s.Id, s.Code, s.Name, s.Recorded.RecordedUtc, s.Recorded.RecordedBy) { Revision = s.Revision, Reason = s.Recorded.Reason };
}

/// <summary>Settings of <c>site correct</c>.</summary>
public sealed class SiteCorrectSettings : ChangeSettings
{
    /// <summary>Site code.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Code of the site to correct (the code itself is the site's identity and is not corrected).")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Corrected name.</summary>
    [CommandOption("--name <NAME>")]
    [Description("The corrected descriptive name (required).")]
    public string? Name { get; init; }
}

/// <summary>Corrects a site's name: a new revision with who, when and why; the earlier name stays readable.</summary>
public sealed class SiteCorrectCommand(CliHost host) : CliCommand<SiteCorrectSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(SiteCorrectSettings settings, CancellationToken cancellation)
    {
        var name = RegisterAccess.Text("--name", settings.Name);
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var site = RegisterAccess.Require(store.CorrectSite(settings.Id, name, RegisterAccess.Actor(settings.By), reason), "site correct");
        if (settings.Json) WriteJson(SiteRow.From(store.SiteHistory(site.Code)[^1]));
        else Line($"Corrected site {site.Code}: name '{site.Name}' (revision {site.Revision.ToString(CultureInfo.InvariantCulture)}); earlier names stay in its history (site list --all-revisions).");
        return ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>site list</c>.</summary>
public sealed class SiteListSettings : RegisterSettings
{
    /// <summary>Show every revision.</summary>
    [CommandOption("--all-revisions")]
    [Description("Also show each site's earlier names (every correction with who, when and why).")]
    public bool AllRevisions { get; init; }
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
        var rows = settings.AllRevisions ? sites.SelectMany(s => store.SiteHistory(s.Code)).ToArray() : sites.ToArray();
        if (settings.Json) WriteJson(new SiteList(rows.Select(SiteRow.From).ToArray()));
        else
        {
            Table(["site", "rev", "name", "components", "recorded", "by", "reason"], rows.Select(s => (IReadOnlyList<string>)
                [s.Code, s.Revision.ToString(CultureInfo.InvariantCulture), s.Name, components.Count(c => c.SiteId == s.Id).ToString(CultureInfo.InvariantCulture),
                 s.Recorded.RecordedUtc.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), s.Recorded.RecordedBy, s.Recorded.Reason.Length == 0 ? "-" : s.Recorded.Reason]));
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>site list</c>.</summary>
public sealed record SiteList(IReadOnlyList<SiteRow> Sites);
