using InspectionUpdate.Inspection;

namespace InspectionUpdate.Register;

/// <summary>What a finding reports. Stored as the text in brackets.</summary>
public enum FindingKind
{
    /// <summary>Inspected with a method, nothing found ("no-indication").</summary>
    NoIndication,

    /// <summary>An indication was found but not sized ("indication-not-sized").</summary>
    IndicationNotSized,

    /// <summary>An indication sized at <see cref="NewFinding.MeasuredSizeMm"/> ("sized-indication").</summary>
    SizedIndication,

    /// <summary>A remaining-wall reading <see cref="NewFinding.RemainingWallMm"/>; the depth is wall − reading ("wall-thickness").</summary>
    WallThickness,

    /// <summary>The component was seen in service, not failed; no method ("in-service").</summary>
    InService,
}

/// <summary>One problem found while validating input: the field, the offending value and what is wrong.</summary>
/// <param name="Field">Field or column name, e.g. "measured_size_mm".</param>
/// <param name="Value">The offending value as given (null when missing).</param>
/// <param name="Message">What is wrong, in words.</param>
/// <param name="LineNumber">Line in the source file (1 = header) for imports; null otherwise.</param>
public sealed record ValidationProblem(string Field, string? Value, string Message, int? LineNumber = null)
{
    /// <inheritdoc />
    public override string ToString() =>
        (LineNumber is { } line ? $"line {line}: " : "") + $"{Field} = '{Value ?? "(empty)"}': {Message}";
}

/// <summary>The outcome of a write: the stored record, or every problem found with nothing written.</summary>
/// <typeparam name="T">Type of the stored record.</typeparam>
/// <param name="Value">The record written (null when refused).</param>
/// <param name="Problems">Every validation problem (empty when written).</param>
public sealed record WriteResult<T>(T? Value, IReadOnlyList<ValidationProblem> Problems)
    where T : class
{
    /// <summary>True when the record was written.</summary>
    public bool Succeeded => Value is not null;

    /// <summary>The written record, or an exception listing every problem.</summary>
    /// <exception cref="RegisterValidationException">The write was refused.</exception>
    public T Require() => Value ?? throw new RegisterValidationException(Problems);

    internal static WriteResult<T> Ok(T value) => new(value, []);

    internal static WriteResult<T> Refused(IReadOnlyList<ValidationProblem> problems) => new(null, problems);
}

/// <summary>Thrown by <see cref="WriteResult{T}.Require"/> when a write was refused; lists every problem.</summary>
public sealed class RegisterValidationException : Exception
{
    /// <summary>Creates the exception from the problems found.</summary>
    public RegisterValidationException(IReadOnlyList<ValidationProblem> problems)
        : base("Refused, nothing written: " + string.Join("; ", problems))
    {
        Problems = problems;
    }

    /// <summary>Every problem found.</summary>
    public IReadOnlyList<ValidationProblem> Problems { get; }
}

/// <summary>Who recorded a row, when (UTC) and, for revisions, why.</summary>
/// <param name="RecordedUtc">When the row was written (UTC).</param>
/// <param name="RecordedBy">Who wrote it.</param>
/// <param name="Reason">Why (for revisions; empty for plain rows).</param>
public sealed record Provenance(DateTimeOffset RecordedUtc, string RecordedBy, string Reason);

/// <summary>A site (a plant, a field, a pipeline system).</summary>
/// <remarks>
/// <see cref="Recorded"/> is when the site was first recorded; <see cref="Revision"/> counts its corrections (1: never
/// corrected). In <see cref="RegisterStore.SiteHistory(string)"/> each entry's <see cref="Recorded"/> is that revision's own.
/// </remarks>
public sealed record Site(long Id, string Code, string Name, Provenance Recorded)
{
    /// <summary>Revision of the site's name as read (1: as first recorded; each correction adds one).</summary>
    public int Revision { get; init; } = 1;
}

