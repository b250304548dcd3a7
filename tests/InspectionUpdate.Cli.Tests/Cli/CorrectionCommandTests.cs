using System.Globalization;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>Site and method corrections, finding list columns, the two dates in plan and report, the post-repair prior's spelling.</summary>
public sealed class CorrectionCommandTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");
    private static readonly string Today = CliRunner.Today.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

    [Fact]
    [Reference("Design rule (DESIGN.md §5): a correction is a new revision with who, when and why; nothing is deleted")]
    public void Site_correct_keeps_the_earlier_name_and_refuses_a_missing_reason_untouched()
    {
        using var cli = EndToEndTests.Prepared(out var register);
        var before = ValidationAtTheDoorTests.Fingerprint(cli, register);
        Assert.Equal(ExitCodes.BadInput, cli.Run("site", "correct", "SF-IL3", "--name", "Sandwick injection line 3", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.BadInput, cli.Run("site", "correct", "NO-SUCH", "--name", "x", "--reason", "r", "-r", register).ExitCode);
        Assert.Equal(before, ValidationAtTheDoorTests.Fingerprint(cli, register));

        var run = cli.Run("site", "correct", "SF-IL3", "--name", "Sandwick injection line 3", "--reason", "name from the asset list", "--by", "tester", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Equal((2, "name from the asset list", "tester"), (run.Json().GetProperty("revision").GetInt32(), run.Json().GetProperty("reason").GetString(), run.Json().GetProperty("recorded_by").GetString()));
        var history = cli.Run("site", "list", "--all-revisions", "-r", register, "--json").Json().GetProperty("sites").EnumerateArray().ToArray();
        Assert.Equal(["test line", "Sandwick injection line 3"], history.Select(s => s.GetProperty("name").GetString()));
        Assert.Equal("Sandwick injection line 3", Assert.Single(cli.Run("site", "list", "-r", register, "--json").Json().GetProperty("sites").EnumerateArray()).GetProperty("name").GetString());
    }

    [Fact]
    [Reference("Design rule (DESIGN.md §5): a correction is a new revision; issue 14: finding list shows location and note; plan prints both dates")]
    public void Method_correct_records_a_revision_and_finding_list_and_plan_show_what_they_read()
    {
        using var cli = EndToEndTests.Prepared(out var register);
        Assert.Equal(ExitCodes.Ok, cli.Run("finding", "log", "IL3-KP42", "--date", "2019-06-18", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "1.6",
            "--location", "KP42-6h", "--note", "pit cluster", "-r", register).ExitCode);
        var list = cli.Run("finding", "list", "-r", register);
        Assert.Contains("KP42-6h", list.Output, StringComparison.Ordinal);
        Assert.Contains("pit cluster", list.Output, StringComparison.Ordinal);

        var corrected = cli.PathOf("mfl.method.json");
        File.WriteAllText(corrected, File.ReadAllText(Path.Combine(SampleData, "methods", "mfl-ili.method.json")).Replace("\"sd\": 0.8", "\"sd\": 0.6", StringComparison.Ordinal));
        var run = cli.Run("method", "correct", "MFL-ILI", "--file", corrected, "--reason", "sizing sd from the 2025 qualification", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Equal((2, 0.6), (run.Json().GetProperty("revision").GetInt32(), run.Json().GetProperty("sizing_sd").GetDouble()));
        var history = cli.Run("method", "list", "--all-revisions", "-r", register, "--json").Json().GetProperty("methods").EnumerateArray().ToArray();
        Assert.Equal([0.8, 0.6], history.Select(m => m.GetProperty("sizing_sd").GetDouble()));
        Assert.Equal(ExitCodes.BadInput, cli.Run("method", "correct", "MFL-ILI", "--file", corrected, "--reason", "again", "-r", register).ExitCode); // nothing changes

        var plan = cli.Run("plan", "IL3-KP42", "--route", "first-order", "--no-schedule", "--as-of", "2020-01-01", "--known-on", Today, "-r", register);
        Assert.True(plan.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, plan.Error);
        Assert.Contains($"Evidence to 2020-01-01; register as known on {Today}.", plan.Output, StringComparison.Ordinal);
        var json = cli.Run("plan", "IL3-KP42", "--route", "first-order", "--no-schedule", "--as-of", "2020-01-01", "-r", register, "--json");
        Assert.Equal(Today, json.Json().GetProperty("known_on").GetString());
    }

    [Fact]
    [Reference("Issue 14: the HTML report prints both dates (evidence up to, register as known on)")]
    public void The_component_report_shows_the_known_on_date_in_its_header_and_provenance()
    {
        using var cli = EndToEndTests.Prepared(out var register);
        var out_ = cli.PathOf("report");
        var run = cli.Run("report", "IL3-KP42", "--out", out_, "--as-of", "2020-01-01", "--known-on", Today, "--route", "first-order", "-r", register);
        Assert.True(run.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, run.Error);
        var html = File.ReadAllText(Path.Combine(out_, "IL3-KP42.html"));
        Assert.Contains("evidence to 2020-01-01 · register as known on " + Today, html, StringComparison.Ordinal);
        Assert.Contains("<dt>Register as known on</dt><dd>" + Today + "</dd>", html, StringComparison.Ordinal);
        Assert.Contains("register as known on " + Today, File.ReadAllText(Path.Combine(out_, "index.html")), StringComparison.Ordinal);
    }

    [Fact]
    [Reference("Issue 14, one spelling per concept: the post-repair prior says \"family\", as model files do")]
    public void A_post_repair_prior_spelt_distribution_is_refused_naming_family()
    {
        using var cli = EndToEndTests.Prepared(out var register);
        var prior = cli.PathOf("prior.json");
        File.WriteAllText(prior, """{"inputs": {"initiationTime_years": {"distribution": "lognormal", "mean": 10, "sd": 3}}}""");
        var run = cli.Run("repair", "log", "IL3-KP42", "--date", "2020-03-01", "--description", "sleeve", "--post-repair-prior", prior, "-r", register);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("\"family\"", run.Error, StringComparison.Ordinal);
        File.WriteAllText(prior, """{"inputs": {"initiationTime_years": {"family": "lognormal", "mean": 10, "sd": 3}}}""");
        Assert.Equal(ExitCodes.Ok, cli.Run("repair", "log", "IL3-KP42", "--date", "2020-03-01", "--description", "sleeve", "--post-repair-prior", prior, "-r", register).ExitCode);
    }
}
