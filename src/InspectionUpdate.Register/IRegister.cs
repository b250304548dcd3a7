using InspectionUpdate.Inspection;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Register;

/// <summary>Which database holds a register.</summary>
public enum RegisterStoreKind
{
    /// <summary>One SQLite file (the embedded default).</summary>
    Sqlite,

    /// <summary>A PostgreSQL database named by a connection URI (a team register shared by several writers).</summary>
    PostgreSql,
}

/// <summary>
/// The inspection register as the application and the front ends see it, whatever database holds it: sites,
/// components with their model revisions, inspection methods, append-only findings and repairs with revisions (who,
/// when, why), "as known on" reads, fingerprints, the audit trail and the stored results of whole-register runs.
/// </summary>
/// <remarks>
/// A straightforward mirror of the public instance API of <see cref="RegisterStore"/> (same names and signatures):
/// code written against <see cref="RegisterStore"/> compiles against this interface by changing the declared type.
/// Every write is one transaction; a refused write writes nothing and lists every problem. Static helpers
/// (<see cref="RegisterStore.KindText"/>, <see cref="RegisterStore.EndOfDay"/>, ...) stay on <see cref="RegisterStore"/>.
/// </remarks>
public interface IRegister : IResultSink, IDisposable
{
    // Identity and schema facts a front end shows.

    /// <summary>Which database holds the register.</summary>
    RegisterStoreKind Kind { get; }

    /// <summary>
    /// Where the register is: the full path of a SQLite file, or a PostgreSQL URI without its password
    /// (<c>postgresql://user@host:port/database</c>).
    /// </summary>
    string Path { get; }

    /// <summary>Whether the register was opened read-only (every write then fails with <see cref="RegisterFileException"/>).</summary>
    bool IsReadOnly { get; }

    /// <summary>Schema version after opening (the version this program reads and writes).</summary>
    int SchemaVersion { get; }

    // Sites, components, models, methods.

    /// <summary>Adds a site (see <see cref="RegisterStore.AddSite"/>).</summary>
    WriteResult<Site> AddSite(NewSite site, string actor);

    /// <summary>Sites recorded on or before <paramref name="asOf"/> (all when null), by code.</summary>
    IReadOnlyList<Site> Sites(DateTimeOffset? asOf = null);

    /// <summary>Adds a component with revision 1 of its model definition.</summary>
    WriteResult<Component> AddComponent(NewComponent component, string actor);

    /// <summary>Records a new revision of a component's model definition.</summary>
    WriteResult<ComponentModelRevision> ReviseModel(string componentCode, string definitionJson, string modelVersion, string actor, string reason);

    /// <summary>Retires or reinstates a component, with who, when and why.</summary>
    WriteResult<ComponentStatusChange> SetRetired(string componentCode, bool retired, string actor, string reason);

    /// <summary>Whether the component was retired as known on <paramref name="asOf"/> (now when null).</summary>
    bool IsRetired(long componentId, DateTimeOffset? asOf = null);

    /// <summary>Every retire and reinstate of a component, oldest first.</summary>
    IReadOnlyList<ComponentStatusChange> StatusHistory(long componentId);

    /// <summary>Components in service (not retired) as known on <paramref name="asOf"/>.</summary>
    IReadOnlyList<Component> ComponentsInService(DateTimeOffset? asOf = null);

    /// <summary>Every revision of a component's model definition, oldest first.</summary>
    IReadOnlyList<ComponentModelRevision> ModelHistory(long componentId);

    /// <summary>Components recorded on or before <paramref name="asOf"/> (all when null), each with its model as known then, by code.</summary>
    IReadOnlyList<Component> Components(DateTimeOffset? asOf = null);

    /// <summary>The component with this id as known on <paramref name="asOf"/>, or null.</summary>
    Component? GetComponent(long componentId, DateTimeOffset? asOf = null);

    /// <summary>The component with this code as known on <paramref name="asOf"/>, or null.</summary>
    Component? FindComponent(string code, DateTimeOffset? asOf = null);

    /// <summary>Components of a shared-parameter group as known on <paramref name="asOf"/>, by code.</summary>
    IReadOnlyList<Component> ComponentsInGroup(string parameterGroup, DateTimeOffset? asOf = null);

