using System.Globalization;
using System.Text;
using InspectionUpdate.Reporting.Plots;

namespace InspectionUpdate.Reporting.Html;

public static partial class HtmlReportWriter
{
    /// <summary>Section ids of the register report from stored results.</summary>
    public static IReadOnlyList<string> RegisterResultsSections { get; } =
        ["summary", "ranking", "due-dates", "distributions", "due-per-year", "not-assessed", "component-pages", "assumptions", "provenance", "cautions"];

    /// <summary>
    /// The register report from stored results, readable at 10,000 components: summary counts, the top of the ranking
    /// and of the due dates as sortable tables (the CSV holds every row), distributions of the annual Pf and of the
    /// years to target, and counts of due inspections per year and per site. Computes nothing.
    /// </summary>
    public static string RegisterResults(RegisterResultsReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var h = new StringBuilder();
        Head(h, data.Title);
        var rows = data.Rows;
        var assessed = rows.Where(r => r.AnnualPf is not null).ToArray();
        h.Append("<header><div class=\"kicker\">Register integrity report (stored results)</div><h1>").Append(E(data.Title))
            .Append("</h1><div class=\"sub\">").Append(Count(rows.Count)).Append(" components with stored results · evidence to ")
            .Append(Date(data.Provenance.AssessedAsOf)).Append("</div></header>\n");
        DocumentControlBlock(h, data.DocumentControl);
        CautionBanner(h);

        Section(h, "summary", "Summary");
        h.Append("<div class=\"cards\">");
        Card(h, "Stored results", Count(rows.Count));
        Card(h, "Assessed, converged", Count(rows.Count(r => r.Status == "assessed")));
        Card(h, "Failed", Count(rows.Count(r => r.Status == "failed")));
        Card(h, "Target", NumberText.Format(data.TargetAnnualPf) + " per year");
        var counts = ReportMarks.Counts(rows.Select(r => r.Flags));
        FlagCards(h, counts);
        Card(h, "Due within a year", Count(rows.Count(r => r.NextDue is { } d && d <= data.Provenance.AssessedAsOf.AddYears(1))));
        h.Append("</div>\n");
        Legend(h, counts);
        if (data.Missing.Count > 0)
        {
            h.Append("<p class=\"na\">").Append(Count(data.Missing.Count)).Append(" component(s) in service have no stored result for these options and are not in this report (run register assess): ")
                .Append(E(Shorten(data.Missing, 20))).Append("</p>\n");
        }

        if (data.Stale.Count > 0)
        {
            h.Append("<p class=\"na\">").Append(Count(data.Stale.Count)).Append(" stored result(s) are stale (their component changed since): marked “stale” below; rerun register assess: ")
                .Append(E(Shorten(data.Stale, 20))).Append("</p>\n");
        }

        h.Append("<p class=\"small\">Options: <code>").Append(E(data.OptionsKey)).Append("</code>.");
        if (data.CsvFile is not null) h.Append(" Every row: <a href=\"").Append(E(data.CsvFile)).Append("\">").Append(E(data.CsvFile)).Append("</a>.");
        h.Append(" Click a column heading to sort a table.</p>\n");
        EndSection(h);

        var stale = data.Stale.ToHashSet(StringComparer.Ordinal);
        string Name(RegisterResultRow r) => r.ComponentId + (stale.Contains(r.ComponentId) ? " (stale)" : string.Empty);

        Section(h, "ranking", "Risk ranking (top " + Count(Math.Min(data.Top, assessed.Length)) + " of " + Count(assessed.Length) + ")");
        var ranked = assessed.OrderByDescending(r => r.AnnualPf).ThenBy(r => r.ComponentId, StringComparer.Ordinal).Take(data.Top).ToArray();
        SortableTable(h, ["rank", "component", "site", "annual Pf now", "β", "years to target", "next due", "route", "status", "marks"],
            ranked.Select((r, i) => new[]
            {
                Cell((i + 1).ToString(CultureInfo.InvariantCulture)), Link(r, Name(r)), Cell(r.Site),
                Cell(NumberText.Format(r.AnnualPf!.Value) + (r.YearEnding is { } end ? " (year ending " + Date(end) + ")" : string.Empty), r.AnnualPf.Value.ToString("R", CultureInfo.InvariantCulture)),
                Cell(r.Beta is { } b ? NumberText.Format(b) : "-", r.Beta?.ToString("R", CultureInfo.InvariantCulture)),
                YearsCell(r), DueCell(r), Cell(r.Route ?? "-"), Cell(r.Status), MarksCell(r.Flags),
            }),
            ranked.Select(r => FlagRowClass(r.Flags)).ToArray());
        EndSection(h);

        Section(h, "risk", "Risk: probability and consequence");
        RiskSection(h, data.RiskRows, data.ConsequenceClasses, data.Top);
        EndSection(h);

        var due = rows.Where(r => r.NextDue is not null).OrderBy(r => r.NextDue).ThenBy(r => r.ComponentId, StringComparer.Ordinal).Take(data.Top).ToArray();
        Section(h, "due-dates", "Next due dates (soonest " + Count(due.Length) + " of " + Count(rows.Count(r => r.NextDue is not null)) + " planned)");
        SortableTable(h, ["next due", "component", "site", "annual Pf now", "years to target", "status", "marks"],
            due.Select(r => new[]
            {
                DueCell(r), Link(r, Name(r)), Cell(r.Site),
                Cell(r.AnnualPf is { } p ? NumberText.Format(p) : "-", r.AnnualPf?.ToString("R", CultureInfo.InvariantCulture)), YearsCell(r), Cell(r.Status), MarksCell(r.Flags),
            }),
            due.Select(r => FlagRowClass(r.Flags)).ToArray());
        EndSection(h);

        Section(h, "distributions", "Distributions");
        if (assessed.Length > 0)
        {
            Figure(h, RegisterCharts.AnnualPfDistribution(assessed.Select(r => r.AnnualPf!.Value).ToArray(), data.TargetAnnualPf),
                "Components by current annual Pf (half-decade bins); the dashed line is the target.");
        }
        else h.Append("<p class=\"na\">No component has a current annual Pf.</p>\n");
        var years = rows.Where(r => r.YearsToTarget is { } y && double.IsFinite(y)).Select(r => r.YearsToTarget!.Value).ToArray();
        var beyond = rows.Count(r => r.TargetReached == false);
        Figure(h, RegisterCharts.YearsToTargetDistribution(years),
            string.Create(CultureInfo.InvariantCulture, $"Components by years until the annual Pf reaches the target: {Count(years.Length)} drawn; {Count(beyond)} do not reach it within the horizon (not drawn)."));
        EndSection(h);

        Section(h, "due-per-year", "Due inspections per year and per site");
        var perYear = rows.Where(r => r.NextDue is not null).GroupBy(r => r.NextDue!.Value.Year).OrderBy(g => g.Key).Select(g => (g.Key, g.Count())).ToArray();
        Figure(h, RegisterCharts.DuePerYear(perYear), "Components whose next inspection is due (latest date) in each calendar year.");
        var first = data.Provenance.AssessedAsOf.Year;
        var columns = Enumerable.Range(first, 10).ToArray();
        var sites = rows.GroupBy(r => r.Site).OrderBy(g => g.Key, StringComparer.Ordinal).ToArray();
        string[] SiteRow(string site, IReadOnlyCollection<RegisterResultRow> g) =>
        [
            site, Count(g.Count),
            .. columns.Select(y => Count(g.Count(r => r.NextDue?.Year == y))),
            Count(g.Count(r => r.NextDue?.Year > columns[^1])), Count(g.Count(r => r.NextDue is null)),
        ];
        Table(h, ["site", "components", .. columns.Select(y => y.ToString(CultureInfo.InvariantCulture)), "later", "not planned"],
            [.. sites.Select(g => SiteRow(g.Key, g.ToArray())), SiteRow("all sites", rows.ToArray())]);
        h.Append("<p class=\"small\">A year before the evidence date's year cannot occur: a plan's next date is never before the evidence date. "
            + "“Not planned”: failed, or the horizon ends before the evidence date.</p>\n");
        EndSection(h);

        var failed = rows.Where(r => r.Status == "failed").OrderBy(r => r.ComponentId, StringComparer.Ordinal).ToArray();
        Section(h, "not-assessed", "Not assessed (" + Count(failed.Length) + ")");
        if (failed.Length == 0) h.Append("<p>Every component with a stored result was assessed.</p>\n");
        else
        {
            SortableTable(h, ["component", "site", "reason"], failed.Take(data.Top).Select(r => new[] { Cell(r.ComponentId), Cell(r.Site), Cell(r.Error ?? "-") }), null);
            if (failed.Length > data.Top) h.Append("<p class=\"small\">The first ").Append(Count(data.Top)).Append(" shown; the CSV has all.</p>\n");
        }

        EndSection(h);

        Section(h, "component-pages", "Component pages");
        var pages = rows.Where(r => r.ReportFile is not null).OrderBy(r => r.ComponentId, StringComparer.Ordinal).ToArray();
        if (pages.Length == 0) h.Append("<p>None written in this run (request them for a list of components, a site, or the components above an annual Pf).</p>\n");
        else
        {
            h.Append("<ul>");
            foreach (var r in pages) h.Append("<li><a href=\"").Append(E(r.ReportFile!)).Append("\">").Append(E(r.ComponentId)).Append("</a> (").Append(E(r.Site)).Append(") ").Append(FlagMarks(r.Flags)).Append("</li>");
            h.Append("</ul>\n");
        }

        EndSection(h);

        Section(h, "assumptions", "Assumptions");
        List(h, data.Assumptions.Count > 0 ? data.Assumptions : ["None stated."]);
        EndSection(h);
        Provenance(h, data.Provenance);
        CautionSection(h);
        h.Append(SortScript).Append("</main></body></html>\n");
        return h.ToString();
    }

