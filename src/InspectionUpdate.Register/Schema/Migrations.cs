using System.Globalization;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Register.Schema;

/// <summary>
/// The register's schema, as a list of forward migrations. The file's <c>PRAGMA user_version</c> is the number of
/// migrations applied; each runs in its own write transaction together with the version bump, so a file is always
/// at one whole version. Migrations are never edited once released: a change is a new migration.
/// </summary>
internal static partial class Migrations
{
    private const string Utc = "CHECK ({0} GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]T[0-9][0-9]:[0-9][0-9]:[0-9][0-9].[0-9][0-9][0-9][0-9][0-9][0-9][0-9]Z')";
    private const string NonBlank = "CHECK (length(trim({0})) > 0)";
    private const string IsoDate = "CHECK (date({0}) IS {0})";

    /// <summary>Tables whose rows are never updated or deleted (enforced by triggers). Declared before Scripts, which use it.</summary>
    public static IReadOnlyList<string> AppendOnlyTables { get; } =
    [
        "site", "component", "component_model_revision", "inspection_method", "finding", "finding_revision",
        "repair", "repair_revision", "audit_log", "import_batch", "model_check", "component_status",
        "site_revision", "inspection_method_revision",
        "document_control", "consequence_class", "component_consequence",
    ];

    /// <summary>Tables added after version 1 (their append-only triggers come with their own migration).</summary>
    private static readonly string[] LaterTables = ["import_batch", "model_check", "component_status", "site_revision", "inspection_method_revision", "document_control", "consequence_class", "component_consequence"];


    /// <summary>
    /// The migrations, in order: index i takes the schema from version i to i + 1. Each is written once, in SQLite's
    /// words; its PostgreSQL text is derived from the same method (<see cref="PostgresScripts"/>). A new migration is
    /// appended here (docs/register.md, "Adding a migration").
    /// </summary>
    private static readonly Func<string>[] Definitions = [Version1, Version2, StoredResults, ModelChecks, SiteAndMethodCorrections, OwnerReports];

    /// <summary>Migration scripts (SQLite); index i takes the schema from version i to i + 1.</summary>
    public static IReadOnlyList<string> Scripts { get; } = Definitions.Select(d => d()).ToList();

    /// <summary>Index in <see cref="Scripts"/> of the migration that adds model checks (its C# step follows the SQL).</summary>
    private static int ModelCheckIndex => Array.IndexOf(Definitions, (Func<string>)ModelChecks);

    /// <summary>
    /// The schema version from which a register holds site and method corrections; a store opened at an earlier version
    /// (tests of migrations) reads sites and methods as first recorded.
    /// </summary>
    public static int CorrectionsVersion => Array.IndexOf(Definitions, (Func<string>)SiteAndMethodCorrections) + 1;

    /// <summary>The schema version this code writes and reads.</summary>
    public static int Current => Scripts.Count;

    private static string F(string format, string column) => string.Format(CultureInfo.InvariantCulture, format, column);

    private static string Recorded(bool withReason) =>
        $"""
          recorded_utc TEXT NOT NULL {F(Utc, "recorded_utc")},
          recorded_by TEXT NOT NULL {F(NonBlank, "recorded_by")}{(withReason ? $",\n  reason TEXT NOT NULL {F(NonBlank, "reason")}" : "")}
        """;

    private static string AppendOnly(string table) => Postgres ? PgAppendOnly(table) :
        $"""
        CREATE TRIGGER {table}_no_update BEFORE UPDATE ON {table}
        BEGIN SELECT RAISE(ABORT, '{table} is append-only: rows are never updated; record a new revision instead'); END;
        CREATE TRIGGER {table}_no_delete BEFORE DELETE ON {table}
        BEGIN SELECT RAISE(ABORT, '{table} is append-only: rows are never deleted; record a withdrawal instead'); END;
        """;

    private static string Audit(string table, string entity, string idColumn, string action, string detail) => Postgres ? PgAudit(table, entity, idColumn, action, detail) :
        $"""
        CREATE TRIGGER {table}_audit AFTER INSERT ON {table}
        BEGIN
          INSERT INTO audit_log (at_utc, actor, action, entity, entity_id, detail)
          VALUES (NEW.recorded_utc, NEW.recorded_by, {action}, '{entity}', NEW.{idColumn}, {detail});
        END;
        """;

