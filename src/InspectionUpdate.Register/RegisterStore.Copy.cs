using System.Data.Common;
using System.Globalization;

namespace InspectionUpdate.Register;

/// <summary>What <see cref="RegisterStore.Copy"/> copied.</summary>
/// <param name="From">The source register (path or URI without password).</param>
/// <param name="To">The new register.</param>
/// <param name="RowsByTable">Rows copied, by table.</param>
/// <param name="Fingerprint">The fingerprint of both registers (equal, checked before the copy was committed).</param>
public sealed record RegisterCopyResult(string From, string To, IReadOnlyDictionary<string, long> RowsByTable, string Fingerprint);

public sealed partial class RegisterStore
{
    /// <summary>
    /// Every table of the register in an order that respects the foreign keys. A migration that adds a table adds it
    /// here; a copy refuses a source holding a table this list does not name (no table is ever left behind silently).
    /// </summary>
    internal static readonly string[] CopyOrder =
    [
        "audit_log", "site", "component", "component_model_revision", "inspection_method", "import_batch", "finding", "finding_revision",
        "repair", "repair_revision", "model_check", "component_status", "site_revision", "inspection_method_revision",
        "document_control", "consequence_class", "component_consequence", "component_result",
    ];

    /// <summary>
    /// Copies a whole register into a new one, SQLite to PostgreSQL or back (or the same kind): every row of every
    /// table with its id — all revisions, who/when/why, the audit trail as it stands, stored results. The target must
    /// not exist (a new file, or an empty PostgreSQL database); it is created at the current schema version, so the
    /// source must be at that version too. Everything is written in one transaction, and committed only when the
    /// target's fingerprint equals the source's; otherwise nothing is written.
    /// </summary>
    /// <remarks>
    /// On PostgreSQL the copy keeps each row's recorded_by from the source (the database user does not replace it)
    /// and the audit triggers are off while the rows go in (the source's audit rows are copied instead): the user who
    /// copies into PostgreSQL must own the register (the one who creates it). The target's own migration rows in the
    /// audit trail are replaced by the source's.
    /// </remarks>
    /// <exception cref="RegisterFileException">A register cannot be opened or created, the source holds a table the
    /// copy does not know, or the fingerprints differ (nothing written).</exception>
    public static RegisterCopyResult Copy(string from, string to, RegisterOptions? options = null)
    {
        using var source = (RegisterStore)RegisterLocation.Open(from, RegisterOpenMode.OpenExistingToRead, options);
        var snapshot = source.Read((c, t) =>
        {
            var tables = ListTables(c, t);
            var unknown = tables.Except(CopyOrder, StringComparer.Ordinal).ToList();
            if (unknown.Count > 0)
            {
                throw new RegisterFileException($"Register {source.Path} holds tables that 'register copy' does not know ({string.Join(", ", unknown)}): nothing was copied. Use a program whose copy lists them.");
            }

            var rows = new Dictionary<string, (string[] Columns, List<object?[]> Rows)>(StringComparer.Ordinal);
            foreach (var table in CopyOrder.Where(tables.Contains))
            {
                // Table names come from the constant list above, never from input.
                using var command = Sql.Command(c, t, $"SELECT * FROM {table}");
                using var reader = command.ExecuteReader();
                var columns = Enumerable.Range(0, reader.FieldCount).Select(reader.GetName).ToArray();
                var list = new List<object?[]>();
                while (reader.Read())
                {
                    var row = new object?[reader.FieldCount];
                    for (var i = 0; i < row.Length; i++) row[i] = reader.IsDBNull(i) ? null : reader.GetValue(i);
                    list.Add(row);
                }

                rows[table] = (columns, list);
            }

            return (Rows: rows, Fingerprint: source.FingerprintIn(c, t, DateTimeOffset.MaxValue));
        });

        using var target = (RegisterStore)RegisterLocation.Open(to, RegisterOpenMode.CreateNew, options);
        var counts = target.Write((c, t) =>
        {
            var restore = SuspendTriggers(target, c, t);
            using (var clear = Sql.Command(c, t, "DELETE FROM audit_log"))
            {
                clear.ExecuteNonQuery();
            }

            var counts = new Dictionary<string, long>(StringComparer.Ordinal);
            foreach (var table in CopyOrder.Where(snapshot.Rows.ContainsKey))
            {
                var (columns, list) = snapshot.Rows[table];
                var sql = $"INSERT INTO {table} ({string.Join(", ", columns)}) VALUES ({string.Join(", ", columns.Select((_, i) => "$p" + i.ToString(CultureInfo.InvariantCulture)))})";
                foreach (var row in list)
                {
                    using var insert = Sql.Command(c, t, sql, row.Select((v, i) => ("$p" + i.ToString(CultureInfo.InvariantCulture), v)).ToArray());
                    insert.ExecuteNonQuery();
                }

                counts[table] = list.Count;
            }

            restore();
            var copied = target.FingerprintIn(c, t, DateTimeOffset.MaxValue);
            if (copied != snapshot.Fingerprint)
            {
                throw new RegisterFileException($"Copy of {source.Path} into {target.Path}: the fingerprints differ ({snapshot.Fingerprint} and {copied}); nothing was written.");
            }

            return (counts, true);
        });
        return new RegisterCopyResult(source.Path, target.Path, counts, snapshot.Fingerprint);
    }

