using InspectionUpdate.Reliability;

namespace InspectionUpdate.Reporting;

/// <summary>Where a report's numbers come from, so that they can be reproduced.</summary>
/// <param name="ToolVersion">Version of InspectionUpdate that produced the report.</param>
/// <param name="RegisterFingerprint">Fingerprint of the register state (or of the model and findings files) the numbers were computed from.</param>
/// <param name="Source">The register file or the model file, as the user named it.</param>
/// <param name="GeneratedAtUtc">When the report was written (UTC).</param>
/// <param name="AssessedAsOf">The date the evidence was taken up to.</param>
public sealed record ReportProvenance(string ToolVersion, string RegisterFingerprint, string Source, DateTimeOffset GeneratedAtUtc, DateOnly AssessedAsOf)
{
    /// <summary>The date the register was read as recorded on (--known-on); null for model files.</summary>
    public DateOnly? RegisterKnownOn { get; init; }
}

/// <summary>One uncertain or fixed input of a component model, as the report states it.</summary>
/// <param name="Name">Input name with its unit in the name, e.g. "rate_mmPerYear".</param>
/// <param name="Distribution">Distribution and parameters in words, e.g. "lognormal, mean 0.20, CoV 0.30".</param>
/// <param name="Unit">Unit, e.g. "mm/year"; "-" when dimensionless.</param>
/// <param name="Source">Where the value comes from (a standard, a data set, a judgement).</param>
public sealed record ReportInput(string Name, string Distribution, string Unit, string Source);

/// <summary>One revision of one finding, as recorded in the register.</summary>
/// <param name="Reference">Finding identifier with revision, e.g. "F-12 r2".</param>
/// <param name="Date">Inspection date.</param>
/// <param name="TimeYears">Years since the component entered service.</param>
/// <param name="Outcome">"no indication", "indication, not sized", "sized indication", "in service".</param>
/// <param name="Method">Inspection method name, or "-".</param>
/// <param name="MeasuredSizeMm">Measured size for a sized indication, else null.</param>
/// <param name="Revision">Revision number, 1 for the first record.</param>
/// <param name="RecordedBy">Who recorded this revision.</param>
/// <param name="Reason">Why this revision was made (null for the first).</param>
/// <param name="Superseded">True when a later revision replaces this one (it is then not used as evidence).</param>
public sealed record ReportFinding(string Reference, DateOnly Date, double TimeYears, string Outcome, string Method,
    double? MeasuredSizeMm, int Revision, string RecordedBy, string? Reason, bool Superseded);

/// <summary>A repair of the component.</summary>
/// <param name="Date">Repair date.</param>
/// <param name="TimeYears">Years since the component entered service.</param>
/// <param name="Description">What was done.</param>
public sealed record ReportRepair(DateOnly Date, double TimeYears, string Description);

/// <summary>A probability-of-detection curve sampled for plotting.</summary>
/// <param name="Method">Method name.</param>
/// <param name="SizesMm">Defect sizes (mm), increasing.</param>
/// <param name="Probabilities">PoD at each size, in [0, 1].</param>
public sealed record ReportPodCurve(string Method, IReadOnlyList<double> SizesMm, IReadOnlyList<double> Probabilities);

/// <summary>Samples of one input before and after updating (e.g. from the simulation route).</summary>
/// <param name="Variable">Input name with unit.</param>
/// <param name="Prior">Prior samples.</param>
/// <param name="Posterior">Posterior samples.</param>
/// <param name="Route">How the posterior samples were drawn.</param>
public sealed record ReportPosterior(string Variable, IReadOnlyList<double> Prior, IReadOnlyList<double> Posterior, string Route);

/// <summary>Prior and posterior summary of one input, as the updater reports it.</summary>
/// <param name="Variable">Input name with unit.</param>
/// <param name="PriorMean">Prior mean.</param>
/// <param name="PriorStandardDeviation">Prior standard deviation.</param>
/// <param name="PosteriorMean">Posterior mean.</param>
/// <param name="PosteriorStandardDeviation">Posterior standard deviation.</param>
/// <param name="Quantile05">Posterior 5 % quantile.</param>
/// <param name="Quantile95">Posterior 95 % quantile.</param>
public sealed record ReportPosteriorSummary(string Variable, double PriorMean, double PriorStandardDeviation, double PosteriorMean,
    double PosteriorStandardDeviation, double Quantile05, double Quantile95);

/// <summary>Importance factors at one time: α² per input (they sum to 1 for independent inputs).</summary>
/// <param name="TimeYears">Time of the design point.</param>
/// <param name="Names">Input names.</param>
/// <param name="Values">Importance factors in [0, 1].</param>
/// <param name="Label">e.g. "prior, design point at 20 years".</param>
public sealed record ReportImportance(double TimeYears, IReadOnlyList<string> Names, IReadOnlyList<double> Values, string Label);

/// <summary>One inspection proposed by the plan.</summary>
/// <param name="TimeYears">Years since entry into service.</param>
/// <param name="Date">Calendar date.</param>
/// <param name="Method">Method assumed; empty when none is (the next inspection of a plan without a schedule).</param>
/// <param name="Basis">Why it is due then, e.g. "annual Pf reaches 1e-4".</param>
public sealed record ReportPlannedInspection(double TimeYears, DateOnly Date, string Method, string Basis);