    private static string RevisionChain(string table, string parent, string idColumn) => Postgres ? PgRevisionChain(table, parent, idColumn) :
        $"""
        CREATE TRIGGER {table}_chain BEFORE INSERT ON {table}
        WHEN NEW.revision > 1 AND (
             NEW.supersedes_revision_id IS NOT (SELECT {idColumn} FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)
          OR NEW.recorded_utc < (SELECT recorded_utc FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1))
        BEGIN SELECT RAISE(ABORT, '{table}: a revision must supersede the latest revision of the same record and be recorded no earlier'); END;
        """;

    private static string Version1() =>
        $"""
        CREATE TABLE audit_log (
          audit_id INTEGER PRIMARY KEY,
          at_utc TEXT NOT NULL {F(Utc, "at_utc")},
          actor TEXT NOT NULL {F(NonBlank, "actor")},
          action TEXT NOT NULL CHECK (action IN ('create', 'revise', 'withdraw', 'import', 'migrate')),
          entity TEXT NOT NULL,
          entity_id INTEGER NOT NULL,
          detail TEXT NOT NULL CHECK (json_valid(detail))
        ) STRICT;

        CREATE TABLE site (
          site_id INTEGER PRIMARY KEY,
          code TEXT NOT NULL UNIQUE {F(NonBlank, "code")},
          name TEXT NOT NULL {F(NonBlank, "name")},
        {Recorded(false)}
        ) STRICT;

        CREATE TABLE component (
          component_id INTEGER PRIMARY KEY,
          site_id INTEGER NOT NULL REFERENCES site (site_id),
          code TEXT NOT NULL UNIQUE {F(NonBlank, "code")},
          description TEXT NOT NULL DEFAULT '',
          install_date TEXT NOT NULL {F(IsoDate, "install_date")},
          wall_thickness_mm REAL CHECK (wall_thickness_mm IS NULL OR wall_thickness_mm > 0),
          parameter_group TEXT CHECK (parameter_group IS NULL OR length(trim(parameter_group)) > 0),
        {Recorded(false)}
        ) STRICT;

        CREATE TABLE component_model_revision (
          model_revision_id INTEGER PRIMARY KEY,
          component_id INTEGER NOT NULL REFERENCES component (component_id),
          revision INTEGER NOT NULL CHECK (revision >= 1),
          supersedes_revision_id INTEGER REFERENCES component_model_revision (model_revision_id),
          definition_json TEXT NOT NULL CHECK (json_valid(definition_json)),
          model_version TEXT NOT NULL {F(NonBlank, "model_version")},
        {Recorded(true)},
          UNIQUE (component_id, revision),
          CHECK ((revision = 1) = (supersedes_revision_id IS NULL))
        ) STRICT;

        CREATE TABLE inspection_method (
          method_id INTEGER PRIMARY KEY,
          name TEXT NOT NULL UNIQUE {F(NonBlank, "name")},
          description TEXT NOT NULL DEFAULT '',
          pod_form TEXT NOT NULL CHECK (pod_form IN ('log-logistic', 'cumulative-lognormal', 'exponential')),
          pod_mu_ln_mm REAL,
          pod_sigma_ln REAL CHECK (pod_sigma_ln IS NULL OR pod_sigma_ln > 0),
          pod_lambda_mm REAL CHECK (pod_lambda_mm IS NULL OR pod_lambda_mm > 0),
          pod_lower_limit_mm REAL NOT NULL DEFAULT 0 CHECK (pod_lower_limit_mm >= 0),
          pod_max REAL NOT NULL DEFAULT 1 CHECK (pod_max > 0 AND pod_max <= 1),
          false_call_probability REAL NOT NULL DEFAULT 0 CHECK (false_call_probability >= 0 AND false_call_probability < 1),
          sizing_kind TEXT NOT NULL CHECK (sizing_kind IN ('additive-normal', 'multiplicative-lognormal')),
          sizing_bias_mm REAL,
          sizing_sd_mm REAL CHECK (sizing_sd_mm IS NULL OR sizing_sd_mm > 0),
          sizing_ln_bias REAL,
          sizing_ln_sd REAL CHECK (sizing_ln_sd IS NULL OR sizing_ln_sd > 0),
        {Recorded(false)},
          CHECK ((pod_form = 'exponential' AND pod_lambda_mm IS NOT NULL AND pod_mu_ln_mm IS NULL AND pod_sigma_ln IS NULL)
              OR (pod_form <> 'exponential' AND pod_lambda_mm IS NULL AND pod_mu_ln_mm IS NOT NULL AND pod_sigma_ln IS NOT NULL)),
          CHECK ((sizing_kind = 'additive-normal' AND sizing_bias_mm IS NOT NULL AND sizing_sd_mm IS NOT NULL
                  AND sizing_ln_bias IS NULL AND sizing_ln_sd IS NULL)
              OR (sizing_kind = 'multiplicative-lognormal' AND sizing_ln_bias IS NOT NULL AND sizing_ln_sd IS NOT NULL
                  AND sizing_bias_mm IS NULL AND sizing_sd_mm IS NULL))
        ) STRICT;

        CREATE TABLE finding (
          finding_id INTEGER PRIMARY KEY,
          component_id INTEGER NOT NULL REFERENCES component (component_id),
        {Recorded(false)}
        ) STRICT;

        CREATE TABLE finding_revision (
          finding_revision_id INTEGER PRIMARY KEY,
          finding_id INTEGER NOT NULL REFERENCES finding (finding_id),
          revision INTEGER NOT NULL CHECK (revision >= 1),
          supersedes_revision_id INTEGER REFERENCES finding_revision (finding_revision_id),
          inspection_date TEXT NOT NULL {F(IsoDate, "inspection_date")},
          kind TEXT NOT NULL CHECK (kind IN ('no-indication', 'indication-not-sized', 'sized-indication', 'wall-thickness', 'in-service')),
          method_id INTEGER REFERENCES inspection_method (method_id),
          measured_size_mm REAL CHECK (measured_size_mm IS NULL OR measured_size_mm >= 0),
          remaining_wall_mm REAL CHECK (remaining_wall_mm IS NULL OR remaining_wall_mm >= 0),
          location TEXT NOT NULL DEFAULT '',
          note TEXT NOT NULL DEFAULT '',
          withdrawn INTEGER NOT NULL DEFAULT 0 CHECK (withdrawn IN (0, 1)),
        {Recorded(true)},
          UNIQUE (finding_id, revision),
          CHECK ((revision = 1) = (supersedes_revision_id IS NULL)),
          CHECK ((kind = 'in-service') = (method_id IS NULL)),
          CHECK ((kind = 'sized-indication') = (measured_size_mm IS NOT NULL)),
          CHECK ((kind = 'wall-thickness') = (remaining_wall_mm IS NOT NULL))
        ) STRICT;

        CREATE TABLE repair (
          repair_id INTEGER PRIMARY KEY,
          component_id INTEGER NOT NULL REFERENCES component (component_id),
        {Recorded(false)}
        ) STRICT;

        CREATE TABLE repair_revision (
          repair_revision_id INTEGER PRIMARY KEY,
          repair_id INTEGER NOT NULL REFERENCES repair (repair_id),
          revision INTEGER NOT NULL CHECK (revision >= 1),
          supersedes_revision_id INTEGER REFERENCES repair_revision (repair_revision_id),
          repair_date TEXT NOT NULL {F(IsoDate, "repair_date")},
          description TEXT NOT NULL DEFAULT '',
          post_repair_prior_json TEXT NOT NULL CHECK (json_valid(post_repair_prior_json)),
          withdrawn INTEGER NOT NULL DEFAULT 0 CHECK (withdrawn IN (0, 1)),
        {Recorded(true)},
          UNIQUE (repair_id, revision),
          CHECK ((revision = 1) = (supersedes_revision_id IS NULL))
        ) STRICT;

        {RevisionChain("component_model_revision", "component_id", "model_revision_id")}
        {RevisionChain("finding_revision", "finding_id", "finding_revision_id")}
        {RevisionChain("repair_revision", "repair_id", "repair_revision_id")}

        {Audit("site", "site", "site_id", "'create'", "json_object('code', NEW.code)")}
        {Audit("component", "component", "component_id", "'create'", "json_object('code', NEW.code)")}
        {Audit("component_model_revision", "component-model", "component_id", "CASE WHEN NEW.revision = 1 THEN 'create' ELSE 'revise' END", "json_object('revision', NEW.revision, 'model_version', NEW.model_version, 'reason', NEW.reason)")}
        {Audit("inspection_method", "inspection-method", "method_id", "'create'", "json_object('name', NEW.name)")}
        {Audit("finding_revision", "finding", "finding_id", "CASE WHEN NEW.revision = 1 THEN 'create' WHEN NEW.withdrawn = 1 THEN 'withdraw' ELSE 'revise' END", "json_object('revision', NEW.revision, 'reason', NEW.reason)")}
        {Audit("repair_revision", "repair", "repair_id", "CASE WHEN NEW.revision = 1 THEN 'create' WHEN NEW.withdrawn = 1 THEN 'withdraw' ELSE 'revise' END", "json_object('revision', NEW.revision, 'reason', NEW.reason)")}

        {string.Join("\n", AppendOnlyTables.Where(t => !LaterTables.Contains(t)).Select(AppendOnly))}
        """;

