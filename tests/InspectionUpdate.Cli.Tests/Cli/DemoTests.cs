using System.Text.Json;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

public sealed class DemoTests
{
    // Its speed is measured outside the tests (docs/benchmarks.md); here it must finish and be complete.
    [Fact]
    public void Demo_builds_the_register_assesses_plans_and_reports_every_component()
    {
        using var cli = new CliRunner();
        var run = cli.Run("demo", "--out", "demo", "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        var json = run.Json();
        Assert.Equal(2, json.GetProperty("sites").GetInt32());
        var steps = json.GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("step").GetString() ?? string.Empty).ToArray();
        Assert.Equal(["register", "findings", "assess", "plan", "report"], steps);
        Assert.All(json.GetProperty("steps").EnumerateArray(), s => Assert.Equal("done", s.GetProperty("status").GetString()));
        var summary = json.GetProperty("summary").EnumerateArray().ToArray();
        Assert.Equal(4, summary.Length);
        Assert.All(summary, r => Assert.Equal(JsonValueKind.Null, r.GetProperty("error").ValueKind));
        // A component whose numbers did not all converge says where, so that a reader can judge how much it matters.
        Assert.All(summary.Where(r => !r.GetProperty("all_converged").GetBoolean()),
            r => Assert.Contains("not converged", r.GetProperty("convergence_note").GetString(), StringComparison.Ordinal));
        var index = json.GetProperty("portfolio_report").GetString()!;
        Assert.True(File.Exists(index));
        var html = File.ReadAllText(index);
        foreach (var id in InspectionUpdate.Reporting.Html.HtmlReportWriter.PortfolioSections) Assert.Contains("<section id=\"" + id + "\">", html, StringComparison.Ordinal);
        foreach (var c in summary) Assert.True(File.Exists(c.GetProperty("report").GetString()));
        Assert.True(json.GetProperty("elapsed_seconds").GetDouble() > 0);
        Assert.Contains("judgement", json.GetProperty("caution").GetString(), StringComparison.Ordinal);
    }
}
