using System.Text.Json;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>The command line end to end, in process, on a temporary register built from the shipped sample data.</summary>
public sealed class EndToEndTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");

    internal static CliRunner Prepared(out string register)
    {
        var cli = new CliRunner();
        register = cli.PathOf("t.register");
        Assert.Equal(ExitCodes.Ok, cli.Run("register", "create", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "SF-IL3", "--name", "test line", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("method", "add", "MFL-ILI", "--file", Path.Combine(SampleData, "methods", "mfl-ili.method.json"), "-r", register).ExitCode);
        var add = cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json"),
            "--in-service", "2008-05-01", "--wall-mm", "12.7", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, add.ExitCode);
        Assert.Equal("IL3-KP42", add.Json().GetProperty("code").GetString());
        return cli;
    }

    [Fact]
    public void Log_correct_and_list_keep_every_revision()
    {
        using var cli = Prepared(out var register);
        var log = cli.Run("finding", "log", "IL3-KP42", "--date", "2019-06-18", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "1.6", "--by", "tester", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, log.ExitCode);
        var id = log.Json().GetProperty("finding_id").GetInt64().ToString(System.Globalization.CultureInfo.InvariantCulture);
        var fix = cli.Run("finding", "correct", id, "--size-mm", "2.1", "--by", "tester", "--reason", "verification dig", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, fix.ExitCode);
        Assert.Equal(2, fix.Json().GetProperty("revision").GetInt32());
        var list = cli.Run("finding", "list", "IL3-KP42", "--all-revisions", "-r", register, "--json").Json().GetProperty("findings").EnumerateArray().ToArray();
        Assert.Equal([1.6, 2.1], list.Select(f => f.GetProperty("measured_size_mm").GetDouble()).ToArray());
        Assert.Equal("verification dig", list[1].GetProperty("reason").GetString());
    }

    [Fact]
    public void A_bad_import_is_refused_with_every_problem_and_leaves_the_register_unchanged()
    {
        using var cli = Prepared(out var register);
        var before = cli.Run("register", "check", "-r", register, "--json").Json().GetProperty("fingerprint").GetString();
        var bad = cli.PathOf("bad.csv");
        File.WriteAllText(bad, "component_code,inspection_date,kind,method,measured_size_mm\nIL3-KP42,2016-05-20,no-indication,MFL-ILI,\nNOPE,2017-05-20,sized-indication,MFL-ILI,-1\n");
        var run = cli.Run("finding", "import", bad, "-r", register, "--json");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        var problems = run.Json().GetProperty("error").GetProperty("problems").EnumerateArray().Select(p => p.GetString()!).ToArray();
        Assert.Contains(problems, p => p.Contains("NOPE", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.Contains("-1", StringComparison.Ordinal));
        Assert.Equal(before, cli.Run("register", "check", "-r", register, "--json").Json().GetProperty("fingerprint").GetString());
        Assert.Empty(cli.Run("finding", "list", "-r", register, "--json").Json().GetProperty("findings").EnumerateArray());

        var good = cli.PathOf("good.csv");
        File.WriteAllText(good, "component_code,inspection_date,kind,method,measured_size_mm\nIL3-KP42,2016-05-20,no-indication,MFL-ILI,\n");
        var ok = cli.Run("finding", "import", good, "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, ok.ExitCode);
        Assert.Equal(1, ok.Json().GetProperty("findings").GetInt32());
    }

    [Fact]
    public void Assess_plan_and_report_on_the_register_give_parseable_json_and_files()
    {
        using var cli = Prepared(out var register);
        cli.Run("finding", "log", "IL3-KP42", "--date", "2016-05-20", "--method", "MFL-ILI", "--outcome", "none", "-r", register);
        var assess = cli.Run("assess", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--json");
        Assert.True(assess.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, assess.Error);
        var a = assess.Json();
        Assert.Equal(1, a.GetProperty("evidence_count").GetInt32());
        Assert.Equal(30, a.GetProperty("prior").GetProperty("points").GetArrayLength()); // service life of the model file: 30 years
        Assert.Equal(a.GetProperty("all_converged").GetBoolean(), assess.ExitCode == ExitCodes.Ok);
        Assert.Contains("judgement", a.GetProperty("caution").GetString(), StringComparison.Ordinal);

        var plan = cli.Run("plan", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--no-schedule", "--target-annual-pf", "1e-4", "--json");
        Assert.True(plan.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, plan.Error);
        var p = plan.Json();
        Assert.Equal(1e-4, p.GetProperty("target_annual_pf").GetDouble());
        Assert.True(DateOnly.Parse(p.GetProperty("next_date").GetString()!, System.Globalization.CultureInfo.InvariantCulture) >= new DateOnly(2025, 6, 30));

        var report = cli.Run("report", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--out", "rep", "--json");
        Assert.True(report.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, report.Error);
        foreach (var f in new[] { "index.html", "IL3-KP42.html", "IL3-KP42.json", "IL3-KP42.profile.csv", "register.json" })
        {
            Assert.True(File.Exists(Path.Combine(cli.PathOf("rep"), f)), f);
        }
    }

    [Fact]
    public void A_known_on_date_before_the_component_was_recorded_names_the_component_and_both_dates()
    {
        using var cli = Prepared(out var register);
        var recorded = cli.Run("component", "list", "-r", register, "--json").Json().GetProperty("components")[0].GetProperty("recorded_utc").GetDateTimeOffset();
        var recordedText = recorded.UtcDateTime.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);
        var asOf = DateOnly.FromDateTime(recorded.UtcDateTime).AddYears(-3).ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);
        foreach (var command in new[] { "assess", "plan", "report" })
        {
            string[] args = [command, "IL3-KP42", "-r", register, "--known-on", asOf];
            var run = cli.Run(command == "report" ? [.. args, "--out", "rep"] : args);
            Assert.Equal(ExitCodes.BadInput, run.ExitCode);
            Assert.DoesNotContain("is not in the register", run.Error, StringComparison.Ordinal);
            Assert.Contains("IL3-KP42", run.Error, StringComparison.Ordinal);
            Assert.Contains("--known-on '" + asOf + "'", run.Error, StringComparison.Ordinal);
            Assert.Contains("recorded in the register on " + recordedText, run.Error, StringComparison.Ordinal);
        }

        Assert.Contains("is not in the register", cli.Run("assess", "NOPE-1", "-r", register, "--as-of", asOf).Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("assess")]
    [InlineData("plan")]
    [InlineData("report")]
    public void As_of_help_says_evidence_up_to_and_known_on_help_says_the_register_as_recorded(string command)
    {
        using var cli = new CliRunner();
        var help = cli.Run(command, "--help").Output;
        string Own(string option)
        {
            // The option's description: its own row and the wrapped rows under it, up to the next option.
            var rows = help.Split('\n').SkipWhile(l => !l.TrimStart().StartsWith(option, StringComparison.Ordinal)).ToArray();
            var own = rows.Take(1).Concat(rows.Skip(1).TakeWhile(l => !l.TrimStart().StartsWith('-') && l.Trim().Length > 0));
            return System.Text.RegularExpressions.Regex.Replace(string.Join(' ', own), @"\s+", " ");
        }

        Assert.Contains("Evidence up to this date", Own("--as-of"), StringComparison.Ordinal);
        var knownOn = Own("--known-on");
        Assert.Contains("as it was recorded on this date", knownOn, StringComparison.Ordinal);
        foreach (var what in new[] { "components", "methods", "findings" }) Assert.Contains(what, knownOn, StringComparison.Ordinal);
    }

    [Fact]
    public void Assess_runs_straight_on_a_model_file_without_a_register()
    {
        using var cli = new CliRunner();
        var run = cli.Run("assess", "--model", Path.Combine(SampleData, "models", "hollin-reef-brace-joint-crack-growth.json"), "--route", "first-order", "--horizon-years", "10", "--json");
        Assert.True(run.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, run.Error);
        Assert.Equal(10, run.Json().GetProperty("prior").GetProperty("points").GetArrayLength());
    }

    [Fact]
    public void A_bad_model_file_is_bad_input_naming_the_path_of_the_problem()
    {
        using var cli = new CliRunner();
        var model = cli.PathOf("bad.model.json");
        File.WriteAllText(model, "{\"schemaVersion\": 1, \"name\": \"x\", \"mechanism\": {\"type\": \"corrosion\"}, \"inputs\": {\"rate_mmPerYear\": {\"family\": \"Lognormal\", \"mean\": -1, \"cov\": 0.2}}}");
        var run = cli.Run("assess", "--model", model);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("$.", run.Error, StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_register_is_a_register_error()
    {
        using var cli = new CliRunner();
        var run = cli.Run("site", "list", "-r", cli.PathOf("none.register"));
        Assert.Equal(ExitCodes.RegisterError, run.ExitCode);
    }

    [Fact]
    public void Verify_passes_every_case_and_writes_the_markdown_table()
    {
        using var cli = new CliRunner();
        var run = cli.Run("verify", "--json", "--benchmarks", "none", "--write-doc", "v.md");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        var doc = run.Json();
        Assert.Equal(0, doc.GetProperty("failed").GetInt32());
        Assert.True(doc.GetProperty("passed").GetInt32() >= 6);
        Assert.Contains("| case | source |", File.ReadAllText(cli.PathOf("v.md")), StringComparison.Ordinal);
        // The main job is verified too: updating by both routes and the planner on the docs/references.md worked case.
        var methods = doc.GetProperty("rows").EnumerateArray().Select(r => r.GetProperty("method").GetString()).ToHashSet();
        Assert.Contains("first-order updating", methods);
        Assert.Contains("importance-sampling updating", methods);
        Assert.Contains("planner (first order)", methods);
        Assert.Contains("PHI2 (FORM at t and t ± h)", methods);
        Assert.Equal(0, doc.GetProperty("benchmarks").GetProperty("rows").GetArrayLength());
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Reference Pf of RP107 (closed form Φ(−5)), RP22, RP57, RP110, four-branch (closed forms or quadrature) and RP14 (otbenchmark table, confirmed by crude Monte Carlo): tests/InspectionUpdate.Core.Tests/data/benchmarks")]
    public void Verify_quick_benchmarks_show_every_route_with_none_wrong_and_converged()
    {
        using var cli = new CliRunner();
        var run = cli.Run("verify", "--json", "--benchmarks", "quick", "--write-doc", "v.md");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        var benchmarks = run.Json().GetProperty("benchmarks");
        Assert.Equal("quick", benchmarks.GetProperty("set").GetString());
        Assert.Equal(0, benchmarks.GetProperty("wrong_and_converged").GetInt32());
        var rows = benchmarks.GetProperty("rows").EnumerateArray().ToArray();
        var routes = rows.Select(r => r.GetProperty("route").GetString()).Distinct().ToArray();
        Assert.Equal(6 * routes.Length, rows.Length);
        Assert.Contains("FORM (multi-start)", routes);
        Assert.Contains("subset simulation", routes);
        Assert.Contains("sample set (automatic route)", routes);
        Assert.Equal(8, routes.Length);

        // RP107 is linear in standard normal space: FORM is exact (Φ(−5) = 2.8665e-7) and passes.
        var rp107 = rows.Single(r => r.GetProperty("problem").GetString() == "RP107" && r.GetProperty("route").GetString() == "FORM (multi-start)");
        Assert.Equal("pass", rp107.GetProperty("outcome").GetString());
        Assert.Equal(2.86652e-7, rp107.GetProperty("obtained").GetDouble(), 1e-11);

        // RP14 (FORM about 9 % low) and RP57 (design point of the wrong branch) are flagged by the simulation check, never passed.
        foreach (var id in new[] { "RP14", "RP57" })
        {
            var form = rows.Single(r => r.GetProperty("problem").GetString() == id && r.GetProperty("route").GetString() == "FORM (multi-start)");
            Assert.Equal("flagged", form.GetProperty("outcome").GetString());
            Assert.Contains(form.GetProperty("flags").EnumerateArray(), f => f.GetString()!.StartsWith("simulation check", StringComparison.Ordinal));
        }

        var summary = benchmarks.GetProperty("summary").EnumerateArray().ToArray();
        Assert.Equal(routes.Length, summary.Length);
        Assert.All(summary, s => Assert.Equal(0, s.GetProperty("wrong_and_converged").GetInt32()));
        var md = File.ReadAllText(cli.PathOf("v.md"));
        Assert.Contains("| problem | source | route | reference | obtained | evaluations | converged | pass |", md, StringComparison.Ordinal);
        Assert.Contains("| route | passed | flagged (cross-check only) | wrong and converged |", md, StringComparison.Ordinal);
    }

    [Fact]
    public void Verify_refuses_an_unknown_benchmark_set_naming_the_value()
    {
        using var cli = new CliRunner();
        var run = cli.Run("verify", "--benchmarks", "some");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--benchmarks 'some'", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Method_fit_from_the_shipped_trials_gives_a_curve_without_storing_on_dry_run()
    {
        using var cli = new CliRunner();
        var run = cli.Run("method", "fit", "ACFM-FIT", "--data", Path.Combine(SampleData, "qualification", "acfm-trials.csv"), "--sizing-sd-mm", "0.4", "--dry-run", "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        var fit = run.Json();
        Assert.Equal(JsonValueKind.Null, fit.GetProperty("id").ValueKind);
        Assert.True(fit.GetProperty("a90_at95_mm").GetDouble() > fit.GetProperty("a90_mm").GetDouble());
    }

    [Fact]
    public void Evidence_as_of_an_earlier_date_is_read_from_the_register_as_known_today()
    {
        // History logged today (the register's clock) about an inspection in 2019, assessed with evidence up to
        // 2020-01-01: an auditor's question. Before --known-on, --as-of 2020-01-01 refused the component.
        using var cli = Prepared(out var register);
        Assert.Equal(ExitCodes.Ok, cli.Run("finding", "log", "IL3-KP42", "--date", "2019-06-18", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "1.6", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("finding", "log", "IL3-KP42", "--date", "2023-06-18", "--method", "MFL-ILI", "--outcome", "none", "-r", register).ExitCode);
        var run = cli.Run("assess", "IL3-KP42", "--as-of", "2020-01-01", "--route", "first-order", "-r", register, "--json");
        Assert.True(run.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, run.Error);
        Assert.Equal("2020-01-01", run.Json().GetProperty("as_of").GetString());
        var text = cli.Run("assess", "IL3-KP42", "--as-of", "2020-01-01", "--route", "first-order", "-r", register);
        // Only the 2019 inspection is evidence up to 2020-01-01.
        Assert.Contains("evidence to 2020-01-01 (11.67 years): 1 record(s)", text.Output, StringComparison.Ordinal);
        Assert.Contains("register as known on " + CliRunner.Today.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture), text.Output, StringComparison.Ordinal);
    }
}
