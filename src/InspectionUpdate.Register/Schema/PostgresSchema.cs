using System.Data.Common;
using System.Globalization;
using System.Text.RegularExpressions;
using Npgsql;

namespace InspectionUpdate.Register.Schema;

/// <summary>
/// The same migrations in PostgreSQL's dialect. One definition serves both stores: each migration is written once,
/// in SQLite's words (the version methods of <see cref="Migrations"/>), and its PostgreSQL text is derived from it:
/// the trigger helpers (<c>AppendOnly</c>, <c>Audit</c>, <c>RevisionChain</c>) emit PL/pgSQL triggers when the
/// PostgreSQL scripts are generated, and <see cref="ToPostgres"/> translates the table definitions (column types,
/// STRICT, GLOB, json_valid, date checks). A migration that keeps to these words needs nothing more; anything else
/// is listed in <see cref="PostgresOnly"/> by version (docs/register.md, "Adding a migration").
/// </summary>
/// <remarks>
/// The PostgreSQL register keeps its version in <c>schema_migration</c> (one row per applied migration, with who and
/// when), not in a pragma. Times and dates are stored as the same ISO 8601 text as in SQLite (collation "C", so text
/// order is time order and ORDER BY gives SQLite's byte order), and ids are the largest id + 1 as in SQLite: the same
/// operations give the same rows and the same fingerprints in both stores.
/// </remarks>
internal static partial class Migrations
{
    /// <summary>True while the PostgreSQL scripts are being generated (under <see cref="GenerationLock"/>).</summary>
    private static bool Postgres { get; set; }

    private static readonly Lock GenerationLock = new();

    /// <summary>
    /// Extra PostgreSQL statements of a migration, by the version it takes the schema to, for what the translation
    /// cannot express. Empty today.
    /// </summary>
    private static readonly Dictionary<int, string> PostgresOnly = [];

    private static readonly Lazy<IReadOnlyList<string>> PgScripts = new(() =>
    {
        lock (GenerationLock)
        {
            Postgres = true;
            try
            {
                return Definitions.Select(d => d()).Select((script, i) => PgPrelude(i) + ToPostgres(script) + PgRecordedBy(script) + PostgresOnly.GetValueOrDefault(i + 1, "")).ToList();
            }
            finally
            {
                Postgres = false;
            }
        }
    });

    /// <summary>The PostgreSQL migration scripts; index i takes the schema from version i to i + 1 (same numbering as <see cref="Scripts"/>).</summary>
    public static IReadOnlyList<string> PostgresScripts => PgScripts.Value;

    /// <summary>The advisory lock key every write and migration takes first ("IURG", the register's application id).</summary>
    public const long WriteLockKey = RegisterIdentity.ApplicationId;

    /// <summary>Tables that take recorded_by from the database user, found in a script.</summary>
    private static readonly Regex TableWithRecordedBy = new(@"CREATE TABLE (\w+) \(([^;]*?)\) STRICT;", RegexOptions.Singleline | RegexOptions.CultureInvariant);

    /// <summary>Translates a migration written in SQLite's words into PostgreSQL's.</summary>
    public static string ToPostgres(string sqlite)
    {
        var s = sqlite;
        s = Regex.Replace(s, @"\bINTEGER PRIMARY KEY\b", "bigint PRIMARY KEY");
        s = Regex.Replace(s, @"\bINTEGER\b", "bigint");
        s = Regex.Replace(s, @"\bREAL\b", "double precision");
        s = Regex.Replace(s, @"\bTEXT\b", "text COLLATE \"C\"");
        s = Regex.Replace(s, @"\)\s*STRICT;", ");");
        s = Regex.Replace(s, @"\bjson_valid\((\w+)\)", "register_json_valid($1)");
        s = Regex.Replace(s, @"\bjson_type\((\w+)\)", "register_json_type($1)");
        s = Regex.Replace(s, @"\bdate\((\w+)\) IS \1\b", "register_iso_date($1)");
        s = Regex.Replace(s, @"(\w+) GLOB '([^']*)'", m => $"{m.Groups[1].Value} ~ '^{GlobToRegex(m.Groups[2].Value)}$'");
        return s;
    }

    private static string GlobToRegex(string glob) => Regex.Replace(glob, @"\[[^\]]*\]|.", m => m.Value switch
    {
        "*" => ".*",
        "?" => ".",
        var v when v.StartsWith('[') => v,
        var v => Regex.Escape(v),
    });