    private static HashSet<string> ListTables(DbConnection c, DbTransaction t) => Sql.IsPostgres(c)
        ? Sql.Query(c, t, "SELECT table_name::text FROM information_schema.tables WHERE table_schema = current_schema() AND table_name <> 'schema_migration'", r => r.GetString(0)).ToHashSet(StringComparer.Ordinal)
        : Sql.Query(c, t, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'", r => r.GetString(0)).ToHashSet(StringComparer.Ordinal);

    /// <summary>
    /// Turns off, inside the copy's transaction, the triggers that would rewrite copied rows (audit rows, recorded_by,
    /// the append-only guard of the audit trail that the target's own migration rows are cleared under); returns the
    /// action that turns them back on. SQLite drops and re-creates them from their stored text; PostgreSQL disables
    /// and enables them (the table owner may). Both are undone by a rollback.
    /// </summary>
    private static Action SuspendTriggers(RegisterStore target, DbConnection c, DbTransaction t)
    {
        void Run(string sql)
        {
            using var command = c.CreateCommand();
            command.Transaction = t;
            command.CommandText = sql;
            command.ExecuteNonQuery();
        }

        if (Sql.IsPostgres(c))
        {
            var tables = ListTables(c, t).Order(StringComparer.Ordinal).ToList();
            try
            {
                foreach (var table in tables) Run($"ALTER TABLE {table} DISABLE TRIGGER USER");
            }
            catch (Npgsql.PostgresException e) when (e.SqlState == Npgsql.PostgresErrorCodes.InsufficientPrivilege)
            {
                throw new RegisterFileException($"Copy into {target.Path}: only the register's owner may copy into it ({e.MessageText}); nothing was written.", e);
            }

            return () =>
            {
                foreach (var table in tables) Run($"ALTER TABLE {table} ENABLE TRIGGER USER");
            };
        }

        var triggers = Sql.Query(c, t, "SELECT name, sql FROM sqlite_master WHERE type = 'trigger' AND (name LIKE '%\\_audit' ESCAPE '\\' OR name = 'audit_log_no_delete')",
            r => (Name: r.GetString(0), Sql: r.GetString(1)));
        foreach (var (name, _) in triggers) Run($"DROP TRIGGER \"{name.Replace("\"", "\"\"", StringComparison.Ordinal)}\"");
        return () =>
        {
            foreach (var (_, sql) in triggers) Run(sql);
        };
    }
}