/// <summary>The plan of a component as the report states it.</summary>
/// <param name="TargetAnnualPf">Target annual failure probability ΔPf per year.</param>
/// <param name="TargetSource">Where the target comes from.</param>
/// <param name="Schedule">Planned inspections in time order (the first is the next due).</param>
/// <param name="Status">One-line status, e.g. "next inspection due 2029-04-17".</param>
/// <param name="Notes">Assumptions of the plan (e.g. "each planned inspection finds nothing").</param>
public sealed record ReportPlan(double TargetAnnualPf, string TargetSource, IReadOnlyList<ReportPlannedInspection> Schedule,
    string Status, IReadOnlyList<string> Notes)
{
    /// <summary>The branch assumed after a detection, as the option spells it: "monitor" or "repair".</summary>
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>The sentence stating the branch when a detection is open since the last repair, else null.</summary>
    public string? BranchNote { get; init; }
}

/// <summary>
/// Document control of a report: what an owner signs. Null fields are not set (the page says "not set"); the register
/// holds them with their history, a run may override each.
/// </summary>
/// <param name="Title">Report title of the owner's choosing.</param>
/// <param name="Owner">Owner (duty holder).</param>
/// <param name="Author">Who prepared the report.</param>
/// <param name="Checker">Who checked it.</param>
/// <param name="Approver">Who approved it.</param>
/// <param name="Revision">Revision number or letter.</param>
/// <param name="RevisionDate">Date of the revision.</param>
/// <param name="TargetSource">The owner's source or justification of the target.</param>
public sealed record ReportDocumentControl(string? Title = null, string? Owner = null, string? Author = null, string? Checker = null, string? Approver = null,
    string? Revision = null, DateOnly? RevisionDate = null, string? TargetSource = null)
{
    /// <summary>Earlier records of the register's document control, oldest first, each in one line.</summary>
    public IReadOnlyList<string> History { get; init; } = [];

    /// <summary>The fields of <paramref name="over"/> that are set, else those of this record.</summary>
    public ReportDocumentControl With(ReportDocumentControl? over) => over is null ? this : new(
        over.Title ?? Title, over.Owner ?? Owner, over.Author ?? Author, over.Checker ?? Checker, over.Approver ?? Approver,
        over.Revision ?? Revision, over.RevisionDate ?? RevisionDate, over.TargetSource ?? TargetSource)
    {
        History = History,
    };
}

/// <summary>Everything one component report shows. Missing pieces are null and the report says they are not available.</summary>
public sealed record ComponentReportData
{
    /// <summary>Component identifier, e.g. "WI-07".</summary>
    public required string ComponentId { get; init; }

    /// <summary>Descriptive name.</summary>
    public required string ComponentName { get; init; }

    /// <summary>Site name.</summary>
    public required string Site { get; init; }

    /// <summary>Degradation model name and version.</summary>
    public required string Model { get; init; }

    /// <summary>Date the component entered service (time zero of every profile).</summary>
    public required DateOnly InServiceDate { get; init; }

    /// <summary>Model inputs.</summary>
    public required IReadOnlyList<ReportInput> Inputs { get; init; }

    /// <summary>Every revision of every finding.</summary>
    public IReadOnlyList<ReportFinding> Findings { get; init; } = [];

    /// <summary>Repairs.</summary>
    public IReadOnlyList<ReportRepair> Repairs { get; init; } = [];

    /// <summary>Prior profile (no inspection evidence).</summary>
    public ReliabilityProfile? Prior { get; init; }

    /// <summary>Profile updated with the findings and repairs.</summary>
    public ReliabilityProfile? Updated { get; init; }

    /// <summary>Importance factors.</summary>
    public ReportImportance? Importance { get; init; }

    /// <summary>PoD curves of the methods used or planned.</summary>
    public IReadOnlyList<ReportPodCurve> PodCurves { get; init; } = [];

    /// <summary>Posterior samples of updated inputs.</summary>
    public IReadOnlyList<ReportPosterior> Posteriors { get; init; } = [];

    /// <summary>Posterior summaries of the inputs (means, deviations, quantiles).</summary>
    public IReadOnlyList<ReportPosteriorSummary> PosteriorSummaries { get; init; } = [];

    /// <summary>How the posterior summaries were obtained (route, samples, convergence), or null.</summary>
    public string? PosteriorRoute { get; init; }

    /// <summary>The plan.</summary>
    public ReportPlan? Plan { get; init; }

    /// <summary>Assumptions behind the numbers.</summary>
    public IReadOnlyList<string> Assumptions { get; init; } = [];

    /// <summary>Parts the tool could not compute in this build, each as a sentence.</summary>
    public IReadOnlyList<string> NotAvailable { get; init; } = [];

    /// <summary>Parts this run was not asked to compute, each as a sentence saying how to request it.</summary>
    public IReadOnlyList<string> NotRequested { get; init; } = [];

    /// <summary>Provenance.</summary>
    public required ReportProvenance Provenance { get; init; }

