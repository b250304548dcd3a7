using System.Globalization;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// --after-detection on plan, report and register assess: the branch is stated in the JSON, CSV and HTML and is part
/// of the stored-results key. The numbers of each branch are checked against closed forms in the core's
/// AfterDetectionTests; here the option's plumbing.
/// </summary>
public sealed class AfterDetectionCommandTests
{
    private static CliRunner Sized(out string register)
    {
        var cli = EndToEndTests.Prepared(out register);
        Assert.Equal(ExitCodes.Ok, cli.Run("finding", "log", "IL3-KP42", "--date", "2019-06-18", "--method", "MFL-ILI", "--outcome", "sized", "--size-mm", "3.5", "-r", register).ExitCode);
        return cli;
    }

    private static DateOnly Date(System.Text.Json.JsonElement e, string name) => DateOnly.Parse(e.GetProperty(name).GetString()!, CultureInfo.InvariantCulture);

    [Fact]
    public void Plan_states_the_branch_in_its_json_and_the_repair_branch_plans_the_repaired_component()
    {
        using var cli = Sized(out var register);
        string[] common = ["plan", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--no-schedule", "--json"];
        var monitor = cli.Run([.. common]);
        var repair = cli.Run([.. common, "--after-detection", "repair"]);
        Assert.True(monitor.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, monitor.Error);
        Assert.True(repair.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, repair.Error);
        var m = monitor.Json();
        var r = repair.Json();

        Assert.Equal("monitor", m.GetProperty("after_detection").GetString());
        Assert.Equal("repair", r.GetProperty("after_detection").GetString());
        Assert.Contains("left in service and monitored", m.GetProperty("after_detection_note").GetString(), StringComparison.Ordinal);
        Assert.Contains("repair on detection", r.GetProperty("after_detection_note").GetString(), StringComparison.Ordinal);
        Assert.Contains(r.GetProperty("assumptions").EnumerateArray(), a => a.GetString()!.Contains("repair on detection", StringComparison.Ordinal));
        // A repair renews the defect (initiation time and length restart): the repaired component is due no earlier.
        Assert.True(Date(r, "next_date") >= Date(m, "next_date"), $"repair {Date(r, "next_date")} before monitor {Date(m, "next_date")}");
    }

    [Fact]
    public void A_bad_branch_is_refused_naming_the_option_and_the_value()
    {
        using var cli = Sized(out var register);
        var run = cli.Run("plan", "IL3-KP42", "-r", register, "--route", "first-order", "--no-schedule", "--after-detection", "replace");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--after-detection 'replace'", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Report_writes_the_branch_on_the_page_and_in_the_exports()
    {
        using var cli = Sized(out var register);
        var report = cli.Run("report", "IL3-KP42", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--out", "rep", "--after-detection", "repair", "--json");
        Assert.True(report.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, report.Error);
        var folder = cli.PathOf("rep");
        Assert.Contains("After a detection: <strong>repair on detection</strong>", File.ReadAllText(Path.Combine(folder, "IL3-KP42.html")), StringComparison.Ordinal);
        using var json = System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "IL3-KP42.json")));
        Assert.Equal("repair", json.RootElement.GetProperty("plan").GetProperty("after_detection").GetString());
        var planCsv = File.ReadAllLines(Path.Combine(folder, "IL3-KP42.plan.csv"));
        Assert.EndsWith(",after_detection", planCsv[0], StringComparison.Ordinal);
        Assert.All(planCsv.Skip(1), l => Assert.EndsWith(",repair", l, StringComparison.Ordinal));
        var registerCsv = File.ReadAllLines(Path.Combine(folder, "register.csv"));
        Assert.EndsWith(",after_detection", registerCsv[0], StringComparison.Ordinal);
        Assert.EndsWith(",repair", registerCsv[1], StringComparison.Ordinal);
        using var registerJson = System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "register.json")));
        Assert.Equal("repair", registerJson.RootElement.GetProperty("after_detection").GetString());
        Assert.Contains("plans assume repair on detection", File.ReadAllText(Path.Combine(folder, "index.html")), StringComparison.Ordinal);
    }

    [Fact]
    public void The_branch_is_part_of_the_stored_results_key_so_a_rerun_with_the_other_recomputes()
    {
        using var cli = Sized(out var register);
        string[] assess = ["register", "assess", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "--json"];
        var monitor = cli.Run([.. assess]).Json();
        var repair = cli.Run([.. assess, "--after-detection", "repair"]).Json();
        var again = cli.Run([.. assess, "--after-detection", "repair"]).Json();

        Assert.Contains("after-detection=monitor", monitor.GetProperty("options_key").GetString(), StringComparison.Ordinal);
        Assert.Contains("after-detection=repair", repair.GetProperty("options_key").GetString(), StringComparison.Ordinal);
        Assert.Equal(0, repair.GetProperty("reused").GetInt32());
        Assert.Equal(1, again.GetProperty("reused").GetInt32());

        var report = cli.Run("register", "report", "-r", register, "--route", "first-order", "--as-of", "2025-06-30", "-o", "stored", "--after-detection", "repair", "--json");
        Assert.True(report.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged, report.Error);
        var csv = File.ReadAllLines(Path.Combine(cli.PathOf("stored"), "register-results.csv"));
        var column = Array.IndexOf(csv[0].Split(','), "after_detection");
        Assert.True(column >= 0, csv[0]);
        Assert.Equal("repair", csv[1].Split(',')[column]);
    }
}
