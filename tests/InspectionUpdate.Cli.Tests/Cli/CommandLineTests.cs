using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

public sealed class CommandLineTests
{
    [Theory]
    [InlineData("register", "create")]
    [InlineData("register", "check")]
    [InlineData("site", "add")]
    [InlineData("site", "list")]
    [InlineData("component", "add")]
    [InlineData("component", "list")]
    [InlineData("method", "add")]
    [InlineData("method", "fit")]
    [InlineData("method", "list")]
    [InlineData("finding", "log")]
    [InlineData("finding", "import")]
    [InlineData("finding", "correct")]
    [InlineData("finding", "list")]
    [InlineData("repair", "log")]
    [InlineData("assess", null)]
    [InlineData("plan", null)]
    [InlineData("report", null)]
    [InlineData("verify", null)]
    [InlineData("demo", null)]
    public void Every_command_has_help_with_an_example_and_the_json_option(string noun, string? verb)
    {
        using var cli = new CliRunner();
        var run = verb is null ? cli.Run(noun, "--help") : cli.Run(noun, verb, "--help");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Contains("EXAMPLES:", run.Output, StringComparison.Ordinal);
        Assert.Contains("--json", run.Output, StringComparison.Ordinal);
        Assert.Contains("inspection-update " + noun, run.Output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("site", "add")]
    [InlineData("component", "add")]
    [InlineData("finding", "log")]
    [InlineData("finding", "correct")]
    [InlineData("finding", "list")]
    [InlineData("repair", "log")]
    [InlineData("method", "fit")]
    [InlineData("assess", null)]
    [InlineData("plan", null)]
    [InlineData("report", null)]
    public void Help_examples_split_by_a_shell_give_each_option_at_most_one_value(string noun, string? verb)
    {
        using var cli = new CliRunner();
        var help = (verb is null ? cli.Run(noun, "--help") : cli.Run(noun, verb, "--help")).Output;
        var examples = help.Split('\n').SkipWhile(l => !l.StartsWith("EXAMPLES:", StringComparison.Ordinal)).Skip(1)
            .TakeWhile(l => l.Trim().Length > 0).Select(l => l.Trim()).Where(l => l.StartsWith("inspection-update", StringComparison.Ordinal)).ToArray();
        Assert.NotEmpty(examples);
        foreach (var example in examples)
        {
            var words = ShellWords(example);
            // After the first option, an option takes at most one value: a multi-word value must be quoted.
            var values = 0;
            foreach (var w in words.SkipWhile(w => !w.StartsWith('-')))
            {
                values = w.StartsWith('-') ? 0 : values + 1;
                Assert.True(values <= 1, $"'{w}' is a stray word in the example: {example}");
            }
        }
    }

    [Theory]
    [InlineData("log")]
    [InlineData("correct")]
    public void Finding_outcome_help_lists_every_outcome_the_command_accepts(string verb)
    {
        using var cli = new CliRunner();
        var help = System.Text.RegularExpressions.Regex.Replace(cli.Run("finding", verb, "--help").Output, @"\s+", " ");
        var accepted = InspectionUpdate.Cli.Commands.FindingText.Outcomes
            .Concat(Enum.GetValues<InspectionUpdate.Register.FindingKind>().Select(InspectionUpdate.Register.RegisterStore.KindText));
        foreach (var outcome in accepted)
        {
            Assert.Contains(outcome, help, StringComparison.Ordinal);
            // Every listed word is one the command takes.
            _ = InspectionUpdate.Cli.Commands.FindingText.Kind(outcome);
        }
    }

    [Fact]
    public void Model_version_help_claims_no_field_the_model_file_schema_lacks()
    {
        using var cli = new CliRunner();
        var help = cli.Run("component", "add", "--help").Output;
        Assert.DoesNotContain("\"version\" field", help, StringComparison.Ordinal);
        var folder = new DirectoryInfo(AppContext.BaseDirectory);
        while (folder is not null && !File.Exists(Path.Combine(folder.FullName, "docs", "schema", "component-model.schema.json"))) folder = folder.Parent;
        Assert.NotNull(folder);
        var schema = File.ReadAllText(Path.Combine(folder.FullName, "docs", "schema", "component-model.schema.json"));
        Assert.DoesNotContain("\"version\"", schema, StringComparison.Ordinal);
    }

    private static List<string> ShellWords(string line)
    {
        var words = new List<string>();
        var current = new System.Text.StringBuilder();
        char? quote = null;
        var inWord = false;
        foreach (var c in line)
        {
            if (quote is { } q)
            {
                if (c == q) quote = null;
                else current.Append(c);
            }
            else if (c is '"' or '\'')
            {
                quote = c;
                inWord = true;
            }
            else if (char.IsWhiteSpace(c))
            {
                if (inWord) words.Add(current.ToString());
                current.Clear();
                inWord = false;
            }
            else
            {
                current.Append(c);
                inWord = true;
            }
        }

        if (inWord) words.Add(current.ToString());
        return words;
    }

    [Fact]
    public void Unknown_command_is_bad_input_with_one_sentence_and_no_stack_trace()
    {
        using var cli = new CliRunner();
        var run = cli.Run("inspect-everything");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Single(run.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.DoesNotContain("   at ", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Invalid_option_value_names_the_option_and_the_value()
    {
        using var cli = new CliRunner();
        var run = cli.Run("plan", "--model", "m.json", "--target-annual-pf", "1.5");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--target-annual-pf '1.5'", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Assess_needs_a_component_or_a_model_file()
    {
        using var cli = new CliRunner();
        var run = cli.Run("assess");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--model", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void Register_commands_without_a_register_name_it_as_missing()
    {
        using var cli = new CliRunner();
        Environment.SetEnvironmentVariable(RegisterSettings.EnvironmentVariable, null);
        var run = cli.Run("site", "list", "--json");
        Assert.True(run.ExitCode is ExitCodes.BadInput or ExitCodes.NotAvailable, run.Error);
        var error = run.Json().GetProperty("error");
        Assert.Equal(run.ExitCode, error.GetProperty("exit_code").GetInt32());
        Assert.False(string.IsNullOrWhiteSpace(error.GetProperty("message").GetString()));
    }

    [Fact]
    public void Exit_code_names_are_stable()
    {
        // The names are part of the documented --json error document (docs/cli.md).
        Assert.Equal("bad_input", ExitCodes.Name(ExitCodes.BadInput));
        Assert.Equal("not_converged", ExitCodes.Name(ExitCodes.NotConverged));
        Assert.Equal("register_error", ExitCodes.Name(ExitCodes.RegisterError));
        Assert.Equal("not_available", ExitCodes.Name(ExitCodes.NotAvailable));
        Assert.Equal("verification_failed", ExitCodes.Name(ExitCodes.VerificationFailed));
    }
}

public sealed class OptionErrorTests
{
    [Fact]
    public void A_value_that_is_not_a_number_is_reported_with_its_option()
    {
        using var cli = new CliRunner();
        var run = cli.Run("assess", "--model", "m.json", "--horizon-years", "abc");
        Assert.Equal(InspectionUpdate.Cli.Infrastructure.ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--horizon-years 'abc' is not", run.Error, StringComparison.Ordinal);
    }
}
