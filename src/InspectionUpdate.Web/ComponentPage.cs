using System.Text;
using InspectionUpdate.Application;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Time;
using static InspectionUpdate.Web.Html;

namespace InspectionUpdate.Web;

/// <summary>What the component page shows.</summary>
/// <param name="Records">The register's records of the component (every revision).</param>
/// <param name="Context">The component as the engine sees it (model, inputs, evidence), or null when its model cannot be built.</param>
/// <param name="ContextError">Why the model could not be built, or null.</param>
/// <param name="Current">The result for the component's current key, or null while it is computed.</param>
/// <param name="Job">The run computing it, or null.</param>
/// <param name="Change">The latest change written through the view, or null.</param>
public sealed record ComponentView(ComponentRecords Records, ComponentContext? Context, string? ContextError, CachedResult? Current, Job? Job, ComponentChange? Change);

/// <summary>The component page: model summary, findings and repairs with every revision, the results with route and convergence of every number, the plan.</summary>
public static class ComponentPage
{
    /// <summary>Renders the page.</summary>
    public static string Render(HttpContext context, ComponentView view)
    {
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(view);
        var c = view.Records.Component;
        var b = new StringBuilder();
        b.Append("<h1>Component <span id=\"component-code\">").Append(E(c.Code)).Append("</span></h1>");
        b.Append("<p id=\"component-name\">").Append(E(c.Description)).Append("</p>");
        b.Append("<dl class=\"facts\"><dt>Site</dt><dd>").Append(E(view.Records.Site?.Code)).Append(" – ").Append(E(view.Records.Site?.Name)).Append("</dd>")
            .Append("<dt>In service since</dt><dd>").Append(E(D(c.InstallDate))).Append("</dd>")
            .Append("<dt>Nominal wall</dt><dd>").Append(E(c.WallThicknessMm is { } w ? N(w) + " mm" : "not given")).Append("</dd>")
            .Append("<dt>Model</dt><dd>").Append(E(view.Context?.ModelDescription ?? $"version {c.Model.ModelVersion} (revision {c.Model.Revision})")).Append("</dd>")
            .Append("<dt>Parameter group</dt><dd>").Append(E(c.ParameterGroup ?? "none")).Append("</dd>");
        if (view.Records.Retired) b.Append("<dt>Status</dt><dd><strong>retired</strong></dd>");
        b.Append("</dl>");
        b.Append("<p><a href=\"/components/").Append(Seg(c.Code)).Append("/findings/new\" id=\"log-finding\">Log a finding</a> · <a href=\"/import\">Import findings (CSV)</a></p>");

        Change(b, view);
        Results(b, view);
        Findings(b, view.Records);
        Repairs(b, view.Records);
        Model(b, view);
        return Page(context, c.Code, b.ToString(), poll: view.Current is null && view.Job is { State: JobState.Queued or JobState.Running });
    }