    // Version 2: import batches (which file, its SHA-256, how many rows) and indexes for the as-of reads.
    private static string Version2() =>
        $"""
        CREATE TABLE import_batch (
          import_batch_id INTEGER PRIMARY KEY,
          source_name TEXT NOT NULL {F(NonBlank, "source_name")},
          source_sha256 TEXT NOT NULL CHECK (length(source_sha256) = 64),
          row_count INTEGER NOT NULL CHECK (row_count >= 1),
        {Recorded(true)}
        ) STRICT;

        ALTER TABLE finding_revision ADD COLUMN import_batch_id INTEGER REFERENCES import_batch (import_batch_id);

        CREATE INDEX finding_by_component ON finding (component_id);
        CREATE INDEX repair_by_component ON repair (component_id);
        CREATE INDEX finding_revision_by_import ON finding_revision (import_batch_id);
        CREATE INDEX model_revision_by_component ON component_model_revision (component_id, revision);

        {Audit("import_batch", "import", "import_batch_id", "'import'", "json_object('source', NEW.source_name, 'sha256', NEW.source_sha256, 'rows', NEW.row_count)")}
        {AppendOnly("import_batch")}
        """;

    // Version 3: stored results of whole-register runs (results, not evidence: a rerun replaces a row; findings never change).
    // Self-contained so that it can be renumbered when migrations from other branches land first.
    private static string StoredResults() => ResultTable(inRegister: true);

