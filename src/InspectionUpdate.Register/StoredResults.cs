using System.Data.Common;
using System.Globalization;
using InspectionUpdate.Register.Schema;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Register;

/// <summary>Outcome of one component in a whole-register run.</summary>
public enum ResultStatus
{
    /// <summary>Assessed and planned; every number converged.</summary>
    Assessed,

    /// <summary>Assessed and planned; at least one number did not converge (flagged, kept).</summary>
    NotConverged,

    /// <summary>Could not be assessed; <see cref="StoredResult.Error"/> says why.</summary>
    Failed,
}

/// <summary>
/// One component's stored result: what it was computed from (the key) and the numbers a register report needs.
/// Stored results are results, not evidence: they never change a finding, and a rerun replaces them.
/// </summary>
/// <param name="ComponentId">Register id of the component.</param>
/// <param name="ComponentCode">Component code.</param>
/// <param name="SiteCode">Site code.</param>
/// <param name="AsOf">Evidence date of the run.</param>
/// <param name="OptionsKey">Canonical text of the run options that change numbers.</param>
/// <param name="ModelRevision">Revision of the component's model the result was computed with.</param>
/// <param name="ComponentFingerprint">The component's fingerprint as known on <paramref name="AsOf"/> (<see cref="RegisterStore.ComponentFingerprint"/>).</param>
/// <param name="ToolVersion">Tool version and build identity that computed it.</param>
/// <param name="ResultKey">SHA-256 (hex) over the key fields above.</param>
/// <param name="Status">Assessed, not converged, or failed.</param>
/// <param name="Error">Why it failed, or null.</param>
/// <param name="ComputedUtc">When it was computed.</param>
public sealed record StoredResult(long ComponentId, string ComponentCode, string SiteCode, DateOnly AsOf, string OptionsKey, int ModelRevision,
    string ComponentFingerprint, string ToolVersion, string ResultKey, ResultStatus Status, string? Error, DateTimeOffset ComputedUtc)
{
    /// <summary>Updated (or prior, without evidence) annual failure probability ΔPf of the grid year ending at the first grid time at or after the evidence date.</summary>
    public double? AnnualPf { get; init; }

    /// <summary>End date of that grid year.</summary>
    public DateOnly? AnnualPfYearEnding { get; init; }

    /// <summary>Cumulative Pf at that grid time.</summary>
    public double? CumulativePf { get; init; }

    /// <summary>Reliability index β at that grid time (±99 for Pf of 0 or 1).</summary>
    public double? Beta { get; init; }

    /// <summary>Route key of that number (e.g. first-order).</summary>
    public string? Route { get; init; }

    /// <summary>True when every number of the profiles and the plan converged.</summary>
    public bool Converged { get; init; }

    /// <summary>CoV of that number when simulated.</summary>
    public double? Cov { get; init; }

    /// <summary>Latest date of the next inspection.</summary>
    public DateOnly? NextDue { get; init; }

    /// <summary>Status of the next-inspection search (snake_case of the planner's status).</summary>
    public string? NextStatus { get; init; }

    /// <summary>Years from the evidence date until the annual Pf reaches the target (null when not planned or not reached).</summary>
    public double? YearsToTarget { get; init; }

    /// <summary>Whether the target is reached before the horizon (null when not planned).</summary>
    public bool? TargetReached { get; init; }

    /// <summary>Remaining life against the cumulative limit, when the plan has one.</summary>
    public double? RemainingLifeYears { get; init; }

    /// <summary>Prior and updated profiles as JSON (null when failed or when read without profiles).</summary>
    public string? ProfilesJson { get; init; }
}

/// <summary>Where a run writes its results: the register, or a shard results file.</summary>
public interface IResultSink
{
    /// <summary>Writes a batch in one transaction, replacing rows of the same component, date and options.</summary>
    void Save(IReadOnlyList<StoredResult> batch);
}

