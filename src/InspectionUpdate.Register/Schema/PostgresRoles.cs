using Npgsql;

namespace InspectionUpdate.Register.Schema;

/// <summary>
/// The three database roles of a PostgreSQL register, named after the database: <c>&lt;db&gt;_reader</c> (reads),
/// <c>&lt;db&gt;_recorder</c> (reads; records findings, repairs, imports and run results), <c>&lt;db&gt;_modeller</c>
/// (reads; records sites, components, model revisions, methods, component status and run results). They are NOLOGIN
/// group roles: an administrator grants them to people's logins (<c>GRANT mydb_recorder TO alice;</c>).
/// Audit rows are written by the table owner's trigger functions, so no role may insert into the audit trail directly;
/// no role may update or delete evidence (the append-only triggers refuse it even for the owner).
/// </summary>
internal static class PostgresRoles
{
    /// <summary>Tables each writing role may insert into. A migration that adds a table adds it here (docs/register.md).</summary>
    public static readonly string[] RecorderTables = ["finding", "finding_revision", "repair", "repair_revision", "import_batch"];

    /// <inheritdoc cref="RecorderTables"/>
    public static readonly string[] ModellerTables = ["site", "component", "component_model_revision", "inspection_method", "model_check", "component_status", "site_revision", "inspection_method_revision", "document_control", "consequence_class", "component_consequence"];

    /// <summary>Tables both writing roles may insert into and update (results, not evidence: a rerun replaces a row).</summary>
    public static readonly string[] ResultTables = ["component_result"];

    private static string Array(string[] names) => "ARRAY[" + string.Join(", ", names.Select(n => "'" + n + "'")) + "]";

    /// <summary>Creates the three roles if missing (needs CREATEROLE). Names are quoted by format('%I'); nothing from input enters the SQL.</summary>
    public static void Create(NpgsqlConnection connection)
    {
        using var command = new NpgsqlCommand(
            """
            DO $d$
            DECLARE
              db text := current_database();
              r text;
            BEGIN
              FOREACH r IN ARRAY ARRAY['_reader', '_recorder', '_modeller'] LOOP
                IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = db || r) THEN
                  EXECUTE format('CREATE ROLE %I NOLOGIN', db || r);
                END IF;
              END LOOP;
              EXECUTE format('GRANT %I TO %I', db || '_reader', db || '_recorder');
              EXECUTE format('GRANT %I TO %I', db || '_reader', db || '_modeller');
            END $d$;
            """, connection);
        command.ExecuteNonQuery();
    }

    /// <summary>Grants the roles their privileges on the tables that exist, when the roles exist and the current user owns the register.</summary>
    public static void GrantIfOwner(NpgsqlConnection connection, NpgsqlTransaction transaction)
    {
        using var command = new NpgsqlCommand(
            $"""
            DO $d$
            DECLARE
              db text := current_database();
              s text := current_schema();
              t text;
            BEGIN
              IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = db || '_reader')
                 OR NOT EXISTS (SELECT 1 FROM pg_tables WHERE schemaname = s AND tablename = 'audit_log' AND tableowner = current_user) THEN
                RETURN;
              END IF;
              EXECUTE format('GRANT USAGE ON SCHEMA %I TO %I, %I, %I', s, db || '_reader', db || '_recorder', db || '_modeller');
              EXECUTE format('GRANT SELECT ON ALL TABLES IN SCHEMA %I TO %I', s, db || '_reader');
              FOREACH t IN ARRAY {Array(RecorderTables)} LOOP
                IF to_regclass(t) IS NOT NULL THEN EXECUTE format('GRANT INSERT ON %I TO %I', t, db || '_recorder'); END IF;
              END LOOP;
              FOREACH t IN ARRAY {Array(ModellerTables)} LOOP
                IF to_regclass(t) IS NOT NULL THEN EXECUTE format('GRANT INSERT ON %I TO %I', t, db || '_modeller'); END IF;
              END LOOP;
              FOREACH t IN ARRAY {Array(ResultTables)} LOOP
                IF to_regclass(t) IS NOT NULL THEN EXECUTE format('GRANT INSERT, UPDATE ON %I TO %I, %I', t, db || '_recorder', db || '_modeller'); END IF;
              END LOOP;
            END $d$;
            """, connection, transaction);
        command.ExecuteNonQuery();
    }
}
