using System.Globalization;
using System.Net;
using System.Text;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting.Plots;
using InspectionUpdate.Time;

namespace InspectionUpdate.Reporting.Html;

/// <summary>
/// Self-contained HTML reports: one page per component and one for the register, every plot embedded as a base64
/// PNG, a print style sheet, and no external resource.
/// </summary>
/// <remarks>
/// Sections carry stable ids (<see cref="ComponentSections"/>, <see cref="PortfolioSections"/>) so that tests and
/// users can link to them.
/// </remarks>
public static partial class HtmlReportWriter
{
    /// <summary>Ids of the sections of a component report, in page order.</summary>
    public static IReadOnlyList<string> ComponentSections { get; } =
        ["summary", "inputs", "findings", "results", "plots", "plan", "assumptions", "provenance", "cautions"];

    /// <summary>Ids of the sections of a register report, in page order.</summary>
    public static IReadOnlyList<string> PortfolioSections { get; } =
        ["summary", "ranking", "risk", "due-dates", "components", "assumptions", "provenance", "cautions"];

    /// <summary>The HTML page of one component.</summary>
    public static string Component(ComponentReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var h = new StringBuilder();
        Head(h, $"{data.ComponentId} — {data.ComponentName}");
        h.Append("<header><div class=\"kicker\">Component integrity report</div><h1>")
            .Append(E(data.ComponentId)).Append(" · ").Append(E(data.ComponentName)).Append("</h1><div class=\"sub\">")
            .Append(E(data.Site)).Append(" · ").Append(E(data.Model)).Append(" · evidence to ")
            .Append(Date(data.Provenance.AssessedAsOf)).Append(KnownOnText(data.Provenance)).Append("</div><div class=\"marks\">Marks: ").Append(FlagMarks(data.Flags)).Append("</div></header>\n");
        DocumentControlBlock(h, data.DocumentControl);
        CautionBanner(h);

        Section(h, "summary", "Summary");
        var current = data.Updated ?? data.Prior;
        var now = YearsSince(data.InServiceDate, data.Provenance.AssessedAsOf);
        var point = current is null ? null : PointAt(current, now);
        h.Append("<div class=\"cards\">");
        Card(h, "In service since", Date(data.InServiceDate));
        Card(h, point is null ? "Annual Pf" : AnnualPfLabel(data.InServiceDate, point, data.Updated is null ? "prior" : "updated"),
            point is null ? "not available" : NumberText.Format(point.IntervalPf));
        Card(h, "Route of this number", point is null ? "-" : RouteText(point));
        Card(h, "Next inspection", data.Plan?.Schedule.Count > 0 ? Date(data.Plan.Schedule[0].Date) : "not planned");
        h.Append("<div class=\"card card-flag\"><div class=\"k\">Marks</div><div class=\"v\">").Append(FlagMarks(data.Flags)).Append("</div></div>");
        h.Append("</div>\n");
        Legend(h);
        NotAvailable(h, data.NotAvailable);
        NotRequested(h, data.NotRequested);
        EndSection(h);

        Section(h, "inputs", "Inputs");
        Table(h, ["input", "distribution", "unit", "source"], data.Inputs.Select(i => new[] { i.Name, i.Distribution, i.Unit, i.Source }));
        EndSection(h);

        Section(h, "findings", "Findings and repairs");
        if (data.Findings.Count == 0) h.Append("<p>No finding recorded.</p>\n");
        else
        {
            h.Append("<p>Every revision is listed; superseded revisions are struck through and are not used as evidence.</p>\n");
            Table(h, ["reference", "date", "time (years)", "outcome", "method", "measured size (mm)", "revision", "recorded by", "reason"],
                data.Findings.OrderBy(f => f.Date).ThenBy(f => f.Reference, StringComparer.Ordinal).ThenBy(f => f.Revision)
                    .Select(f => new[]
                    {
                        f.Reference, Date(f.Date), NumberText.Format(f.TimeYears), f.Outcome, f.Method,
                        f.MeasuredSizeMm is { } m ? NumberText.Format(m) : "-", f.Revision.ToString(CultureInfo.InvariantCulture),
                        f.RecordedBy, f.Reason ?? (f.Revision == 1 ? OriginalRecord : "-"),
                    }),
                data.Findings.OrderBy(f => f.Date).ThenBy(f => f.Reference, StringComparer.Ordinal).ThenBy(f => f.Revision).Select(f => f.Superseded ? "superseded" : null).ToArray());
        }

        if (data.Repairs.Count > 0)
        {
            h.Append("<h3>Repairs</h3>\n");
            Table(h, ["date", "time (years)", "description"], data.Repairs.Select(r => new[] { Date(r.Date), NumberText.Format(r.TimeYears), r.Description }));
        }

        EndSection(h);

        Section(h, "results", "Results");
        h.Append("<p>Pf(t) is cumulative from entry into service; ΔPf(t) is the annual failure probability Pf(t) − Pf(t − 1); the hazard is ΔPf / (1 − Pf(t − 1)); β = −Φ⁻¹(Pf(t)). The route says how each number was computed.</p>\n");
        foreach (var profile in new[] { data.Prior, data.Updated })
        {
            if (profile is null) continue;
            h.Append("<h3>").Append(E(profile.Label)).Append("</h3>\n");
            ProfileTable(h, profile, profile == data.Prior ? "prior" : "updated");
        }

        if (data.Prior is null && data.Updated is null) h.Append("<p class=\"na\">No profile available.</p>\n");
        if (data.PosteriorSummaries.Count > 0)
        {
            h.Append("<h3>Posterior of the inputs</h3>\n");
            if (data.PosteriorRoute is not null) h.Append("<p>").Append(E(data.PosteriorRoute)).Append("</p>\n");
            Table(h, ["input", "prior mean", "prior sd", "posterior mean", "posterior sd", "posterior 5 %", "posterior 95 %"],
                data.PosteriorSummaries.Select(p => new[]
                {
                    p.Variable, NumberText.Format(p.PriorMean), NumberText.Format(p.PriorStandardDeviation), NumberText.Format(p.PosteriorMean), NumberText.Format(p.PosteriorStandardDeviation), NumberText.Format(p.Quantile05), NumberText.Format(p.Quantile95),
                }));
        }
        EndSection(h);

        Section(h, "plots", "Plots");
        if (data.Prior is not null || data.Updated is not null)
        {
            var markers = new ChartMarkers(
                data.Findings.Where(f => !f.Superseded).Select(f => f.TimeYears).Distinct().ToArray(),
                data.Repairs.Select(r => r.TimeYears).ToArray(),
                data.Plan?.Schedule.Select(s => s.TimeYears).ToArray() ?? []);
            Figure(h, ReportCharts.Profile(ProfileQuantity.AnnualPf, data.Prior, data.Updated, data.Plan?.TargetAnnualPf, markers),
                "Annual failure probability, prior (dashed) against updated (solid), with the target and the inspection, repair and planned-inspection times.");
            Figure(h, ReportCharts.Profile(ProfileQuantity.Beta, data.Prior, data.Updated, null, markers),
                "Reliability index β(t) of the cumulative failure probability. The cumulative Pf cannot fall, so β cannot rise except at a repair (Pf restarts): every rise is marked, a triangle where it is noise of the estimate (read the profile table's notes), a diamond at a repair.");
            Figure(h, ReportCharts.Profile(ProfileQuantity.CumulativePf, data.Prior, data.Updated, null, markers),
                "Cumulative failure probability Pf(t), axis within [1e-12, 1]; values below 1e-12 (and zeros) are drawn at 1e-12.");
        }

        if (data.Importance is not null)
        {
            Figure(h, ReportCharts.Importance(data.Importance),
                "Importance factors α² of the model's inputs (with their units) at the " + data.Importance.Label + ": which inputs drive failure. The design point is that of the next due date, or of the evidence date when nothing is planned.");
        }
        else if (data.Prior is not null || data.Updated is not null)
        {
            h.Append("<p class=\"small\">No importance-factor chart: no step near the next due date or the evidence date has a first-order design point with weight on the model's inputs (sampled steps carry no design point).</p>\n");
        }
        if (data.PodCurves.Count > 0)
        {
            Figure(h, ReportCharts.PodCurves(data.PodCurves),
                "Probability-of-detection curves of the methods used in this component's findings or assumed for its planned inspections: "
                + string.Join(", ", data.PodCurves.Select(c => c.Method)) + ".");
        }
        foreach (var p in data.Posteriors.Where(p => p.Prior.Count + p.Posterior.Count >= 2))
        {
            Figure(h, ReportCharts.Posterior(p), "Prior and posterior samples of " + p.Variable + ".");
        }

        EndSection(h);

        Section(h, "plan", "Inspection plan");
        if (data.Plan is null) h.Append("<p class=\"na\">No plan: the planner was not run or is not available in this build.</p>\n");
        else
        {
            h.Append("<p><strong>").Append(T(data.Plan.Status)).Append("</strong></p>\n<p>Target annual failure probability ")
                .Append(T(NumberText.Format(data.Plan.TargetAnnualPf))).Append(" per year (").Append(T(data.Plan.TargetSource)).Append(").</p>\n");
            h.Append("<p class=\"small\">").Append(T(PlanAnnualNote(data.InServiceDate, data.Provenance.AssessedAsOf, point))).Append("</p>\n");
            h.Append("<p class=\"small\" id=\"after-detection\">After a detection: <strong>")
                .Append(T(data.Plan.AfterDetection == "repair" ? "repair on detection" : "monitor"))
                .Append("</strong> (").Append(T(data.Plan.BranchNote is null
                    ? "no detection since the last repair: the choice changes no number of this plan"
                    : data.Plan.AfterDetection == "repair" ? "the defect is assumed repaired and the component restarts from its post-repair prior; see the first note"
                    : "the known defect stays in service and is monitored; see the first note")).Append(").</p>\n");
            if (data.Plan.Schedule.Count > 0)
            {
                Table(h, ["#", "date", "time (years)", "method", "basis"],
                    data.Plan.Schedule.Select((s, i) => new[]
                    {
                        (i + 1).ToString(CultureInfo.InvariantCulture), Date(s.Date), NumberText.Format(s.TimeYears), s.Method.Length > 0 ? s.Method : NoMethod, s.Basis,
                    }));
            }

            List(h, data.Plan.Notes);
        }

        EndSection(h);

        Section(h, "assumptions", "Assumptions");
        List(h, data.Assumptions.Count > 0 ? data.Assumptions : ["None stated."]);
        EndSection(h);

        Provenance(h, data.Provenance);
        CautionSection(h);
        h.Append("</main></body></html>\n");
        return h.ToString();
    }