    /// <summary>Functions the translated checks and triggers use; created by migration 1.</summary>
    private static string PgPrelude(int index) => index != 0 ? "" :
        """
        CREATE TABLE IF NOT EXISTS schema_migration (
          version integer PRIMARY KEY CHECK (version >= 1),
          applied_utc text NOT NULL,
          applied_by text NOT NULL
        );

        CREATE FUNCTION register_json_valid(value text) RETURNS boolean LANGUAGE plpgsql IMMUTABLE AS $f$
        BEGIN
          PERFORM value::jsonb;
          RETURN true;
        EXCEPTION WHEN others THEN
          RETURN false;
        END $f$;

        CREATE FUNCTION register_json_type(value text) RETURNS text LANGUAGE sql IMMUTABLE AS $f$ SELECT jsonb_typeof(value::jsonb) $f$;

        CREATE FUNCTION register_iso_date(value text) RETURNS boolean LANGUAGE plpgsql IMMUTABLE AS $f$
        BEGIN
          IF value IS NULL THEN RETURN NULL; END IF;
          IF value !~ '^[0-9]{4}-[0-9]{2}-[0-9]{2}$' THEN RETURN false; END IF;
          RETURN to_char(make_date(substr(value, 1, 4)::int, substr(value, 6, 2)::int, substr(value, 9, 2)::int), 'YYYY-MM-DD') = value;
        EXCEPTION WHEN others THEN
          RETURN false;
        END $f$;

        CREATE FUNCTION register_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $f$
        BEGIN
          RAISE EXCEPTION '% is append-only: rows are never updated; record a new revision instead', TG_TABLE_NAME USING ERRCODE = 'restrict_violation';
        END $f$;

        CREATE FUNCTION register_refuse_delete() RETURNS trigger LANGUAGE plpgsql AS $f$
        BEGIN
          RAISE EXCEPTION '% is append-only: rows are never deleted; record a withdrawal instead', TG_TABLE_NAME USING ERRCODE = 'restrict_violation';
        END $f$;

        CREATE FUNCTION register_recorded_by() RETURNS trigger LANGUAGE plpgsql AS $f$
        BEGIN
          NEW.recorded_by := session_user;
          RETURN NEW;
        END $f$;

        """;

    /// <summary>On PostgreSQL recorded_by is the database user: a trigger sets it on every table of the script that has the column.</summary>
    private static string PgRecordedBy(string sqliteScript) => string.Concat(TableWithRecordedBy.Matches(sqliteScript)
        .Where(m => m.Groups[2].Value.Contains("recorded_by", StringComparison.Ordinal))
        .Select(m => $"\nCREATE TRIGGER {m.Groups[1].Value}_recorded_by BEFORE INSERT ON {m.Groups[1].Value} FOR EACH ROW EXECUTE FUNCTION register_recorded_by();"));

    private static string PgAppendOnly(string table) =>
        $"""
        CREATE TRIGGER {table}_no_update BEFORE UPDATE ON {table} FOR EACH ROW EXECUTE FUNCTION register_refuse_update();
        CREATE TRIGGER {table}_no_delete BEFORE DELETE ON {table} FOR EACH ROW EXECUTE FUNCTION register_refuse_delete();
        CREATE TRIGGER {table}_no_truncate BEFORE TRUNCATE ON {table} FOR EACH STATEMENT EXECUTE FUNCTION register_refuse_delete();
        """;

    // The audit row is written by the table owner's function (SECURITY DEFINER): users insert findings, never audit rows.
    private static string PgAudit(string table, string entity, string idColumn, string action, string detail) =>
        $"""
        CREATE FUNCTION {table}_audit() RETURNS trigger LANGUAGE plpgsql SECURITY DEFINER SET search_path FROM CURRENT AS $f$
        BEGIN
          INSERT INTO audit_log (audit_id, at_utc, actor, action, entity, entity_id, detail)
          VALUES ((SELECT COALESCE(MAX(audit_id), 0) + 1 FROM audit_log), NEW.recorded_utc, NEW.recorded_by, {action}, '{entity}', NEW.{idColumn},
                  ({Regex.Replace(detail, @"\bjson_object\(", "jsonb_build_object(")})::text);
          RETURN NULL;
        END $f$;
        CREATE TRIGGER {table}_audit AFTER INSERT ON {table} FOR EACH ROW EXECUTE FUNCTION {table}_audit();
        """;

    private static string PgRevisionChain(string table, string parent, string idColumn) =>
        $"""
        CREATE FUNCTION {table}_chain() RETURNS trigger LANGUAGE plpgsql AS $f$
        BEGIN
          IF NEW.revision > 1 AND (
               NEW.supersedes_revision_id IS DISTINCT FROM (SELECT {idColumn} FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)
            OR NEW.recorded_utc < (SELECT recorded_utc FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)) THEN
            RAISE EXCEPTION '{table}: a revision must supersede the latest revision of the same record and be recorded no earlier' USING ERRCODE = 'check_violation';
          END IF;
          RETURN NEW;
        END $f$;
        CREATE TRIGGER {table}_chain BEFORE INSERT ON {table} FOR EACH ROW EXECUTE FUNCTION {table}_chain();
        """;