    /// <summary>Adds an inspection method.</summary>
    WriteResult<StoredMethod> AddMethod(NewMethod method, string actor);

    /// <summary>Methods recorded on or before <paramref name="asOf"/> (all when null), by name.</summary>
    IReadOnlyList<StoredMethod> Methods(DateTimeOffset? asOf = null);

    /// <summary>The method with this name, or null.</summary>
    StoredMethod? FindMethod(string name);

    // Findings.

    /// <summary>Checks a finding against the register without writing; every problem is listed.</summary>
    IReadOnlyList<ValidationProblem> ValidateFinding(NewFinding finding);

    /// <summary>Adds a finding as revision 1.</summary>
    WriteResult<FindingRevision> AddFinding(NewFinding finding, string actor, string reason);

    /// <summary>Records a correction as a new revision superseding the latest one.</summary>
    WriteResult<FindingRevision> ReviseFinding(long findingId, NewFinding corrected, string actor, string reason);

    /// <summary>
    /// Records a correction of revision <paramref name="ofRevision"/>: refused, nothing written, when another user has
    /// superseded that revision in the meantime (no lost update).
    /// </summary>
    WriteResult<FindingRevision> ReviseFinding(long findingId, NewFinding corrected, string actor, string reason, int ofRevision);

    /// <summary>Withdraws a finding (a new revision marked withdrawn).</summary>
    WriteResult<FindingRevision> WithdrawFinding(long findingId, string actor, string reason);

    /// <summary>Every revision of a finding, oldest first.</summary>
    IReadOnlyList<FindingRevision> FindingHistory(long findingId);

    /// <summary>Every revision of every finding of a component recorded by <paramref name="asOf"/> (withdrawals included), by finding and revision.</summary>
    IReadOnlyList<FindingRevision> FindingRevisions(long componentId, DateTimeOffset asOf);

    /// <summary>The latest revision of a finding recorded on or before <paramref name="asOf"/>, or null.</summary>
    FindingRevision? GetFinding(long findingId, DateTimeOffset? asOf = null);

    /// <summary>The findings of a component as known on <paramref name="asOf"/>.</summary>
    IReadOnlyList<FindingRevision> Findings(long componentId, DateTimeOffset? asOf = null, bool includeWithdrawn = false);

    /// <summary>Imports findings from a UTF-8 CSV file, all or nothing.</summary>
    ImportResult ImportFindingsCsv(string filePath, string actor, string reason, IProgress<int>? progress = null);

    /// <summary>Imports findings from CSV text, all or nothing.</summary>
    ImportResult ImportFindingsCsv(TextReader reader, string sourceName, string actor, string reason, IProgress<int>? progress = null);

    // Repairs.

    /// <summary>Records a repair with its post-repair prior (revision 1).</summary>
    WriteResult<RepairRevision> AddRepair(NewRepair repair, string actor, string reason);

    /// <summary>Records a corrected repair as a new revision.</summary>
    WriteResult<RepairRevision> ReviseRepair(long repairId, NewRepair corrected, string actor, string reason);

    /// <summary>Withdraws a repair (a new revision marked withdrawn).</summary>
    WriteResult<RepairRevision> WithdrawRepair(long repairId, string actor, string reason);

    /// <summary>The repairs of a component as known on <paramref name="asOf"/>.</summary>
    IReadOnlyList<RepairRevision> Repairs(long componentId, DateTimeOffset? asOf = null, bool includeWithdrawn = false);

    /// <summary>Every revision of a repair, oldest first.</summary>
    IReadOnlyList<RepairRevision> RepairHistory(long repairId);

    // Evidence, fingerprints, audit, check.

    /// <summary>The evidence of a component as known on <paramref name="asOf"/>.</summary>
    IReadOnlyList<InspectionOutcome> EvidenceFor(long componentId, DateTimeOffset asOf);

    /// <summary>Evidence as known at the end of <paramref name="asKnownOn"/> (UTC).</summary>
    IReadOnlyList<InspectionOutcome> EvidenceFor(long componentId, DateOnly asKnownOn);

    /// <summary>Evidence of every component of a shared-parameter group as known on <paramref name="asOf"/>, by component id.</summary>
    IReadOnlyDictionary<long, IReadOnlyList<InspectionOutcome>> EvidenceForGroup(string parameterGroup, DateTimeOffset asOf);

