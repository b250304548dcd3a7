using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Html;

namespace InspectionUpdate.Tests.Reporting;

public sealed class HtmlReportWriterTests
{
    // A plot with axes, text and curves on white has a luma variance far above this; a blank canvas has 0.
    // Threshold chosen on purpose: well below what the sparsest chart (few bars) gives.
    private const double MinimumLumaVariance = 50;

    [Fact]
    public void Component_report_has_every_section_in_order()
    {
        var html = HtmlReportWriter.Component(SampleReports.Component());
        var last = -1;
        foreach (var id in HtmlReportWriter.ComponentSections)
        {
            var at = html.IndexOf("<section id=\"" + id + "\">", StringComparison.Ordinal);
            Assert.True(at > last, $"section {id} missing or out of order");
            last = at;
        }
    }

    [Fact]
    public void Component_report_embeds_decodable_non_blank_images_of_the_plot_size()
    {
        var html = HtmlReportWriter.Component(SampleReports.Component());
        var images = PngCheck.EmbeddedImages(html);
        // Annual Pf, β, cumulative Pf, importance, PoD, one posterior histogram.
        Assert.Equal(6, images.Count);
        foreach (var png in images)
        {
            var (w, h, variance) = PngCheck.Inspect(png);
            Assert.Equal((900, 460), (w, h));
            Assert.True(variance > MinimumLumaVariance, $"image looks blank (luma variance {variance})");
        }
    }

    [Fact]
    public void Component_report_states_provenance_cautions_revisions_routes_and_gaps()
    {
        var data = SampleReports.Component();
        var html = HtmlReportWriter.Component(data);
        Assert.Contains("sha256:abc123", html, StringComparison.Ordinal);
        Assert.Contains("0.1.0-test", html, StringComparison.Ordinal);
        Assert.Contains("never replace", html, StringComparison.Ordinal);
        Assert.Contains("licensed", html, StringComparison.Ordinal);
        Assert.Contains("<tr class=\"superseded\">", html, StringComparison.Ordinal);
        Assert.Contains("transcription error", html, StringComparison.Ordinal);
        Assert.Contains("subset simulation", html, StringComparison.Ordinal);
        Assert.Contains("<tr class=\"not-converged\">", html, StringComparison.Ordinal);
        Assert.Contains("test: posterior from simulation", html, StringComparison.Ordinal);
        Assert.Contains("mm/year", html, StringComparison.Ordinal);
        Assert.Contains("2026-08-12", html, StringComparison.Ordinal);
        Assert.Contains("Posterior of the inputs", html, StringComparison.Ordinal);
        Assert.Contains("test route", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Component_report_without_plan_says_so_and_has_no_external_resource()
    {
        var html = HtmlReportWriter.Component(SampleReports.Component(withPlan: false));
        Assert.Contains("No plan", html, StringComparison.Ordinal);
        Assert.DoesNotContain("http://", html, StringComparison.Ordinal);
        Assert.DoesNotContain("https://", html, StringComparison.Ordinal);
        Assert.DoesNotContain("<script", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Component_report_escapes_user_text()
    {
        var data = SampleReports.Component() with { ComponentName = "<b>spool & co</b>" };
        var html = HtmlReportWriter.Component(data);
        Assert.Contains("&lt;b&gt;spool &amp; co&lt;/b&gt;", html, StringComparison.Ordinal);
        Assert.DoesNotContain("<b>spool", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Portfolio_report_has_every_section_a_ranking_plot_and_due_dates_in_order()
    {
        var html = HtmlReportWriter.Portfolio(SampleReports.Portfolio());
        foreach (var id in HtmlReportWriter.PortfolioSections)
        {
            Assert.Contains("<section id=\"" + id + "\">", html, StringComparison.Ordinal);
        }

        var images = PngCheck.EmbeddedImages(html);
        var png = Assert.Single(images);
        var (_, _, variance) = PngCheck.Inspect(png);
        Assert.True(variance > MinimumLumaVariance);
        // The overdue component (2025-01-01) is listed before the later one in the due-date table.
        var due = html[html.IndexOf("id=\"due-dates\"", StringComparison.Ordinal)..];
        Assert.True(due.IndexOf("CX-102", StringComparison.Ordinal) < due.IndexOf("CX-101", StringComparison.Ordinal));
        Assert.Contains("href=\"CX-101.html\"", html, StringComparison.Ordinal);
        Assert.Contains("not planned", html, StringComparison.Ordinal);
    }
}
