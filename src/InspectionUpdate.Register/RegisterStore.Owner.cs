using System.Data.Common;

namespace InspectionUpdate.Register;

/// <summary>
/// Document control of a register's reports, as recorded (null fields: not set). The latest record is in force; the
/// earlier ones are its history.
/// </summary>
/// <param name="Id">Row id.</param>
/// <param name="Title">Report title of the owner's choosing.</param>
/// <param name="Owner">Owner (the duty holder) the report is issued for.</param>
/// <param name="Author">Who prepared the report.</param>
/// <param name="Checker">Who checked it.</param>
/// <param name="Approver">Who approved it.</param>
/// <param name="Revision">Revision number or letter, e.g. "2" or "B".</param>
/// <param name="RevisionDate">Date of that revision.</param>
/// <param name="TargetSource">Where the target comes from (the owner's justification).</param>
/// <param name="Recorded">Who recorded it, when and why.</param>
public sealed record DocumentControlRecord(long Id, string? Title, string? Owner, string? Author, string? Checker, string? Approver, string? Revision,
    DateOnly? RevisionDate, string? TargetSource, Provenance Recorded);

/// <summary>New document-control fields; a null field keeps the value in force (set a field to clear it with an empty string).</summary>
public sealed record DocumentControlChange(string? Title = null, string? Owner = null, string? Author = null, string? Checker = null, string? Approver = null,
    string? Revision = null, DateOnly? RevisionDate = null, string? TargetSource = null);

/// <summary>One of the owner's consequence classes (1–5) as recorded.</summary>
/// <param name="Id">Row id.</param>
/// <param name="Class">Class number, 1 (least severe) to 5 (most severe).</param>
/// <param name="Meaning">What the class means, in the owner's words.</param>
/// <param name="TargetPreset">Name of the target preset the class chooses, or null.</param>
/// <param name="Recorded">Who, when and why.</param>
public sealed record ConsequenceClassRecord(long Id, int Class, string Meaning, string? TargetPreset, Provenance Recorded);

/// <summary>A component's consequence class as recorded.</summary>
/// <param name="Id">Row id.</param>
/// <param name="ComponentId">Component id.</param>
/// <param name="ComponentCode">Component code.</param>
/// <param name="Class">Consequence class 1–5.</param>
/// <param name="CostOfFailure">Optional cost of failure (the owner's currency, as the register states it).</param>
/// <param name="Recorded">Who, when and why.</param>
public sealed record ComponentConsequenceRecord(long Id, long ComponentId, string ComponentCode, int Class, double? CostOfFailure, Provenance Recorded);

public sealed partial class RegisterStore
{
    /// <summary>
    /// Records new document control for the register's reports: the given fields replace those in force, the others
    /// are kept; the earlier record stays as history. Refused when the actor or reason is blank.
    /// </summary>
    public WriteResult<DocumentControlRecord> SetDocumentControl(DocumentControlChange change, string actor, string reason) => Write((c, t) =>
    {
        ArgumentNullException.ThrowIfNull(change);
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        if (problems.Count > 0) return (WriteResult<DocumentControlRecord>.Refused(problems), false);
        var current = DocumentControlIn(c, t);
        static string? Pick(string? given, string? kept) => given is null ? kept : given.Trim().Length == 0 ? null : given.Trim();
        var now = NowText();
        var id = Sql.Insert(c, t,
            "INSERT INTO document_control (title, owner, author, checker, approver, revision, revision_date, target_source, recorded_utc, recorded_by, reason) " +
            "VALUES ($title, $owner, $author, $checker, $approver, $revision, $date, $source, $at, $by, $reason)",
            ("$title", Pick(change.Title, current?.Title)), ("$owner", Pick(change.Owner, current?.Owner)), ("$author", Pick(change.Author, current?.Author)),
            ("$checker", Pick(change.Checker, current?.Checker)), ("$approver", Pick(change.Approver, current?.Approver)),
            ("$revision", Pick(change.Revision, current?.Revision)),
            ("$date", change.RevisionDate is { } d ? Sql.Date(d) : current?.RevisionDate is { } cd ? Sql.Date(cd) : null),
            ("$source", Pick(change.TargetSource, current?.TargetSource)), ("$at", now), ("$by", actor), ("$reason", reason));
        return (WriteResult<DocumentControlRecord>.Ok(DocumentControlIn(c, t, id)!), true);
    });

    /// <summary>The document control in force, or null when none was ever recorded.</summary>
    public DocumentControlRecord? DocumentControl() => Read((c, t) => DocumentControlIn(c, t));

    /// <summary>Every document-control record, oldest first.</summary>
    public IReadOnlyList<DocumentControlRecord> DocumentControlHistory() => Read((c, t) =>
        Sql.Query(c, t, "SELECT * FROM document_control ORDER BY document_control_id", ReadDocumentControl));

