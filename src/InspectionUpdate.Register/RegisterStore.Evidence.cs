using System.Data.Common;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using InspectionUpdate.Inspection;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    /// <summary>
    /// The evidence on a component as known on <paramref name="asOf"/>, in the core's terms: the latest revision of
    /// each finding and repair recorded by then (withdrawn ones left out), times in years since the install date
    /// (<see cref="ServiceTime"/>), methods rebuilt as <see cref="InspectionMethod"/>, ordered by time.
    /// </summary>
    /// <remarks>
    /// Mapping: no-indication → <see cref="NoIndication"/>; indication-not-sized → <see cref="IndicationNotSized"/>;
    /// sized-indication → <see cref="SizedIndication"/> with the measured size; wall-thickness → <see cref="SizedIndication"/>
    /// on the depth (nominal wall − reading) with the method's sizing error; in-service → <see cref="SurvivedInService"/>;
    /// repair → <see cref="Repair"/> with the parsed post-repair prior. Each outcome's Reference is "finding {id} rev {n}"
    /// or "repair {id} rev {n}".
    /// </remarks>
    /// <exception cref="ArgumentException">No component with this id was recorded by <paramref name="asOf"/>.</exception>
    public IReadOnlyList<InspectionOutcome> EvidenceFor(long componentId, DateTimeOffset asOf) => Read<IReadOnlyList<InspectionOutcome>>((c, t) => Evidence(c, t, componentId, asOf));

    /// <summary>Evidence as known at the end of <paramref name="asKnownOn"/> (UTC), see <see cref="EvidenceFor(long, DateTimeOffset)"/>.</summary>
    public IReadOnlyList<InspectionOutcome> EvidenceFor(long componentId, DateOnly asKnownOn) => EvidenceFor(componentId, EndOfDay(asKnownOn));

    /// <summary>
    /// Evidence of every component of a shared-parameter group as known on <paramref name="asOf"/>, by component id
    /// (one snapshot), for updating the group's shared parameter from sister components' findings.
    /// </summary>
    public IReadOnlyDictionary<long, IReadOnlyList<InspectionOutcome>> EvidenceForGroup(string parameterGroup, DateTimeOffset asOf) => Read((c, t) =>
    {
        var ids = Sql.Query(c, t, "SELECT component_id FROM component WHERE parameter_group = $group AND recorded_utc <= $asOf ORDER BY code",
            r => r.GetInt64(0), ("$group", parameterGroup), ("$asOf", Sql.Utc(asOf)));
        return (IReadOnlyDictionary<long, IReadOnlyList<InspectionOutcome>>)ids.ToDictionary(id => id, id => (IReadOnlyList<InspectionOutcome>)Evidence(c, t, id, asOf));
    });

    private static List<InspectionOutcome> Evidence(DbConnection c, DbTransaction t, long componentId, DateTimeOffset asOf)
    {
        var component = ReadComponent(c, t, componentId, asOf)
            ?? throw new ArgumentException(FormattableString.Invariant($"No component with id {componentId} in the register as of {Sql.Utc(asOf)}."), nameof(componentId));
        // Every method is loaded (a finding recorded by a machine whose clock ran behind the one that recorded its method
        // must still resolve), each with its corrections recorded by the as-known-on instant.
        var methods = ReadMethods(c, t, Sql.Utc(asOf), "1 = 1").ToDictionary(m => m.Name, m => m.ToInspectionMethod(), StringComparer.Ordinal);
        var outcomes = new List<(InspectionOutcome Outcome, int Order)>();
        var findings = ReadRevisions(c, t, $"f.component_id = $component AND {LatestAsOf} AND fr.withdrawn = 0",
            ("$component", componentId), ("$asOf", Sql.Utc(asOf)));
        foreach (var f in findings)
        {
            var years = ServiceTime.YearsSince(component.InstallDate, f.InspectionDate);
            InspectionMethod Method() => methods[f.MethodName!];
            InspectionOutcome outcome = f.Kind switch
            {
                FindingKind.NoIndication => new NoIndication(years, f.Reference, Method()),
                FindingKind.IndicationNotSized => new IndicationNotSized(years, f.Reference, Method()),
                FindingKind.SizedIndication => new SizedIndication(years, f.Reference, Method(), f.MeasuredSizeMm!.Value),
                FindingKind.WallThickness => new SizedIndication(years, f.Reference, Method(), component.WallThicknessMm!.Value - f.RemainingWallMm!.Value),
                FindingKind.InService => new SurvivedInService(years, f.Reference),
                _ => throw new InvalidDataException($"Unknown finding kind {f.Kind}."),
            };
            outcomes.Add((outcome, 1));
        }

        foreach (var r in ReadRepairs(c, t, $"r.component_id = $component AND {RepairLatestAsOf} AND rr.withdrawn = 0",
            ("$component", componentId), ("$asOf", Sql.Utc(asOf))))
        {
            var years = ServiceTime.YearsSince(component.InstallDate, r.RepairDate);
            // A finding on the repair date is taken to precede the repair (Order 1 before 2).
            outcomes.Add((new Repair(years, r.Reference, PostRepairPrior.ParseStored(r.PostRepairPriorJson)), 2));
        }

        return outcomes.OrderBy(o => o.Outcome.TimeYears).ThenBy(o => o.Order).ThenBy(o => o.Outcome.Reference, StringComparer.Ordinal)
            .Select(o => o.Outcome).ToList();
    }

    /// <summary>
    /// SHA-256 (hex) of the register's content as known on <paramref name="asOf"/>: schema version, sites, components,
    /// model revisions, methods, every finding and repair revision recorded by then (the audit trail is not included).
    /// Equal fingerprints mean an assessment run as of that instant sees the same data; print it in reports.
    /// </summary>
    public string Fingerprint(DateTimeOffset asOf) => Read((c, t) => FingerprintIn(c, t, asOf));

    private string FingerprintIn(DbConnection c, DbTransaction t, DateTimeOffset asOf) => Hash(c, t, "inspection-update register schema " + SchemaVersion.ToString(CultureInfo.InvariantCulture),
    [
        ("site", "SELECT site_id, code, name, recorded_utc, recorded_by FROM site WHERE recorded_utc <= $asOf ORDER BY site_id"),
        ("component", "SELECT component_id, site_id, code, description, install_date, wall_thickness_mm, parameter_group, recorded_utc, recorded_by FROM component WHERE recorded_utc <= $asOf ORDER BY component_id"),
        ("component_model_revision", "SELECT model_revision_id, component_id, revision, supersedes_revision_id, definition_json, model_version, recorded_utc, recorded_by, reason FROM component_model_revision WHERE recorded_utc <= $asOf ORDER BY model_revision_id"),
        ("inspection_method", $"SELECT {MethodColumns} FROM inspection_method WHERE recorded_utc <= $asOf ORDER BY method_id"),
        ("finding_revision", "SELECT fr.finding_revision_id, fr.finding_id, f.component_id, fr.revision, fr.supersedes_revision_id, fr.inspection_date, fr.kind, fr.method_id, fr.measured_size_mm, fr.remaining_wall_mm, fr.location, fr.note, fr.withdrawn, fr.recorded_utc, fr.recorded_by, fr.reason FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id WHERE fr.recorded_utc <= $asOf ORDER BY fr.finding_revision_id"),
        ("repair_revision", "SELECT rr.repair_revision_id, rr.repair_id, r.component_id, rr.revision, rr.supersedes_revision_id, rr.repair_date, rr.description, rr.post_repair_prior_json, rr.withdrawn, rr.recorded_utc, rr.recorded_by, rr.reason FROM repair_revision rr JOIN repair r ON r.repair_id = rr.repair_id WHERE rr.recorded_utc <= $asOf ORDER BY rr.repair_revision_id"),
        ("site_revision", "SELECT site_revision_id, site_id, revision, name, recorded_utc, recorded_by, reason FROM site_revision WHERE recorded_utc <= $asOf ORDER BY site_revision_id"),
        ("inspection_method_revision", $"SELECT method_revision_id, method_id, revision, {MethodParameterColumns}, recorded_utc, recorded_by, reason FROM inspection_method_revision WHERE recorded_utc <= $asOf ORDER BY method_revision_id"),
    ], ("$asOf", Sql.Utc(asOf)));

    /// <summary>
    /// SHA-256 (hex) of what one component's numbers rest on, as known on <paramref name="asOf"/>: the component row,
    /// its model revisions, every revision of its findings and repairs recorded by then, the methods those findings
    /// name, and its shared-parameter group's name. It reads only this component's rows (and the methods it uses), so
    /// it costs the same whatever the register size; it changes when anything that can change this component's
    /// numbers changes (and also on edits that cannot, such as a finding's note: a recomputation, never a stale result).
    /// </summary>
    /// <remarks>
    /// The assessment today treats each component on its own; shared parameters are not pooled across a group. When
    /// they are, the fingerprints of the group's other members must enter this hash.
    /// </remarks>
    public string ComponentFingerprint(long componentId, DateTimeOffset asOf) => Read((c, t) => Hash(c, t, "inspection-update component schema " + SchemaVersion.ToString(CultureInfo.InvariantCulture),
    [
        ("component", "SELECT component_id, site_id, code, install_date, wall_thickness_mm, parameter_group FROM component WHERE component_id = $id AND recorded_utc <= $asOf"),
        ("component_model_revision", "SELECT model_revision_id, revision, definition_json, model_version FROM component_model_revision WHERE component_id = $id AND recorded_utc <= $asOf ORDER BY revision"),
        ("finding_revision", "SELECT fr.finding_revision_id, fr.finding_id, fr.revision, fr.inspection_date, fr.kind, fr.method_id, fr.measured_size_mm, fr.remaining_wall_mm, fr.location, fr.note, fr.withdrawn, fr.recorded_utc FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id WHERE f.component_id = $id AND fr.recorded_utc <= $asOf ORDER BY fr.finding_revision_id"),
        ("repair_revision", "SELECT rr.repair_revision_id, rr.repair_id, rr.revision, rr.repair_date, rr.post_repair_prior_json, rr.withdrawn, rr.recorded_utc FROM repair_revision rr JOIN repair r ON r.repair_id = rr.repair_id WHERE r.component_id = $id AND rr.recorded_utc <= $asOf ORDER BY rr.repair_revision_id"),
        ("inspection_method", $"SELECT {MethodColumns} FROM inspection_method WHERE method_id IN (SELECT fr.method_id FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id WHERE f.component_id = $id AND fr.recorded_utc <= $asOf) ORDER BY method_id"),
        ("inspection_method_revision", $"SELECT method_id, revision, {MethodParameterColumns} FROM inspection_method_revision WHERE recorded_utc <= $asOf AND method_id IN (SELECT fr.method_id FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id WHERE f.component_id = $id AND fr.recorded_utc <= $asOf) ORDER BY method_revision_id"),
        // The consequence class chooses the plan's target where its class names a preset: a new class or preset is a new key.
        ("component_consequence", "SELECT component_consequence_id, class, cost_of_failure FROM component_consequence WHERE component_id = $id AND recorded_utc <= $asOf ORDER BY component_consequence_id"),
        ("consequence_class", "SELECT consequence_class_id, class, target_preset FROM consequence_class WHERE recorded_utc <= $asOf AND class IN (SELECT class FROM component_consequence WHERE component_id = $id AND recorded_utc <= $asOf) ORDER BY consequence_class_id"),
    ], ("$id", componentId), ("$asOf", Sql.Utc(asOf))));

    /// <summary>
    /// <see cref="ComponentFingerprint"/> of every component recorded by <paramref name="asOf"/>, with the latest model
    /// revision recorded by then, by component id: the same values as one call per component, read in one transaction
    /// with one query per table (a whole-register run compares every stored key with these before computing anything).
    /// </summary>
    public IReadOnlyDictionary<long, ComponentStamp> ComponentFingerprints(DateTimeOffset asOf) => Read((c, t) => ComponentFingerprintsIn(c, t, asOf));

    /// <summary>
    /// The text <see cref="ComponentFingerprint"/> hashes, built for all components at once: each table is read once,
    /// ordered by component, and each component's rows are appended to its own running hash in the same order and the
    /// same canonical form as the per-component queries. The methods and consequence classes a component names are
    /// taken from its own finding and consequence rows, as the per-component subqueries take them.
    /// </summary>
    private Dictionary<long, ComponentStamp> ComponentFingerprintsIn(DbConnection c, DbTransaction t, DateTimeOffset asOf)
    {
        var at = ("$asOf", (object?)Sql.Utc(asOf));
        var ids = Sql.Query(c, t, "SELECT component_id FROM component WHERE recorded_utc <= $asOf ORDER BY component_id", r => Id(r.GetValue(0)), at);
        var index = new Dictionary<long, int>(ids.Count);
        for (var i = 0; i < ids.Count; i++) index[ids[i]] = i;
        var hashes = new IncrementalHash[ids.Count];
        var revisions = new int?[ids.Count];
        var methodsUsed = new HashSet<long>?[ids.Count];
        var classesNamed = new HashSet<string>?[ids.Count];
        var text = new StringBuilder();
        try
        {
            var start = Encoding.UTF8.GetBytes("inspection-update component schema " + SchemaVersion.ToString(CultureInfo.InvariantCulture) + "\n");
            for (var i = 0; i < hashes.Length; i++)
            {
                hashes[i] = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
                hashes[i].AppendData(start);
            }

            // Rows ordered by component id (column 0, not hashed), then as the per-component query orders them.
            void Section(string name, string sql, Action<int, DbDataReader>? seen = null)
            {
                var header = Encoding.UTF8.GetBytes("# " + name + "\n");
                int next = 0, open = -1;
                void Flush()
                {
                    if (open < 0) return;
                    hashes[open].AppendData(Encoding.UTF8.GetBytes(text.ToString()));
                    text.Clear();
                    open = -1;
                }

                using (var command = Sql.Command(c, t, sql, at))
                using (var reader = command.ExecuteReader())
                {
                    while (reader.Read())
                    {
                        if (!index.TryGetValue(Id(reader.GetValue(0)), out var i)) continue;
                        if (i != open)
                        {
                            if (i < next) throw new InvalidOperationException($"Rows of section {name} are not ordered by component.");
                            Flush();
                            while (next <= i) hashes[next++].AppendData(header);
                            open = i;
                        }

                        AppendRow(text, reader, 1);
                        seen?.Invoke(i, reader);
                    }
                }

                Flush();
                while (next < hashes.Length) hashes[next++].AppendData(header);
            }

            // Rows shared by many components (methods, consequence classes): each component takes those it names.
            void Shared<TName>(string name, IReadOnlyList<(TName Name, string Row)> rows, Func<int, TName, bool> names)
            {
                var header = "# " + name + "\n";
                for (var i = 0; i < hashes.Length; i++)
                {
                    text.Clear().Append(header);
                    foreach (var (n, row) in rows)
                    {
                        if (names(i, n)) text.Append(row);
                    }

                    hashes[i].AppendData(Encoding.UTF8.GetBytes(text.ToString()));
                }

                text.Clear();
            }

            List<(TName, string)> Rows<TName>(string sql, Func<DbDataReader, TName> name) => Sql.Query(c, t, sql, r =>
            {
                var row = new StringBuilder();
                AppendRow(row, r, 1);
                return (name(r), row.ToString());
            }, at);

            Section("component", "SELECT component_id, component_id, site_id, code, install_date, wall_thickness_mm, parameter_group FROM component WHERE recorded_utc <= $asOf ORDER BY component_id");
            Section("component_model_revision", "SELECT component_id, model_revision_id, revision, definition_json, model_version FROM component_model_revision WHERE recorded_utc <= $asOf ORDER BY component_id, revision",
                (i, r) => revisions[i] = Convert.ToInt32(r.GetValue(2), CultureInfo.InvariantCulture));
            Section("finding_revision", "SELECT f.component_id, fr.finding_revision_id, fr.finding_id, fr.revision, fr.inspection_date, fr.kind, fr.method_id, fr.measured_size_mm, fr.remaining_wall_mm, fr.location, fr.note, fr.withdrawn, fr.recorded_utc FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id WHERE fr.recorded_utc <= $asOf ORDER BY f.component_id, fr.finding_revision_id",
                (i, r) =>
                {
                    if (!r.IsDBNull(6)) (methodsUsed[i] ??= []).Add(Id(r.GetValue(6)));
                });
            Section("repair_revision", "SELECT r.component_id, rr.repair_revision_id, rr.repair_id, rr.revision, rr.repair_date, rr.post_repair_prior_json, rr.withdrawn, rr.recorded_utc FROM repair_revision rr JOIN repair r ON r.repair_id = rr.repair_id WHERE rr.recorded_utc <= $asOf ORDER BY r.component_id, rr.repair_revision_id");
            Shared("inspection_method", Rows($"SELECT method_id, {MethodColumns} FROM inspection_method ORDER BY method_id", r => Id(r.GetValue(0))), (i, m) => methodsUsed[i]?.Contains(m) == true);
            Shared("inspection_method_revision", Rows($"SELECT method_id, method_id, revision, {MethodParameterColumns} FROM inspection_method_revision WHERE recorded_utc <= $asOf ORDER BY method_revision_id", r => Id(r.GetValue(0))), (i, m) => methodsUsed[i]?.Contains(m) == true);
            Section("component_consequence", "SELECT component_id, component_consequence_id, class, cost_of_failure FROM component_consequence WHERE recorded_utc <= $asOf ORDER BY component_id, component_consequence_id",
                (i, r) =>
                {
                    if (!r.IsDBNull(2)) (classesNamed[i] ??= new HashSet<string>(StringComparer.Ordinal)).Add(Canonical(r.GetValue(2)));
                });
            Shared("consequence_class", Rows("SELECT class, consequence_class_id, class, target_preset FROM consequence_class WHERE recorded_utc <= $asOf ORDER BY consequence_class_id", r => Canonical(r.GetValue(0))), (i, k) => classesNamed[i]?.Contains(k) == true);

            var stamps = new Dictionary<long, ComponentStamp>(ids.Count);
            for (var i = 0; i < ids.Count; i++) stamps[ids[i]] = new ComponentStamp(revisions[i], Convert.ToHexStringLower(hashes[i].GetHashAndReset()));
            return stamps;
        }
        finally
        {
            foreach (var h in hashes) h?.Dispose();
        }
    }

    private static long Id(object value) => Convert.ToInt64(value, CultureInfo.InvariantCulture);

    private static string Hash(DbConnection c, DbTransaction t, string header, IReadOnlyList<(string Name, string Sql)> tables, params (string Name, object? Value)[] parameters)
    {
        var text = new StringBuilder();
        text.Append(header).Append('\n');
        foreach (var (name, sql) in tables)
        {
            text.Append("# ").Append(name).Append('\n');
            using var command = Sql.Command(c, t, sql, parameters);
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                AppendRow(text, reader, 0);
            }
        }

        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
    }

    /// <summary>One row of a fingerprint: the columns from <paramref name="first"/> on, canonical, tab-separated, then a line end.</summary>
    private static void AppendRow(StringBuilder text, DbDataReader reader, int first)
    {
        var count = reader.FieldCount;
        for (var i = first; i < count; i++)
        {
            if (i > first)
            {
                text.Append('\t');
            }

            text.Append(Canonical(reader.GetValue(i)));
        }

        text.Append('\n');
    }

    private static string Canonical(object value) => value switch
    {
        DBNull => "\\N",
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        long l => l.ToString(CultureInfo.InvariantCulture),
        string s when s.AsSpan().IndexOfAny("\\\t\n\r") < 0 => s,
        string s => s.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("\t", "\\t", StringComparison.Ordinal).Replace("\n", "\\n", StringComparison.Ordinal).Replace("\r", "\\r", StringComparison.Ordinal),
        _ => Convert.ToString(value, CultureInfo.InvariantCulture) ?? "",
    };

    /// <summary>The audit trail, oldest first, optionally limited to entries at or after <paramref name="since"/> and to one entity kind.</summary>
    public IReadOnlyList<AuditEntry> AuditTrail(DateTimeOffset? since = null, string? entity = null) => Read((c, t) => Sql.Query(c, t,
        "SELECT * FROM audit_log WHERE at_utc >= $since AND (CAST($entity AS TEXT) IS NULL OR entity = $entity) ORDER BY audit_id",
        r => new AuditEntry(r.Long("audit_id"), Sql.ParseUtc(r.Text("at_utc")), r.Text("actor"), r.Text("action"), r.Text("entity"), r.Long("entity_id"), r.Text("detail")),
        ("$since", Sql.Utc(since ?? DateTimeOffset.MinValue)), ("$entity", entity)));

    /// <summary>
    /// Checks the file: PRAGMA integrity_check, PRAGMA foreign_key_check, and the register's invariants (schema
    /// version, WAL mode, append-only triggers present, contiguous revision chains, a model for every component).
    /// </summary>
    public RegisterCheckResult Check() => Read((c, t) =>
    {
        IReadOnlyList<string> integrity, foreign;
        var invariants = new List<string>();
        int version;
        HashSet<string> triggers;
        if (Kind == RegisterStoreKind.PostgreSql)
        {
            // PostgreSQL checks its own pages and enforces the foreign keys; unvalidated constraints are listed.
            (integrity, foreign, version, invariants, triggers) = PostgresCheckFacts(c, t);
            if (version != Schema.Migrations.Current)
            {
                invariants.Add(FormattableString.Invariant($"schema version {version}, expected {Schema.Migrations.Current}"));
            }
        }
        else
        {
            integrity = Sql.Query(c, t, "PRAGMA integrity_check", r => r.GetString(0));
            foreign = Sql.Query(c, t, "PRAGMA foreign_key_check", r =>
                FormattableString.Invariant($"{r.GetString(0)} row {(r.IsDBNull(1) ? "?" : r.GetInt64(1).ToString(CultureInfo.InvariantCulture))} refers to a missing {r.GetString(2)} (constraint {r.GetInt64(3)})"));
            version = Schema.Migrations.ReadVersion((Microsoft.Data.Sqlite.SqliteConnection)c, (Microsoft.Data.Sqlite.SqliteTransaction)t);
            if (version != Schema.Migrations.Current)
            {
                invariants.Add(FormattableString.Invariant($"schema version {version}, expected {Schema.Migrations.Current}"));
            }

            // An immutable (read-only) connection reports its own journal mode: the file header tells the file's.
            var journal = IsReadOnly ? (Schema.RegisterIdentity.IsWalFile(Path) ? "wal" : "delete")
                : Convert.ToString(Sql.Scalar(c, t, "PRAGMA journal_mode"), CultureInfo.InvariantCulture);
            if (!string.Equals(journal, "wal", StringComparison.OrdinalIgnoreCase))
            {
                invariants.Add($"journal mode is '{journal}', expected 'wal'");
            }

            triggers = Sql.Query(c, t, "SELECT name FROM sqlite_master WHERE type = 'trigger'", r => r.GetString(0)).ToHashSet(StringComparer.Ordinal);
        }

        foreach (var table in Schema.Migrations.AppendOnlyTables)
        {
            foreach (var trigger in new[] { table + "_no_update", table + "_no_delete" })
            {
                if (!triggers.Contains(trigger))
                {
                    invariants.Add($"append-only trigger {trigger} is missing");
                }
            }
        }

        foreach (var (table, parent, logical) in new[] { ("finding_revision", "finding_id", "finding"), ("repair_revision", "repair_id", "repair"), ("component_model_revision", "component_id", "component") })
        {
            // Table and column names come from the constant list above, never from input.
            invariants.AddRange(Sql.Query(c, t,
                $"SELECT p.{parent}, COUNT(x.revision), MIN(x.revision), MAX(x.revision) FROM {logical} p LEFT JOIN {table} x ON x.{parent} = p.{parent} " +
                $"GROUP BY p.{parent} HAVING COUNT(x.revision) = 0 OR MIN(x.revision) <> 1 OR MAX(x.revision) <> COUNT(x.revision)",
                r => FormattableString.Invariant($"{logical} {r.GetInt64(0)}: revisions in {table} are not 1..n ({r.GetInt64(1)} rows)")));
        }

        // Corrections of sites and methods: revisions 2..n+1 after the base row (revision 1).
        foreach (var (table, parent) in new[] { ("site_revision", "site_id"), ("inspection_method_revision", "method_id") })
        {
            // Table and column names come from the constant list above, never from input.
            invariants.AddRange(Sql.Query(c, t,
                $"SELECT {parent}, COUNT(*), MIN(revision), MAX(revision) FROM {table} GROUP BY {parent} HAVING MIN(revision) <> 2 OR MAX(revision) <> COUNT(*) + 1",
                r => FormattableString.Invariant($"{table} of {parent} {r.GetInt64(0)}: corrections are not revisions 2..n ({r.GetInt64(1)} rows)")));
        }

        // Current models (latest revision of each component) checked as an assessment would; marked ones first.
        var marked = Sql.Query(c, t, "SELECT model_revision_id FROM model_check WHERE passes = 0", r => r.GetInt64(0)).ToHashSet();
        var invalidModels = new List<string>();
        foreach (var (code, revisionId, revision, json) in Sql.Query(c, t,
            "SELECT c.code, r.model_revision_id, r.revision, r.definition_json FROM component c JOIN component_model_revision r ON r.component_id = c.component_id " +
            "WHERE r.revision = (SELECT MAX(revision) FROM component_model_revision x WHERE x.component_id = c.component_id) ORDER BY c.code",
            r => (r.GetString(0), r.GetInt64(1), r.GetInt64(2), r.GetString(3))))
        {
            var problems = ModelProblems(json);
            if (problems.Count == 0) continue;
            invalidModels.Add(FormattableString.Invariant($"component {code} model revision {revision}{(marked.Contains(revisionId) ? " (marked when the register was migrated)" : "")}: ")
                + string.Join("; ", problems.Select(p => p.ToString())));
        }

        return new RegisterCheckResult(version, integrity, foreign, invariants, invalidModels);
    });
}