/// <summary>Input for a new site.</summary>
/// <param name="Code">Unique short code, e.g. "NORTH-FIELD".</param>
/// <param name="Name">Descriptive name.</param>
public sealed record NewSite(string Code, string Name);

/// <summary>Input for a new component.</summary>
/// <param name="SiteCode">Code of an existing site.</param>
/// <param name="Code">Unique component code, e.g. "P-101-W3".</param>
/// <param name="Description">Free text.</param>
/// <param name="InstallDate">Date the component entered service (ISO 8601 in the file); service time counts from it.</param>
/// <param name="WallThicknessMm">Nominal wall thickness in mm (&gt; 0), or null when not applicable.</param>
/// <param name="ModelDefinitionJson">The degradation model definition, stored as given (valid JSON).</param>
/// <param name="ModelVersion">Version of the model definition, e.g. "corrosion-1.2".</param>
/// <param name="ParameterGroup">Shared-parameter group (e.g. an environment whose corrosion rate sister components share), or null.</param>
public sealed record NewComponent(
    string SiteCode,
    string Code,
    string Description,
    DateOnly InstallDate,
    double? WallThicknessMm,
    string ModelDefinitionJson,
    string ModelVersion,
    string? ParameterGroup = null);

/// <summary>One revision of a component's model definition.</summary>
public sealed record ComponentModelRevision(long RevisionId, long ComponentId, int Revision, string DefinitionJson, string ModelVersion, Provenance Recorded);

/// <summary>What a stored result's key rests on for one component, as known at the time of the read.</summary>
/// <param name="ModelRevision">Latest revision of the component's model recorded by then, or null when none was.</param>
/// <param name="Fingerprint">The component's fingerprint (<see cref="RegisterStore.ComponentFingerprint"/>).</param>
public readonly record struct ComponentStamp(int? ModelRevision, string Fingerprint);

/// <summary>A component with its model definition as known at the time of the read.</summary>
public sealed record Component(
    long Id,
    long SiteId,
    string Code,
    string Description,
    DateOnly InstallDate,
    double? WallThicknessMm,
    string? ParameterGroup,
    ComponentModelRevision Model,
    Provenance Recorded);

/// <summary>
/// The stored parameters of a PoD curve. Log-logistic and cumulative-lognormal use μ (ln mm) and σ (ln); exponential
/// uses λ (mm). See <see cref="ParametricPod"/> for the lower limit, the saturation and the false-call probability.
/// </summary>
public sealed record PodSpec(
    string Form,
    double? MuLnMm,
    double? SigmaLn,
    double? LambdaMm,
    double LowerLimitMm = 0,
    double MaxPod = 1,
    double FalseCallProbability = 0)
{
    /// <summary>Builds the curve. </summary>
    /// <exception cref="ArgumentException">Unknown form, missing or out-of-range parameter (the message names it).</exception>
    public ParametricPod ToCurve() => Form switch
    {
        PodForms.LogLogistic => new LogLogisticPod(Need(MuLnMm, "pod_mu_ln_mm"), Need(SigmaLn, "pod_sigma_ln"), LowerLimitMm, MaxPod, FalseCallProbability),
        PodForms.CumulativeLognormal => new CumulativeLognormalPod(Need(MuLnMm, "pod_mu_ln_mm"), Need(SigmaLn, "pod_sigma_ln"), LowerLimitMm, MaxPod, FalseCallProbability),
        PodForms.Exponential => new ExponentialPod(Need(LambdaMm, "pod_lambda_mm"), LowerLimitMm, MaxPod, FalseCallProbability),
        _ => throw new ArgumentException($"Unknown PoD form '{Form}'; expected {PodForms.LogLogistic}, {PodForms.CumulativeLognormal} or {PodForms.Exponential}.", "pod_form"),
    };

    /// <summary>The stored parameters of an existing curve.</summary>
    public static PodSpec From(ParametricPod curve)
    {
        ArgumentNullException.ThrowIfNull(curve);
        return curve switch
        {
            LogLogisticPod ll => new PodSpec(PodForms.LogLogistic, ll.MuLnMm, ll.SigmaLn, null, ll.LowerLimitMm, ll.MaxPod, ll.FalseCallProbability),
            CumulativeLognormalPod ln => new PodSpec(PodForms.CumulativeLognormal, ln.MuLnMm, ln.SigmaLn, null, ln.LowerLimitMm, ln.MaxPod, ln.FalseCallProbability),
            ExponentialPod ex => new PodSpec(PodForms.Exponential, null, null, ex.LambdaMm, ex.LowerLimitMm, ex.MaxPod, ex.FalseCallProbability),
            _ => throw new ArgumentException($"PoD form '{curve.Form}' cannot be stored in the register.", nameof(curve)),
        };
    }

    private double Need(double? value, string field) =>
        value ?? throw new ArgumentException($"The PoD form '{Form}' needs {field}.", field);
}

