using System.Net;
using System.Text.RegularExpressions;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Reporting.Plots;
using InspectionUpdate.Time;

namespace InspectionUpdate.Tests.Reporting;

public sealed class ReportWordingTests
{
    // Number spans are inline: removed without a space, other tags become one.
    private static string Text(string html) =>
        WebUtility.HtmlDecode(Regex.Replace(Regex.Replace(Regex.Replace(html, "<span class=\"num\">([^<]*)</span>", "$1"), "<img[^>]*>", " "), "<[^>]+>", " "));

    [Theory]
    [InlineData(45, 2)]
    [InlineData(61, 3)]
    [InlineData(100, 4)]
    public void A_thinned_profile_table_says_one_step_in_n_without_a_wrong_ordinal(int years, int step)
    {
        var data = SampleReports.Component() with { Prior = SampleReports.Profile("prior", 1e-12, years: years), Updated = null };
        var text = Text(HtmlReportWriter.Component(data));
        Assert.Contains($"One step in {step} shown", text, StringComparison.Ordinal);
        Assert.DoesNotMatch(@"\d(th|st|nd|rd) step", text);
    }

    [Fact]
    public void Parts_not_requested_are_listed_apart_from_parts_not_available()
    {
        var data = SampleReports.Component() with { NotAvailable = [], NotRequested = ["Life-cycle schedule: not requested; request it with report --schedule."] };
        var text = Text(HtmlReportWriter.Component(data));
        Assert.DoesNotContain("Not available in this build", text, StringComparison.Ordinal);
        Assert.Contains("Not requested in this run", text, StringComparison.Ordinal);
        Assert.Contains("report --schedule", text, StringComparison.Ordinal);
        Assert.Contains("never replace", text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_planned_inspection_without_a_method_has_an_empty_csv_cell_and_says_so_in_the_report()
    {
        var plan = new ReportPlan(1e-4, "test target", [new ReportPlannedInspection(14.2, new DateOnly(2026, 8, 12), string.Empty, "annual Pf reaches the target")], "due", []);
        using var w = new StringWriter();
        ProfileExport.WritePlanCsv(w, "CX-101", plan);
        var lines = w.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var method = Array.IndexOf(lines[0].Split(','), "method");
        Assert.Equal(string.Empty, lines[1].Split(',')[method]);
        var text = Text(HtmlReportWriter.Component(SampleReports.Component() with { Plan = plan }));
        Assert.Contains(HtmlReportWriter.NoMethod, text, StringComparison.Ordinal);
    }

    [Fact]
    public void The_first_revision_of_a_finding_reads_original_record()
    {
        var html = HtmlReportWriter.Component(SampleReports.Component());
        var row = Regex.Match(html, "<tr[^>]*><td>F-2 r1</td>.*?</tr>").Value;
        Assert.Contains("<td>" + HtmlReportWriter.OriginalRecord + "</td>", row, StringComparison.Ordinal);
    }

    [Fact]
    public void The_summary_annual_pf_names_its_grid_year_and_the_plan_names_the_evidence_date()
    {
        var data = SampleReports.Component();
        var text = Text(HtmlReportWriter.Component(data));
        var asOfYears = (data.Provenance.AssessedAsOf.DayNumber - data.InServiceDate.DayNumber) / ServiceTime.DaysPerYear;
        var point = HtmlReportWriter.PointAt(data.Updated!, asOfYears)!;
        var end = ServiceTime.DateAt(data.InServiceDate, point.TimeYears).ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);
        Assert.Contains("Annual Pf (updated), grid year ending " + end, text, StringComparison.Ordinal);
        Assert.Contains("evidence date 2024-12-31", text, StringComparison.Ordinal);
        Assert.DoesNotContain("Annual Pf now", text, StringComparison.Ordinal);
    }

    [Fact]
    public void The_ranking_table_names_the_year_of_each_annual_pf()
    {
        var data = SampleReports.Portfolio();
        data = data with { Rows = [data.Rows[0] with { CurrentYearEnding = new DateOnly(2025, 6, 1) }, .. data.Rows.Skip(1)] };
        var text = Text(HtmlReportWriter.Portfolio(data));
        Assert.Contains("(year ending 2025-06-01)", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Ranking_labels_of_points_at_the_same_spot_do_not_overlap()
    {
        (string, double, double)[] points = [("HR1-J112", 0.0, -3.04), ("HR1-J118", 0.0, -3.04), ("IL3-KP42", 0.05, -3.05), ("IL3-KP38", 10.2, -6)];
        var labels = ReportCharts.RankingLabels(points, -1, 13, -7, -2);
        Assert.Equal(points.Select(p => p.Item1).Order(), labels.Select(l => l.Text).Order());
        for (var i = 0; i < labels.Count; i++)
        {
            for (var j = i + 1; j < labels.Count; j++) Assert.False(labels[i].Overlaps(labels[j]), $"{labels[i].Text} overlaps {labels[j].Text}");
        }

        var rows = points.Select(p => new PortfolioRow(p.Item1, "x", "s", Math.Pow(10, p.Item3), "first order, converged", p.Item2, null, "due", null)).ToArray();
        var (w, h, variance) = PngCheck.Inspect(ReportCharts.RiskRanking(rows, 1e-4));
        Assert.Equal((900, 460), (w, h));
        Assert.True(variance > 50);
    }
}