    private readonly record struct HtmlCell(string Html, string? SortKey);

    private static HtmlCell Cell(string text, string? sortKey = null) => new(T(text), sortKey);

    private static HtmlCell MarksCell(ReportMark flags) => new(FlagMarks(flags), ReportMarks.CsvCell(flags));

    private static HtmlCell Link(RegisterResultRow r, string text) =>
        new(r.ReportFile is null ? E(text) : "<a href=\"" + E(r.ReportFile) + "\">" + E(text) + "</a>", text);

    private static HtmlCell YearsCell(RegisterResultRow r) => r.YearsToTarget is { } y && double.IsFinite(y)
        ? Cell(NumberText.Format(y), y.ToString("R", CultureInfo.InvariantCulture))
        : Cell(r.TargetReached == false ? "beyond horizon" : "-", r.TargetReached == false ? "1e9" : "-1");

    private static HtmlCell DueCell(RegisterResultRow r) => r.NextDue is { } d ? Cell(Date(d), d.ToString("yyyyMMdd", CultureInfo.InvariantCulture)) : Cell("not planned", "99999999");

    private static string Count(int n) => n.ToString("N0", CultureInfo.InvariantCulture);

    private static string Shorten(IReadOnlyList<string> items, int max) =>
        string.Join(", ", items.Take(max)) + (items.Count > max ? $", … ({Count(items.Count - max)} more)" : string.Empty);