/// <summary>Reading and writing the component_result table (in the register or in a shard results file).</summary>
internal static class ResultRows
{
    private const string Columns =
        "component_id, component_code, site_code, as_of, options_key, model_revision, component_fingerprint, tool_version, result_key, status, error, " +
        "annual_pf, annual_pf_year_ending, cumulative_pf, beta, route, converged, cov, next_due, next_status, years_to_target, target_reached, remaining_life_years, profiles_json, computed_utc";

    public static string StatusText(ResultStatus s) => s switch
    {
        ResultStatus.Assessed => "assessed",
        ResultStatus.NotConverged => "not-converged",
        _ => "failed",
    };

    private static ResultStatus ParseStatus(string s) => s switch
    {
        "assessed" => ResultStatus.Assessed,
        "not-converged" => ResultStatus.NotConverged,
        _ => ResultStatus.Failed,
    };

    public static void Save(DbConnection c, DbTransaction t, IReadOnlyList<StoredResult> batch)
    {
        // Column list and placeholders are constants of this class; every value is a parameter.
        var names = Columns.Split(", ");
        var postgres = Sql.IsPostgres(c);
        var values = $"VALUES ({string.Join(", ", names.Select(n => "$" + n))})";
        // SQLite replaces the row; PostgreSQL spells the same as an upsert on the primary key.
        var sql = postgres
            ? $"INSERT INTO component_result ({Columns}) {values} ON CONFLICT (component_id, as_of, options_key) DO UPDATE SET " +
              string.Join(", ", names.Where(n => n is not ("component_id" or "as_of" or "options_key")).Select(n => $"{n} = excluded.{n}"))
            : $"INSERT OR REPLACE INTO component_result ({Columns}) {values}";
        foreach (var r in batch)
        {
            object? D(DateOnly? d) => d is { } v ? Sql.Date(v) : null;
            object?[] row =
            [
                r.ComponentId, r.ComponentCode, r.SiteCode, Sql.Date(r.AsOf), r.OptionsKey, r.ModelRevision, r.ComponentFingerprint, r.ToolVersion, r.ResultKey,
                StatusText(r.Status), r.Error, r.AnnualPf, D(r.AnnualPfYearEnding), r.CumulativePf, r.Beta, r.Route, r.Converged ? 1 : 0, r.Cov, D(r.NextDue), r.NextStatus,
                r.YearsToTarget, r.TargetReached is { } b ? (b ? 1 : 0) : null, r.RemainingLifeYears, r.ProfilesJson, Sql.Utc(r.ComputedUtc),
            ];
            using var command = Sql.Command(c, t, sql, names.Select((n, i) => ("$" + n, row[i])).ToArray());
            command.ExecuteNonQuery();
        }
    }

    public static List<StoredResult> Read(DbConnection c, DbTransaction t, DateOnly? asOf, string? optionsKey, bool withProfiles) =>
        Sql.Query(c, t,
            $"SELECT {Columns.Replace("profiles_json", withProfiles ? "profiles_json" : "NULL AS profiles_json", StringComparison.Ordinal)} FROM component_result " +
            "WHERE (CAST($asOf AS TEXT) IS NULL OR as_of = $asOf) AND (CAST($options AS TEXT) IS NULL OR options_key = $options) ORDER BY as_of, options_key, component_code",
            Map, ("$asOf", asOf is { } d ? Sql.Date(d) : null), ("$options", optionsKey));