    /// <summary>The HTML page of the register: ranking, next due dates and links to the component pages.</summary>
    public static string Portfolio(PortfolioReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var h = new StringBuilder();
        Head(h, data.Title);
        h.Append("<header><div class=\"kicker\">Register integrity report</div><h1>").Append(E(data.Title))
            .Append("</h1><div class=\"sub\">").Append(data.Rows.Count.ToString(CultureInfo.InvariantCulture)).Append(" components · evidence to ")
            .Append(Date(data.Provenance.AssessedAsOf)).Append(KnownOnText(data.Provenance)).Append("</div></header>\n");
        DocumentControlBlock(h, data.DocumentControl);
        CautionBanner(h);

        Section(h, "summary", "Summary");
        var assessed = data.Rows.Where(r => r.CurrentAnnualPf is not null).ToArray();
        var counts = ReportMarks.Counts(data.Rows.Select(r => r.FlagSet));
        h.Append("<div class=\"cards\">");
        Card(h, "Components", data.Rows.Count.ToString(CultureInfo.InvariantCulture));
        Card(h, "Assessed", assessed.Length.ToString(CultureInfo.InvariantCulture));
        Card(h, "Target", data.TargetAnnualPf is { } t ? NumberText.Format(t) + " per year" : "none");
        FlagCards(h, counts);
        h.Append("</div>\n");
        Legend(h, counts);
        NotAvailable(h, data.NotAvailable);
        EndSection(h);

        Section(h, "ranking", "Risk ranking");
        if (data.Rows.Any(r => r.CurrentAnnualPf is not null && r.YearsToTarget is not null))
        {
            Figure(h, ReportCharts.RiskRanking(data.Rows, data.TargetAnnualPf),
                "Current annual failure probability against the years left until it reaches the target; top left is most urgent.");
        }
        else h.Append("<p class=\"na\">No component has both a current annual Pf and a time to target.</p>\n");
        var ranked = data.Rows.OrderByDescending(r => r.CurrentAnnualPf ?? -1).ToArray();
        SortableTable(h, ["rank", "component", "site", "annual Pf now (grid year at or after the evidence date)", "route", "years to target", "marks"],
            ranked.Select((r, i) => new[]
            {
                Cell((i + 1).ToString(CultureInfo.InvariantCulture)), Cell(r.ComponentId), Cell(r.Site),
                Cell(r.CurrentAnnualPf is { } p ? NumberText.Format(p) + (r.CurrentYearEnding is { } end ? " (year ending " + Date(end) + ")" : string.Empty) : "not available"),
                Cell(r.Route),
                Cell(r.YearsToTarget is { } y ? (double.IsPositiveInfinity(y) ? "beyond horizon" : NumberText.Format(y)) : "-"),
                new HtmlCell(FlagMarks(r.FlagSet), ReportMarks.CsvCell(r.FlagSet)),
            }),
            ranked.Select(r => FlagRowClass(r.FlagSet)).ToArray(), sortable: false);
        EndSection(h);

        Section(h, "risk", "Risk: probability and consequence");
        RiskSection(h, data.Rows, data.ConsequenceClasses);
        EndSection(h);

        Section(h, "due-dates", "Next due dates");
        var byDue = data.Rows.OrderBy(r => r.NextDue ?? DateOnly.MaxValue).ToArray();
        SortableTable(h, ["next due", "component", "site", "status", "marks"],
            byDue.Select(r => new[]
            {
                Cell(r.NextDue is { } d ? Date(d) : "not planned"), Cell(r.ComponentId), Cell(r.Site), Cell(r.Status),
                new HtmlCell(FlagMarks(r.FlagSet), ReportMarks.CsvCell(r.FlagSet)),
            }),
            byDue.Select(r => FlagRowClass(r.FlagSet)).ToArray(), sortable: false);
        if (data.Downloads.Count > 0)
        {
            h.Append("<p class=\"small\">Files: ");
            h.Append(string.Join(", ", data.Downloads.Select(f => "<a href=\"" + E(f) + "\">" + E(f) + "</a>")));
            h.Append(". The inspection calendar (CSV and iCalendar, to import into a calendar) lists every due inspection of the plans, overdue ones first, then by site and month.</p>\n");
        }
        EndSection(h);

        Section(h, "components", "Components");
        h.Append("<ul>");
        foreach (var r in data.Rows)
        {
            h.Append("<li>");
            if (r.ReportFile is not null) h.Append("<a href=\"").Append(E(r.ReportFile)).Append("\">").Append(E(r.ComponentId)).Append("</a>");
            else h.Append(E(r.ComponentId));
            h.Append(" — ").Append(E(r.ComponentName)).Append(" (").Append(E(r.Site)).Append(") ").Append(FlagMarks(r.FlagSet)).Append("</li>");
        }

        h.Append("</ul>\n");
        EndSection(h);

        Section(h, "assumptions", "Assumptions");
        List(h, data.Assumptions.Count > 0 ? data.Assumptions : ["None stated."]);
        EndSection(h);
        Provenance(h, data.Provenance);
        CautionSection(h);
        h.Append("</main></body></html>\n");
        return h.ToString();
    }

