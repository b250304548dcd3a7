using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>An unknown option or an extra argument is refused (exit 2) with the word named, never ignored (docs/cli.md).</summary>
public sealed class StrictCommandLineTests
{
    [Theory]
    [InlineData("register check --fingerprint-only -r x.register", "--fingerprint-only")]
    [InlineData("site list --foo bar -r x.register", "--foo")]
    [InlineData("component list --sites -r x.register", "--sites")]
    [InlineData("method list --kind x -r x.register", "--kind")]
    [InlineData("finding import a.csv --reason why -r x.register", "--reason")]
    [InlineData("repair log A --size-mm 2 -r x.register", "--size-mm")]
    [InlineData("assess A --samples 10 -r x.register", "--samples")]
    [InlineData("report --format pdf -r x.register", "--format")]
    [InlineData("verify --fast", "--fast")]
    [InlineData("demo --quick", "--quick")]
    public void Unknown_option_is_refused_in_every_command_family_naming_it(string line, string option)
    {
        using var cli = new CliRunner();
        var run = cli.Run(line.Split(' '));
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains($"Unknown option '{option}'", run.Error, StringComparison.Ordinal);
        // Nothing ran: no register was created by a refused command line.
        Assert.False(File.Exists(cli.PathOf("x.register")));
    }

    [Theory]
    [InlineData("plan A --traget-annual-pf 1e-6 -r x.register", "--target-annual-pf")]
    [InlineData("assess A --as-off 2024-01-01 -r x.register", "--as-of")]
    [InlineData("finding log A --sizemm 2 -r x.register", "--size-mm")]
    [InlineData("site add S --nmae North -r x.register", "--name")]
    [InlineData("component add C --modle m.json -r x.register", "--model")]
    [InlineData("method add M --flie m.json -r x.register", "--file")]
    [InlineData("report --ouput out -r x.register", "--out")]
    public void A_misspelt_option_suggests_the_nearest_known_one(string line, string suggestion)
    {
        using var cli = new CliRunner();
        var run = cli.Run(line.Split(' '));
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains($"Did you mean '{suggestion}'?", run.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("site list extra -r x.register", "extra")]
    [InlineData("site add S North Bay -r x.register", "North")]
    [InlineData("register create a.register b.register", "b.register")]
    [InlineData("finding correct 7 8 --reason r -r x.register", "8")]
    public void An_extra_argument_is_refused_naming_it(string line, string word)
    {
        using var cli = new CliRunner();
        var run = cli.Run(line.Split(' '));
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains($"Unexpected argument '{word}'", run.Error, StringComparison.Ordinal);
        Assert.False(File.Exists(cli.PathOf("a.register")));
    }

    [Fact]
    public void A_misspelt_command_suggests_the_nearest_command()
    {
        using var cli = new CliRunner();
        var run = cli.Run("componet", "list");
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("Did you mean 'component'?", run.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("--traget-annual-pf", "--target-annual-pf", 1)]
    [InlineData("abc", "acb", 1)]
    [InlineData("", "abc", 3)]
    public void Edit_distance_counts_insertions_deletions_substitutions_and_swaps(string a, string b, int expected)
    {
        // Optimal string alignment distance, worked by hand (Damerau 1964 transpositions).
        Assert.Equal(expected, StrictCommandLine.Distance(a, b));
    }
}