    private static void SortableTable(StringBuilder h, IReadOnlyList<string> headers, IEnumerable<HtmlCell[]> rows, string?[]? rowClasses, bool sortable = true)
    {
        h.Append(sortable ? "<table class=\"sortable\"><thead><tr>" : "<table><thead><tr>");
        foreach (var c in headers) h.Append(sortable ? "<th title=\"sort\" style=\"cursor:pointer\">" : "<th>").Append(E(c)).Append(sortable ? " ⇅</th>" : "</th>");
        h.Append("</tr></thead><tbody>\n");
        var i = 0;
        foreach (var r in rows)
        {
            var cls = rowClasses is not null && i < rowClasses.Length ? rowClasses[i] : null;
            h.Append(cls is null ? "<tr>" : "<tr class=\"" + cls + "\">");
            foreach (var c in r)
            {
                h.Append(c.SortKey is null ? "<td>" : "<td data-v=\"" + E(c.SortKey) + "\">").Append(c.Html).Append("</td>");
            }

            h.Append("</tr>\n");
            i++;
        }

        h.Append("</tbody></table>\n");
    }

    /// <summary>Sorts a table.sortable by the clicked column (numbers as numbers, else text); a second click reverses.</summary>
    private const string SortScript = """
        <script>
        document.querySelectorAll('table.sortable th').forEach(function (th, i) {
          th.addEventListener('click', function () {
            var body = th.closest('table').tBodies[0], rows = Array.prototype.slice.call(body.rows);
            var up = th.dataset.dir !== 'up'; th.dataset.dir = up ? 'up' : 'down';
            function key(r) { var c = r.cells[i]; return c.dataset.v !== undefined ? c.dataset.v : c.textContent; }
            rows.sort(function (a, b) {
              var x = key(a), y = key(b), nx = parseFloat(x), ny = parseFloat(y);
              var d = (!isNaN(nx) && !isNaN(ny) && /^[-+0-9.eE]+$/.test(x) && /^[-+0-9.eE]+$/.test(y)) ? nx - ny : x.localeCompare(y);
              return up ? d : -d;
            });
            rows.forEach(function (r) { body.appendChild(r); });
          });
        });
        </script>

        """;
}
