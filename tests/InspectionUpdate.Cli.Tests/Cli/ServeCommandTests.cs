using InspectionUpdate.Cli.Commands;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary><c>serve</c>: the loopback address by default, another only when asked (with a warning), a bad register refused before listening.</summary>
public sealed class ServeCommandTests
{
    [Theory]
    [InlineData(null, 5080, "http://127.0.0.1:5080", false)]
    [InlineData("127.0.0.1", 0, "http://127.0.0.1:0", false)]
    [InlineData("::1", 8080, "http://[::1]:8080", false)]
    [InlineData("0.0.0.0", 8080, "http://0.0.0.0:8080", true)]
    [InlineData("192.0.2.10", 8080, "http://192.0.2.10:8080", true)]
    [Reference("RFC 1122, 3.2.1.3 (127/8 is loopback) and RFC 4291, 2.5.3 (::1); 192.0.2.0/24 is documentation space (RFC 5737)")]
    public void Listens_on_the_loopback_address_unless_told_otherwise(string? listen, int port, string url, bool exposed)
    {
        Assert.Equal((url, exposed), ServeCommand.Address(listen, port));
    }

    [Theory]
    [InlineData("localhost-ish", 5080, "--listen")]
    [InlineData("127.0.0.1", 70000, "--port")]
    [Reference("docs/cli.md: bad input names the option and the value")]
    public void A_bad_address_or_port_is_bad_input_naming_the_option(string listen, int port, string option)
    {
        var e = Assert.Throws<CliException>(() => ServeCommand.Address(listen, port));
        Assert.Contains(option, e.Message, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("docs/cli.md, exit codes: 4 register_error for a missing register")]
    public void A_missing_register_is_refused_before_anything_listens()
    {
        using var cli = new CliRunner();
        var run = cli.Run("serve", "-r", cli.PathOf("missing.register"), "--port", "0");
        Assert.Equal(ExitCodes.RegisterError, run.ExitCode);
        Assert.Contains("does not exist", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("docs/cli.md: every command has help with an example")]
    public void Serve_has_help_with_examples()
    {
        using var cli = new CliRunner();
        var run = cli.Run("serve", "--help");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        Assert.Contains("EXAMPLES:", run.Output, StringComparison.Ordinal);
        Assert.Contains("--listen", run.Output, StringComparison.Ordinal);
    }
}
