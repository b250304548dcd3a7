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
}