    private static StoredResult Map(DbDataReader r)
    {
        DateOnly? D(string col) => r.NullableString(col) is { } s ? Sql.ParseDate(s) : null;
        return new StoredResult(r.Long("component_id"), r.Text("component_code"), r.Text("site_code"), Sql.ParseDate(r.Text("as_of")), r.Text("options_key"),
            (int)r.Long("model_revision"), r.Text("component_fingerprint"), r.Text("tool_version"), r.Text("result_key"), ParseStatus(r.Text("status")),
            r.NullableString("error"), Sql.ParseUtc(r.Text("computed_utc")))
        {
            AnnualPf = r.NullableDouble("annual_pf"),
            AnnualPfYearEnding = D("annual_pf_year_ending"),
            CumulativePf = r.NullableDouble("cumulative_pf"),
            Beta = r.NullableDouble("beta"),
            Route = r.NullableString("route"),
            Converged = r.Long("converged") == 1,
            Cov = r.NullableDouble("cov"),
            NextDue = D("next_due"),
            NextStatus = r.NullableString("next_status"),
            YearsToTarget = r.NullableDouble("years_to_target"),
            TargetReached = r.NullableLong("target_reached") is { } b ? b == 1 : null,
            RemainingLifeYears = r.NullableDouble("remaining_life_years"),
            ProfilesJson = r.NullableString("profiles_json"),
        };
    }

    public static Dictionary<long, (string Key, ResultStatus Status)> Keys(DbConnection c, DbTransaction t, DateOnly asOf, string optionsKey) =>
        Sql.Query(c, t, "SELECT component_id, result_key, status FROM component_result WHERE as_of = $asOf AND options_key = $options",
            r => (Id: r.GetInt64(0), Key: r.GetString(1), Status: ParseStatus(r.GetString(2))), ("$asOf", Sql.Date(asOf)), ("$options", optionsKey))
            .ToDictionary(x => x.Id, x => (x.Key, x.Status));

    public static string Invariant(long v) => v.ToString(CultureInfo.InvariantCulture);
}

public sealed partial class RegisterStore : IResultSink
{
    /// <summary>Stored result keys of one evidence date and options, by component id (small: no numbers, no profiles).</summary>
    public IReadOnlyDictionary<long, (string Key, ResultStatus Status)> ResultKeys(DateOnly asOf, string optionsKey) =>
        Read((c, t) => ResultRows.Keys(c, t, asOf, optionsKey));

    /// <summary>Writes a batch of results in one write transaction, replacing rows of the same component, date and options.</summary>
    /// <remarks>Only the component_result table is written: findings, repairs, models and the audit trail are untouched.</remarks>
    public void Save(IReadOnlyList<StoredResult> batch)
    {
        ArgumentNullException.ThrowIfNull(batch);
        if (batch.Count == 0) return;
        Write<bool>((c, t) =>
        {
            ResultRows.Save(c, t, batch);
            return (true, true);
        });
    }

    /// <summary>Stored results, optionally of one evidence date and options, by date, options and component code.</summary>
    public IReadOnlyList<StoredResult> Results(DateOnly? asOf = null, string? optionsKey = null, bool withProfiles = false) =>
        Read((c, t) => ResultRows.Read(c, t, asOf, optionsKey, withProfiles));

    /// <summary>Components recorded on or before <paramref name="asOf"/> and not retired as known then: id, code and install date only (cheap for large registers), by code.</summary>
    public IReadOnlyList<(long Id, string Code, DateOnly InstallDate)> ComponentIndex(DateTimeOffset asOf) => Read((c, t) => Sql.Query(c, t,
        "SELECT component_id, code, install_date FROM component c WHERE recorded_utc <= $asOf AND COALESCE((SELECT s.status FROM component_status s WHERE s.component_id = c.component_id AND s.recorded_utc <= $asOf ORDER BY s.recorded_utc DESC, s.status_id DESC LIMIT 1), 'in-service') <> 'retired' ORDER BY code",
        r => (r.GetInt64(0), r.GetString(1), Sql.ParseDate(r.GetString(2))), ("$asOf", Sql.Utc(asOf))));
}

/// <summary>
/// A shard's results file: a small SQLite file (rollback journal, not WAL, so that it lives safely on a shared file
/// system) holding the component_result rows one shard computed, with a header naming the run. A register file takes
/// writes from one machine at a time; each shard writes its own file and <c>register merge</c> folds them in.
/// </summary>
public sealed class ShardResultsFile : IResultSink, IDisposable
{
    /// <summary>Format name in the header.</summary>
    public const string FormatName = "inspection-update/shard-results/1";

