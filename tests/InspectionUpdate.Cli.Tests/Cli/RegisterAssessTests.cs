namespace InspectionUpdate.Tests.Cli;

/// <summary>register invent, assess, check on the command line (numbers are carried, not checked, here).</summary>
public sealed class RegisterAssessTests
{
    [Fact]
    [Reference("docs/cli.md: register assess stores each result under its key; a rerun reuses it; register check verifies it")]
    public void Assess_stores_results_a_rerun_reuses_them_and_check_finds_every_key_matching()
    {
        using var cli = new CliRunner();
        Assert.Equal(0, cli.Run("register", "invent", "t.register", "--components", "2", "--recorded", "2025-01-01").ExitCode);
        var first = cli.Run("register", "assess", "-r", "t.register", "--as-of", "2025-06-30", "--route", "first-order", "--json");
        Assert.Contains(first.ExitCode, new[] { 0, 3 });
        var doc = first.Json();
        Assert.Equal(2, doc.GetProperty("components").GetInt32());
        Assert.Equal(2, doc.GetProperty("assessed").GetInt32() + doc.GetProperty("not_converged").GetInt32());
        var again = cli.Run("register", "assess", "-r", "t.register", "--as-of", "2025-06-30", "--route", "first-order", "--json").Json();
        Assert.Equal(2, again.GetProperty("reused").GetInt32());
        var check = cli.Run("register", "check", "-r", "t.register", "--json");
        Assert.Equal(0, check.ExitCode);
        Assert.Equal(2, check.Json().GetProperty("stored_results").GetInt32());
        Assert.Equal(0, check.Json().GetProperty("stale_results").GetArrayLength());
    }

    [Fact]
    [Reference("Project rule: bad input names the field and the value")]
    public void A_shard_index_out_of_range_is_bad_input_naming_it()
    {
        using var cli = new CliRunner();
        cli.Run("register", "invent", "t.register", "--components", "1");
        var run = cli.Run("register", "assess", "-r", "t.register", "--shard", "4/4");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--shard '4'", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("Register identity rule (docs/register.md): a file that is not of its kind is refused and left as it is")]
    public void A_shard_results_file_never_replaces_the_register()
    {
        using var cli = new CliRunner();
        Assert.Equal(0, cli.Run("register", "invent", "t.register", "--components", "1").ExitCode);
        var path = cli.PathOf("t.register");
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        var before = File.ReadAllBytes(path);
        var run = cli.Run("register", "assess", "-r", path, "--shard", "0/2", "--results", path);
        Assert.Equal(4, run.ExitCode);
        Assert.Contains("is a register, not a shard results file", run.Error, StringComparison.Ordinal);
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Assert.Equal(before, File.ReadAllBytes(path));
    }

    [Fact]
    [Reference("Register identity rule (docs/register.md): a file that is not of its kind is refused and left as it is")]
    public void Merge_refuses_a_file_that_is_not_a_shard_results_file_and_leaves_it_as_it_is()
    {
        using var cli = new CliRunner();
        Assert.Equal(0, cli.Run("register", "invent", "t.register", "--components", "1").ExitCode);
        var notes = cli.PathOf("notes.results");
        File.WriteAllText(notes, "field notes, not results");
        var run = cli.Run("register", "merge", notes, "-r", "t.register");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("not a shard results file", run.Error, StringComparison.Ordinal);
        Assert.Equal("field notes, not results", File.ReadAllText(notes));
        var self = cli.Run("register", "merge", cli.PathOf("t.register"), "-r", "t.register");
        Assert.Equal(2, self.ExitCode);
        Assert.Contains("is a register", self.Error, StringComparison.Ordinal);
    }

    [Theory]
    [Reference("docs/cli.md: the command line is strict; a misspelt option names the nearest one")]
    [InlineData("assess", "--frce", "--force")]
    [InlineData("assess", "--target-cv", "--target-cov")]
    [InlineData("invent", "--component", "--components")]
    public void A_misspelt_option_of_the_register_commands_is_refused_with_the_nearest_one(string verb, string given, string nearest)
    {
        using var cli = new CliRunner();
        string[] args = verb == "invent" ? ["register", verb, "x.register", given, "3"] : ["register", verb, given, "-r", "x.register"];
        var run = cli.Run(args);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains($"Did you mean '{nearest}'?", run.Error, StringComparison.Ordinal);
        Assert.False(File.Exists(cli.PathOf("x.register")));
    }

    [Fact]
    [Reference("docs/cli.md: a retired component leaves reports and runs from then on")]
    public void A_retired_component_leaves_register_assess()
    {
        using var cli = new CliRunner();
        Assert.Equal(0, cli.Run("register", "invent", "t.register", "--components", "2", "--recorded", "2025-01-01").ExitCode);
        var code = cli.Run("component", "list", "-r", "t.register", "--json").Json().GetProperty("components")[0].GetProperty("code").GetString()!;
        Assert.Equal(0, cli.Run("component", "retire", code, "--reason", "replaced (invented)", "-r", "t.register").ExitCode);
        var run = cli.Run("register", "assess", "-r", "t.register", "--route", "first-order", "--json");
        Assert.Contains(run.ExitCode, new[] { 0, 3 });
        Assert.Equal(1, run.Json().GetProperty("components").GetInt32());
    }
}