    /// <summary>
    /// The table of stored component results. In the register it refers to the component; in a shard results file
    /// (<see cref="ShardResultsFile"/>) the same columns stand alone. One row per component, evidence date and options.
    /// </summary>
    public static string ResultTable(bool inRegister) =>
        $"""
        CREATE TABLE component_result (
          component_id INTEGER NOT NULL{(inRegister ? " REFERENCES component (component_id)" : "")},
          component_code TEXT NOT NULL {F(NonBlank, "component_code")},
          site_code TEXT NOT NULL,
          as_of TEXT NOT NULL {F(IsoDate, "as_of")},
          options_key TEXT NOT NULL {F(NonBlank, "options_key")},
          model_revision INTEGER NOT NULL CHECK (model_revision >= 1),
          component_fingerprint TEXT NOT NULL CHECK (length(component_fingerprint) = 64),
          tool_version TEXT NOT NULL {F(NonBlank, "tool_version")},
          result_key TEXT NOT NULL CHECK (length(result_key) = 64),
          status TEXT NOT NULL CHECK (status IN ('assessed', 'not-converged', 'failed')),
          error TEXT,
          annual_pf REAL,
          annual_pf_year_ending TEXT CHECK (annual_pf_year_ending IS NULL OR date(annual_pf_year_ending) IS annual_pf_year_ending),
          cumulative_pf REAL,
          beta REAL,
          route TEXT,
          converged INTEGER NOT NULL CHECK (converged IN (0, 1)),
          cov REAL,
          next_due TEXT CHECK (next_due IS NULL OR date(next_due) IS next_due),
          next_status TEXT,
          years_to_target REAL,
          target_reached INTEGER CHECK (target_reached IS NULL OR target_reached IN (0, 1)),
          remaining_life_years REAL,
          profiles_json TEXT CHECK (profiles_json IS NULL OR json_valid(profiles_json)),
          computed_utc TEXT NOT NULL {F(Utc, "computed_utc")},
          PRIMARY KEY (component_id, as_of, options_key),
          CHECK ((status = 'failed') = (error IS NOT NULL))
        ) STRICT;
        """;

