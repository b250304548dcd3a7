using System.Data;
using System.Data.Common;
using System.Globalization;
using InspectionUpdate.Register.Schema;
using Npgsql;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    /// <summary>How often a write is tried when PostgreSQL reports a serialization failure or a deadlock.</summary>
    public const int PostgresWriteAttempts = 8;

    private readonly NpgsqlDataSource? _dataSource;

    /// <summary>The database user (PostgreSQL): every row's recorded_by.</summary>
    private readonly string? _databaseUser;

    private RegisterStore(string display, NpgsqlDataSource dataSource, string databaseUser, TimeProvider clock, int schemaVersion, bool readOnly)
    {
        Path = display;
        _dataSource = dataSource;
        _databaseUser = databaseUser;
        _connectionString = "";
        _clock = clock;
        SchemaVersion = schemaVersion;
        IsReadOnly = readOnly;
    }

    /// <summary>
    /// Opens (and if needed creates) a PostgreSQL register named by a URI <c>postgresql://user@host:port/database</c>
    /// (query parameters: <c>sslmode</c>, <c>host</c> for a Unix-socket folder), and migrates its schema forward.
    /// The register lives in the user's current schema (normally <c>public</c>) of that database.
    /// </summary>
    /// <remarks>
    /// The password is taken from the URI only when the URI itself came from an environment variable (the command
    /// line refuses a URI with a password), else from PGPASSWORD, else from the password file (PGPASSFILE or
    /// ~/.pgpass). <see cref="RegisterOpenMode.CreateNew"/> also creates the roles <c>&lt;db&gt;_reader</c>,
    /// <c>&lt;db&gt;_recorder</c> and <c>&lt;db&gt;_modeller</c> (needs CREATEROLE) and grants them their privileges.
    /// Every row's recorded_by is the database user, whatever actor the caller names.
    /// </remarks>
    /// <exception cref="RegisterFileException">The URI is malformed, the server cannot be reached or refuses the login,
    /// the schema holds other tables but no register, no register exists (OpenExisting), one exists (CreateNew), or its
    /// schema is newer than this program's.</exception>
    public static RegisterStore OpenPostgres(string uri, RegisterOpenMode mode = RegisterOpenMode.OpenOrCreate, RegisterOptions? options = null) =>
        OpenPostgres(uri, mode, options, Migrations.Current);

    internal static RegisterStore OpenPostgres(string uri, RegisterOpenMode mode, RegisterOptions? options, int targetVersion)
    {
        var (builder, display) = PostgresConnection(uri);
        options ??= new RegisterOptions();
        var dataSource = NpgsqlDataSource.Create(builder);
        try
        {
            using var connection = dataSource.OpenConnection();
            string user;
            using (var who = new NpgsqlCommand("SELECT session_user", connection))
            {
                user = (string)who.ExecuteScalar()!;
            }

            var version = Migrations.ReadPostgresVersion(connection, null);
            if (version is null)
            {
                var tables = Migrations.PostgresTables(connection);
                if (tables.Count > 0)
                {
                    throw new RegisterFileException($"PostgreSQL database {display} is not a register: its schema holds {tables.Count.ToString(CultureInfo.InvariantCulture)} other tables (e.g. '{tables[0]}') and no schema_migration table; it was left as it is. Create the register in an empty database.");
                }

                if (mode is RegisterOpenMode.OpenExisting or RegisterOpenMode.OpenExistingToRead)
                {
                    throw new RegisterFileException($"PostgreSQL database {display} holds no register; create one with 'register create {display}'.");
                }
            }
            else if (mode == RegisterOpenMode.CreateNew)
            {
                throw new RegisterFileException($"PostgreSQL database {display} already holds a register (schema version {version.Value.ToString(CultureInfo.InvariantCulture)}).");
            }

            if (version > Migrations.Current)
            {
                throw new RegisterFileException(FormattableString.Invariant($"PostgreSQL register {display} has schema version {version}, newer than this program's {Migrations.Current}; use a newer program."));
            }

            var clock = options.Clock ?? TimeProvider.System;
            if (mode == RegisterOpenMode.OpenExistingToRead && version != Migrations.Current)
            {
                throw new RegisterFileException(FormattableString.Invariant(
                    $"PostgreSQL register {display} has schema version {version}; this program reads version {Migrations.Current}. Open it once to write (the owner migrates it), or use the program that wrote it."));
            }

            var store = new RegisterStore(display, dataSource, user, clock, targetVersion, readOnly: false);
            if (mode == RegisterOpenMode.CreateNew)
            {
                try
                {
                    PostgresRoles.Create(connection);
                }
                catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.InsufficientPrivilege)
                {
                    throw new RegisterFileException($"PostgreSQL register {display} was not created: user '{user}' may not create the roles {builder.Database}_reader, _recorder and _modeller ({e.MessageText}). Create it as a user with CREATEROLE (or ask the database administrator); nothing was written.", e);
                }
            }

            if ((version ?? 0) < targetVersion)
            {
                try
                {
                    Migrations.MigratePostgresTo(connection, targetVersion, store.NowText, user);
                }
                catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.InsufficientPrivilege)
                {
                    throw new RegisterFileException(FormattableString.Invariant(
                        $"PostgreSQL register {display} has schema version {version ?? 0} and user '{user}' may not migrate it to {targetVersion} ({e.MessageText}); the register's owner opens it once to migrate it. Nothing was written."), e);
                }
            }

            return store;
        }
        catch (NpgsqlException e)
        {
            dataSource.Dispose();
            throw new RegisterFileException($"PostgreSQL register {display} cannot be opened: {e.Message}", e);
        }
        catch
        {
            dataSource.Dispose();
            throw;
        }
    }

    /// <summary>The database named by a PostgreSQL register URI (the roles are named after it).</summary>
    public static string PostgresDatabase(string uri) => PostgresConnection(uri).Builder.Database ?? "";

    /// <summary>The Npgsql connection string of a register URI (tests and tools that need a raw connection).</summary>
    public static string PostgresConnectionString(string uri) => PostgresConnection(uri).Builder.ConnectionString;

    /// <summary>The login a register URI names (PGUSER or the OS user when the URI names none).</summary>
    public static string PostgresConnectionUser(string uri) => PostgresConnection(uri).Builder.Username ?? "";

    /// <summary>Whether a register URI carries a password (the command line refuses it: ps would show it).</summary>
    public static bool UriHasPassword(string uri) =>
        Uri.TryCreate(uri, UriKind.Absolute, out var u) && u.UserInfo.Contains(':', StringComparison.Ordinal);

    /// <summary>The Npgsql settings of a URI and the URI as shown (never with its password).</summary>
    internal static (NpgsqlConnectionStringBuilder Builder, string Display) PostgresConnection(string uri)
    {
        if (!Uri.TryCreate(uri, UriKind.Absolute, out var u) || !RegisterLocation.IsPostgres(uri))
        {
            throw new RegisterFileException($"'{Redact(uri)}' is not a PostgreSQL URI: expected postgresql://user@host:port/database.");
        }

        var userInfo = u.UserInfo.Split(':', 2);
        var user = Uri.UnescapeDataString(userInfo[0]);
        var database = Uri.UnescapeDataString(u.AbsolutePath.TrimStart('/'));
        var query = System.Web.HttpUtility.ParseQueryString(u.Query);
        var host = query["host"] ?? (string.IsNullOrEmpty(u.Host) ? "localhost" : u.Host);
        var port = u.Port > 0 ? u.Port : 5432;
        if (string.IsNullOrEmpty(database))
        {
            throw new RegisterFileException($"'{Redact(uri)}' names no database: expected postgresql://user@host:port/database.");
        }

        var builder = new NpgsqlConnectionStringBuilder
        {
            Host = host,
            Port = port,
            Database = database,
            Username = string.IsNullOrEmpty(user) ? Environment.GetEnvironmentVariable("PGUSER") ?? Environment.UserName : user,
            ApplicationName = "inspection-update",
            Pooling = true,
            Timeout = 30,
            CommandTimeout = 300,
            IncludeErrorDetail = false,
        };
        if (userInfo.Length == 2) builder.Password = Uri.UnescapeDataString(userInfo[1]);
        else if (Environment.GetEnvironmentVariable("PGPASSWORD") is { Length: > 0 } password) builder.Password = password;
        if (Environment.GetEnvironmentVariable("PGPASSFILE") is { Length: > 0 } passfile) builder.Passfile = passfile;
        if (query["sslmode"] is { } ssl)
        {
            builder.SslMode = Enum.TryParse<SslMode>(ssl.Replace("-", "", StringComparison.Ordinal), ignoreCase: true, out var mode)
                ? mode
                : throw new RegisterFileException($"sslmode '{ssl}' in the register URI is not one of disable, allow, prefer, require, verify-ca, verify-full.");
        }

        var display = FormattableString.Invariant($"postgresql://{Uri.EscapeDataString(builder.Username!)}@{(query["host"] is null ? u.Host : "")}:{port}/{Uri.EscapeDataString(database)}")
            + (query["host"] is { } socket ? "?host=" + socket : "");
        return (builder, display);
    }

    private static string Redact(string uri) =>
        Uri.TryCreate(uri, UriKind.Absolute, out var u) && u.UserInfo.Contains(':', StringComparison.Ordinal)
            ? uri.Replace(u.UserInfo, u.UserInfo.Split(':')[0] + ":***", StringComparison.Ordinal)
            : uri;

    /// <summary>Who records: on PostgreSQL the database user (the actor named by the caller is not used), else the actor.</summary>
    private string Who(string actor) => _databaseUser ?? actor;

    /// <summary>
    /// A write on PostgreSQL: one READ COMMITTED transaction that first takes the register's advisory write lock (so
    /// writers from every machine serialize and validation sees the state it writes into, as SQLite's IMMEDIATE
    /// transaction does), then runs <paramref name="work"/>. A serialization failure or deadlock is retried up to
    /// <see cref="PostgresWriteAttempts"/> times, then reported; a missing privilege is reported at once.
    /// </summary>
    private T PostgresWrite<T>(Func<DbConnection, DbTransaction, (T Result, bool Commit)> work)
    {
        for (var attempt = 1; ; attempt++)
        {
            try
            {
                using var connection = _dataSource!.OpenConnection();
                using var transaction = connection.BeginTransaction(IsolationLevel.ReadCommitted);
                using (var take = new NpgsqlCommand("SELECT pg_advisory_xact_lock(@key)", connection, transaction))
                {
                    take.Parameters.AddWithValue("key", Migrations.WriteLockKey);
                    take.ExecuteNonQuery();
                }

                var (result, commit) = work(connection, transaction);
                if (commit) transaction.Commit();
                else transaction.Rollback();
                return result;
            }
            catch (PostgresException e) when (e.SqlState is PostgresErrorCodes.SerializationFailure or PostgresErrorCodes.DeadlockDetected)
            {
                if (attempt >= PostgresWriteAttempts)
                {
                    throw new RegisterFileException(FormattableString.Invariant(
                        $"PostgreSQL register {Path}: the write met a conflicting write {attempt} times ({e.SqlState}: {e.MessageText}); nothing was written. Try again."), e);
                }

                Thread.Sleep(TimeSpan.FromMilliseconds(Random.Shared.Next(10, 40) * attempt));
            }
            catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.InsufficientPrivilege)
            {
                throw new RegisterFileException(
                    $"PostgreSQL register {Path}: user '{_databaseUser}' may not write this ({e.MessageText}); nothing was written. Writing findings and repairs needs the role {Database}_recorder, models and methods {Database}_modeller.", e);
            }
            catch (NpgsqlException e)
            {
                throw new RegisterFileException($"PostgreSQL register {Path}: {e.Message}; nothing was written.", e);
            }
        }
    }

    private string Database => new NpgsqlConnectionStringBuilder(_dataSource!.ConnectionString).Database ?? "";

    /// <summary>A read on PostgreSQL: one REPEATABLE READ transaction (one snapshot, as SQLite's deferred read).</summary>
    private T PostgresRead<T>(Func<DbConnection, DbTransaction, T> work)
    {
        try
        {
            using var connection = _dataSource!.OpenConnection();
            using var transaction = connection.BeginTransaction(IsolationLevel.RepeatableRead);
            var result = work(connection, transaction);
            transaction.Commit();
            return result;
        }
        catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.InsufficientPrivilege)
        {
            throw new RegisterFileException($"PostgreSQL register {Path}: user '{_databaseUser}' may not read it ({e.MessageText}); reading needs the role {Database}_reader.", e);
        }
        catch (NpgsqlException e)
        {
            throw new RegisterFileException($"PostgreSQL register {Path}: {e.Message}", e);
        }
    }

    /// <summary>
    /// The register check on PostgreSQL: version, triggers, revision chains, unvalidated constraints. Page integrity is
    /// the server's (pg_amcheck), not checked here: IntegrityCheck is reported as "ok" so that the rest decides health.
    /// </summary>
    private static (IReadOnlyList<string> Integrity, IReadOnlyList<string> Foreign, int Version, List<string> Invariants, HashSet<string> Triggers) PostgresCheckFacts(DbConnection c, DbTransaction t)
    {
        var version = Migrations.ReadPostgresVersion(c, t) ?? 0;
        var foreign = Sql.Query(c, t, "SELECT conrelid::regclass::text || ': constraint ' || conname || ' is not validated' FROM pg_constraint WHERE NOT convalidated AND connamespace = current_schema()::regnamespace",
            r => r.GetString(0));
        var triggers = Sql.Query(c, t, "SELECT tgname::text FROM pg_trigger WHERE NOT tgisinternal AND tgenabled <> 'D'", r => r.GetString(0)).ToHashSet(StringComparer.Ordinal);
        return (["ok"], foreign, version, [], triggers);
    }
}