    /// <summary>SHA-256 (hex) of the register's content as known on <paramref name="asOf"/>; equal whatever the store.</summary>
    string Fingerprint(DateTimeOffset asOf);

    /// <summary>SHA-256 (hex) of what one component's numbers rest on, as known on <paramref name="asOf"/>.</summary>
    string ComponentFingerprint(long componentId, DateTimeOffset asOf);

    /// <summary>
    /// The fingerprint (as <see cref="ComponentFingerprint"/>) and latest model revision of every component recorded by
    /// <paramref name="asOf"/>, by component id, read in one pass.
    /// </summary>
    IReadOnlyDictionary<long, ComponentStamp> ComponentFingerprints(DateTimeOffset asOf);

    /// <summary>The audit trail, oldest first.</summary>
    IReadOnlyList<AuditEntry> AuditTrail(DateTimeOffset? since = null, string? entity = null);

    /// <summary>Checks the database and the register's invariants.</summary>
    RegisterCheckResult Check();

    // Stored results of the whole-register run.

    /// <summary>Stored result keys of one evidence date and options, by component id.</summary>
    IReadOnlyDictionary<long, (string Key, ResultStatus Status)> ResultKeys(DateOnly asOf, string optionsKey);

    /// <summary>Stored results, optionally of one evidence date and options.</summary>
    IReadOnlyList<StoredResult> Results(DateOnly? asOf = null, string? optionsKey = null, bool withProfiles = false);

    /// <summary>Components recorded on or before <paramref name="asOf"/> and not retired then: id, code and install date only.</summary>
    IReadOnlyList<(long Id, string Code, DateOnly InstallDate)> ComponentIndex(DateTimeOffset asOf);

    // Corrections of sites and methods (new revisions with who, when and why; the first record is never changed).

    /// <summary>Corrects a site's name; refused when the site is unknown, the name blank or unchanged, or the actor or reason blank.</summary>
    WriteResult<Site> CorrectSite(string siteCode, string name, string actor, string reason);

    /// <summary>Every revision of a site, oldest first.</summary>
    IReadOnlyList<Site> SiteHistory(string siteCode);

    /// <summary>Corrects a method (description, PoD, sizing error); its name names the method to correct.</summary>
    WriteResult<StoredMethod> CorrectMethod(NewMethod corrected, string actor, string reason);

    /// <summary>Every revision of a method, oldest first.</summary>
    IReadOnlyList<StoredMethod> MethodHistory(string methodName);

    // The owner's records: document control of the reports, consequence classes, each component's class (append-only, with history).

    /// <summary>Records the document control of the register's reports (a new row; the history is kept).</summary>
    WriteResult<DocumentControlRecord> SetDocumentControl(DocumentControlChange change, string actor, string reason);

    /// <summary>The current document control, or null when none was recorded.</summary>
    DocumentControlRecord? DocumentControl();

    /// <summary>Every document-control record, oldest first.</summary>
    IReadOnlyList<DocumentControlRecord> DocumentControlHistory();

    /// <summary>Records the meaning (and target preset) of one consequence class, 1–5.</summary>
    WriteResult<ConsequenceClassRecord> SetConsequenceClass(int consequenceClass, string meaning, string? targetPreset, string actor, string reason);

    /// <summary>The current record of each consequence class.</summary>
    IReadOnlyList<ConsequenceClassRecord> ConsequenceClasses();

    /// <summary>Every consequence-class record, oldest first.</summary>
    IReadOnlyList<ConsequenceClassRecord> ConsequenceClassHistory();

    /// <summary>Records a component's consequence class and optional cost of failure.</summary>
    WriteResult<ComponentConsequenceRecord> SetComponentConsequence(string componentCode, int consequenceClass, double? costOfFailure, string actor, string reason);

    /// <summary>The current consequence of each component, as known on <paramref name="asOf"/> (now when null).</summary>
    IReadOnlyList<ComponentConsequenceRecord> ComponentConsequences(DateTimeOffset? asOf = null);

    /// <summary>Every consequence record of one component, oldest first.</summary>
    IReadOnlyList<ComponentConsequenceRecord> ComponentConsequenceHistory(string componentCode);
}
