using InspectionUpdate.Cli.Infrastructure;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Cli;

/// <summary>The command line refuses files that are not registers, untouched, and reads read-only registers.</summary>
public sealed class RegisterFileTests
{
    private static void AssertUntouched(string path, byte[] before)
    {
        SqliteConnection.ClearAllPools();
        Assert.Equal(before, File.ReadAllBytes(path));
        Assert.False(File.Exists(path + "-wal"));
        Assert.False(File.Exists(path + "-shm"));
    }

    [Theory]
    [InlineData("finding", "list")]
    [InlineData("site", "add")]
    [InlineData("register", "check")]
    [InlineData("component", "list")]
    [InlineData("register", "assess")]
    public void A_foreign_sqlite_file_is_refused_with_exit_4_and_left_as_it_was(string noun, string verb)
    {
        using var cli = new CliRunner();
        var path = cli.PathOf("other.sqlite");
        using (var connection = new SqliteConnection($"Data Source={path};Pooling=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = "PRAGMA journal_mode = WAL; CREATE TABLE invoice (id INTEGER PRIMARY KEY, total REAL); INSERT INTO invoice (total) VALUES (12.5);";
            command.ExecuteNonQuery();
        }

        var before = File.ReadAllBytes(path);
        string[] args = verb == "add" ? [noun, verb, "S", "--name", "x", "-r", path] : [noun, verb, "-r", path];
        var run = cli.Run(args);
        Assert.Equal(ExitCodes.RegisterError, run.ExitCode);
        Assert.Contains("not a register", run.Error, StringComparison.Ordinal);
        AssertUntouched(path, before);
    }

    [Fact]
    public void An_empty_file_is_refused_and_stays_empty()
    {
        using var cli = new CliRunner();
        var path = cli.PathOf("empty.register");
        File.WriteAllBytes(path, []);
        var run = cli.Run("site", "list", "-r", path);
        Assert.Equal(ExitCodes.RegisterError, run.ExitCode);
        Assert.Contains("is empty", run.Error, StringComparison.Ordinal);
        AssertUntouched(path, []);
    }

    [Fact]
    public void Register_create_refuses_to_overwrite_an_existing_file()
    {
        using var cli = new CliRunner();
        var path = cli.PathOf("notes.txt");
        File.WriteAllText(path, "field notes, not a register");
        var before = File.ReadAllBytes(path);
        var run = cli.Run("register", "create", path);
        Assert.Equal(ExitCodes.RegisterError, run.ExitCode);
        Assert.Contains("already exists", run.Error, StringComparison.Ordinal);
        AssertUntouched(path, before);
    }

    [Fact]
    public void A_read_only_register_is_read_and_a_write_fails_with_exit_4()
    {
        if (OperatingSystem.IsWindows()) return; // Unix file modes.
        using var cli = new CliRunner();
        var path = cli.PathOf("ro.register");
        Assert.Equal(ExitCodes.Ok, cli.Run("register", "create", path).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "NORTH", "--name", "North (invented)", "-r", path).ExitCode);
        SqliteConnection.ClearAllPools();
        File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.GroupRead | UnixFileMode.OtherRead);
        try
        {
            var before = File.ReadAllBytes(path);
            var list = cli.Run("site", "list", "-r", path, "--json");
            Assert.Equal(ExitCodes.Ok, list.ExitCode);
            Assert.Equal("NORTH", list.Json().GetProperty("sites")[0].GetProperty("code").GetString());
            Assert.Equal(ExitCodes.Ok, cli.Run("register", "check", "-r", path).ExitCode);
            var add = cli.Run("site", "add", "SOUTH", "--name", "South (invented)", "-r", path);
            Assert.Equal(ExitCodes.RegisterError, add.ExitCode);
            Assert.Contains("read-only", add.Error, StringComparison.Ordinal);
            AssertUntouched(path, before);
        }
        finally
        {
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        }
    }
}
