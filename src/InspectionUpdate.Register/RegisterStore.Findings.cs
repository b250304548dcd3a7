using System.Data.Common;
using System.Globalization;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    private const string RevisionSelect =
        "SELECT fr.*, f.component_id, c.code AS component_code, m.name AS method_name " +
        "FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id " +
        "JOIN component c ON c.component_id = f.component_id LEFT JOIN inspection_method m ON m.method_id = fr.method_id ";

    // Latest revision of each finding recorded on or before $asOf (revisions are recorded in order, enforced by trigger).
    private const string LatestAsOf =
        "fr.recorded_utc <= $asOf AND fr.revision = (SELECT MAX(x.revision) FROM finding_revision x WHERE x.finding_id = fr.finding_id AND x.recorded_utc <= $asOf)";

    /// <summary>Text stored for each finding kind.</summary>
    public static string KindText(FindingKind kind) => kind switch
    {
        FindingKind.NoIndication => "no-indication",
        FindingKind.IndicationNotSized => "indication-not-sized",
        FindingKind.SizedIndication => "sized-indication",
        FindingKind.WallThickness => "wall-thickness",
        FindingKind.InService => "in-service",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown finding kind."),
    };

    /// <summary>Parses the stored text of a finding kind; false for unknown text.</summary>
    public static bool TryParseKind(string? text, out FindingKind kind)
    {
        foreach (var k in Enum.GetValues<FindingKind>())
        {
            if (string.Equals(KindText(k), text?.Trim(), StringComparison.Ordinal))
            {
                kind = k;
                return true;
            }
        }

        kind = default;
        return false;
    }

    /// <summary>
    /// Checks a finding against the register without writing: unknown component, date before install or in the
    /// future, unknown or missing method, missing, negative or beyond-the-wall size or reading, duplicate (a live
    /// finding of the same component, date, method and location). Every problem is listed.
    /// </summary>
    public IReadOnlyList<ValidationProblem> ValidateFinding(NewFinding finding)
    {
        ArgumentNullException.ThrowIfNull(finding);
        return Read((c, t) => new FindingValidation(this, c, t).Validate(finding, null, null));
    }

    /// <summary>Adds a finding as revision 1. Refused, with every problem and nothing written, when invalid.</summary>
    /// <param name="finding">The finding.</param>
    /// <param name="actor">Who records it.</param>
    /// <param name="reason">Why (e.g. "inspection report IR-2031"); stored with the revision.</param>
    public WriteResult<FindingRevision> AddFinding(NewFinding finding, string actor, string reason)
    {
        ArgumentNullException.ThrowIfNull(finding);
        return Write((c, t) =>
        {
            var validation = new FindingValidation(this, c, t);
            var problems = validation.Validate(finding, null, null).ToList();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "reason", reason);
            if (problems.Count > 0)
            {
                return (WriteResult<FindingRevision>.Refused(problems), false);
            }

            var id = InsertNewFinding(c, t, validation, finding, actor, reason, null, NowText());
            return (WriteResult<FindingRevision>.Ok(ReadRevisions(c, t, "fr.finding_id = $id", ("$id", id)).Single()), true);
        });
    }

    /// <summary>
    /// Records a correction: a new revision of the finding with the corrected content, superseding the latest one.
    /// The component cannot change (withdraw and add instead). The old revision stays readable.
    /// </summary>
    public WriteResult<FindingRevision> ReviseFinding(long findingId, NewFinding corrected, string actor, string reason) =>
        Revise(findingId, corrected, actor, reason, null);

    /// <summary>
    /// Records a correction of revision <paramref name="ofRevision"/> of the finding (the revision the user read). When
    /// another user has superseded that revision in the meantime, the correction is refused (field <c>revision</c>,
    /// naming who recorded the newer revision and when) and nothing is written: no correction is applied over one the
    /// user has not seen.
    /// </summary>
    public WriteResult<FindingRevision> ReviseFinding(long findingId, NewFinding corrected, string actor, string reason, int ofRevision) =>
        Revise(findingId, corrected, actor, reason, ofRevision);

    private WriteResult<FindingRevision> Revise(long findingId, NewFinding corrected, string actor, string reason, int? ofRevision)
    {
        ArgumentNullException.ThrowIfNull(corrected);
        return Write((c, t) =>
        {
            var latest = ReadRevisions(c, t, "fr.finding_id = $id ORDER BY fr.revision DESC LIMIT 1", ("$id", findingId)).SingleOrDefault();
            if (latest is null)
            {
                return (WriteResult<FindingRevision>.Refused([new("finding_id", findingId.ToString(CultureInfo.InvariantCulture), "no finding with this id")]), false);
            }

            if (ofRevision is { } seen && seen != latest.Revision)
            {
                return (WriteResult<FindingRevision>.Refused([new("revision", seen.ToString(CultureInfo.InvariantCulture), seen > latest.Revision || seen < 1
                    ? FormattableString.Invariant($"finding {findingId} has no revision {seen} (its latest is {latest.Revision})")
                    : FormattableString.Invariant($"finding {findingId} revision {seen} was superseded by revision {latest.Revision}, recorded by {latest.Recorded.RecordedBy} at {Sql.Utc(latest.Recorded.RecordedUtc)}: nothing was written; read the finding again and correct revision {latest.Revision}"))]), false);
            }

            var validation = new FindingValidation(this, c, t);
            var problems = validation.Validate(corrected, findingId, null).ToList();
            if (corrected.ComponentCode != latest.ComponentCode)
            {
                problems.Add(new("component_code", corrected.ComponentCode, $"a revision cannot move finding {findingId} from component '{latest.ComponentCode}'; withdraw it and add a new finding"));
            }

            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "reason", reason);
            if (problems.Count > 0)
            {
                return (WriteResult<FindingRevision>.Refused(problems), false);
            }

            var resolved = validation.Resolve(corrected);
            InsertRevision(c, t, findingId, latest.Revision + 1, latest.RevisionId, corrected, resolved.MethodId, false, actor, reason, null,
                Monotone(latest.Recorded.RecordedUtc));
            return (WriteResult<FindingRevision>.Ok(ReadRevisions(c, t, "fr.finding_id = $id ORDER BY fr.revision DESC LIMIT 1", ("$id", findingId)).Single()), true);
        });
    }

    /// <summary>Withdraws a finding (entered in error): a new revision marked withdrawn; nothing is deleted.</summary>
    public WriteResult<FindingRevision> WithdrawFinding(long findingId, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        var latest = ReadRevisions(c, t, "fr.finding_id = $id ORDER BY fr.revision DESC LIMIT 1", ("$id", findingId)).SingleOrDefault();
        if (latest is null)
        {
            problems.Add(new("finding_id", findingId.ToString(CultureInfo.InvariantCulture), "no finding with this id"));
        }
        else if (latest.Withdrawn)
        {
            problems.Add(new("finding_id", findingId.ToString(CultureInfo.InvariantCulture), "the finding is already withdrawn"));
        }

        if (problems.Count > 0)
        {
            return (WriteResult<FindingRevision>.Refused(problems), false);
        }

        var content = new NewFinding(latest!.ComponentCode, latest.InspectionDate, latest.Kind, latest.MethodName, latest.MeasuredSizeMm,
            latest.RemainingWallMm, latest.Location, latest.Note);
        var methodId = Sql.Scalar(c, t, "SELECT method_id FROM finding_revision WHERE finding_revision_id = $id", ("$id", latest.RevisionId));
        InsertRevision(c, t, findingId, latest.Revision + 1, latest.RevisionId, content, methodId as long?, true, actor, reason, null,
            Monotone(latest.Recorded.RecordedUtc));
        return (WriteResult<FindingRevision>.Ok(ReadRevisions(c, t, "fr.finding_id = $id ORDER BY fr.revision DESC LIMIT 1", ("$id", findingId)).Single()), true);
    });

    /// <summary>Every revision of a finding, oldest first (empty for an unknown id).</summary>
    public IReadOnlyList<FindingRevision> FindingHistory(long findingId) =>
        Read((c, t) => ReadRevisions(c, t, "fr.finding_id = $id ORDER BY fr.revision", ("$id", findingId)));

    /// <summary>
    /// Every revision of every finding of a component recorded on or before <paramref name="asOf"/> (withdrawals
    /// included), by finding and revision: each finding's history as known then, in one read.
    /// </summary>
    public IReadOnlyList<FindingRevision> FindingRevisions(long componentId, DateTimeOffset asOf) =>
        Read((c, t) => ReadRevisions(c, t, "f.component_id = $component AND fr.recorded_utc <= $asOf ORDER BY fr.finding_id, fr.revision",
            ("$component", componentId), ("$asOf", Sql.Utc(asOf))));

    /// <summary>The latest revision of a finding recorded on or before <paramref name="asOf"/>, or null.</summary>
    public FindingRevision? GetFinding(long findingId, DateTimeOffset? asOf = null) =>
        Read((c, t) => ReadRevisions(c, t, $"fr.finding_id = $id AND {LatestAsOf}", ("$id", findingId), ("$asOf", AsOfText(asOf))).SingleOrDefault());

    /// <summary>
    /// The findings of a component as known on <paramref name="asOf"/>: the latest revision of each recorded by then,
    /// withdrawn ones left out unless asked for, ordered by inspection date.
    /// </summary>
    public IReadOnlyList<FindingRevision> Findings(long componentId, DateTimeOffset? asOf = null, bool includeWithdrawn = false) =>
        Read((c, t) => ReadRevisions(c, t,
            $"f.component_id = $component AND {LatestAsOf}{(includeWithdrawn ? "" : " AND fr.withdrawn = 0")} ORDER BY fr.inspection_date, fr.finding_id",
            ("$component", componentId), ("$asOf", AsOfText(asOf))));

    private static List<FindingRevision> ReadRevisions(DbConnection c, DbTransaction t, string where, params (string, object?)[] parameters) =>
        Sql.Query(c, t, RevisionSelect + "WHERE " + where, r =>
        {
            if (!TryParseKind(r.Text("kind"), out var kind))
            {
                throw new InvalidDataException($"Unknown finding kind '{r.Text("kind")}' in the register (the CHECK constraint should have refused it).");
            }

            return new FindingRevision(
                r.Long("finding_id"), (int)r.Long("revision"), r.Long("finding_revision_id"), r.Long("component_id"), r.Text("component_code"),
                Sql.ParseDate(r.Text("inspection_date")), kind, r.NullableString("method_name"), r.NullableDouble("measured_size_mm"),
                r.NullableDouble("remaining_wall_mm"), r.Text("location"), r.Text("note"), r.Long("withdrawn") == 1,
                r.NullableLong("import_batch_id"), r.Provenance(true));
        }, parameters);

    private static long InsertNewFinding(DbConnection c, DbTransaction t, FindingValidation validation, NewFinding finding,
        string actor, string reason, long? importBatchId, string now)
    {
        var resolved = validation.Resolve(finding);
        var id = Sql.Insert(c, t, "INSERT INTO finding (component_id, recorded_utc, recorded_by) VALUES ($component, $at, $by)",
            ("$component", resolved.ComponentId), ("$at", now), ("$by", actor));
        InsertRevision(c, t, id, 1, null, finding, resolved.MethodId, false, actor, reason, importBatchId, now);
        validation.Remember(finding, id);
        return id;
    }

    private static void InsertRevision(DbConnection c, DbTransaction t, long findingId, int revision, long? supersedes, NewFinding f,
        long? methodId, bool withdrawn, string actor, string reason, long? importBatchId, string now) =>
        Sql.Insert(c, t,
            "INSERT INTO finding_revision (finding_id, revision, supersedes_revision_id, inspection_date, kind, method_id, measured_size_mm, " +
            "remaining_wall_mm, location, note, withdrawn, recorded_utc, recorded_by, reason, import_batch_id) " +
            "VALUES ($finding, $revision, $supersedes, $date, $kind, $method, $size, $wall, $location, $note, $withdrawn, $at, $by, $reason, $batch)",
            ("$finding", findingId), ("$revision", revision), ("$supersedes", supersedes), ("$date", Sql.Date(f.InspectionDate)),
            ("$kind", KindText(f.Kind)), ("$method", methodId), ("$size", f.MeasuredSizeMm), ("$wall", f.RemainingWallMm),
            ("$location", f.Location?.Trim() ?? ""), ("$note", f.Note ?? ""), ("$withdrawn", withdrawn ? 1 : 0),
            ("$at", now), ("$by", actor), ("$reason", reason), ("$batch", importBatchId));

    /// <summary>Validation of findings inside one transaction, caching components, methods and live duplicate keys.</summary>
    private sealed class FindingValidation(RegisterStore store, DbConnection c, DbTransaction t)
    {
        private readonly Dictionary<string, (long Id, DateOnly Install, double? WallMm)?> _components = new(StringComparer.Ordinal);
        private readonly Dictionary<string, long?> _methods = new(StringComparer.Ordinal);
        private readonly Dictionary<long, Dictionary<string, long>> _liveKeys = [];

        public (long ComponentId, long? MethodId) Resolve(NewFinding f) =>
            (Component(f.ComponentCode)!.Value.Id, string.IsNullOrWhiteSpace(f.MethodName) ? null : Method(f.MethodName));

        public void Remember(NewFinding f, long findingId)
        {
            var (componentId, methodId) = Resolve(f);
            LiveKeys(componentId)[Key(f, methodId)] = findingId;
        }

        /// <param name="self">The finding being revised (excluded from the duplicate check).</param>
        /// <param name="line">Line number for imports.</param>
        public List<ValidationProblem> Validate(NewFinding f, long? self, int? line)
        {
            var problems = new List<ValidationProblem>();
            void Problem(string field, string? value, string message) => problems.Add(new(field, value, message, line));

            var component = string.IsNullOrWhiteSpace(f.ComponentCode) ? null : Component(f.ComponentCode);
            if (component is null)
            {
                Problem("component_code", f.ComponentCode, "no component with this code");
            }
            else if (f.InspectionDate < component.Value.Install)
            {
                Problem("inspection_date", Sql.Date(f.InspectionDate), $"the inspection date lies before the component's install date {Sql.Date(component.Value.Install)}");
            }

            if (f.InspectionDate > store.Today())
            {
                Problem("inspection_date", Sql.Date(f.InspectionDate), "the inspection date lies in the future");
            }

            if (!Enum.IsDefined(f.Kind))
            {
                Problem("kind", f.Kind.ToString(), "unknown finding kind");
                return problems;
            }

            long? methodId = null;
            if (f.Kind == FindingKind.InService)
            {
                if (!string.IsNullOrWhiteSpace(f.MethodName))
                {
                    Problem("method", f.MethodName, "an in-service record takes no inspection method");
                }
            }
            else if (string.IsNullOrWhiteSpace(f.MethodName))
            {
                Problem("method", f.MethodName, $"a {KindText(f.Kind)} finding needs the inspection method");
            }
            else
            {
                methodId = Method(f.MethodName);
                if (methodId is null)
                {
                    Problem("method", f.MethodName, "no inspection method with this name");
                }
            }

            var wall = component?.WallMm;
            if (f.Kind == FindingKind.SizedIndication)
            {
                CheckSize(Problem, "measured_size_mm", f.MeasuredSizeMm, wall, "the measured size");
            }
            else if (f.MeasuredSizeMm is { } size)
            {
                Problem("measured_size_mm", Sql.Invariant(size), $"only a sized-indication finding carries a measured size (kind is {KindText(f.Kind)})");
            }

            if (f.Kind == FindingKind.WallThickness)
            {
                if (component is not null && wall is null)
                {
                    Problem("remaining_wall_mm", f.RemainingWallMm is { } w ? Sql.Invariant(w) : null, $"component '{f.ComponentCode}' has no nominal wall thickness, so a wall reading cannot be turned into a depth");
                }

                CheckSize(Problem, "remaining_wall_mm", f.RemainingWallMm, wall, "the remaining wall");
            }
            else if (f.RemainingWallMm is { } reading)
            {
                Problem("remaining_wall_mm", Sql.Invariant(reading), $"only a wall-thickness finding carries a remaining-wall reading (kind is {KindText(f.Kind)})");
            }

            if (component is not null && (methodId is not null || f.Kind == FindingKind.InService)
                && LiveKeys(component.Value.Id).TryGetValue(Key(f, methodId), out var existing) && existing != self)
            {
                Problem("inspection_date", Sql.Date(f.InspectionDate),
                    $"duplicate: finding {existing} already records component '{f.ComponentCode}' on this date with method '{f.MethodName ?? "(none)"}' at location '{f.Location?.Trim() ?? ""}'; correct it with a revision instead");
            }

            return problems;
        }

        private static void CheckSize(Action<string, string?, string> problem, string field, double? value, double? wallMm, string what)
        {
            if (value is not { } v)
            {
                problem(field, null, $"{what} is required for this kind of finding");
            }
            else if (!double.IsFinite(v))
            {
                problem(field, Sql.Invariant(v), $"{what} must be a finite number of mm");
            }
            else if (v < 0)
            {
                problem(field, Sql.Invariant(v), $"{what} must not be negative");
            }
            else if (wallMm is { } wall && v > wall)
            {
                problem(field, Sql.Invariant(v), $"{what} lies beyond the wall thickness {Sql.Invariant(wall)} mm");
            }
        }

        private static string Key(NewFinding f, long? methodId) =>
            FormattableString.Invariant($"{Sql.Date(f.InspectionDate)}|{methodId ?? 0}|{(f.Location ?? "").Trim().ToUpperInvariant()}");

        private (long Id, DateOnly Install, double? WallMm)? Component(string code)
        {
            if (!_components.TryGetValue(code, out var value))
            {
                value = Sql.Query(c, t, "SELECT component_id, install_date, wall_thickness_mm FROM component WHERE code = $code",
                    r => ((long Id, DateOnly Install, double? WallMm)?)(r.Long("component_id"), Sql.ParseDate(r.Text("install_date")), r.NullableDouble("wall_thickness_mm")),
                    ("$code", code)).SingleOrDefault();
                _components[code] = value;
            }

            return value;
        }

        private long? Method(string name)
        {
            if (!_methods.TryGetValue(name, out var value))
            {
                value = Sql.Scalar(c, t, "SELECT method_id FROM inspection_method WHERE name = $name", ("$name", name)) as long?;
                _methods[name] = value;
            }

            return value;
        }

        private Dictionary<string, long> LiveKeys(long componentId)
        {
            if (!_liveKeys.TryGetValue(componentId, out var keys))
            {
                keys = [];
                var rows = Sql.Query(c, t,
                    "SELECT fr.finding_id, fr.inspection_date, fr.method_id, fr.location FROM finding_revision fr JOIN finding f ON f.finding_id = fr.finding_id " +
                    "WHERE f.component_id = $component AND fr.withdrawn = 0 AND fr.revision = (SELECT MAX(x.revision) FROM finding_revision x WHERE x.finding_id = fr.finding_id)",
                    r => (Id: r.Long("finding_id"), Date: r.Text("inspection_date"), Method: r.NullableLong("method_id"), Location: r.Text("location")),
                    ("$component", componentId));
                foreach (var row in rows)
                {
                    keys[FormattableString.Invariant($"{row.Date}|{row.Method ?? 0}|{row.Location.Trim().ToUpperInvariant()}")] = row.Id;
                }

                _liveKeys[componentId] = keys;
            }

            return keys;
        }
    }
}