    // A correction (revision 2, 3, ...) supersedes the latest revision of the same site or method (revision 1 is the
    // base row) and is recorded no earlier than it.
    private static string PgCorrectionChain(string table, string baseTable, string parent, string idColumn) =>
        $"""
        CREATE FUNCTION {table}_chain() RETURNS trigger LANGUAGE plpgsql AS $f$
        BEGIN
          IF (NEW.revision = 2 AND (EXISTS (SELECT 1 FROM {table} WHERE {parent} = NEW.{parent})
                                   OR NEW.recorded_utc < (SELECT recorded_utc FROM {baseTable} WHERE {parent} = NEW.{parent})))
             OR (NEW.revision > 2 AND (
                  NEW.supersedes_revision_id IS DISTINCT FROM (SELECT {idColumn} FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)
               OR NEW.recorded_utc < (SELECT recorded_utc FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1))) THEN
            RAISE EXCEPTION '{table}: a correction must supersede the latest revision of the same record and be recorded no earlier' USING ERRCODE = 'check_violation';
          END IF;
          RETURN NEW;
        END $f$;
        CREATE TRIGGER {table}_chain BEFORE INSERT ON {table} FOR EACH ROW EXECUTE FUNCTION {table}_chain();
        """;

    /// <summary>The register's version on PostgreSQL: the largest applied migration, 0 when none; null when the schema holds no register.</summary>
    public static int? ReadPostgresVersion(DbConnection connection, DbTransaction? transaction)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT to_regclass('schema_migration') IS NOT NULL";
        if (!(bool)command.ExecuteScalar()!) return null;
        command.CommandText = "SELECT COALESCE(MAX(version), 0) FROM schema_migration";
        return Convert.ToInt32(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>Names of the tables in the connection's current schema.</summary>
    public static IReadOnlyList<string> PostgresTables(DbConnection connection)
    {
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT table_name FROM information_schema.tables WHERE table_schema = current_schema() ORDER BY table_name";
        using var reader = command.ExecuteReader();
        var tables = new List<string>();
        while (reader.Read()) tables.Add(reader.GetString(0));
        return tables;
    }

    /// <summary>
    /// Applies the PostgreSQL migrations up to <paramref name="target"/>, each in one transaction that first takes the
    /// register's write lock and re-reads the version (another process may have migrated meanwhile). Each applied
    /// migration adds a row to schema_migration and an audit entry, and the roles' grants are renewed.
    /// </summary>
    public static IReadOnlyList<int> MigratePostgresTo(NpgsqlConnection connection, int target, Func<string> utcNow, string actor)
    {
        var applied = new List<int>();
        while (true)
        {
            using var transaction = connection.BeginTransaction(System.Data.IsolationLevel.ReadCommitted);
            using (var lockCommand = new NpgsqlCommand("SELECT pg_advisory_xact_lock(@key)", connection, transaction))
            {
                lockCommand.Parameters.AddWithValue("key", WriteLockKey);
                lockCommand.ExecuteNonQuery();
            }

            var version = ReadPostgresVersion(connection, transaction) ?? 0;
            if (version >= target)
            {
                transaction.Commit();
                return applied;
            }

            // The script is a constant of this assembly: no user data is built into SQL.
            using (var command = new NpgsqlCommand(PostgresScripts[version], connection, transaction))
            {
                command.ExecuteNonQuery();
            }

            if (version == ModelCheckIndex) CheckStoredModels(connection, transaction, utcNow(), actor);
            var at = utcNow();
            using (var record = new NpgsqlCommand("INSERT INTO schema_migration (version, applied_utc, applied_by) VALUES (@v, @at, session_user)", connection, transaction))
            {
                record.Parameters.AddWithValue("v", version + 1);
                record.Parameters.AddWithValue("at", at);
                record.ExecuteNonQuery();
            }

            Sql.Insert(connection, transaction, "INSERT INTO audit_log (at_utc, actor, action, entity, entity_id, detail) VALUES ($at, $actor, 'migrate', 'schema', $version, $detail)",
                ("$at", at), ("$actor", actor), ("$version", (long)(version + 1)), ("$detail", string.Create(CultureInfo.InvariantCulture, $"{{\"to_version\":{version + 1}}}")));
            PostgresRoles.GrantIfOwner(connection, transaction);
            transaction.Commit();
            applied.Add(version + 1);
        }
    }
}
