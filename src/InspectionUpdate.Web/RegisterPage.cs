using System.Text;
using InspectionUpdate.Application;
using static InspectionUpdate.Web.Html;

namespace InspectionUpdate.Web;

/// <summary>The register page: every component in service with its stored result, sortable and filterable by site.</summary>
public static class RegisterPage
{
    /// <summary>Sort keys of the table (query parameter sort).</summary>
    public static IReadOnlyList<string> SortKeys { get; } = ["code", "site", "annual_pf", "next_due"];

    /// <summary>Renders the page.</summary>
    public static string Render(HttpContext context, RegisterOverviewData data, string? site, string? sort, bool descending, Job? job)
    {
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(data);
        var key = sort is not null && SortKeys.Contains(sort) ? sort : "code";
        IEnumerable<OverviewRow> rows = data.Rows;
        if (!string.IsNullOrEmpty(site)) rows = rows.Where(r => r.SiteCode == site);
        rows = key switch
        {
            "site" => rows.OrderBy(r => r.SiteCode, StringComparer.Ordinal).ThenBy(r => r.Code, StringComparer.Ordinal),
            // Not assessed last in either direction.
            "annual_pf" => descending ? rows.OrderByDescending(r => r.Result?.AnnualPf ?? double.NegativeInfinity) : rows.OrderBy(r => r.Result?.AnnualPf ?? double.PositiveInfinity),
            "next_due" => descending ? rows.OrderByDescending(r => r.Result?.NextDue ?? DateOnly.MinValue) : rows.OrderBy(r => r.Result?.NextDue ?? DateOnly.MaxValue),
            _ => rows.OrderBy(r => r.Code, StringComparer.Ordinal),
        };
        if (descending && key is "code" or "site") rows = rows.Reverse();
        var list = rows.ToList();

        var b = new StringBuilder();
        b.Append("<h1>Register</h1>");
        var assessed = data.Rows.Count(r => r.Result is not null);
        b.Append("<p>").Append(E(data.Rows.Count)).Append(" component(s) in service as of ").Append(E(D(data.AsOf))).Append("; ")
            .Append(E(assessed)).Append(" with a stored result for these options, ")
            .Append(E(data.Rows.Count(r => r.Stale is not null))).Append(" of them stale (the register changed since). ")
            .Append("The numbers are stored results (the same as <code>register assess</code> writes); this page computes none.</p>");

        if (job is not null && job.State is JobState.Queued or JobState.Running)
        {
            b.Append("<div class=\"box\" id=\"progress\" data-status=\"/jobs/").Append(Seg(job.Id)).Append("\">Assessing the register: <progress max=\"1\" value=\"")
                .Append(E(N(job.Progress, "0.00"))).Append("\"></progress> <span class=\"pct\">").Append(E(N(100 * job.Progress, "0"))).Append(" %</span>")
                .Append(" <span class=\"muted\">(the page updates when the run ends; other pages stay usable)</span></div>");
        }
        else
        {
            if (job is { State: JobState.Done }) b.Append("<div class=\"box change\">Register run finished: ").Append(E(job.Note)).Append("</div>");
            if (job is { State: JobState.Failed }) b.Append("<div class=\"box error\">Register run failed: ").Append(E(job.Error)).Append("</div>");
            b.Append("<form method=\"post\" action=\"/register/assess\">").Append(Token(context))
                .Append("<button type=\"submit\">Assess every component without a current result</button> <span class=\"muted\">runs in the background; unchanged components are reused</span></form>");
        }

        b.Append("<p class=\"filters\">Site: ").Append(Link("All", null, key, descending, string.IsNullOrEmpty(site)));
        foreach (var (code, name) in data.Sites) b.Append(Link(code, code, key, descending, site == code, name));
        b.Append("</p>");

        b.Append("<table id=\"register\"><thead><tr>")
            .Append(Head("Component", "code", site, key, descending)).Append(Head("Site", "site", site, key, descending))
            .Append("<th>Description</th>")
            .Append(Head("Annual Pf (current)", "annual_pf", site, key, descending))
            .Append("<th>Route</th>")
            .Append(Head("Next inspection due", "next_due", site, key, descending))
            .Append("<th>Flags</th></tr></thead><tbody>");
        foreach (var r in list)
        {
            b.Append("<tr data-code=\"").Append(E(r.Code)).Append("\"><td><a href=\"/components/").Append(Seg(r.Code)).Append("\">").Append(E(r.Code)).Append("</a></td>")
                .Append("<td title=\"").Append(E(r.SiteName)).Append("\">").Append(E(r.SiteCode)).Append("</td>")
                .Append("<td>").Append(E(r.Description)).Append("</td>")
                .Append("<td class=\"num\">").Append(E(P(r.Result?.AnnualPf))).Append(r.Result?.AnnualPfYearEnding is { } ye ? "<br><span class=\"muted\">year to " + E(D(ye)) + "</span>" : string.Empty).Append("</td>")
                .Append("<td>").Append(E(r.Result?.Route ?? "–")).Append(r.Result?.Cov is { } cov ? ", CoV " + E(N(cov, "0.000")) : string.Empty).Append("</td>")
                .Append("<td>").Append(E(D(r.Result?.NextDue))).Append("</td><td>");
            if (r.Result is null) b.Append("<span class=\"flag none\">not assessed</span>");
            if (r.Failed) b.Append("<span class=\"flag overdue\" title=\"").Append(E(r.Result?.Error)).Append("\">failed</span>");
            if (r.AboveTarget) b.Append("<span class=\"flag above\">above target</span>");
            if (r.Overdue) b.Append("<span class=\"flag overdue\">overdue</span>");
            if (r.NotConverged) b.Append("<span class=\"flag nc\">not converged</span>");
            if (r.Stale is not null) b.Append("<span class=\"flag stale\" title=\"").Append(E(r.Stale)).Append("\">stale</span>");
            b.Append("</td></tr>");
        }

        b.Append("</tbody></table>");
        b.Append("<p class=\"muted\">Annual Pf: the updated ΔPf of the grid year ending at the first grid time at or after the evidence date (the prior where there are no findings). ")
            .Append("Above target: that annual Pf exceeds the target. Overdue: the next inspection date lies on or before the evidence date. ")
            .Append("Not converged: some number behind the result did not reach its accuracy (see the component page). ")
            .Append("The register holds no consequence class, so none is shown.</p>");
        return Page(context, "Register", b.ToString(), poll: job is { State: JobState.Queued or JobState.Running });
    }

    private static string Query(string? site, string sort, bool descending) =>
        "/?" + (string.IsNullOrEmpty(site) ? string.Empty : "site=" + Uri.EscapeDataString(site) + "&") + "sort=" + sort + (descending ? "&dir=desc" : string.Empty);

    private static string Link(string text, string? site, string sort, bool descending, bool on, string? title = null) =>
        $"<a href=\"{E(Query(site, sort, descending))}\"{(on ? " class=\"on\" aria-current=\"true\"" : string.Empty)}{(title is null ? string.Empty : $" title=\"{E(title)}\"")}>{E(text)}</a>";

    private static string Head(string text, string key, string? site, string sort, bool descending)
    {
        var active = sort == key;
        var nextDescending = active && !descending;
        var mark = active ? (descending ? " ▼" : " ▲") : string.Empty;
        var aria = active ? (descending ? " aria-sort=\"descending\"" : " aria-sort=\"ascending\"") : string.Empty;
        return $"<th{aria}><a href=\"{E(Query(site, key, nextDescending))}\">{E(text)}{mark}</a></th>";
    }
}