/// <summary>Input for a new inspection method.</summary>
/// <param name="Name">Unique name, e.g. "UT-PA-2024".</param>
/// <param name="Description">Free text.</param>
/// <param name="Pod">PoD curve parameters.</param>
/// <param name="Sizing">Sizing-error model (additive: bias and σ in mm; multiplicative: of ln ε).</param>
public sealed record NewMethod(string Name, string Description, PodSpec Pod, SizingError Sizing);

/// <summary>A stored inspection method.</summary>
/// <remarks>
/// <see cref="Recorded"/> is when the method was first recorded; <see cref="Revision"/> counts its corrections (1: never
/// corrected). In <see cref="RegisterStore.MethodHistory(string)"/> each entry's <see cref="Recorded"/> is that revision's own.
/// </remarks>
public sealed record StoredMethod(long Id, string Name, string Description, PodSpec Pod, SizingError Sizing, Provenance Recorded)
{
    /// <summary>Revision of the method's parameters as read (1: as first recorded; each correction adds one).</summary>
    public int Revision { get; init; } = 1;

    /// <summary>Rebuilds the core's <see cref="InspectionMethod"/>.</summary>
    public InspectionMethod ToInspectionMethod() => new(Name, Pod.ToCurve(), Sizing);
}

/// <summary>Input for a finding (new, or the corrected content of a revision).</summary>
/// <param name="ComponentCode">Code of an existing component.</param>
/// <param name="InspectionDate">Date of the inspection (not before the install date, not in the future).</param>
/// <param name="Kind">What was found.</param>
/// <param name="MethodName">Name of an existing method; required except for <see cref="FindingKind.InService"/>.</param>
/// <param name="MeasuredSizeMm">Sized indication in mm (≥ 0, not beyond the wall): only for <see cref="FindingKind.SizedIndication"/>.</param>
/// <param name="RemainingWallMm">Remaining wall reading in mm (0 … wall): only for <see cref="FindingKind.WallThickness"/>.</param>
/// <param name="Location">Where on the component (e.g. "weld 3, 6 o'clock"); part of the duplicate key.</param>
/// <param name="Note">Free text.</param>
public sealed record NewFinding(
    string ComponentCode,
    DateOnly InspectionDate,
    FindingKind Kind,
    string? MethodName,
    double? MeasuredSizeMm = null,
    double? RemainingWallMm = null,
    string? Location = null,
    string? Note = null);

/// <summary>One revision of a finding, as stored.</summary>
public sealed record FindingRevision(
    long FindingId,
    int Revision,
    long RevisionId,
    long ComponentId,
    string ComponentCode,
    DateOnly InspectionDate,
    FindingKind Kind,
    string? MethodName,
    double? MeasuredSizeMm,
    double? RemainingWallMm,
    string Location,
    string Note,
    bool Withdrawn,
    long? ImportBatchId,
    Provenance Recorded)
{
    /// <summary>Identifier carried into the core's outcomes and results: "finding {id} rev {n}".</summary>
    public string Reference => FormattableString.Invariant($"finding {FindingId} rev {Revision}");
}