    // Version 4 (two parts, one migration). Component status: retire and reinstate, with who, when and why.
    // Model checks: the register refuses a model that an assessment would refuse (since this version). Models stored
    // before are checked once when the file is migrated; those that do not pass are marked, listed by 'register check',
    // and stay readable: a new revision ('component revise') replaces them. One row per model revision, never updated.
    private static string ModelChecks() =>
        $"""
        CREATE TABLE model_check (
          model_revision_id INTEGER PRIMARY KEY REFERENCES component_model_revision (model_revision_id),
          passes INTEGER NOT NULL CHECK (passes IN (0, 1)),
          problems_json TEXT NOT NULL CHECK (json_valid(problems_json) AND json_type(problems_json) = 'array'),
          checked_utc TEXT NOT NULL {F(Utc, "checked_utc")},
          checked_by TEXT NOT NULL {F(NonBlank, "checked_by")}
        ) STRICT;

        {AppendOnly("model_check")}

        CREATE TABLE component_status (
          status_id INTEGER PRIMARY KEY,
          component_id INTEGER NOT NULL REFERENCES component (component_id),
          status TEXT NOT NULL CHECK (status IN ('retired', 'in-service')),
        {Recorded(true)}
        ) STRICT;
        CREATE INDEX component_status_by_component ON component_status (component_id, recorded_utc);

        {Audit("component_status", "component", "component_id", "CASE WHEN NEW.status = 'retired' THEN 'withdraw' ELSE 'revise' END", "json_object('status', NEW.status, 'reason', NEW.reason)")}
        {AppendOnly("component_status")}
        """;

    // Site and method corrections: revision 1 is the row in site / inspection_method (never changed); each correction
    // is a row here with revision 2, 3, ... superseding the previous one, with who, when and why. Reads as known on a
    // date take the latest revision recorded by then. A site's code and a method's name are their identity and are
    // never corrected (findings name the method); a site's name, a method's description, PoD and sizing error are.
    private static string SiteAndMethodCorrections() =>
        $"""
        CREATE TABLE site_revision (
          site_revision_id INTEGER PRIMARY KEY,
          site_id INTEGER NOT NULL REFERENCES site (site_id),
          revision INTEGER NOT NULL CHECK (revision >= 2),
          supersedes_revision_id INTEGER REFERENCES site_revision (site_revision_id),
          name TEXT NOT NULL {F(NonBlank, "name")},
        {Recorded(true)},
          UNIQUE (site_id, revision),
          CHECK ((revision = 2) = (supersedes_revision_id IS NULL))
        ) STRICT;

        CREATE TABLE inspection_method_revision (
          method_revision_id INTEGER PRIMARY KEY,
          method_id INTEGER NOT NULL REFERENCES inspection_method (method_id),
          revision INTEGER NOT NULL CHECK (revision >= 2),
          supersedes_revision_id INTEGER REFERENCES inspection_method_revision (method_revision_id),
          description TEXT NOT NULL DEFAULT '',
          pod_form TEXT NOT NULL CHECK (pod_form IN ('log-logistic', 'cumulative-lognormal', 'exponential')),
          pod_mu_ln_mm REAL,
          pod_sigma_ln REAL CHECK (pod_sigma_ln IS NULL OR pod_sigma_ln > 0),
          pod_lambda_mm REAL CHECK (pod_lambda_mm IS NULL OR pod_lambda_mm > 0),
          pod_lower_limit_mm REAL NOT NULL DEFAULT 0 CHECK (pod_lower_limit_mm >= 0),
          pod_max REAL NOT NULL DEFAULT 1 CHECK (pod_max > 0 AND pod_max <= 1),
          false_call_probability REAL NOT NULL DEFAULT 0 CHECK (false_call_probability >= 0 AND false_call_probability < 1),
          sizing_kind TEXT NOT NULL CHECK (sizing_kind IN ('additive-normal', 'multiplicative-lognormal')),
          sizing_bias_mm REAL,
          sizing_sd_mm REAL CHECK (sizing_sd_mm IS NULL OR sizing_sd_mm > 0),
          sizing_ln_bias REAL,
          sizing_ln_sd REAL CHECK (sizing_ln_sd IS NULL OR sizing_ln_sd > 0),
        {Recorded(true)},
          UNIQUE (method_id, revision),
          CHECK ((revision = 2) = (supersedes_revision_id IS NULL)),
          CHECK ((pod_form = 'exponential' AND pod_lambda_mm IS NOT NULL AND pod_mu_ln_mm IS NULL AND pod_sigma_ln IS NULL)
              OR (pod_form <> 'exponential' AND pod_lambda_mm IS NULL AND pod_mu_ln_mm IS NOT NULL AND pod_sigma_ln IS NOT NULL)),
          CHECK ((sizing_kind = 'additive-normal' AND sizing_bias_mm IS NOT NULL AND sizing_sd_mm IS NOT NULL
                  AND sizing_ln_bias IS NULL AND sizing_ln_sd IS NULL)
              OR (sizing_kind = 'multiplicative-lognormal' AND sizing_ln_bias IS NOT NULL AND sizing_ln_sd IS NOT NULL
                  AND sizing_bias_mm IS NULL AND sizing_sd_mm IS NULL))
        ) STRICT;

        CREATE INDEX site_revision_by_site ON site_revision (site_id, revision);
        CREATE INDEX method_revision_by_method ON inspection_method_revision (method_id, revision);

        {CorrectionChain("site_revision", "site", "site_id", "site_revision_id")}
        {CorrectionChain("inspection_method_revision", "inspection_method", "method_id", "method_revision_id")}

        {Audit("site_revision", "site", "site_id", "'revise'", "json_object('revision', NEW.revision, 'name', NEW.name, 'reason', NEW.reason)")}
        {Audit("inspection_method_revision", "inspection-method", "method_id", "'revise'", "json_object('revision', NEW.revision, 'reason', NEW.reason)")}

        {AppendOnly("site_revision")}
        {AppendOnly("inspection_method_revision")}
        """;

