using System.Globalization;
using System.Text.RegularExpressions;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>A register with a used and an unused method, a corrected finding, and one report run without --schedule.</summary>
public sealed class ReportRunFixture : IDisposable
{
    public static readonly DateOnly AsOf = new(2025, 6, 30);

    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");

    private readonly CliRunner cli = new();

    public ReportRunFixture()
    {
        var register = cli.PathOf("t.register");
        Check(cli.Run("register", "create", register));
        Check(cli.Run("site", "add", "SF-IL3", "--name", "test line", "-r", register));
        Check(cli.Run("method", "add", "MFL-ILI", "--file", Path.Combine(SampleData, "methods", "mfl-ili.method.json"), "-r", register));
        Check(cli.Run("method", "add", "UT-CMAP", "--file", Path.Combine(SampleData, "methods", "ut-cmap.method.json"), "-r", register));
        Check(cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json"),
            "--in-service", "2008-05-01", "--wall-mm", "12.7", "-r", register));
        var id = cli.Run("finding", "log", "IL3-KP42", "--date", "2016-05-20", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "1.2", "--by", "tester", "-r", register, "--json")
            .Json().GetProperty("finding_id").GetInt64().ToString(CultureInfo.InvariantCulture);
        Check(cli.Run("finding", "correct", id, "--size-mm", "1.4", "--by", "tester", "--reason", "verification dig", "-r", register));
        Report = cli.Run("report", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", AsOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), "--out", "rep", "--json");
        Assert.True(Report.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, Report.Error);
        Folder = cli.PathOf("rep");
        ComponentHtml = File.ReadAllText(Path.Combine(Folder, "IL3-KP42.html"));
        IndexHtml = File.ReadAllText(Path.Combine(Folder, "index.html"));
    }

    internal CliRun Report { get; }

    public string Folder { get; }

    public string ComponentHtml { get; }

    public string IndexHtml { get; }

    /// <summary>The text of one section of a page, tags removed and spaces collapsed.</summary>
    public static string Section(string html, string id)
    {
        var start = html.IndexOf("<section id=\"" + id + "\">", StringComparison.Ordinal);
        Assert.True(start >= 0, id);
        var end = html.IndexOf("</section>", start, StringComparison.Ordinal);
        // Number spans are inline: removed without a separator.
        var text = Regex.Replace(Regex.Replace(html[start..end], "<span class=\"num\">([^<]*)</span>", "$1"), "<img[^>]*>", " ");
        text = Regex.Replace(text, "<[^>]+>", " | ");
        return System.Net.WebUtility.HtmlDecode(Regex.Replace(text, @"(\s*\|\s*)+", " | "));
    }

    public void Dispose() => cli.Dispose();

    private static void Check(CliRun run) => Assert.True(run.ExitCode == ExitCodes.Ok, run.Error);
}

public sealed class ReportContentTests(ReportRunFixture run) : IClassFixture<ReportRunFixture>
{
    [Fact]
    public void A_schedule_that_was_not_requested_is_listed_as_not_requested_with_how_to_request_it()
    {
        Assert.DoesNotContain("Not available in this build", run.ComponentHtml, StringComparison.Ordinal);
        var summary = ReportRunFixture.Section(run.ComponentHtml, "summary");
        Assert.Contains("Not requested in this run", summary, StringComparison.Ordinal);
        Assert.Contains("--schedule", summary, StringComparison.Ordinal);
        Assert.Contains("Caution", run.IndexHtml, StringComparison.Ordinal);
    }

    [Fact]
    public void The_plan_csv_method_column_is_empty_when_no_schedule_method_applies()
    {
        var lines = File.ReadAllLines(Path.Combine(run.Folder, "IL3-KP42.plan.csv"));
        var header = lines[0].Split(',');
        var method = Array.IndexOf(header, "method");
        Assert.True(method >= 0);
        var row = lines[1].Split(',');
        Assert.Equal(string.Empty, row[method]);
        Assert.DoesNotContain("| - |", ReportRunFixture.Section(run.ComponentHtml, "plan"), StringComparison.Ordinal);
    }

    [Fact]
    public void The_pod_plot_shows_only_the_methods_of_the_components_findings()
    {
        var plots = ReportRunFixture.Section(run.ComponentHtml, "plots");
        var caption = plots[plots.IndexOf("Probability-of-detection", StringComparison.Ordinal)..];
        caption = caption[..caption.IndexOf('.', StringComparison.Ordinal)];
        Assert.Contains("MFL-ILI", caption, StringComparison.Ordinal);
        Assert.DoesNotContain("UT-CMAP", caption, StringComparison.Ordinal);
    }

    [Fact]
    public void A_component_with_findings_shows_prior_and_posterior_histograms_of_its_uncertain_inputs()
    {
        var plots = ReportRunFixture.Section(run.ComponentHtml, "plots");
        // The corrosion model's rate is uncertain and the findings inform it.
        Assert.Contains("Prior and posterior samples of rate_mmPerYear", plots, StringComparison.Ordinal);
    }

    [Fact]
    public void The_first_revision_of_a_finding_reads_original_record()
    {
        var findings = ReportRunFixture.Section(run.ComponentHtml, "findings");
        var first = findings[findings.IndexOf(" r1 |", StringComparison.Ordinal)..];
        first = first[..first.IndexOf(" r2 |", StringComparison.Ordinal)];
        Assert.Contains("original record", first, StringComparison.Ordinal);
        Assert.Contains("verification dig", findings, StringComparison.Ordinal);
    }

    [Fact]
    public void Each_annual_pf_says_which_year_it_is_of()
    {
        var summary = ReportRunFixture.Section(run.ComponentHtml, "summary");
        var ending = Regex.Match(summary, @"Annual Pf \((updated|prior)\), grid year ending (\d{4}-\d{2}-\d{2})");
        Assert.True(ending.Success, summary);
        var end = DateOnly.ParseExact(ending.Groups[2].Value, "yyyy-MM-dd", CultureInfo.InvariantCulture);
        Assert.True(end >= ReportRunFixture.AsOf && end < ReportRunFixture.AsOf.AddYears(1), end.ToString("o", CultureInfo.InvariantCulture));
        var plan = ReportRunFixture.Section(run.ComponentHtml, "plan");
        Assert.Contains("evidence date 2025-06-30", plan, StringComparison.Ordinal);
        Assert.Contains("grid year ending " + ending.Groups[2].Value, plan, StringComparison.Ordinal);
        Assert.Contains("(year ending " + ending.Groups[2].Value + ")", ReportRunFixture.Section(run.IndexHtml, "ranking"), StringComparison.Ordinal);
        var row = run.Report.Json().GetProperty("components")[0];
        Assert.Equal(ending.Groups[2].Value, row.GetProperty("annual_pf_year_ending").GetString());
    }
}
