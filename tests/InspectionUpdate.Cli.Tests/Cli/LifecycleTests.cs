using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>Lifecycle commands keep history (who, when, why) and never delete; component codes name distinct report files.</summary>
public sealed class LifecycleTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");
    private static readonly string ModelPath = Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json");

    private static CliRunner WithComponent(out string register)
    {
        var cli = ValidationAtTheDoorTests.Prepared(out register);
        Assert.Equal(ExitCodes.Ok, cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", ModelPath, "--in-service", "2008-05-01", "--wall-mm", "12.7", "-r", register).ExitCode);
        return cli;
    }

    [Fact]
    public void Component_revise_adds_a_revision_and_refuses_an_invalid_model_untouched()
    {
        using var cli = WithComponent(out var register);
        var revised = cli.PathOf("revised.model.json");
        File.WriteAllText(revised, File.ReadAllText(ModelPath).Replace("\"mean\": 0.25", "\"mean\": 0.3", StringComparison.Ordinal));
        var run = cli.Run("component", "revise", "IL3-KP42", "--model", revised, "--reason", "new rate survey", "--by", "tester", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Equal(2, run.Json().GetProperty("model_revision").GetInt32());
        Assert.Equal("new rate survey", run.Json().GetProperty("reason").GetString());

        var before = ValidationAtTheDoorTests.Fingerprint(cli, register);
        File.WriteAllText(revised, File.ReadAllText(ModelPath).Replace("\"sd\": 0.25", "\"sd\": -1", StringComparison.Ordinal));
        var bad = cli.Run("component", "revise", "IL3-KP42", "--model", revised, "--reason", "typo", "-r", register);
        Assert.Equal(ExitCodes.BadInput, bad.ExitCode);
        Assert.Contains("-1", bad.Error, StringComparison.Ordinal);
        Assert.Equal(before, ValidationAtTheDoorTests.Fingerprint(cli, register));
        Assert.Equal(ExitCodes.BadInput, cli.Run("component", "revise", "IL3-KP42", "--model", revised, "-r", register).ExitCode); // no --reason
    }

    [Fact]
    public void Retire_and_reinstate_are_recorded_with_who_and_why_and_refused_twice()
    {
        using var cli = WithComponent(out var register);
        var retire = cli.Run("component", "retire", "IL3-KP42", "--reason", "spool replaced", "--by", "tester", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, retire.ExitCode);
        Assert.Equal("retired", retire.Json().GetProperty("status").GetString());
        Assert.Equal("tester", retire.Json().GetProperty("recorded_by").GetString());
        Assert.Equal(ExitCodes.BadInput, cli.Run("component", "retire", "IL3-KP42", "--reason", "again", "-r", register).ExitCode);
        // Still readable: retiring never deletes.
        Assert.Single(cli.Run("component", "list", "-r", register, "--json").Json().GetProperty("components").EnumerateArray());
        Assert.Equal(ExitCodes.Ok, cli.Run("component", "reinstate", "IL3-KP42", "--reason", "retired in error", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.BadInput, cli.Run("component", "reinstate", "IL3-KP42", "--reason", "again", "-r", register).ExitCode);
    }

    [Fact]
    public void Repair_correct_and_withdraw_keep_every_revision()
    {
        using var cli = WithComponent(out var register);
        var log = cli.Run("repair", "log", "IL3-KP42", "--date", "2020-03-01", "--description", "sleeve fitted", "--by", "tester", "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, log.ExitCode);
        var id = log.Json().GetProperty("repair_id").GetInt64().ToString(System.Globalization.CultureInfo.InvariantCulture);
        Assert.Equal(ExitCodes.Ok, cli.Run("repair", "correct", id, "--date", "2020-03-04", "--reason", "date from the work order", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.BadInput, cli.Run("repair", "correct", id, "--reason", "nothing given", "-r", register).ExitCode);
        Assert.Single(cli.Run("repair", "list", "-r", register, "--json").Json().GetProperty("repairs").EnumerateArray());
        Assert.Equal(ExitCodes.Ok, cli.Run("repair", "withdraw", id, "--reason", "wrong component", "-r", register).ExitCode);
        Assert.Empty(cli.Run("repair", "list", "-r", register, "--json").Json().GetProperty("repairs").EnumerateArray());
        var history = cli.Run("repair", "list", "IL3-KP42", "--all-revisions", "-r", register, "--json").Json().GetProperty("repairs").EnumerateArray().ToArray();
        Assert.Equal([1, 2, 3], history.Select(r => r.GetProperty("revision").GetInt32()));
        Assert.Equal(["2020-03-01", "2020-03-04", "2020-03-04"], history.Select(r => r.GetProperty("repair_date").GetString()));
        Assert.Equal([false, false, true], history.Select(r => r.GetProperty("withdrawn").GetBoolean()));
        Assert.Equal("wrong component", history[2].GetProperty("reason").GetString());
    }

    [Theory]
    [InlineData("A/B")]
    [InlineData("A:B")]
    [InlineData("index")]
    [InlineData("Register")]
    [InlineData("il3-kp42")]
    [InlineData(".hidden")]
    [InlineData("NUL.txt")]
    public void A_component_code_that_would_not_give_its_own_report_file_is_refused(string code)
    {
        using var cli = WithComponent(out var register);
        var run = cli.Run("component", "add", code, "--site", "SF-IL3", "--model", ModelPath, "--in-service", "2008-05-01", "-r", register);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains(code, run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void A_component_code_longer_than_64_characters_is_refused_and_64_is_accepted()
    {
        using var cli = WithComponent(out var register);
        var run = cli.Run("component", "add", new string('A', 65), "--site", "SF-IL3", "--model", ModelPath, "--in-service", "2008-05-01", "-r", register);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("at most 64 characters", run.Error, StringComparison.Ordinal);
        Assert.Equal(ExitCodes.Ok, cli.Run("component", "add", new string('A', 64), "--site", "SF-IL3", "--model", ModelPath, "--in-service", "2008-05-01", "-r", register).ExitCode);
    }
}
