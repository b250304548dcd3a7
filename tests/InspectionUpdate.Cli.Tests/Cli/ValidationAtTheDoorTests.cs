using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// Everything the register accepts, an assessment accepts: 'component add' runs the same model parse and build as
/// 'assess' and refuses (exit 2, every problem listed, nothing written) what assess would refuse.
/// </summary>
public sealed class ValidationAtTheDoorTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");
    private static readonly string Corrosion = File.ReadAllText(Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json"));
    private static readonly string Expression = File.ReadAllText(Path.Combine(SampleData, "models", "sandwick-injection-line-leak-expression.json"));

    internal static CliRunner Prepared(out string register)
    {
        var cli = new CliRunner();
        register = cli.PathOf("t.register");
        Assert.Equal(ExitCodes.Ok, cli.Run("register", "create", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "SF-IL3", "--name", "test line", "-r", register).ExitCode);
        return cli;
    }

    internal static string Fingerprint(CliRunner cli, string register) =>
        cli.Run("register", "check", "-r", register, "--json").Json().GetProperty("fingerprint").GetString()!;

    public static TheoryData<string, string, string> BadModels => new()
    {
        // The careless-user cases of the issue: each refused with the field (JSON path) and the value named.
        { "misspelt input", Corrosion.Replace("\"rate_mmPerYear\"", "\"rate_mmPeryear\"", StringComparison.Ordinal), "rate_mmPeryear" },
        { "negative standard deviation", Corrosion.Replace("\"sd\": 0.25", "\"sd\": -0.25", StringComparison.Ordinal), "-0.25" },
        { "unknown family", Corrosion.Replace("\"family\": \"Lognormal\", \"mean\": 8", "\"family\": \"LogNormale\", \"mean\": 8", StringComparison.Ordinal), "LogNormale" },
        { "text for a number", Corrosion.Replace("\"mean\": 12.7", "\"mean\": \"twelve\"", StringComparison.Ordinal), "twelve" },
        { "misspelt top-level field", Corrosion.Replace("\"serviceLife_years\"", "\"serviceLife_year\"", StringComparison.Ordinal), "serviceLife_year" },
        { "expression syntax error", Expression.Replace("\"0.8 * wallThickness_mm - k_mm * pow(max(0, t - initiationTime_years), n)\"", "\"0.8 * wallThickness_mm - k_mm * pow(max(0, t - initiationTime_years, n)\"", StringComparison.Ordinal), "limitState" },
        { "unknown variable", Expression.Replace("0.8 * wallThickness_mm", "0.8 * wallThick_mm", StringComparison.Ordinal), "wallThick_mm" },
        // One spelling per concept: the other spelling of the family key is named with the expected key.
        { "distribution for family", Corrosion.Replace("\"family\": \"Lognormal\", \"mean\": 8", "\"distribution\": \"Lognormal\", \"mean\": 8", StringComparison.Ordinal), "the key is \"family\"" },
    };

    [Theory]
    [MemberData(nameof(BadModels))]
    public void Component_add_refuses_a_model_that_assess_would_refuse(string what, string json, string named)
    {
        using var cli = Prepared(out var register);
        var model = cli.PathOf("bad.model.json");
        File.WriteAllText(model, json);
        var before = Fingerprint(cli, register);
        var run = cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", model, "--in-service", "2008-05-01", "-r", register);
        Assert.True(run.ExitCode == ExitCodes.BadInput, $"{what}: exit {run.ExitCode}\n{run.Error}");
        Assert.Contains(named, run.Error, StringComparison.Ordinal);
        Assert.Contains("component add refused", run.Error, StringComparison.Ordinal);
        Assert.Equal(before, Fingerprint(cli, register));
        Assert.Empty(cli.Run("component", "list", "-r", register, "--json").Json().GetProperty("components").EnumerateArray());
    }

    [Fact]
    public void Every_problem_of_a_model_is_listed_not_only_the_first()
    {
        using var cli = Prepared(out var register);
        var model = cli.PathOf("bad.model.json");
        File.WriteAllText(model, Corrosion.Replace("\"serviceLife_years\"", "\"serviceLife_year\"", StringComparison.Ordinal)
            .Replace("\"sd\": 0.25", "\"sd\": -0.25", StringComparison.Ordinal));
        var run = cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", model, "--in-service", "2008-05-01", "-r", register, "--json");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        var problems = run.Json().GetProperty("error").GetProperty("problems").EnumerateArray().Select(p => p.GetString()!).ToArray();
        Assert.Contains(problems, p => p.Contains("serviceLife_year", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.Contains("-0.25", StringComparison.Ordinal));
    }
}
