using System.Data.Common;
using System.Globalization;

namespace InspectionUpdate.Register;

/// <summary>Parameterized command helpers and the text forms of dates and times stored in the register.</summary>
internal static class Sql
{
    private const string UtcFormat = "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'";
    private const string DateFormat = "yyyy-MM-dd";

    /// <summary>ISO 8601 UTC with 7 fractional digits: text order equals time order.</summary>
    public static string Utc(DateTimeOffset t) => t.UtcDateTime.ToString(UtcFormat, CultureInfo.InvariantCulture);

    public static DateTimeOffset ParseUtc(string text) =>
        new(DateTime.SpecifyKind(DateTime.ParseExact(text, UtcFormat, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal), DateTimeKind.Utc));

    public static string Date(DateOnly d) => d.ToString(DateFormat, CultureInfo.InvariantCulture);

    public static DateOnly ParseDate(string text) => DateOnly.ParseExact(text, DateFormat, CultureInfo.InvariantCulture);

    public static bool TryParseDate(string text, out DateOnly date) =>
        DateOnly.TryParseExact(text, DateFormat, CultureInfo.InvariantCulture, DateTimeStyles.None, out date);

    /// <summary>
    /// A parameterized command. The register's SQL names parameters <c>$name</c> (SQLite); on PostgreSQL they are sent
    /// as <c>@name</c> (Npgsql), the SQL text otherwise unchanged. Values are always parameters, never text.
    /// </summary>
    public static DbCommand Command(DbConnection connection, DbTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        var command = connection.CreateCommand();
        command.Transaction = transaction;
        var postgres = IsPostgres(connection);
        command.CommandText = postgres ? ToPostgres(sql) : sql;
        foreach (var (name, value) in parameters)
        {
            var parameter = command.CreateParameter();
            parameter.ParameterName = postgres ? name.TrimStart('$') : name;
            parameter.Value = value ?? DBNull.Value;
            command.Parameters.Add(parameter);
        }

        return command;
    }

    /// <summary>Whether the connection is to PostgreSQL.</summary>
    public static bool IsPostgres(DbConnection connection) => connection is Npgsql.NpgsqlConnection;

    private static readonly System.Text.RegularExpressions.Regex DollarName = new(@"\$([A-Za-z_][A-Za-z0-9_]*)", System.Text.RegularExpressions.RegexOptions.CultureInvariant);

    /// <summary>The PostgreSQL spelling of the register's SQL: <c>$name</c> parameters become <c>@name</c>.</summary>
    public static string ToPostgres(string sql) => DollarName.Replace(sql, "@$1");

    /// <summary>Primary key column of each table that takes new rows through <see cref="Insert"/>.</summary>
    private static readonly Dictionary<string, string> Keys = new(StringComparer.Ordinal)
    {
        ["audit_log"] = "audit_id",
        ["site"] = "site_id",
        ["component"] = "component_id",
        ["component_model_revision"] = "model_revision_id",
        ["inspection_method"] = "method_id",
        ["finding"] = "finding_id",
        ["finding_revision"] = "finding_revision_id",
        ["repair"] = "repair_id",
        ["repair_revision"] = "repair_revision_id",
        ["import_batch"] = "import_batch_id",
        ["model_check"] = "model_revision_id",
        ["component_status"] = "status_id",
        ["site_revision"] = "site_revision_id",
        ["inspection_method_revision"] = "method_revision_id",
        ["document_control"] = "document_control_id",
        ["consequence_class"] = "consequence_class_id",
        ["component_consequence"] = "component_consequence_id",
    };

    private static readonly System.Text.RegularExpressions.Regex InsertHead = new(@"^INSERT INTO (\w+) \((.*?)\) VALUES \(", System.Text.RegularExpressions.RegexOptions.Singleline | System.Text.RegularExpressions.RegexOptions.CultureInvariant);

    /// <summary>
    /// Inserts one row and returns its id. SQLite gives an INTEGER PRIMARY KEY the largest id + 1; on PostgreSQL the
    /// same id is written explicitly (writers are serialized by the register's write lock), so that the same
    /// operations give the same ids, and the same fingerprints, in both stores. A newly added table must be listed
    /// in <see cref="Keys"/>.
    /// </summary>
    public static long Insert(DbConnection connection, DbTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        ArgumentNullException.ThrowIfNull(connection);
        if (!IsPostgres(connection))
        {
            using var command = Command(connection, transaction, sql + " RETURNING rowid", parameters);
            return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
        }

        var head = InsertHead.Match(sql);
        if (!head.Success || !Keys.TryGetValue(head.Groups[1].Value, out var key))
        {
            throw new InvalidOperationException("Sql.Insert on PostgreSQL needs 'INSERT INTO <listed table> (columns) VALUES (...)': " + sql);
        }

        var table = head.Groups[1].Value;
        var columns = head.Groups[2].Value.Split(',', StringSplitOptions.TrimEntries);
        var text = columns.Contains(key, StringComparer.Ordinal)
            ? sql
            : $"INSERT INTO {table} ({key}, {head.Groups[2].Value}) VALUES ((SELECT COALESCE(MAX({key}), 0) + 1 FROM {table}), " + sql[head.Length..];
        using var insert = Command(connection, transaction, text + " RETURNING " + key, parameters);
        return Convert.ToInt64(insert.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    public static object? Scalar(DbConnection connection, DbTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        using var command = Command(connection, transaction, sql, parameters);
        var value = command.ExecuteScalar();
        return value is DBNull ? null : value;
    }

    public static List<T> Query<T>(DbConnection connection, DbTransaction transaction, string sql, Func<DbDataReader, T> map, params (string Name, object? Value)[] parameters)
    {
        using var command = Command(connection, transaction, sql, parameters);
        using var reader = command.ExecuteReader();
        var rows = new List<T>();
        while (reader.Read())
        {
            rows.Add(map(reader));
        }

        return rows;
    }

    public static string? NullableString(this DbDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetString(i);
    }

    public static double? NullableDouble(this DbDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetDouble(i);
    }

    public static long? NullableLong(this DbDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetInt64(i);
    }

    public static string Text(this DbDataReader r, string column) => r.GetString(r.GetOrdinal(column));

    public static long Long(this DbDataReader r, string column) => r.GetInt64(r.GetOrdinal(column));

    public static double Real(this DbDataReader r, string column) => r.GetDouble(r.GetOrdinal(column));

    public static Provenance Provenance(this DbDataReader r, bool withReason) =>
        new(ParseUtc(r.Text("recorded_utc")), r.Text("recorded_by"), withReason ? r.Text("reason") : "");

    public static string Invariant(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
