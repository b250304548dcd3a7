using System.Globalization;
using InspectionUpdate.Register.Schema;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Register;

/// <summary>How <see cref="RegisterStore.Open"/> treats the file.</summary>
public enum RegisterOpenMode
{
    /// <summary>Open the file if it exists (it must be a register), else create it.</summary>
    OpenOrCreate,

    /// <summary>The file must exist.</summary>
    OpenExisting,

    /// <summary>The file must not exist; it is created.</summary>
    CreateNew,

    /// <summary>
    /// The file must exist and the caller only reads: a register that cannot be written (file mode without write
    /// permission, read-only file system) is opened read-only instead of refused; every write on it then fails with
    /// <see cref="RegisterFileException"/>.
    /// </summary>
    OpenExistingToRead,
}

/// <summary>Options of a register connection.</summary>
/// <param name="Clock">Source of "now" for recorded times (UTC); the system clock when null. Tests pass a fixed clock.</param>
/// <param name="BusyTimeout">How long a writer waits for another process's write lock before failing.</param>
public sealed record RegisterOptions(TimeProvider? Clock = null, TimeSpan? BusyTimeout = null);

/// <summary>Raised when the register file cannot be used (newer schema, not a register, missing file).</summary>
public sealed class RegisterFileException : Exception
{
    /// <summary>Creates the exception with a message naming the file.</summary>
    public RegisterFileException(string message, Exception? inner = null) : base(message, inner)
    {
    }
}

/// <summary>
/// The inspection register: one SQLite file holding sites, components (with their model definitions), inspection
/// methods, findings, repairs and an audit trail. Findings and repairs are append-only: a correction is a new revision
/// that supersedes the old one, with who, when and why; reads can be made "as known on" any instant.
/// </summary>
/// <remarks>
/// Every write runs in one IMMEDIATE transaction (the write lock is taken before any validation read, so concurrent
/// writers from several processes serialize and validation sees the state it writes into). Connections enable
/// foreign keys, a busy timeout and synchronous=FULL; the file is in WAL mode. All SQL is parameterized. The instance
/// is thread-safe: each operation opens its own pooled connection. Dispose it to release the pool (and the file).
/// </remarks>
public sealed partial class RegisterStore : IRegister
{
    private const string Actor = "inspection-update";
    private readonly string _connectionString;
    private readonly TimeProvider _clock;
    private readonly int _busyTimeoutMs;

    private RegisterStore(string path, string connectionString, TimeProvider clock, int busyTimeoutMs, int schemaVersion, bool readOnly = false)
    {
        IsReadOnly = readOnly;
        Path = path;
        _connectionString = connectionString;
        _clock = clock;
        _busyTimeoutMs = busyTimeoutMs;
        SchemaVersion = schemaVersion;
    }

    /// <summary>The schema version this code reads and writes.</summary>
    public static int CurrentSchemaVersion => Migrations.Current;

    /// <summary>Which database holds the register.</summary>
    public RegisterStoreKind Kind => _dataSource is null ? RegisterStoreKind.Sqlite : RegisterStoreKind.PostgreSql;

    /// <summary>Full path of the register file.</summary>
    public string Path { get; }

    /// <summary>Whether the register was opened read-only (its file or file system cannot be written).</summary>
    public bool IsReadOnly { get; }

    /// <summary>Schema version of the file after opening (always <see cref="CurrentSchemaVersion"/>).</summary>
    public int SchemaVersion { get; }

    /// <summary>
    /// Opens (and if needed creates) a register, switches it to WAL mode and migrates its schema forward to
    /// <see cref="CurrentSchemaVersion"/>.
    /// </summary>
    /// <exception cref="RegisterFileException">The file is missing (OpenExisting), exists (CreateNew), is empty, is not a
    /// SQLite database, is a SQLite database but not a register (application id and tables), or has a negative or
    /// newer schema version than this program. A refused file is left as it was: same bytes, no side files.</exception>
    public static RegisterStore Open(string path, RegisterOpenMode mode = RegisterOpenMode.OpenOrCreate, RegisterOptions? options = null) =>
        Open(path, mode, options, Migrations.Current);