    // Corrections of a base row (revision 1) kept in a table of their own: revision 2 supersedes the base row (no
    // supersedes id), each later one the previous correction; none is recorded before what it supersedes.
    private static string CorrectionChain(string table, string baseTable, string parent, string idColumn) => Postgres ? PgCorrectionChain(table, baseTable, parent, idColumn) :
        $"""
        CREATE TRIGGER {table}_chain BEFORE INSERT ON {table}
        WHEN (NEW.revision = 2 AND (EXISTS (SELECT 1 FROM {table} WHERE {parent} = NEW.{parent})
                                   OR NEW.recorded_utc < (SELECT recorded_utc FROM {baseTable} WHERE {parent} = NEW.{parent})))
          OR (NEW.revision > 2 AND (
               NEW.supersedes_revision_id IS NOT (SELECT {idColumn} FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)
            OR NEW.recorded_utc < (SELECT recorded_utc FROM {table} WHERE {parent} = NEW.{parent} AND revision = NEW.revision - 1)))
        BEGIN SELECT RAISE(ABORT, '{table}: a correction must supersede the latest revision of the same record and be recorded no earlier'); END;
        """;

    // Version 6: what an owner signs and sends. Document control of the register's reports (title, owner, author,
    // checker, approver, revision and its date, the target's source), the owner's consequence classes 1–5 (meaning in
    // the owner's words, the target preset each class chooses) and each component's class with an optional cost of
    // failure. Append-only: the latest row is in force, every earlier one is the history, each with who, when and why.
    // Self-contained so that it can be renumbered when migrations from other branches land first.
    private static string OwnerReports() =>
        $"""
        CREATE TABLE document_control (
          document_control_id INTEGER PRIMARY KEY,
          title TEXT, owner TEXT, author TEXT, checker TEXT, approver TEXT,
          revision TEXT, revision_date TEXT CHECK (revision_date IS NULL OR date(revision_date) IS revision_date),
          target_source TEXT,
        {Recorded(true)}
        ) STRICT;
        {AppendOnly("document_control")}

        CREATE TABLE consequence_class (
          consequence_class_id INTEGER PRIMARY KEY,
          class INTEGER NOT NULL CHECK (class BETWEEN 1 AND 5),
          meaning TEXT NOT NULL {F(NonBlank, "meaning")},
          target_preset TEXT,
        {Recorded(true)}
        ) STRICT;
        CREATE INDEX consequence_class_by_class ON consequence_class (class, consequence_class_id);
        {AppendOnly("consequence_class")}

        CREATE TABLE component_consequence (
          component_consequence_id INTEGER PRIMARY KEY,
          component_id INTEGER NOT NULL REFERENCES component (component_id),
          class INTEGER NOT NULL CHECK (class BETWEEN 1 AND 5),
          cost_of_failure REAL CHECK (cost_of_failure IS NULL OR cost_of_failure >= 0),
        {Recorded(true)}
        ) STRICT;
        CREATE INDEX component_consequence_by_component ON component_consequence (component_id, component_consequence_id);
        {AppendOnly("component_consequence")}
        """;