    /// <summary>
    /// The risk section: the owner's classes, the probability–consequence chart, and the components ranked by their
    /// annual Pf over their own class's target (then by expected annual cost of failure where a cost is given).
    /// </summary>
    private static void RiskSection(StringBuilder h, IReadOnlyList<PortfolioRow> rows, IReadOnlyList<string> consequenceClasses, int top = int.MaxValue)
    {
        var classified = rows.Where(r => r.ConsequenceClass is not null).ToArray();
        if (consequenceClasses.Count > 0)
        {
            h.Append("<p>The owner's consequence classes (1 least to 5 most severe):</p>");
            List(h, consequenceClasses);
        }

        if (classified.Length == 0)
        {
            h.Append("<p class=\"na\">No component has a consequence class in the register: record them with <code>component consequence</code> (classes and their meanings with <code>register consequence-class</code>). Until then the register is ranked by probability alone (above).</p>\n");
            return;
        }

        if (classified.Any(r => r.CurrentAnnualPf is not null))
        {
            Figure(h, Plots.ConsequenceChart.Draw(classified),
                "Annual Pf now of each component in the column of its consequence class; the red bar across a column is that class's target. Filled red points are at or above their own target, open blue ones below.");
        }

        var ranked = classified.OrderByDescending(r => r.RatioToTarget ?? -1).ThenByDescending(r => r.ExpectedAnnualCost ?? -1)
            .ThenBy(r => r.ComponentId, StringComparer.Ordinal).Take(top).ToArray();
        if (ranked.Length < classified.Length)
        {
            h.Append("<p class=\"small\">The ").Append(Count(ranked.Length)).Append(" highest of ").Append(Count(classified.Length)).Append(" classified components; the exports have them all.</p>\n");
        }

        SortableTable(h, ["risk rank", "component", "class", "annual Pf now", "target of its class", "ratio to target", "cost of failure", "expected cost per year", "marks"],
            ranked.Select((r, i) => new[]
            {
                Cell((i + 1).ToString(CultureInfo.InvariantCulture)), Cell(r.ComponentId), Cell(r.ConsequenceClass!.Value.ToString(CultureInfo.InvariantCulture)),
                Cell(r.CurrentAnnualPf is { } p ? NumberText.Format(p) : "not available"), Cell(r.TargetAnnualPf is { } t ? NumberText.Format(t) : "-"),
                Cell(r.RatioToTarget is { } q ? NumberText.Format(q) : "-"), Cell(r.CostOfFailure is { } c ? NumberText.Format(c) : "not given"),
                Cell(r.ExpectedAnnualCost is { } e ? NumberText.Format(e) : "-"), new HtmlCell(FlagMarks(r.FlagSet), ReportMarks.CsvCell(r.FlagSet)),
            }),
            ranked.Select(r => FlagRowClass(r.FlagSet)).ToArray(), sortable: false);
        h.Append("<p class=\"small\">Ranked by the annual Pf now over the target of the component's own class (the class's preset, else the run's target), then by the expected cost of failure per year (annual Pf × cost of failure, in the owner's currency) where a cost is given. Components without a class are not in this table.</p>\n");
    }