    /// <summary>The component's marks, the same as on the register page and in the exports.</summary>
    public ReportMark Flags { get; init; }

    /// <summary>Document control (title, owner, author, checker, approver, revision, target source).</summary>
    public ReportDocumentControl DocumentControl { get; init; } = new();
}

/// <summary>One row of the register (portfolio) report.</summary>
/// <param name="ComponentId">Component identifier.</param>
/// <param name="ComponentName">Name.</param>
/// <param name="Site">Site.</param>
/// <param name="CurrentAnnualPf">Updated annual failure probability ΔPf in the year of the assessment date; null when not computed.</param>
/// <param name="Route">Route of that number, e.g. "first order, converged".</param>
/// <param name="YearsToTarget">Years from the assessment date until the updated ΔPf reaches the target without further inspection; null when not computed, +∞ when never within the horizon.</param>
/// <param name="NextDue">Date of the next inspection proposed by the plan; null when not planned.</param>
/// <param name="Status">One-line status.</param>
/// <param name="ReportFile">File name of the component report, relative to the portfolio report, or null.</param>
public sealed record PortfolioRow(string ComponentId, string ComponentName, string Site, double? CurrentAnnualPf, string Route,
    double? YearsToTarget, DateOnly? NextDue, string Status, string? ReportFile)
{
    /// <summary>End of the grid year whose ΔPf is <see cref="CurrentAnnualPf"/> (the first grid time at or after the assessment date); not exported.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public DateOnly? CurrentYearEnding { get; init; }

    /// <summary>The component's marks (<see cref="ReportMarks.Of"/>); not exported as such, see <see cref="Flags"/>.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public ReportMark FlagSet { get; init; }

    /// <summary>The marks' keys (<c>not_converged</c>, <c>overdue</c>, <c>above_target</c>), exported in register.json.</summary>
    public IReadOnlyList<string> Flags => ReportMarks.Keys(FlagSet);

    /// <summary>Whether every number behind the row converged (profiles and plan).</summary>
    public bool AllConverged => !FlagSet.HasFlag(ReportMark.NotConverged);

    /// <summary>The owner's consequence class 1–5, or null when none is recorded.</summary>
    public int? ConsequenceClass { get; init; }

    /// <summary>Cost of failure in the owner's currency, or null.</summary>
    public double? CostOfFailure { get; init; }

    /// <summary>The branch the plan assumed after a detection: "monitor" or "repair" (the run's option).</summary>
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>The target this component was planned against (its class's, else the run's), or null.</summary>
    public double? TargetAnnualPf { get; init; }

    /// <summary>Annual Pf now over the component's target (null when either is missing): the ranking measure of the risk table.</summary>
    public double? RatioToTarget => CurrentAnnualPf is { } p && TargetAnnualPf is { } t && t > 0 ? p / t : null;

    /// <summary>Expected cost of failure per year, annual Pf now × cost of failure (null when either is missing).</summary>
    public double? ExpectedAnnualCost => CurrentAnnualPf is { } p && CostOfFailure is { } c ? p * c : null;
}

/// <summary>Everything the register report shows.</summary>
public sealed record PortfolioReportData
{
    /// <summary>Title, e.g. the register name.</summary>
    public required string Title { get; init; }

    /// <summary>One row per component.</summary>
    public required IReadOnlyList<PortfolioRow> Rows { get; init; }

    /// <summary>Target annual failure probability used for ranking and plans.</summary>
    public double? TargetAnnualPf { get; init; }

    /// <summary>Assumptions behind the numbers.</summary>
    public IReadOnlyList<string> Assumptions { get; init; } = [];

    /// <summary>Parts not available in this build.</summary>
    public IReadOnlyList<string> NotAvailable { get; init; } = [];

    /// <summary>Provenance.</summary>
    public required ReportProvenance Provenance { get; init; }

    /// <summary>The owner's consequence classes, one line each (meaning and target).</summary>
    public IReadOnlyList<string> ConsequenceClasses { get; init; } = [];

    /// <summary>Files written beside the page (exports and the inspection calendar), linked from it.</summary>
    public IReadOnlyList<string> Downloads { get; init; } = [];

    /// <summary>Document control (title, owner, author, checker, approver, revision, target source).</summary>
    public ReportDocumentControl DocumentControl { get; init; } = new();
}

/// <summary>Wording that every user-facing output carries.</summary>
public static class Cautions
{
    /// <summary>The one-line caution printed under results in the terminal.</summary>
    public const string Line =
        "Caution: these results support, and never replace, engineering judgement; defer to the applicable codes and licensed practice.";

    /// <summary>The cautions of a report, one paragraph each.</summary>
    public static IReadOnlyList<string> Paragraphs { get; } =
    [
        "The results in this report support, and never replace, the judgement of a competent engineer.",
        "Defer to the applicable design and assessment codes, to the operator's integrity management system and to licensed professional practice.",
        "Check every model input, every finding and every result before acting on it. A number marked as not converged is a best estimate only.",
        "Probabilities depend on the model and on the inputs stated here; they are not frequencies observed in service.",
    ];
}