    private static void Change(StringBuilder b, ComponentView view)
    {
        if (view.Change is not { } change) return;
        b.Append("<div class=\"box change\" id=\"change\"><strong>").Append(E(change.What)).Append("</strong> <span class=\"muted\">(")
            .Append(E(change.AtUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", System.Globalization.CultureInfo.InvariantCulture))).Append(" UTC)</span>");
        var after = view.Current is { } cur && cur.Result.Key != change.Before?.Key ? ResultSummary.Of(cur.Result) : null;
        if (after is null && view.Current is not null)
        {
            b.Append("<p>The numbers are unchanged: the view reads the register as recorded at the end of its evidence date ")
                .Append(E(D(view.Current.Result.Request.AsOf))).Append(", and this change was recorded later. Serve without --as-of to see it counted.</p></div>");
            return;
        }

        if (after is null)
        {
            b.Append("<p>The numbers after the change are being computed.</p></div>");
            return;
        }

        var before = change.Before;
        b.Append("<table class=\"beforeafter\"><thead><tr><th></th><th>Before</th><th></th><th>After</th></tr></thead><tbody>")
            .Append("<tr><th>Annual Pf (current)</th><td class=\"num\" id=\"before-annual\">").Append(E(before is null ? "not computed" : P(before.AnnualPf)))
            .Append("</td><td class=\"arrow\">→</td><td class=\"num\" id=\"after-annual\">").Append(E(P(after.AnnualPf))).Append("</td></tr>")
            .Append("<tr><th>Next inspection due</th><td id=\"before-due\">").Append(E(before is null ? "not computed" : D(before.NextDue)))
            .Append("</td><td class=\"arrow\">→</td><td id=\"after-due\">").Append(E(D(after.NextDue))).Append("</td></tr>")
            .Append("<tr><th>Route, converged</th><td>").Append(E(before is null ? "–" : $"{before.Route}, {(before.Converged ? "converged" : "NOT converged")}"))
            .Append("</td><td class=\"arrow\">→</td><td>").Append(E($"{after.Route}, {(after.Converged ? "converged" : "NOT converged")}")).Append("</td></tr>")
            .Append("</tbody></table></div>");
    }

    private static void Results(StringBuilder b, ComponentView view)
    {
        b.Append("<h2>Failure probability and plan</h2>");
        if (view.Current is not { } cached)
        {
            if (view.Job is { State: JobState.Failed } failed)
            {
                b.Append("<div class=\"box error\" id=\"run-error\">The assessment could not be made: ").Append(E(failed.Error)).Append("</div>");
                return;
            }

            var job = view.Job;
            b.Append("<div class=\"box\" id=\"progress\"").Append(job is null ? string.Empty : " data-status=\"/jobs/" + Seg(job.Id) + "\"").Append(">Assessing and planning in the background: ")
                .Append("<progress max=\"1\" value=\"").Append(E(N(job?.Progress ?? 0, "0.00"))).Append("\"></progress> <span class=\"pct\">")
                .Append(E(N(100 * (job?.Progress ?? 0), "0"))).Append(" %</span> <span class=\"muted\">(this page updates when it is done; reload if it does not)</span></div>");
            return;
        }

        var r = cached.Result;
        var o = r.Outcome;
        var point = HtmlReportWriter.PointAt(o.Current, r.Request.AsOfYears);
        b.Append("<dl class=\"facts\" id=\"summary\">");
        if (point is not null)
        {
            b.Append("<dt>").Append(E(HtmlReportWriter.AnnualPfLabel(r.Context.InServiceDate, point, o.Updated is null ? "prior" : "updated"))).Append("</dt><dd id=\"annual-pf\">")
                .Append(E(P(point.IntervalPf))).Append(" <span class=\"muted\">(").Append(E(HtmlReportWriter.RouteText(point))).Append(")</span></dd>")
                .Append("<dt>Cumulative Pf, β</dt><dd>").Append(E(P(point.CumulativePf))).Append(", β = ").Append(E(N(point.Beta, "0.00"))).Append("</dd>");
        }

        b.Append("<dt>Evidence</dt><dd>").Append(E(r.Request.Evidence.Count)).Append(" record(s) up to ").Append(E(D(r.Request.AsOf))).Append("</dd>");
        if (r.Plan is { } plan)
        {
            b.Append("<dt>Next inspection due</dt><dd id=\"next-due\">").Append(E(D(plan.Next.Date))).Append("</dd>")
                .Append("<dt>Why</dt><dd>").Append(E(plan.Next.Message)).Append(" <span class=\"muted\">(")
                .Append(E(Computation(plan.Next.Computation))).Append(")</span></dd>")
                .Append("<dt>Remaining life</dt><dd>").Append(E(plan.RemainingLife.Message)).Append(" <span class=\"muted\">(")
                .Append(E(Computation(plan.RemainingLife.Computation))).Append(")</span></dd>");
            b.Append("<dt>After a detection</dt><dd id=\"after-detection\">").Append(E(plan.AfterDetection == AfterDetection.Repair ? "repair on detection" : "monitor"))
                .Append(plan.BranchStatement is { } branch ? " – " + E(branch) : " <span class=\"muted\">(no detection since the last repair: changes no number)</span>").Append("</dd>");
        }
        else
        {
            b.Append("<dt>Plan</dt><dd>none: the evidence date lies at or beyond the horizon</dd>");
        }

        b.Append("<dt>All numbers converged</dt><dd id=\"converged\">").Append(r.AllConverged ? "yes" : "<strong>no</strong> – see the flagged rows below").Append("</dd>")
            .Append("<dt>Result key</dt><dd><code>").Append(E(r.Key[..16])).Append("…</code></dd></dl>");
        if (o.PosteriorNote is not null) b.Append("<p class=\"muted\">").Append(E(o.PosteriorNote)).Append("</p>");

        b.Append("<div class=\"plots\"><figure><img class=\"plot\" alt=\"Annual failure probability, prior (dashed) and updated (solid), with the target line\" src=\"data:image/png;base64,")
            .Append(cached.AnnualPfPng).Append("\"></figure><figure><img class=\"plot\" alt=\"Reliability index beta over time, prior and updated\" src=\"data:image/png;base64,")
            .Append(cached.BetaPng).Append("\"></figure></div>");

        if (r.Plan?.Schedule is { } schedule)
        {
            b.Append("<h2>Plan: inspections over the remaining life with ").Append(E(schedule.MethodName)).Append("</h2><p>").Append(E(schedule.Message))
                .Append(" Each planned inspection is assumed to find nothing (the usual planning assumption).</p>");
            b.Append("<table id=\"schedule\"><thead><tr><th>#</th><th>Date</th><th>Years in service</th><th>Interval (years)</th><th>Annual Pf before</th><th>after</th><th>Route</th><th>Converged</th></tr></thead><tbody>");
            foreach (var i in schedule.Inspections)
            {
                b.Append("<tr><td>").Append(E(i.Number)).Append("</td><td>").Append(E(D(i.Date))).Append("</td><td class=\"num\">").Append(E(N(i.TimeYears, "0.00")))
                    .Append("</td><td class=\"num\">").Append(E(N(i.IntervalYears, "0.00"))).Append("</td><td class=\"num\">").Append(E(P(i.Before.Value)))
                    .Append("</td><td class=\"num\">").Append(E(P(i.After.Value))).Append("</td><td>").Append(E(HtmlReportWriter.RouteName(i.Before.Route)))
                    .Append(i.Before.CoefficientOfVariation is { } cv ? ", CoV " + E(N(cv, "0.000")) : string.Empty)
                    .Append("</td><td>").Append(i.Before.Converged && i.After.Converged ? "yes" : "<strong>no</strong>").Append("</td></tr>");
            }

            b.Append("</tbody></table>");
        }

        b.Append("<details><summary>Profile, year by year (route and convergence of every number)</summary>");
        Profile(b, r.Context.InServiceDate, o.Prior, "Prior (no findings)");
        if (o.Updated is not null) Profile(b, r.Context.InServiceDate, o.Updated, "Updated with the findings");
        b.Append("</details>");
        if (r.Plan is { } p2)
        {
            var assumptions = p2.Next.Assumptions.Concat(p2.Schedule?.Assumptions ?? []).Distinct().ToArray();
            b.Append("<details><summary>Assumptions of the plan</summary><ul>");
            foreach (var a in assumptions) b.Append("<li>").Append(E(a)).Append("</li>");
            b.Append("</ul></details>");
        }
    }

    private static string Computation(ComputationSummary s) =>
        string.Join(", ", s.Routes.Select(HtmlReportWriter.RouteName)) + (s.AllConverged ? ", converged" : ", NOT converged")
        + (s.MaxCoefficientOfVariation is { } cv ? ", max CoV " + N(cv, "0.000") : string.Empty);

    private static void Profile(StringBuilder b, DateOnly inService, ReliabilityProfile profile, string title)
    {
        b.Append("<h3>").Append(E(title)).Append("</h3><table><thead><tr><th>Years in service</th><th>Date</th><th>Annual Pf ΔPf</th><th>Cumulative Pf</th><th>β</th><th>Route</th><th>Converged</th><th>CoV</th></tr></thead><tbody>");
        foreach (var p in profile.Points)
        {
            b.Append("<tr").Append(p.Converged ? string.Empty : " class=\"nc\"").Append("><td class=\"num\">").Append(E(N(p.TimeYears, "0.##"))).Append("</td><td>")
                .Append(E(D(ServiceTime.DateAt(inService, p.TimeYears)))).Append("</td><td class=\"num\">").Append(E(P(p.IntervalPf))).Append("</td><td class=\"num\">")
                .Append(E(P(p.CumulativePf))).Append("</td><td class=\"num\">").Append(E(N(p.Beta, "0.00"))).Append("</td><td>").Append(E(HtmlReportWriter.RouteName(p.Route)))
                .Append("</td><td>").Append(p.Converged ? "yes" : "<strong>no</strong>").Append("</td><td class=\"num\">").Append(E(N(p.CoefficientOfVariation, "0.000"))).Append("</td></tr>");
        }

        b.Append("</tbody></table>");
    }

    private static void Findings(StringBuilder b, ComponentRecords records)
    {
        b.Append("<h2>Findings</h2>");
        if (records.Findings.Count == 0)
        {
            b.Append("<p>No findings yet.</p>");
            return;
        }

        b.Append("<p class=\"muted\">Every revision is kept: superseded revisions are struck through; a correction or withdrawal is a new revision with who, when and why.</p>");
        b.Append("<table id=\"findings\"><thead><tr><th>Finding</th><th>Rev.</th><th>Date</th><th>Outcome</th><th>Method</th><th>Size (mm)</th><th>Remaining wall (mm)</th><th>Location</th><th>Recorded by, when</th><th>Reason</th><th></th></tr></thead><tbody>");
        foreach (var f in records.Findings)
        {
            foreach (var rev in f.Revisions)
            {
                var current = rev.Revision == f.Current.Revision;
                var strike = !current;
                b.Append("<tr data-finding=\"").Append(E(f.FindingId)).Append("\" data-revision=\"").Append(E(rev.Revision)).Append('"')
                    .Append(strike ? " class=\"superseded\"" : string.Empty).Append('>');
                Cell(b, "F-" + rev.FindingId, strike);
                Cell(b, rev.Revision.ToString(System.Globalization.CultureInfo.InvariantCulture), strike);
                Cell(b, D(rev.InspectionDate), strike);
                Cell(b, FindingWords.Of(rev.Kind) + (rev.Withdrawn ? " (withdrawn)" : string.Empty), strike);
                Cell(b, rev.MethodName ?? "–", strike);
                Cell(b, N(rev.MeasuredSizeMm), strike);
                Cell(b, N(rev.RemainingWallMm), strike);
                Cell(b, rev.Location, strike);
                Cell(b, rev.Recorded.RecordedBy + ", " + rev.Recorded.RecordedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", System.Globalization.CultureInfo.InvariantCulture) + " UTC", strike);
                Cell(b, rev.Revision > 1 || rev.Withdrawn ? rev.Recorded.Reason : string.Empty, strike);
                b.Append("<td>");
                if (current && !rev.Withdrawn) b.Append("<a href=\"/findings/").Append(E(f.FindingId)).Append("/correct\">correct or withdraw</a>");
                b.Append("</td></tr>");
            }
        }

        b.Append("</tbody></table>");
    }

    private static void Cell(StringBuilder b, string text, bool strike) =>
        b.Append("<td>").Append(strike ? "<s>" : string.Empty).Append(E(text)).Append(strike ? "</s>" : string.Empty).Append("</td>");

    private static void Repairs(StringBuilder b, ComponentRecords records)
    {
        b.Append("<h2>Repairs</h2>");
        if (records.Repairs.Count == 0)
        {
            b.Append("<p>No repairs.</p>");
            return;
        }

        b.Append("<table id=\"repairs\"><thead><tr><th>Repair</th><th>Rev.</th><th>Date</th><th>What was done</th><th>Recorded by, when</th><th>Reason</th></tr></thead><tbody>");
        foreach (var r in records.Repairs)
        {
            foreach (var rev in r.Revisions)
            {
                var strike = rev.Revision != r.Current.Revision;
                b.Append("<tr").Append(strike ? " class=\"superseded\"" : string.Empty).Append('>');
                Cell(b, "R-" + rev.RepairId, strike);
                Cell(b, rev.Revision.ToString(System.Globalization.CultureInfo.InvariantCulture), strike);
                Cell(b, D(rev.RepairDate), strike);
                Cell(b, rev.Description + (rev.Withdrawn ? " (withdrawn)" : string.Empty), strike);
                Cell(b, rev.Recorded.RecordedBy + ", " + rev.Recorded.RecordedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", System.Globalization.CultureInfo.InvariantCulture) + " UTC", strike);
                Cell(b, rev.Revision > 1 || rev.Withdrawn ? rev.Recorded.Reason : string.Empty, strike);
                b.Append("</tr>");
            }
        }

        b.Append("</tbody></table><p class=\"muted\">Repairs are logged and corrected with the command line (<code>repair log</code>, <code>repair correct</code>).</p>");
    }

    private static void Model(StringBuilder b, ComponentView view)
    {
        b.Append("<h2>Model summary</h2>");
        if (view.Context is not { } ctx)
        {
            b.Append("<div class=\"box error\">The model cannot be built: ").Append(E(view.ContextError)).Append("</div>");
            return;
        }

        b.Append("<p>").Append(E(ctx.ModelDescription)).Append("; service life ").Append(E(ctx.ServiceLifeYears is { } life ? N(life) + " years" : "not stated (horizon 40 years)"))
            .Append(". Degradation size seen by inspections in mm; failure when the limit state g(x, t) ≤ 0.</p>");
        if (ctx.Model.RenewedOnRepair.Count > 0) b.Append("<p>A repair renews ").Append(E(string.Join(", ", ctx.Model.RenewedOnRepair))).Append(".</p>");
        b.Append("<table id=\"inputs\"><thead><tr><th>Input</th><th>Distribution</th><th>Unit</th><th>Source</th></tr></thead><tbody>");
        foreach (var i in ReportMapping.Inputs(ctx.Model.Inputs, ctx.InputSource))
        {
            b.Append("<tr><td>").Append(E(i.Name)).Append("</td><td>").Append(E(i.Distribution)).Append("</td><td>").Append(E(i.Unit)).Append("</td><td>").Append(E(i.Source)).Append("</td></tr>");
        }

        b.Append("</tbody></table>");
    }
}