    private static void ProfileTable(StringBuilder h, ReliabilityProfile profile, string id)
    {
        // Long grids are thinned for reading; the CSV export carries every step.
        var points = profile.Points;
        var step = Math.Max(1, (int)Math.Ceiling(points.Count / 30.0));
        var shown = points.Where((_, i) => i % step == 0 || i == points.Count - 1).ToArray();
        var notes = new ProfileNotes();
        var rows = shown.Select(p =>
        {
            var (samples, firstOrder, refs) = notes.Split(p.Note);
            var simulated = p.Route is ComputationRoute.MonteCarlo or ComputationRoute.ImportanceSampling or ComputationRoute.SubsetSimulation;
            return new[]
            {
                Cell(NumberText.Format(p.TimeYears)), Cell(double.IsFinite(p.Beta) ? NumberText.Format(p.Beta) : p.Beta > 0 ? "∞" : "−∞"),
                Cell(NumberText.Probability(p.CumulativePf, p.UpperBound, simulated)), Cell(NumberText.Format(p.IntervalPf)), Cell(NumberText.Format(p.Hazard)),
                Cell(RouteName(p.Route)), Cell(p.Converged ? "yes" : "NO"),
                Cell(p.CoefficientOfVariation is { } c && double.IsFinite(c) ? NumberText.Format(c) : "-"),
                Cell(samples ?? "-"), Cell(firstOrder is { } f ? NumberText.Format(f) : "-"),
                new HtmlCell(string.Join(" ", refs.Select(r => "<a class=\"fn\" href=\"#" + id + "-note-" + r.ToString(CultureInfo.InvariantCulture) + "\"><span class=\"num\">" + r.ToString(CultureInfo.InvariantCulture) + "</span></a>")), null),
            };
        }).ToArray();
        SortableTable(h, ["time (years)", "β", "Pf(t)", "ΔPf", "hazard", "route", "converged", "CoV", "effective failure samples", "first order (check)", "notes"],
            rows, shown.Select(p => p.Converged ? null : "not-converged").ToArray(), sortable: false);
        if (notes.Texts.Count > 0)
        {
            h.Append("<ol class=\"notes\">");
            for (var i = 0; i < notes.Texts.Count; i++)
            {
                h.Append("<li id=\"").Append(id).Append("-note-").Append((i + 1).ToString(CultureInfo.InvariantCulture)).Append("\">").Append(T(notes.Texts[i])).Append("</li>");
            }

            h.Append("</ol>\n");
        }

        h.Append("<p class=\"small\">Pf(t) “&lt; x”: no failure sampled at this step, bounded above by x (three standard errors); “")
            .Append(E(NumberText.ExactZero)).Append("”: an exact zero. “Effective failure samples”: effective number of weighted samples that failed by t (at least 30 behind a converged number). “First order (check)”: the first-order value where it disagrees with the sampled one beyond three standard errors and 10 %.</p>\n");
        if (step > 1) h.Append("<p class=\"small\">").Append(T(ThinnedNote(step, points.Count))).Append("</p>\n");
        if (!profile.AllConverged) h.Append("<p class=\"na\">Some steps did not converge: their numbers are best estimates only and must not be relied on.</p>\n");
    }

