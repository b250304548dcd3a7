using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>One component on the register overview: identity, site and its stored result for the overview's date and options.</summary>
/// <param name="Code">Component code.</param>
/// <param name="Description">Component description.</param>
/// <param name="SiteCode">Site code.</param>
/// <param name="SiteName">Site name.</param>
/// <param name="InServiceDate">Entry into service.</param>
/// <param name="Result">Stored result for the date and options, or null when not assessed.</param>
/// <param name="Stale">Why the stored result no longer matches the register (a finding, model or option changed), or null.</param>
/// <param name="AboveTarget">The current annual Pf is above the target.</param>
/// <param name="Overdue">The next inspection date lies on or before the evidence date (the target is already reached).</param>
/// <param name="NotConverged">Some number behind the result did not converge.</param>
public sealed record OverviewRow(string Code, string Description, string SiteCode, string SiteName, DateOnly InServiceDate, StoredResult? Result, string? Stale,
    bool AboveTarget, bool Overdue, bool NotConverged)
{
    /// <summary>True when the component could not be assessed (the result says why).</summary>
    public bool Failed => Result?.Status == ResultStatus.Failed;
}

/// <summary>The register overview: every component in service as of the date with its stored result.</summary>
/// <param name="AsOf">Evidence date.</param>
/// <param name="OptionsKey">Options the results were filed under.</param>
/// <param name="TargetAnnualPf">Target annual failure probability.</param>
/// <param name="Rows">One row per component in service (not retired), by code.</param>
/// <param name="Sites">Site codes and names, by code.</param>
/// <param name="Fingerprint">Fingerprint of the register as known on the date.</param>
public sealed record RegisterOverviewData(DateOnly AsOf, string OptionsKey, double TargetAnnualPf, IReadOnlyList<OverviewRow> Rows,
    IReadOnlyList<(string Code, string Name)> Sites, string Fingerprint);

/// <summary>Reads the register overview from stored results: it computes no reliability number, so it stays quick.</summary>
public static class RegisterOverview
{
    /// <summary>Every component in service as of the options' date with its stored result (computed by <see cref="PortfolioRun"/> or <see cref="ComponentRefresh"/>).</summary>
    public static RegisterOverviewData Read(IRegister store, PortfolioOptions options)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(options);
        var snapshot = new RegisterSnapshot(store, options.AsOf);
        var sites = snapshot.Sites.ToDictionary(s => s.Id);
        var stored = store.Results(options.AsOf, options.OptionsKey);
        var results = stored.ToDictionary(r => r.ComponentId);
        var reasons = StoredResults.WhyStale(store, stored);
        var staleness = stored.Select((r, i) => (r.ComponentId, Why: reasons[i])).ToDictionary(x => x.ComponentId, x => x.Why);
        var rows = store.ComponentsInService(snapshot.Known).Where(c => c.InstallDate <= options.AsOf).OrderBy(c => c.Code, StringComparer.Ordinal).Select(c =>
        {
            var site = sites.GetValueOrDefault(c.SiteId);
            var result = results.GetValueOrDefault(c.Id);
            var stale = result is null ? null : staleness[result.ComponentId];
            var above = result?.AnnualPf is { } pf && pf > options.Target.AnnualPf;
            var overdue = result is not null && (result.NextStatus == "already_exceeded" || (result.NextDue is { } due && due <= options.AsOf));
            return new OverviewRow(c.Code, c.Description, site?.Code ?? "?", site?.Name ?? "?", c.InstallDate, result, stale, above, overdue,
                result?.Status == ResultStatus.NotConverged);
        }).ToArray();
        return new RegisterOverviewData(options.AsOf, options.OptionsKey, options.Target.AnnualPf, rows,
            snapshot.Sites.Select(s => (s.Code, s.Name)).OrderBy(s => s.Code, StringComparer.Ordinal).ToArray(), snapshot.Fingerprint);
    }
}
