using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

public sealed class DemoTests
{
    [Fact]
    public void Demo_runs_and_reports_every_step_in_json()
    {
        using var cli = new CliRunner();
        var run = cli.Run("demo", "--out", "demo", "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        var json = run.Json();
        Assert.Equal(3, json.GetProperty("sites").GetInt32());
        var steps = json.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("step").GetString() ?? string.Empty).ToArray();
        Assert.Equal(["register", "assess", "plan", "report"], steps);
        Assert.True(Directory.Exists(cli.PathOf("demo")));
        Assert.Contains("judgement", json.GetProperty("caution").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Demo_prints_the_caution_in_text_mode()
    {
        using var cli = new CliRunner();
        var run = cli.Run("demo", "--out", "demo");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Contains("Caution:", run.Output, StringComparison.Ordinal);
    }
}