    /// <summary>Reason shown for the first revision of a finding, which has no correction reason.</summary>
    public const string OriginalRecord = "original record";

    /// <summary>Method cell of a planned inspection that assumes no method (the next inspection without a schedule).</summary>
    public const string NoMethod = "none assumed (no schedule)";

    /// <summary>The note under a thinned profile table: one step in <paramref name="step"/> is shown.</summary>
    public static string ThinnedNote(int step, int count) =>
        $"One step in {step.ToString(CultureInfo.InvariantCulture)} shown; the CSV export has all {count.ToString(CultureInfo.InvariantCulture)}.";

    /// <summary>
    /// Label of the summary's annual Pf: the ΔPf of the grid year ending at the first grid time at or after the
    /// evidence date, with that date, e.g. "Annual Pf (updated), grid year ending 2026-05-01".
    /// </summary>
    public static string AnnualPfLabel(DateOnly inService, ProfilePoint point, string which)
    {
        ArgumentNullException.ThrowIfNull(point);
        return $"Annual Pf ({which}), grid year ending {Date(ServiceTime.DateAt(inService, point.TimeYears))}";
    }

    private static string PlanAnnualNote(DateOnly inService, DateOnly asOf, ProfilePoint? point) =>
        $"The plan's annual ΔPf is evaluated over the year ending on the date it names (the evidence date {Date(asOf)} for the state now)"
        + (point is null ? "." : $"; the summary's annual Pf is that of the grid year ending {Date(ServiceTime.DateAt(inService, point.TimeYears))}, so the two can differ.");