    /// <summary>Opens and migrates only up to <paramref name="targetVersion"/> (tests of the migrations).</summary>
    internal static RegisterStore Open(string path, RegisterOpenMode mode, RegisterOptions? options, int targetVersion)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var full = System.IO.Path.GetFullPath(path);
        var exists = File.Exists(full);
        if (mode is RegisterOpenMode.OpenExisting or RegisterOpenMode.OpenExistingToRead && !exists)
        {
            throw new RegisterFileException($"Register file '{full}' does not exist.");
        }

        if (mode == RegisterOpenMode.CreateNew && exists)
        {
            throw new RegisterFileException($"Register file '{full}' already exists.");
        }

        // Identity first, from the bytes alone: nothing that is not a register is ever opened for writing.
        var header = exists ? RegisterIdentity.Require(full) : default;
        if (exists && header.UserVersion > Migrations.Current) throw Newer(full, header.UserVersion);

        options ??= new RegisterOptions();
        if (exists && !Writable(full))
        {
            if (mode == RegisterOpenMode.OpenExistingToRead) return OpenReadOnly(full, options, header.UserVersion);
            throw ReadOnly(full);
        }

        var busy = (int)(options.BusyTimeout ?? TimeSpan.FromSeconds(30)).TotalMilliseconds;
        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = full,
            Mode = SqliteOpenMode.ReadWriteCreate,
            ForeignKeys = true,
            Pooling = true,
            DefaultTimeout = Math.Max(1, busy / 1000),
        };
        var clock = options.Clock ?? TimeProvider.System;
        var store = new RegisterStore(full, builder.ToString(), clock, busy, targetVersion);
        try
        {
            using var connection = (SqliteConnection)store.Connect();
            using (var wal = connection.CreateCommand())
            {
                wal.CommandText = "PRAGMA journal_mode = WAL";
                var journal = Convert.ToString(wal.ExecuteScalar(), CultureInfo.InvariantCulture);
                if (!string.Equals(journal, "wal", StringComparison.OrdinalIgnoreCase))
                {
                    throw new RegisterFileException($"Register file '{full}' could not be switched to WAL mode (journal mode is '{journal}').");
                }
            }

            var version = Migrations.ReadVersion(connection);
            if (version > Migrations.Current) throw Newer(full, version);
            if (version < 0) throw new RegisterFileException(FormattableString.Invariant($"Register file '{full}' has schema version {version}, which no program writes; it was left as it is."));

            Migrations.MigrateTo(connection, targetVersion, () => store.NowText(), Actor);
            return store;
        }
        catch (SqliteException e)
        {
            store.Dispose();
            throw new RegisterFileException($"Register file '{full}' cannot be opened as a register: {e.Message}", e);
        }
        catch
        {
            store.Dispose();
            throw;
        }
    }

    private static RegisterFileException ReadOnly(string full) =>
        new($"Register file '{full}' is read-only (its file mode or file system does not allow writing): nothing was written. Read commands work on it; write where the file can be written.");

    private static RegisterFileException Newer(string full, int version) =>
        new(FormattableString.Invariant($"Register file '{full}' has schema version {version}, newer than this program's {Migrations.Current}; use a newer program."));

    /// <summary>
    /// Whether the file may be written: its mode grants the owner write permission (checked from the mode, so that a
    /// 0444 file is read-only even for a superuser) and it opens for writing (a read-only file system refuses).
    /// Opening for writing changes neither the bytes nor the times of the file.
    /// </summary>
    private static bool Writable(string full)
    {
        try
        {
            if (OperatingSystem.IsWindows())
            {
                if (File.GetAttributes(full).HasFlag(FileAttributes.ReadOnly)) return false;
            }
            else if ((File.GetUnixFileMode(full) & UnixFileMode.UserWrite) == 0)
            {
                return false;
            }

            using var probe = new FileStream(full, FileMode.Open, FileAccess.ReadWrite, FileShare.ReadWrite | FileShare.Delete);
            return true;
        }
        catch (Exception e) when (e is UnauthorizedAccessException or IOException)
        {
            return false;
        }
    }

    /// <summary>A read-only register: immutable reads when no -wal file exists, else read-only reads through it.</summary>
    private static RegisterStore OpenReadOnly(string full, RegisterOptions options, int version)
    {
        if (version != Migrations.Current)
        {
            throw new RegisterFileException(FormattableString.Invariant(
                $"Register file '{full}' is read-only and has schema version {version}; this program reads version {Migrations.Current}. Open it once where it can be written (it is then migrated), or use the program that wrote it."));
        }

        var connectionString = File.Exists(full + "-wal")
            ? new SqliteConnectionStringBuilder { DataSource = full, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString()
            : RegisterIdentity.ImmutableConnectionString(full);
        var busy = (int)(options.BusyTimeout ?? TimeSpan.FromSeconds(30)).TotalMilliseconds;
        var store = new RegisterStore(full, connectionString, options.Clock ?? TimeProvider.System, busy, version, readOnly: true);
        try
        {
            using var connection = store.Connect();
            return store;
        }
        catch (SqliteException e)
        {
            throw new RegisterFileException($"Register file '{full}' is read-only and cannot be read: {e.Message}", e);
        }
    }

    /// <summary>The end of a calendar day in UTC, for "as known on" reads: everything recorded on or before that day.</summary>
    public static DateTimeOffset EndOfDay(DateOnly date) =>
        new DateTimeOffset(date.AddDays(1).ToDateTime(TimeOnly.MinValue), TimeSpan.Zero).AddTicks(-1);

    /// <summary>Releases pooled connections to the file (or the PostgreSQL data source).</summary>
    public void Dispose()
    {
        if (_dataSource is not null)
        {
            _dataSource.Dispose();
            return;
        }

        using var connection = new SqliteConnection(_connectionString);
        SqliteConnection.ClearPool(connection);
    }

    internal System.Data.Common.DbConnection Connect()
    {
        if (_dataSource is not null) return _dataSource.OpenConnection();
        var connection = new SqliteConnection(_connectionString);
        connection.Open();
        using var command = connection.CreateCommand();
        // Integers formatted by the program, not user data.
        command.CommandText = IsReadOnly
            ? string.Create(CultureInfo.InvariantCulture, $"PRAGMA busy_timeout = {_busyTimeoutMs};")
            : string.Create(CultureInfo.InvariantCulture, $"PRAGMA busy_timeout = {_busyTimeoutMs}; PRAGMA synchronous = FULL; PRAGMA foreign_keys = ON;");
        command.ExecuteNonQuery();
        return connection;
    }

    /// <summary>Runs <paramref name="work"/> in one IMMEDIATE write transaction; commits only when it returns a value to keep.</summary>
    internal T Write<T>(Func<System.Data.Common.DbConnection, System.Data.Common.DbTransaction, (T Result, bool Commit)> work)
    {
        if (IsReadOnly)
        {
            throw ReadOnly(Path);
        }

        if (_dataSource is not null) return PostgresWrite(work);

        using var connection = (SqliteConnection)Connect();
        using var transaction = connection.BeginTransaction(deferred: false);
        var (result, commit) = work(connection, transaction);
        if (commit)
        {
            transaction.Commit();
        }
        else
        {
            transaction.Rollback();
        }

        return result;
    }

    /// <summary>Runs a read in one snapshot (deferred transaction).</summary>
    internal T Read<T>(Func<System.Data.Common.DbConnection, System.Data.Common.DbTransaction, T> work)
    {
        if (_dataSource is not null) return PostgresRead(work);
        using var connection = (SqliteConnection)Connect();
        using var transaction = connection.BeginTransaction(deferred: true);
        var result = work(connection, transaction);
        transaction.Commit();
        return result;
    }

    internal DateTimeOffset Now() => _clock.GetUtcNow().ToUniversalTime();

    internal string NowText() => Sql.Utc(Now());
}