    /// <summary>Records the meaning (and the target preset) of a consequence class 1–5; the earlier meaning stays as history.</summary>
    public WriteResult<ConsequenceClassRecord> SetConsequenceClass(int consequenceClass, string meaning, string? targetPreset, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        RequireText(problems, "meaning", meaning);
        if (consequenceClass is < 1 or > 5) problems.Add(new("class", consequenceClass.ToString(System.Globalization.CultureInfo.InvariantCulture), "must be 1 to 5"));
        if (problems.Count > 0) return (WriteResult<ConsequenceClassRecord>.Refused(problems), false);
        var id = Sql.Insert(c, t, "INSERT INTO consequence_class (class, meaning, target_preset, recorded_utc, recorded_by, reason) VALUES ($class, $meaning, $preset, $at, $by, $reason)",
            ("$class", consequenceClass), ("$meaning", meaning.Trim()), ("$preset", string.IsNullOrWhiteSpace(targetPreset) ? null : targetPreset.Trim()), ("$at", NowText()), ("$by", actor), ("$reason", reason));
        return (WriteResult<ConsequenceClassRecord>.Ok(Sql.Query(c, t, "SELECT * FROM consequence_class WHERE consequence_class_id = $id", ReadConsequenceClass, ("$id", id))[0]), true);
    });

    /// <summary>The consequence classes in force (the latest meaning of each class recorded), by class.</summary>
    public IReadOnlyList<ConsequenceClassRecord> ConsequenceClasses() => Read((c, t) => Sql.Query(c, t,
        "SELECT * FROM consequence_class k WHERE consequence_class_id = (SELECT MAX(consequence_class_id) FROM consequence_class WHERE class = k.class) ORDER BY class",
        ReadConsequenceClass));

    /// <summary>Every consequence-class record, oldest first.</summary>
    public IReadOnlyList<ConsequenceClassRecord> ConsequenceClassHistory() => Read((c, t) =>
        Sql.Query(c, t, "SELECT * FROM consequence_class ORDER BY consequence_class_id", ReadConsequenceClass));

    /// <summary>Sets a component's consequence class (1–5) and optional cost of failure; the earlier setting stays as history.</summary>
    public WriteResult<ComponentConsequenceRecord> SetComponentConsequence(string componentCode, int consequenceClass, double? costOfFailure, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        var id = Sql.Scalar(c, t, "SELECT component_id FROM component WHERE code = $code", ("$code", componentCode ?? "")) as long?;
        if (id is null) problems.Add(new("component_code", componentCode, "no component with this code"));
        if (consequenceClass is < 1 or > 5) problems.Add(new("class", consequenceClass.ToString(System.Globalization.CultureInfo.InvariantCulture), "must be 1 to 5"));
        if (costOfFailure is { } cost && !(double.IsFinite(cost) && cost >= 0))
            problems.Add(new("cost_of_failure", cost.ToString(System.Globalization.CultureInfo.InvariantCulture), "must be a finite number ≥ 0"));
        if (problems.Count > 0) return (WriteResult<ComponentConsequenceRecord>.Refused(problems), false);
        var row = Sql.Insert(c, t, "INSERT INTO component_consequence (component_id, class, cost_of_failure, recorded_utc, recorded_by, reason) VALUES ($id, $class, $cost, $at, $by, $reason)",
            ("$id", id), ("$class", consequenceClass), ("$cost", costOfFailure), ("$at", NowText()), ("$by", actor), ("$reason", reason));
        return (WriteResult<ComponentConsequenceRecord>.Ok(ComponentConsequencesIn(c, t, "WHERE k.component_consequence_id = $row", ("$row", row))[0]), true);
    });

    /// <summary>Each component's consequence class in force as known on <paramref name="asOf"/> (now when null), by component code.</summary>
    public IReadOnlyList<ComponentConsequenceRecord> ComponentConsequences(DateTimeOffset? asOf = null) => Read((c, t) => ComponentConsequencesIn(c, t,
        "WHERE k.component_consequence_id = (SELECT MAX(component_consequence_id) FROM component_consequence WHERE component_id = k.component_id AND recorded_utc <= $asOf)",
        ("$asOf", Sql.Utc(asOf ?? DateTimeOffset.MaxValue))));

    /// <summary>Every consequence setting of one component, oldest first.</summary>
    public IReadOnlyList<ComponentConsequenceRecord> ComponentConsequenceHistory(string componentCode) => Read((c, t) =>
        ComponentConsequencesIn(c, t, "WHERE x.code = $code", ("$code", componentCode)));

    private static List<ComponentConsequenceRecord> ComponentConsequencesIn(DbConnection c, DbTransaction t, string where, params (string, object?)[] parameters) =>
        Sql.Query(c, t, "SELECT k.*, x.code FROM component_consequence k JOIN component x USING (component_id) " + where + " ORDER BY x.code, k.component_consequence_id",
            r => new ComponentConsequenceRecord(r.Long("component_consequence_id"), r.Long("component_id"), r.Text("code"), (int)r.Long("class"),
                r.NullableDouble("cost_of_failure"), r.Provenance(true)), parameters);

    private static DocumentControlRecord? DocumentControlIn(DbConnection c, DbTransaction t, long? id = null) =>
        Sql.Query(c, t, id is null ? "SELECT * FROM document_control ORDER BY document_control_id DESC LIMIT 1" : "SELECT * FROM document_control WHERE document_control_id = $id",
            ReadDocumentControl, ("$id", id)).FirstOrDefault();

    private static DocumentControlRecord ReadDocumentControl(DbDataReader r) => new(r.Long("document_control_id"), r.NullableString("title"), r.NullableString("owner"),
        r.NullableString("author"), r.NullableString("checker"), r.NullableString("approver"), r.NullableString("revision"),
        r.NullableString("revision_date") is { } d ? Sql.ParseDate(d) : null, r.NullableString("target_source"), r.Provenance(true));

    private static ConsequenceClassRecord ReadConsequenceClass(DbDataReader r) =>
        new(r.Long("consequence_class_id"), (int)r.Long("class"), r.Text("meaning"), r.NullableString("target_preset"), r.Provenance(true));
}
