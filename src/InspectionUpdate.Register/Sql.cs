using System.Globalization;
using Microsoft.Data.Sqlite;

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

    public static SqliteCommand Command(SqliteConnection connection, SqliteTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value ?? DBNull.Value);
        }

        return command;
    }

    public static long Insert(SqliteConnection connection, SqliteTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        using var command = Command(connection, transaction, sql + " RETURNING rowid", parameters);
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    public static object? Scalar(SqliteConnection connection, SqliteTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        using var command = Command(connection, transaction, sql, parameters);
        var value = command.ExecuteScalar();
        return value is DBNull ? null : value;
    }

    public static List<T> Query<T>(SqliteConnection connection, SqliteTransaction transaction, string sql, Func<SqliteDataReader, T> map, params (string Name, object? Value)[] parameters)
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

    public static string? NullableString(this SqliteDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetString(i);
    }

    public static double? NullableDouble(this SqliteDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetDouble(i);
    }

    public static long? NullableLong(this SqliteDataReader r, string column)
    {
        var i = r.GetOrdinal(column);
        return r.IsDBNull(i) ? null : r.GetInt64(i);
    }

    public static string Text(this SqliteDataReader r, string column) => r.GetString(r.GetOrdinal(column));

    public static long Long(this SqliteDataReader r, string column) => r.GetInt64(r.GetOrdinal(column));

    public static double Real(this SqliteDataReader r, string column) => r.GetDouble(r.GetOrdinal(column));

    public static Provenance Provenance(this SqliteDataReader r, bool withReason) =>
        new(ParseUtc(r.Text("recorded_utc")), r.Text("recorded_by"), withReason ? r.Text("reason") : "");

    public static string Invariant(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
