using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

/// <summary>A register knows itself (PRAGMA application_id); anything else is refused and left exactly as it was.</summary>
public sealed class IdentityTests
{
    private const int RegisterApplicationId = 0x49555247;

    private static object? Pragma(string path, string pragma)
    {
        using var connection = new SqliteConnection($"Data Source={path};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA " + pragma;
        return command.ExecuteScalar();
    }

    private static void Execute(string path, string sql)
    {
        using var connection = new SqliteConnection($"Data Source={path};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    private static void AssertRefusedUntouched(string path, RegisterOpenMode mode, string expected)
    {
        var before = File.ReadAllBytes(path);
        var e = Assert.Throws<RegisterFileException>(() => RegisterStore.Open(path, mode));
        Assert.Contains(expected, e.Message, StringComparison.Ordinal);
        Assert.Contains(path, e.Message, StringComparison.Ordinal);
        SqliteConnection.ClearAllPools();
        Assert.Equal(before, File.ReadAllBytes(path));
        Assert.False(File.Exists(path + "-wal"), "a -wal file was left beside the refused file");
        Assert.False(File.Exists(path + "-shm"), "a -shm file was left beside the refused file");
        Assert.False(File.Exists(path + "-journal"), "a -journal file was left beside the refused file");
    }

    [Theory]
    [InlineData(RegisterOpenMode.OpenExisting)]
    [InlineData(RegisterOpenMode.OpenOrCreate)]
    [InlineData(RegisterOpenMode.OpenExistingToRead)]
    [Reference("Design rule: only 'register create' creates a register; an empty file is not one")]
    public void An_empty_file_is_refused_and_left_empty(RegisterOpenMode mode)
    {
        var path = TestRegister.TempPath();
        try
        {
            File.WriteAllBytes(path, []);
            AssertRefusedUntouched(path, mode, "is empty");
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Theory]
    [InlineData("DELETE")]
    [InlineData("WAL")]
    [Reference("SQLite file format §1.3: application id at header offset 68; a database of another application is not a register")]
    public void A_sqlite_database_of_another_program_is_refused_byte_for_byte_untouched(string journalMode)
    {
        var path = TestRegister.TempPath();
        try
        {
            Execute(path, $"PRAGMA journal_mode = {journalMode}; CREATE TABLE orders (id INTEGER PRIMARY KEY, item TEXT); INSERT INTO orders (item) VALUES ('valve');");
            AssertRefusedUntouched(path, RegisterOpenMode.OpenExisting, "not a register");
            AssertRefusedUntouched(path, RegisterOpenMode.OpenExistingToRead, "not a register");
            Execute(path, "PRAGMA application_id = 1234");
            AssertRefusedUntouched(path, RegisterOpenMode.OpenExisting, "another application");
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Design rule: a SQLite file without tables or application id is not a register either")]
    public void An_empty_sqlite_database_is_refused()
    {
        var path = TestRegister.TempPath();
        try
        {
            Execute(path, "PRAGMA user_version = 0; VACUUM;");
            Assert.True(new FileInfo(path).Length > 0);
            AssertRefusedUntouched(path, RegisterOpenMode.OpenOrCreate, "not a register");
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Theory]
    [InlineData(-1)]
    [InlineData(int.MinValue)]
    [Reference("SQLite PRAGMA user_version is a signed 32-bit integer; no register writes a negative one")]
    public void A_negative_schema_version_is_refused_cleanly(int version)
    {
        var path = TestRegister.TempPath();
        try
        {
            using (RegisterStore.Open(path, RegisterOpenMode.CreateNew))
            {
            }

            SqliteConnection.ClearAllPools();
            Execute(path, $"PRAGMA user_version = {version}; PRAGMA journal_mode = DELETE;");
            AssertRefusedUntouched(path, RegisterOpenMode.OpenExisting, $"schema version {version}");
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Design rule: a new register carries the register's application id ('IURG')")]
    public void A_new_register_carries_the_application_id()
    {
        using var r = new TestRegister(seed: false);
        Assert.Equal((long)RegisterApplicationId, Pragma(r.Path, "application_id"));
    }

    [Theory]
    [Reference("Design rule: registers written before the application id (schema 1, 2 and 3) are recognised by their tables and migrated")]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void A_register_written_before_the_application_id_is_opened_and_given_it(int version)
    {
        var path = TestRegister.TempPath();
        try
        {
            using (RegisterStore.Open(path, RegisterOpenMode.CreateNew, null, targetVersion: version))
            {
            }

            SqliteConnection.ClearAllPools();
            Execute(path, "PRAGMA application_id = 0");
            using var store = RegisterStore.Open(path, RegisterOpenMode.OpenExisting);
            Assert.Equal(RegisterStore.CurrentSchemaVersion, store.SchemaVersion);
            Assert.Equal((long)RegisterApplicationId, Pragma(path, "application_id"));
            Assert.True(store.Check().IsHealthy, string.Join("; ", store.Check().InvariantViolations));
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Design rule: a read-only register (mode 0444) opens read-only for reading; writes fail and change nothing")]
    public void A_read_only_register_is_read_and_refuses_writes_untouched()
    {
        if (OperatingSystem.IsWindows()) return; // Unix file modes; Windows uses the read-only attribute (same code path).
        var path = TestRegister.TempPath();
        try
        {
            using (var writer = RegisterStore.Open(path, RegisterOpenMode.CreateNew))
            {
                TestRegister.Seed(writer);
            }

            SqliteConnection.ClearAllPools();
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.GroupRead | UnixFileMode.OtherRead);
            var before = File.ReadAllBytes(path);
            using (var store = RegisterStore.Open(path, RegisterOpenMode.OpenExistingToRead))
            {
                Assert.True(store.IsReadOnly);
                Assert.Equal(2, store.Components().Count);
                Assert.True(store.Check().IsHealthy);
                var e = Assert.Throws<RegisterFileException>(() => store.AddSite(new NewSite("SOUTH", "South (invented)"), "tester"));
                Assert.Contains("read-only", e.Message, StringComparison.Ordinal);
            }

            SqliteConnection.ClearAllPools();
            Assert.Equal(before, File.ReadAllBytes(path));
            Assert.False(File.Exists(path + "-wal"));
            Assert.False(File.Exists(path + "-shm"));
        }
        finally
        {
            if (File.Exists(path)) File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite);
            TestRegister.Delete(path);
        }
    }
}
