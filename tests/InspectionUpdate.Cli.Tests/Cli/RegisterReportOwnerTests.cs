using System.Text.Json;
using System.Text.RegularExpressions;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// register report (from stored results) carries the owner's document control, with per-run values over the stored
/// ones for that run only, and the risk section (probability–consequence chart and ranked table) as report does.
/// </summary>
public sealed class RegisterReportOwnerTests
{
    private static CliRunner Classified(out string register)
    {
        var cli = EndToEndTests.Prepared(out register);
        Run(cli, "finding", "log", "IL3-KP42", "--date", "2019-06-18", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "3.5", "-r", register);
        Run(cli, "register", "consequence-class", "4", "--meaning", "release to a sensitive shore", "--target-preset", "pipeline-high", "--reason", "owner's scale", "-r", register);
        Run(cli, "component", "consequence", "IL3-KP42", "--class", "4", "--cost-of-failure", "2500000", "--reason", "near the shore", "-r", register);
        Run(cli, "register", "document", "--title", "Stored title", "--owner", "Stored Owner Ltd (invented)", "--author", "A. Stored", "--checker", "C. Stored",
            "--approver", "P. Stored", "--revision", "B", "--revision-date", "2025-05-01", "--target-source", "stored justification", "--reason", "first issue", "-r", register);
        Run(cli, "register", "assess", "-r", register, "--route", "first-order", "--as-of", "2025-06-30");
        return cli;
    }

    private static void Run(CliRunner cli, params string[] args)
    {
        var run = cli.Run(args);
        Assert.True(run.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, string.Join(' ', args) + ": " + run.Error);
    }

    private static string Section(string html, string id)
    {
        var start = html.IndexOf("<section id=\"" + id + "\">", StringComparison.Ordinal);
        Assert.True(start >= 0, "section " + id);
        return html[start..html.IndexOf("</section>", start, StringComparison.Ordinal)];
    }

    [Fact]
    [Reference("Issue 15 (document control per run; risk on the register report): the values written are those given, read back from the files")]
    public void Per_run_document_control_overrides_the_stored_one_for_that_run_only_and_the_risk_section_is_on_the_page_and_in_the_exports()
    {
        using var cli = Classified(out var register);
        Run(cli, "register", "report", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "-o", "stored",
            "--title", "Run title", "--author", "A. Run", "--revision", "C", "--revision-date", "2025-07-01", "--target-source", "run justification");
        var folder = cli.PathOf("stored");
        var html = File.ReadAllText(Path.Combine(folder, "index.html"));

        // Per-run fields over the stored ones; the fields not given this run are the stored ones.
        var control = html[html.IndexOf("id=\"document-control\"", StringComparison.Ordinal)..];
        control = control[..control.IndexOf("</table>", StringComparison.Ordinal)];
        foreach (var expected in new[] { "Run title", "Stored Owner Ltd (invented)", "A. Run", "C. Stored", "P. Stored", "C of 2025-07-01", "run justification" })
        {
            Assert.Contains(expected, Regex.Replace(control, "<[^>]+>", string.Empty), StringComparison.Ordinal);
        }

        Assert.Contains("<h1>Run title</h1>", html, StringComparison.Ordinal);
        Assert.Contains("source: run justification", html, StringComparison.Ordinal); // the target's source in the assumptions

        // The risk section: the owner's class, the probability–consequence chart, the ranked table.
        var risk = Section(html, "risk");
        Assert.Contains("release to a sensitive shore", risk, StringComparison.Ordinal);
        Assert.Contains("<img", risk, StringComparison.Ordinal);
        Assert.Contains("risk rank", risk, StringComparison.Ordinal);
        Assert.Contains("IL3-KP42", risk, StringComparison.Ordinal);

        // The exports: document control and risk rows in register-results.json, the class and its target in the CSV.
        using var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "register-results.json")));
        var doc = json.RootElement.GetProperty("document_control");
        Assert.Equal("Run title", doc.GetProperty("title").GetString());
        Assert.Equal("Stored Owner Ltd (invented)", doc.GetProperty("owner").GetString());
        Assert.Equal("A. Run", doc.GetProperty("author").GetString());
        Assert.Equal("C. Stored", doc.GetProperty("checker").GetString());
        Assert.Equal("C", doc.GetProperty("revision").GetString());
        Assert.Equal("run justification", json.RootElement.GetProperty("target_source").GetString());
        var row = Assert.Single(json.RootElement.GetProperty("risk").EnumerateArray());
        Assert.Equal("IL3-KP42", row.GetProperty("component_id").GetString());
        Assert.Equal(4, row.GetProperty("consequence_class").GetInt32());
        Assert.Equal(1e-5, row.GetProperty("target_annual_pf").GetDouble()); // pipeline-high: 1e-5 per year (TargetPresets.OffshorePipeline)
        Assert.Equal(row.GetProperty("annual_pf").GetDouble() / 1e-5, row.GetProperty("ratio_to_target").GetDouble(), 1e-12);
        Assert.Equal(row.GetProperty("annual_pf").GetDouble() * 2.5e6, row.GetProperty("expected_annual_cost").GetDouble(), 1e-9);
        var csv = File.ReadAllLines(Path.Combine(folder, "register-results.csv"));
        var header = csv[0].Split(',');
        var cells = csv[1].Split(',');
        Assert.Equal("4", cells[Array.IndexOf(header, "consequence_class")]);
        Assert.Equal("2500000", cells[Array.IndexOf(header, "cost_of_failure")]);

        // The stored record is unchanged by the run.
        var stored = cli.Run("register", "document", "-r", register, "--json").Json().GetProperty("current");
        Assert.Equal("Stored title", stored.GetProperty("title").GetString());
        Assert.Equal("A. Stored", stored.GetProperty("author").GetString());
        Assert.Equal("stored justification", stored.GetProperty("target_source").GetString());
    }

    [Fact]
    public void The_calendar_of_register_report_is_grouped_by_the_campaign_window_asked_for_and_a_bad_window_is_refused()
    {
        using var cli = Classified(out var register);
        string[] common = ["register", "report", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "-o", "stored"];
        Run(cli, [.. common, "--campaign-window", "quarter"]);
        var lines = File.ReadAllLines(Path.Combine(cli.PathOf("stored"), "calendar.csv"));
        var header = lines[0].Split(',');
        var row = lines[1].Split(',');
        var date = DateOnly.Parse(row[Array.IndexOf(header, "date")], System.Globalization.CultureInfo.InvariantCulture);
        // Calendar quarter of the due date (January–March is Q1), or overdue on or before the evidence date.
        var expected = date <= new DateOnly(2025, 6, 30) ? "overdue" : $"{date.Year}-Q{(date.Month + 2) / 3}";
        Assert.Equal(expected, row[Array.IndexOf(header, "campaign")]);
        var ics = Ical.Net.Calendar.Load(File.ReadAllText(Path.Combine(cli.PathOf("stored"), "calendar.ics")))!;
        Assert.Contains("campaign " + expected, Assert.Single(ics.Events).Categories);

        var bad = cli.Run([.. common, "--campaign-window", "fortnight"]);
        Assert.Equal(ExitCodes.BadInput, bad.ExitCode);
        Assert.Contains("--campaign-window 'fortnight'", bad.Error, StringComparison.Ordinal);
    }
}