    /// <summary>Human-readable name of a route.</summary>
    public static string RouteName(ComputationRoute route) => route switch
    {
        ComputationRoute.FirstOrder => "first order",
        ComputationRoute.SecondOrder => "second order",
        ComputationRoute.MonteCarlo => "Monte Carlo",
        ComputationRoute.ImportanceSampling => "importance sampling",
        ComputationRoute.SubsetSimulation => "subset simulation",
        ComputationRoute.Exact => "exact",
        _ => route.ToString(),
    };

    /// <summary>Route and CoV of one number, without a word on convergence (that is the component's not-converged mark).</summary>
    public static string RouteAndCov(ProfilePoint p) =>
        RouteName(p.Route) + (p.CoefficientOfVariation is { } c && double.IsFinite(c) ? ", CoV " + NumberText.Format(c) : string.Empty);

    /// <summary>Route, convergence and CoV of one point in words.</summary>
    public static string RouteText(ProfilePoint p) =>
        RouteName(p.Route) + (p.Converged ? ", converged" : ", NOT converged")
        + (p.CoefficientOfVariation is { } c && double.IsFinite(c) ? ", CoV " + NumberText.Format(c) : string.Empty);

    /// <summary>The point of <paramref name="profile"/> at the first time at or after <paramref name="timeYears"/> (the last point beyond the grid).</summary>
    public static ProfilePoint? PointAt(ReliabilityProfile profile, double timeYears)
    {
        ArgumentNullException.ThrowIfNull(profile);
        return profile.Points.FirstOrDefault(p => p.TimeYears >= timeYears) ?? (profile.Points.Count > 0 ? profile.Points[^1] : null);
    }