    private readonly SqliteConnection _connection;

    private ShardResultsFile(string path, SqliteConnection connection)
    {
        Path = path;
        _connection = connection;
    }

    /// <summary>Full path of the file.</summary>
    public string Path { get; }

    /// <summary>The application id of a shard results file: the ASCII letters "IURS" (a register has "IURG").</summary>
    public const int ApplicationId = 0x49555253;

    /// <summary>
    /// Creates a results file with its header, replacing an earlier shard results file at <paramref name="path"/>;
    /// any other existing file (a register, another application's file) is refused and left as it is.
    /// </summary>
    /// <exception cref="RegisterFileException">An existing file at <paramref name="path"/> is not a shard results file.</exception>
    public static ShardResultsFile Create(string path, ShardHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        var full = System.IO.Path.GetFullPath(path);
        SqliteConnection.ClearAllPools();
        if (File.Exists(full))
        {
            // Only an earlier shard results file is replaced (its header is read first, read-only).
            using (OpenRead(full))
            {
            }

            SqliteConnection.ClearAllPools();
        }

        foreach (var f in new[] { full, full + "-journal" })
        {
            if (File.Exists(f)) File.Delete(f);
        }

        var connection = Open(full, SqliteOpenMode.ReadWriteCreate);
        using var transaction = connection.BeginTransaction(deferred: false);
        using (var create = Sql.Command(connection, transaction, Migrations.ResultTable(inRegister: false) +
            "\nCREATE TABLE shard_header (format TEXT NOT NULL, register TEXT NOT NULL, as_of TEXT NOT NULL, options_key TEXT NOT NULL, tool_version TEXT NOT NULL, shard INTEGER NOT NULL, shard_count INTEGER NOT NULL, created_utc TEXT NOT NULL) STRICT;" +
            "\nPRAGMA application_id = " + ApplicationId.ToString(CultureInfo.InvariantCulture) + ";"))
        {
            create.ExecuteNonQuery();
        }

        using (var insert = Sql.Command(connection, transaction,
            "INSERT INTO shard_header VALUES ($format, $register, $asOf, $options, $tool, $shard, $count, $created)",
            ("$format", FormatName), ("$register", header.Register), ("$asOf", Sql.Date(header.AsOf)), ("$options", header.OptionsKey), ("$tool", header.ToolVersion),
            ("$shard", header.Shard), ("$count", header.ShardCount), ("$created", Sql.Utc(header.CreatedUtc))))
        {
            insert.ExecuteNonQuery();
        }

        transaction.Commit();
        return new ShardResultsFile(full, connection);
    }

    /// <summary>Opens an existing results file to read it.</summary>
    /// <exception cref="RegisterFileException">The file is missing or is not a shard results file.</exception>
    public static ShardResultsFile OpenRead(string path)
    {
        var full = System.IO.Path.GetFullPath(path);
        if (!File.Exists(full)) throw new RegisterFileException($"Results file '{full}' does not exist.");
        RequireShardHeader(full);
        try
        {
            var connection = Open(full, SqliteOpenMode.ReadOnly);
            var file = new ShardResultsFile(full, connection);
            _ = file.Header;
            return file;
        }
        catch (SqliteException e)
        {
            throw new RegisterFileException($"'{full}' is not a shard results file: {e.Message}", e);
        }
    }

