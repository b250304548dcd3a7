using System.Text;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// Inputs that once crashed the program (exit 1 or an aborted process). Each now ends in exit 2 with a sentence
/// naming the field and the value, both at 'assess --model' and at 'component add'.
/// </summary>
public sealed class CrashRegressionTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");
    private static readonly string Corrosion = File.ReadAllText(Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json"));
    private static readonly string Expression = File.ReadAllText(Path.Combine(SampleData, "models", "sandwick-injection-line-leak-expression.json"));

    private static void AssertRefused(string json, params string[] named)
    {
        using var cli = ValidationAtTheDoorTests.Prepared(out var register);
        var model = cli.PathOf("case.model.json");
        File.WriteAllText(model, json, new UTF8Encoding(false));
        var before = ValidationAtTheDoorTests.Fingerprint(cli, register);
        foreach (var args in new[]
        {
            new[] { "assess", "--model", model, "--horizon-years", "5" },
            ["component", "add", "C-1", "--site", "SF-IL3", "--model", model, "--in-service", "2008-05-01", "-r", register],
        })
        {
            var run = cli.Run(args);
            Assert.True(run.ExitCode == ExitCodes.BadInput, $"{args[0]}: exit {run.ExitCode}\n{run.Error}");
            foreach (var n in named) Assert.Contains(n, run.Error, StringComparison.Ordinal);
            Assert.DoesNotContain("(Parameter '", run.Error, StringComparison.Ordinal);
            Assert.DoesNotContain("Internal error", run.Error, StringComparison.Ordinal);
        }

        Assert.Equal(before, ValidationAtTheDoorTests.Fingerprint(cli, register));
    }

    [Fact]
    public void A_lone_utf16_surrogate_in_a_string_is_refused() =>
        AssertRefused(Corrosion.Replace("\"name\": \"Sandwick", "\"name\": \"\\ud800Sandwick", StringComparison.Ordinal), "$.name");

    [Fact]
    public void A_service_life_of_1e_minus_300_years_is_refused() =>
        AssertRefused(Corrosion.Replace("\"serviceLife_years\": 30", "\"serviceLife_years\": 1e-300", StringComparison.Ordinal), "serviceLife_years", "1e-300");

    [Fact]
    public void A_model_whose_inputs_are_all_fixed_values_is_refused() =>
        AssertRefused(Expression.Replace("{ \"family\": \"Lognormal\", \"mean\": 8, \"cov\": 0.3 }", "8", StringComparison.Ordinal)
            .Replace("{ \"family\": \"Lognormal\", \"mean\": 0.6, \"cov\": 0.5 }", "0.6", StringComparison.Ordinal)
            .Replace("{ \"family\": \"Normal\", \"mean\": 0.8, \"sd\": 0.05 }", "0.8", StringComparison.Ordinal), "$.inputs", "random");

    [Fact]
    public void A_gamma_shape_of_1e_minus_320_is_refused() =>
        AssertRefused(Expression.Replace("\"k_mm\": { \"family\": \"Lognormal\", \"mean\": 0.6, \"cov\": 0.5 }", "\"k_mm\": { \"family\": \"Gamma\", \"shape\": 1e-320, \"scale\": 1 }", StringComparison.Ordinal), "k_mm", "1e-320");

    [Fact]
    public void An_annual_maximum_input_naming_a_fixed_input_is_refused() =>
        AssertRefused(Expression.Replace("\"maximumSize_mm\": 12.7", "\"maximumSize_mm\": 12.7, \"annualMaximumInput\": \"wallThickness_mm\"", StringComparison.Ordinal), "annualMaximumInput", "wallThickness_mm");

    [Fact]
    public void Five_thousand_nested_brackets_are_refused_by_the_nesting_bound() =>
        AssertRefused(Expression.Replace("\"0.8 * wallThickness_mm", "\"" + new string('(', 5000) + "0.8" + new string(')', 5000) + " * wallThickness_mm", StringComparison.Ordinal), "limitState", "at most");

    [Fact]
    public void Thirty_three_nested_brackets_name_the_nesting_bound() =>
        AssertRefused(Expression.Replace("\"0.8 * wallThickness_mm", "\"" + new string('(', 33) + "0.8" + new string(')', 33) + " * wallThickness_mm", StringComparison.Ordinal), "limitState", "nested deeper than 32");

    [Fact]
    public void A_missing_bracket_names_its_position() =>
        AssertRefused(Expression.Replace("\"0.8 * wallThickness_mm - k_mm * pow(max(0, t - initiationTime_years), n)\"", "\"0.8 * wallThickness_mm - k_mm * pow(max(0, t - initiationTime_years, n)\"", StringComparison.Ordinal), "limitState", "position 35");

    [Fact]
    public void Duplicate_keys_are_refused() =>
        AssertRefused(Corrosion.Replace("\"serviceLife_years\": 30,", "\"serviceLife_years\": 30, \"serviceLife_years\": 40,", StringComparison.Ordinal), "serviceLife_years", "duplicate");

    [Fact]
    public void A_null_mechanism_type_gets_a_real_message() =>
        AssertRefused(Corrosion.Replace("\"type\": \"corrosion\"", "\"type\": null", StringComparison.Ordinal), "$.mechanism.type", "null");
}