    private static double YearsSince(DateOnly from, DateOnly to) => (to.DayNumber - from.DayNumber) / 365.2425;

    private static void Head(StringBuilder h, string title)
    {
        h.Append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"><title>")
            .Append(E(title)).Append("</title>\n<style>\n").Append(Css).Append("</style></head><body><main>\n");
    }

    private const string Css = """
        body { font-family: "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; color: #1f2430; background: #f4f5f7; margin: 0; }
        main { max-width: 1000px; margin: 0 auto; background: #fff; padding: 24px 36px 48px; }
        header { border-left: 8px solid #3d5a80; padding: 4px 0 4px 16px; margin-bottom: 16px; }
        .kicker { text-transform: uppercase; letter-spacing: 0.12em; font-size: 12px; color: #5b6275; }
        h1 { margin: 4px 0; font-size: 26px; } .sub { color: #5b6275; }
        h2 { border-bottom: 2px solid #d9dce3; padding-bottom: 4px; margin-top: 32px; font-size: 20px; }
        h3 { font-size: 16px; margin-bottom: 6px; }
        .banner { background: #fff6e8; border: 1px solid #e07a1f; padding: 8px 12px; font-size: 14px; }
        .cards { display: flex; flex-wrap: wrap; gap: 12px; }
        .card { border: 1px solid #d9dce3; border-top: 4px solid #e07a1f; padding: 8px 14px; min-width: 190px; }
        .card .k { font-size: 12px; color: #5b6275; } .card .v { font-size: 18px; font-weight: bold; }
        table { border-collapse: collapse; width: 100%; font-size: 13px; margin: 8px 0; }
        th { text-align: left; background: #eef0f4; border-bottom: 2px solid #3d5a80; padding: 4px 6px; }
        td { border-bottom: 1px solid #e3e5ea; padding: 3px 6px; font-variant-numeric: tabular-nums; }
        tr.superseded td { text-decoration: line-through; color: #8a8d91; }
        tr.not-converged td { background: #fbe9ec; } tr.above-target td { background: #fff3e0; }
        .num { white-space: nowrap; } a.fn { font-size: 11px; margin-right: 3px; } ol.notes { font-size: 12px; color: #3b4150; }
        .flag { display: inline-block; white-space: nowrap; border-radius: 3px; padding: 0 5px; font-size: 12px; font-weight: bold; border: 1px solid; }
        .flag-not_converged { color: #7a1c2e; border-color: #9b2335; background: #fbe9ec; }
        .flag-overdue { color: #5b2a00; border-color: #b35900; background: #ffe6cc; }
        .flag-above_target { color: #3d1f66; border-color: #5e3a99; background: #efe6fa; }
        .flag-none { color: #5b6275; font-size: 12px; } .marks { margin-top: 4px; }
        table.doc-control { width: auto; font-size: 12px; margin: 4px 0 12px; } table.doc-control th { background: none; border-bottom: 1px solid #e3e5ea; }
        .legend { font-size: 13px; } .legend dl { grid-template-columns: max-content auto; }
        figure { margin: 16px 0; page-break-inside: avoid; } figure img { width: 100%; border: 1px solid #e3e5ea; }
        figcaption { font-size: 13px; color: #5b6275; }
        .na { color: #9b2335; font-weight: bold; } .small { font-size: 12px; color: #5b6275; }
        dl { display: grid; grid-template-columns: max-content auto; gap: 4px 16px; } dt { font-weight: bold; }
        @page { margin: 12mm; }
        @media print, (max-width: 820px) {
          main { padding: 8px 6px 24px; } table { font-size: 10px; } th, td { padding: 2px 3px; } th { font-size: 10px; }
          .card { min-width: 150px; } .card .v { font-size: 15px; } .flag { font-size: 10px; }
        }
        @media print {
          body { background: #fff; } main { padding: 0; max-width: none; } h2, h3 { break-after: avoid; page-break-after: avoid; }
          thead { display: table-header-group; } tr, figure, .card, .legend, table.doc-control, ol.notes li { break-inside: avoid; page-break-inside: avoid; }
          figure img { max-width: 100%; height: auto; } a { color: inherit; text-decoration: none; } .banner { break-inside: avoid; }
          details > * { display: block; } details summary { list-style: none; }
        }

        """;

    private static void CautionBanner(StringBuilder h) =>
        h.Append("<p class=\"banner\">").Append(E(Cautions.Line)).Append(" See <a href=\"#cautions\">Cautions</a>.</p>\n");

    private static void CautionSection(StringBuilder h)
    {
        Section(h, "cautions", "Cautions");
        foreach (var p in Cautions.Paragraphs) h.Append("<p>").Append(E(p)).Append("</p>\n");
        EndSection(h);
    }

    private static string KnownOnText(ReportProvenance p) => p.RegisterKnownOn is { } known ? " · register as known on " + Date(known) : string.Empty;

    private static void Provenance(StringBuilder h, ReportProvenance p)
    {
        Section(h, "provenance", "Provenance");
        h.Append("<dl><dt>Tool</dt><dd>InspectionUpdate ").Append(E(p.ToolVersion)).Append("</dd><dt>Source</dt><dd>").Append(E(p.Source))
            .Append("</dd><dt>Fingerprint</dt><dd><code>").Append(E(p.RegisterFingerprint)).Append("</code></dd><dt>Evidence to</dt><dd>")
            .Append(Date(p.AssessedAsOf)).Append("</dd>")
            .Append(p.RegisterKnownOn is { } known ? "<dt>Register as known on</dt><dd>" + Date(known) + "</dd>" : string.Empty)
            .Append("<dt>Generated</dt><dd>")
            .Append(E(p.GeneratedAtUtc.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture))).Append("</dd></dl>\n")
            .Append("<p class=\"small\">The same tool version on a register with the same fingerprint reproduces these numbers.</p>\n");
        EndSection(h);
    }

    private static void NotAvailable(StringBuilder h, IReadOnlyList<string> items)
    {
        if (items.Count == 0) return;
        h.Append("<div class=\"na-list\"><p class=\"na\">Not available in this build:</p>");
        List(h, items);
        h.Append("</div>\n");
    }

    private static void NotRequested(StringBuilder h, IReadOnlyList<string> items)
    {
        if (items.Count == 0) return;
        h.Append("<div class=\"nr-list\"><p><strong>Not requested in this run:</strong></p>");
        List(h, items);
        h.Append("</div>\n");
    }

    private static void Section(StringBuilder h, string id, string title) =>
        h.Append("<section id=\"").Append(id).Append("\"><h2>").Append(E(title)).Append("</h2>\n");

    private static void EndSection(StringBuilder h) => h.Append("</section>\n");

    private static void Card(StringBuilder h, string key, string value) =>
        h.Append("<div class=\"card\"><div class=\"k\">").Append(E(key)).Append("</div><div class=\"v\">").Append(T(value)).Append("</div></div>");

    private static void Figure(StringBuilder h, byte[] png, string caption) =>
        h.Append("<figure><img alt=\"").Append(E(caption)).Append("\" src=\"data:image/png;base64,").Append(Convert.ToBase64String(png))
            .Append("\"><figcaption>").Append(E(caption)).Append("</figcaption></figure>\n");

    private static void List(StringBuilder h, IEnumerable<string> items)
    {
        h.Append("<ul>");
        foreach (var i in items) h.Append("<li>").Append(T(i)).Append("</li>");
        h.Append("</ul>\n");
    }

    private static void Table(StringBuilder h, IReadOnlyList<string> headers, IEnumerable<string[]> rows, string?[]? rowClasses = null)
    {
        h.Append("<table><thead><tr>");
        foreach (var c in headers) h.Append("<th>").Append(E(c)).Append("</th>");
        h.Append("</tr></thead><tbody>\n");
        var i = 0;
        foreach (var r in rows)
        {
            var cls = rowClasses is not null && i < rowClasses.Length ? rowClasses[i] : null;
            h.Append(cls is null ? "<tr>" : "<tr class=\"" + cls + "\">");
            foreach (var c in r) h.Append("<td>").Append(T(c)).Append("</td>");
            h.Append("</tr>\n");
            i++;
        }

        h.Append("</tbody></table>\n");
    }

    private static string E(string s) => WebUtility.HtmlEncode(s);

    /// <summary>Text content: encoded, numbers in the report format, each number and date in one unbreakable span.</summary>
    private static string T(string s) => NumberText.Html(s);

    private static string Date(DateOnly d) => d.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);



}