    /// <summary>Checks every model revision that has no check row yet (within the migration's transaction).</summary>
    private static void CheckStoredModels(System.Data.Common.DbConnection connection, System.Data.Common.DbTransaction transaction, string at, string actor)
    {
        var revisions = Sql.Query(connection, transaction,
            "SELECT r.model_revision_id, r.definition_json FROM component_model_revision r LEFT JOIN model_check m ON m.model_revision_id = r.model_revision_id WHERE m.model_revision_id IS NULL",
            r => (Id: r.GetInt64(0), Json: r.GetString(1)));
        foreach (var (id, json) in revisions)
        {
            var problems = RegisterStore.ModelProblems(json);
            Sql.Insert(connection, transaction,
                "INSERT INTO model_check (model_revision_id, passes, problems_json, checked_utc, checked_by) VALUES ($id, $passes, $problems, $at, $by)",
                ("$id", id), ("$passes", problems.Count == 0 ? 1 : 0),
                ("$problems", System.Text.Json.JsonSerializer.Serialize(problems.Select(p => p.ToString()).ToArray())), ("$at", at), ("$by", actor));
        }
    }

    /// <summary>Reads PRAGMA user_version.</summary>
    public static int ReadVersion(SqliteConnection connection, SqliteTransaction? transaction = null)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "PRAGMA user_version";
        return Convert.ToInt32(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>Applies the migrations from the file's version up to <paramref name="target"/>, each in one IMMEDIATE transaction.</summary>
    /// <returns>The versions applied.</returns>
    public static IReadOnlyList<int> MigrateTo(SqliteConnection connection, int target, Func<string> utcNow, string actor)
    {
        var applied = new List<int>();
        while (true)
        {
            using var transaction = connection.BeginTransaction(deferred: false);
            // Re-read inside the write lock: another process may have migrated in the meantime.
            var version = ReadVersion(connection, transaction);
            if (version >= target)
            {
                return applied;
            }

            using (var command = connection.CreateCommand())
            {
                command.Transaction = transaction;
                // The script is a constant of this assembly and the version an integer: no user data is built into SQL.
                // Every migrated file carries the register's application id (registers of schema 1, 2 and 3 had none).
                command.CommandText = Scripts[version] + string.Create(CultureInfo.InvariantCulture,
                    $"\nPRAGMA user_version = {version + 1};\nPRAGMA application_id = {RegisterIdentity.ApplicationId};");
                command.ExecuteNonQuery();
            }

            if (version == ModelCheckIndex) CheckStoredModels(connection, transaction, utcNow(), actor);

            using (var audit = connection.CreateCommand())
            {
                audit.Transaction = transaction;
                audit.CommandText = "INSERT INTO audit_log (at_utc, actor, action, entity, entity_id, detail) VALUES ($at, $actor, 'migrate', 'schema', $version, json_object('to_version', $version))";
                audit.Parameters.AddWithValue("$at", utcNow());
                audit.Parameters.AddWithValue("$actor", actor);
                audit.Parameters.AddWithValue("$version", version + 1);
                audit.ExecuteNonQuery();
            }

            transaction.Commit();
            applied.Add(version + 1);
        }
    }
}