    /// <summary>
    /// Refuses, from the file's first 100 bytes and before SQLite opens it, a file that cannot be a shard results file:
    /// not SQLite, a register, another application's database, or a database in WAL mode (a shard results file uses
    /// a rollback journal). Reads only, so the file is left as it is.
    /// </summary>
    private static void RequireShardHeader(string full)
    {
        var header = new byte[100];
        int read;
        using (var stream = new FileStream(full, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete))
        {
            read = stream.ReadAtLeast(header, header.Length, throwOnEndOfStream: false);
        }

        if (read < header.Length || !header.AsSpan(0, 16).SequenceEqual("SQLite format 3\0"u8))
            throw new RegisterFileException($"'{full}' is not a shard results file (not a SQLite database); it was left as it is.");
        var applicationId = System.Buffers.Binary.BinaryPrimitives.ReadInt32BigEndian(header.AsSpan(68, 4));
        if (applicationId == RegisterIdentity.ApplicationId)
            throw new RegisterFileException($"'{full}' is a register, not a shard results file; it was left as it is.");
        if (applicationId != ApplicationId && applicationId != 0)
            throw new RegisterFileException(string.Create(CultureInfo.InvariantCulture, $"'{full}' is a SQLite database of another application (application id 0x{applicationId:X8}), not a shard results file; it was left as it is."));
        if (header[18] == 2 || header[19] == 2)
            throw new RegisterFileException($"'{full}' is a SQLite database in WAL mode, not a shard results file; it was left as it is.");
    }

    private static SqliteConnection Open(string full, SqliteOpenMode mode)
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = full, Mode = mode, Pooling = false }.ToString());
        connection.Open();
        using var pragma = connection.CreateCommand();
        pragma.CommandText = mode == SqliteOpenMode.ReadOnly ? "PRAGMA busy_timeout = 30000;" : "PRAGMA journal_mode = DELETE; PRAGMA synchronous = FULL; PRAGMA busy_timeout = 30000;";
        pragma.ExecuteNonQuery();
        return connection;
    }

    /// <summary>The header.</summary>
    public ShardHeader Header
    {
        get
        {
            using var t = _connection.BeginTransaction(deferred: true);
            var rows = Sql.Query(_connection, t, "SELECT format, register, as_of, options_key, tool_version, shard, shard_count, created_utc FROM shard_header", r =>
                r.GetString(0) != FormatName ? throw new RegisterFileException($"'{Path}' has format '{r.GetString(0)}', expected {FormatName}.")
                : new ShardHeader(r.GetString(1), Sql.ParseDate(r.GetString(2)), r.GetString(3), r.GetString(4), (int)r.GetInt64(5), (int)r.GetInt64(6), Sql.ParseUtc(r.GetString(7))));
            t.Commit();
            return rows.Count == 1 ? rows[0] : throw new RegisterFileException($"'{Path}' has {ResultRows.Invariant(rows.Count)} header rows, expected 1.");
        }
    }

    /// <inheritdoc />
    public void Save(IReadOnlyList<StoredResult> batch)
    {
        ArgumentNullException.ThrowIfNull(batch);
        if (batch.Count == 0) return;
        using var t = _connection.BeginTransaction(deferred: false);
        ResultRows.Save(_connection, t, batch);
        t.Commit();
    }

    /// <summary>Every result in the file, with profiles.</summary>
    public IReadOnlyList<StoredResult> Results()
    {
        using var t = _connection.BeginTransaction(deferred: true);
        var rows = ResultRows.Read(_connection, t, null, null, withProfiles: true);
        t.Commit();
        return rows;
    }

    /// <summary>Closes the file.</summary>
    public void Dispose() => _connection.Dispose();
}

/// <summary>Header of a shard results file.</summary>
/// <param name="Register">The register the shard read.</param>
/// <param name="AsOf">Evidence date.</param>
/// <param name="OptionsKey">Options that change numbers.</param>
/// <param name="ToolVersion">Tool version and build.</param>
/// <param name="Shard">Shard index K (0 ≤ K &lt; N).</param>
/// <param name="ShardCount">Number of shards N.</param>
/// <param name="CreatedUtc">When the file was created.</param>
public sealed record ShardHeader(string Register, DateOnly AsOf, string OptionsKey, string ToolVersion, int Shard, int ShardCount, DateTimeOffset CreatedUtc);