/// <summary>Input for a repair.</summary>
/// <param name="ComponentCode">Code of an existing component.</param>
/// <param name="RepairDate">Date of the repair (not before install, not in the future).</param>
/// <param name="Description">What was done.</param>
/// <param name="PostRepairPriorJson">The post-repair prior of the renewed inputs (format in docs/register.md).</param>
public sealed record NewRepair(string ComponentCode, DateOnly RepairDate, string Description, string PostRepairPriorJson);

/// <summary>One revision of a repair, as stored.</summary>
public sealed record RepairRevision(
    long RepairId,
    int Revision,
    long RevisionId,
    long ComponentId,
    string ComponentCode,
    DateOnly RepairDate,
    string Description,
    string PostRepairPriorJson,
    bool Withdrawn,
    Provenance Recorded)
{
    /// <summary>Identifier carried into the core's outcomes: "repair {id} rev {n}".</summary>
    public string Reference => FormattableString.Invariant($"repair {RepairId} rev {Revision}");
}

/// <summary>One audit-trail entry (written by triggers with every insert, and by migrations).</summary>
public sealed record AuditEntry(long Id, DateTimeOffset AtUtc, string Actor, string Action, string Entity, long EntityId, string DetailJson);

/// <summary>Result of a CSV import: the batch written, or every problem (with line numbers) and nothing written.</summary>
/// <param name="ImportBatchId">Id of the import batch written, null when refused.</param>
/// <param name="Findings">Findings written (first revisions), empty when refused.</param>
/// <param name="Problems">Every problem found, each with its line number and field.</param>
/// <param name="SourceSha256">SHA-256 of the imported text (UTF-8), hex.</param>
public sealed record ImportResult(long? ImportBatchId, IReadOnlyList<FindingRevision> Findings, IReadOnlyList<ValidationProblem> Problems, string SourceSha256)
{
    /// <summary>True when the whole file was written.</summary>
    public bool Succeeded => ImportBatchId is not null;
}

/// <summary>Result of the register check: SQLite integrity and foreign-key checks plus the register's own invariants.</summary>
/// <param name="SchemaVersion">PRAGMA user_version of the file.</param>
/// <param name="IntegrityCheck">Lines of PRAGMA integrity_check ("ok" when sound).</param>
/// <param name="ForeignKeyViolations">One line per row of PRAGMA foreign_key_check.</param>
/// <param name="InvariantViolations">Register invariants broken (revision chains, journal mode, missing triggers).</param>
/// <param name="InvalidModels">Components whose current model does not pass the model check an assessment runs (one
/// line each: component, revision, every problem); stored before the register checked models at the door. They do
/// not make the file unhealthy: revise the model ('component revise') to assess the component again.</param>
public sealed record RegisterCheckResult(int SchemaVersion, IReadOnlyList<string> IntegrityCheck, IReadOnlyList<string> ForeignKeyViolations, IReadOnlyList<string> InvariantViolations,
    IReadOnlyList<string> InvalidModels)
{
    /// <summary>True when every check passed.</summary>
    public bool IsHealthy => IntegrityCheck is ["ok"] && ForeignKeyViolations.Count == 0 && InvariantViolations.Count == 0;
}

/// <summary>A component retired or reinstated, with who, when and why.</summary>
/// <param name="StatusId">Row id.</param>
/// <param name="ComponentId">Component id.</param>
/// <param name="ComponentCode">Component code.</param>
/// <param name="Status">"retired" or "in-service".</param>
/// <param name="Recorded">Who, when (UTC) and why.</param>
public sealed record ComponentStatusChange(long StatusId, long ComponentId, string ComponentCode, string Status, Provenance Recorded);
