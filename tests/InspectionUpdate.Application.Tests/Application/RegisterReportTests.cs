using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Reporting.Plots;

namespace InspectionUpdate.Tests.Application;

/// <summary>The register report from stored results: what it shows is what the register stores; pages only on request.</summary>
public sealed class RegisterReportTests
{
    private static RegisterReportOptions Options => new(PortfolioRegister.AsOf, PortfolioRegister.Options.Target, PortfolioRegister.Options.Route);

    [Fact]
    [Reference("Design rule (issue 13): the register report reads stored results (ranking, due dates, counts per year and site); independent recount in the test")]
    public void The_report_shows_the_stored_results_ranked_and_counted_and_writes_no_component_page_unless_asked()
    {
        using var r = new PortfolioRegister(6);
        PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        var stored = r.Store.Results(PortfolioRegister.AsOf, Options.OptionsKey);
        var folder = Path.Combine(Path.GetTempPath(), "iu-register-report-" + Guid.NewGuid().ToString("N")[..12]);
        try
        {
            var summary = RegisterReport.Write(r.Store, folder, "trial", Options);
            Assert.Equal(stored.Count, summary.Results);
            Assert.Empty(summary.Stale);
            Assert.Empty(summary.Missing);
            Assert.Empty(summary.Pages);
            // No component page: the page, the CSV of every row, its JSON export and the calendar of the stored next due dates.
            Assert.Equal(new[] { InspectionUpdate.Reporting.Export.InspectionCalendar.CsvName, InspectionUpdate.Reporting.Export.InspectionCalendar.IcsName, "index.html", RegisterReport.CsvName, RegisterReport.JsonName }, Directory.GetFiles(folder).Select(f => Path.GetFileName(f)).Order(StringComparer.Ordinal).ToArray());

            // The CSV: every stored result, most urgent first, numbers as stored (round-trip format).
            var lines = File.ReadAllLines(summary.Csv);
            Assert.Equal(stored.Count + 1, lines.Length);
            var expectedOrder = stored.OrderByDescending(x => x.AnnualPf ?? -1).ThenBy(x => x.ComponentCode, StringComparer.Ordinal).ToArray();
            for (var i = 0; i < expectedOrder.Length; i++)
            {
                var cells = lines[i + 1].Split(',');
                Assert.Equal(expectedOrder[i].ComponentCode, cells[1]);
                Assert.Equal(expectedOrder[i].AnnualPf, cells[4].Length == 0 ? null : double.Parse(cells[4], CultureInfo.InvariantCulture));
                Assert.Equal(expectedOrder[i].NextDue?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? string.Empty, cells[10]);
            }

            var html = File.ReadAllText(summary.Index);
            foreach (var id in HtmlReportWriter.RegisterResultsSections) Assert.Contains($"id=\"{id}\"", html, StringComparison.Ordinal);
            foreach (var p in Cautions.Paragraphs) Assert.Contains(System.Net.WebUtility.HtmlEncode(p), html, StringComparison.Ordinal);

            // The "all sites" row of the per-year table, recounted here from the stored dates.
            var year = PortfolioRegister.AsOf.Year;
            var counts = Enumerable.Range(year, 10).Select(y => stored.Count(x => x.NextDue?.Year == y).ToString(CultureInfo.InvariantCulture));
            var allSites = "<tr><td>all sites</td><td>" + stored.Count.ToString(CultureInfo.InvariantCulture) + "</td>" + string.Concat(counts.Select(c => "<td>" + c + "</td>"));
            // Numbers sit in unbreakable spans (docs/reports.md); compare the text of the cells.
            Assert.Contains(allSites, System.Text.RegularExpressions.Regex.Replace(html, "<span class=\"num\">([^<]*)</span>", "$1"), StringComparison.Ordinal);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    [Reference("Design rule (issue 13): component pages only on request (a list, a site, above a threshold)")]
    public void Pages_are_written_for_the_requested_component_and_for_those_above_the_threshold_only()
    {
        using var r = new PortfolioRegister(5);
        PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        var stored = r.Store.Results(PortfolioRegister.AsOf, Options.OptionsKey);
        var threshold = stored.Where(x => x.AnnualPf is not null).Select(x => x.AnnualPf!.Value).Order().ElementAt(2);
        var named = stored.First(x => !(x.AnnualPf > threshold)).ComponentCode;
        var folder = Path.Combine(Path.GetTempPath(), "iu-register-report-" + Guid.NewGuid().ToString("N")[..12]);
        try
        {
            var summary = RegisterReport.Write(r.Store, folder, "trial", Options with { PagesFor = [named], PagesAboveAnnualPf = threshold });
            var expected = stored.Where(x => x.AnnualPf > threshold || x.ComponentCode == named).Select(x => ReportRun.Safe(x.ComponentCode) + ".html").Order(StringComparer.Ordinal);
            Assert.Equal(expected, summary.Pages);
            foreach (var page in summary.Pages)
            {
                Assert.Contains(Cautions.Paragraphs[0], File.ReadAllText(Path.Combine(folder, page)), StringComparison.Ordinal);
            }

            var bad = Assert.Throws<ApplicationFailureException>(() => RegisterReport.Write(r.Store, folder, "trial", Options with { PagesFor = ["NO-SUCH"] }));
            Assert.Contains("NO-SUCH", bad.Message, StringComparison.Ordinal);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    [Reference("Closed form: values 0.5, 1.5, 1.6, 9 in unit bins from 0 (4 bins, last open) count 1, 2, 0, 1")]
    public void Binning_counts_each_value_once_and_puts_overflow_in_the_last_bin()
    {
        var (lower, counts) = RegisterCharts.Bin([0.5, 1.5, 1.6, 9], 0, 1, 4);
        Assert.Equal([0.0, 1, 2, 3], lower);
        Assert.Equal([1, 2, 0, 1], counts);
    }
}
