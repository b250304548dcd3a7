using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>
/// Numerical settings of the planner. The defaults find a due date to about a third of a day.
/// </summary>
public sealed record PlanningOptions
{
    /// <summary>Default settings.</summary>
    public static PlanningOptions Default { get; } = new();

    /// <summary>
    /// Spacing of the scan that brackets the first crossing before regula falsi refines it, in years (default 0.25).
    /// A crossing that starts and ends between two scan points can be missed; a divisor of one year lets the scan
    /// reuse Pf(t − 1) from earlier points.
    /// </summary>
    public double ScanStepYears { get; init; } = 0.25;

    /// <summary>Width of the final bracket around a crossing, in years (default 1e-3, about 0.37 day).</summary>
    public double ToleranceYears { get; init; } = 1e-3;

    /// <summary>
    /// A planned interval shorter than this (years, default 0.25) marks the schedule as degenerate: inspections
    /// no longer buy time, so the planner stops and explains instead of collapsing the interval further.
    /// </summary>
    public double MinimumIntervalYears { get; init; } = 0.25;

    /// <summary>Upper bound on planned inspections in one schedule (default 200).</summary>
    public int MaximumInspections { get; init; } = 200;

    /// <summary>
    /// Grid spacing (years, default 0.25) of the check that a schedule keeps the annual measure under the target,
    /// from each inspection to the next. The default equals the scan step, so the check reuses the scan's
    /// estimates; a finer grid costs about one updated estimate per extra point.
    /// </summary>
    public double VerificationStepYears { get; init; } = 0.25;

    /// <summary>
    /// How many levels of the repair branch a schedule follows (default 0: none). Level 1 gives each planned
    /// inspection's probability of an indication and repair; level 2 also plans the schedule after each such repair,
    /// and so on (the cost grows with the number of inspections to this power).
    /// </summary>
    public int RepairBranchDepth { get; init; }

    /// <summary>Every problem with these settings (empty when valid), each naming the field and its value.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        Positive(problems, nameof(ScanStepYears), ScanStepYears);
        Positive(problems, nameof(ToleranceYears), ToleranceYears);
        if (double.IsFinite(ToleranceYears) && double.IsFinite(ScanStepYears) && ToleranceYears >= ScanStepYears)
        {
            problems.Add(Invariant($"{nameof(ToleranceYears)} = {ToleranceYears} must be smaller than {nameof(ScanStepYears)} = {ScanStepYears}."));
        }

        Positive(problems, nameof(MinimumIntervalYears), MinimumIntervalYears);
        Positive(problems, nameof(VerificationStepYears), VerificationStepYears);
        if (MaximumInspections < 1) problems.Add(Invariant($"{nameof(MaximumInspections)} = {MaximumInspections} must be at least 1."));
        if (RepairBranchDepth is < 0 or > 4) problems.Add(Invariant($"{nameof(RepairBranchDepth)} = {RepairBranchDepth} must lie in 0..4."));
        return problems;
    }

    private static void Positive(List<string> problems, string field, double value)
    {
        if (!(double.IsFinite(value) && value > 0)) problems.Add(Invariant($"{field} = {value} must be finite and > 0."));
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}

/// <summary>
/// What the planner needs about one component: its model, the evidence so far, its calendar, the target and the
/// end of its service life. Time is in years since entry into service.
/// </summary>
public sealed record PlanningRequest
{
    /// <summary>The component's degradation model.</summary>
    public required IDegradationModel Model { get; init; }

    /// <summary>Findings and repairs so far, in time order (may be empty).</summary>
    public IReadOnlyList<InspectionOutcome> Evidence { get; init; } = [];

    /// <summary>The date the component entered service (service time 0).</summary>
    public required DateOnly InServiceDate { get; init; }

    /// <summary>The annual target.</summary>
    public required AnnualTarget Target { get; init; }

    /// <summary>End of the service life in years since entry into service; schedules stop here.</summary>
    public required double EndOfServiceYears { get; init; }

    /// <summary>
    /// Where planning starts, in years since entry into service. Null: at the latest evidence (the last finding),
    /// or at 0 when there is none. Must not be before the latest evidence.
    /// </summary>
    public double? StartTimeYears { get; init; }

    /// <summary>Numerical settings.</summary>
    public PlanningOptions Options { get; init; } = PlanningOptions.Default;

    /// <summary>
    /// The branch assumed after a detection not yet followed by a repair (default <see cref="Planning.AfterDetection.Monitor"/>,
    /// the known defect left in service). <see cref="Planning.AfterDetection.Repair"/> plans the repaired component
    /// (<see cref="DetectionBranch.PlanningEvidence"/>).
    /// </summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>
    /// Post-repair prior of the repairs the repair branch assumes: distributions of inputs the model renews on repair
    /// (empty: the renewed inputs restart from their original prior). Used only on <see cref="Planning.AfterDetection.Repair"/>.
    /// </summary>
    public IReadOnlyDictionary<string, Probability.RandomVariable> AssumedRepairInputs { get; init; } = new Dictionary<string, Probability.RandomVariable>();

    /// <summary>Where <see cref="AssumedRepairInputs"/> come from, in words (e.g. "of repair 3 rev 1"), for the plan's statement; or null.</summary>
    public string? AssumedRepairSource { get; init; }

    /// <summary>The start actually used: <see cref="StartTimeYears"/> or the latest evidence time (0 without evidence).</summary>
    public double EffectiveStartYears => StartTimeYears ?? LatestEvidenceYears;

    /// <summary>Time of the latest evidence, 0 without evidence.</summary>
    public double LatestEvidenceYears => Evidence.Count == 0 ? 0 : Evidence.Max(e => e.TimeYears);

    /// <summary>Every problem with this request (empty when valid), each naming the field and its value.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (Model is null) problems.Add($"{nameof(Model)} is missing.");
        if (Target is null) problems.Add($"{nameof(Target)} is missing.");
        if (Evidence is null)
        {
            problems.Add($"{nameof(Evidence)} is missing (use an empty list).");
        }
        else
        {
            for (var i = 0; i < Evidence.Count; i++)
            {
                var e = Evidence[i];
                if (e is null) { problems.Add(Invariant($"{nameof(Evidence)}[{i}] is null.")); continue; }
                if (!(double.IsFinite(e.TimeYears) && e.TimeYears >= 0))
                {
                    problems.Add(Invariant($"{nameof(Evidence)}[{i}] ({e.Reference}) has time {e.TimeYears} years; it must be finite and ≥ 0."));
                }
                else if (i > 0 && Evidence[i - 1] is { } previous && e.TimeYears < previous.TimeYears)
                {
                    problems.Add(Invariant($"{nameof(Evidence)}[{i}] ({e.Reference}) at {e.TimeYears} years is earlier than the one before it at {previous.TimeYears} years; give evidence in time order."));
                }
            }
        }

        if (!(double.IsFinite(EndOfServiceYears) && EndOfServiceYears > 0))
        {
            problems.Add(Invariant($"{nameof(EndOfServiceYears)} = {EndOfServiceYears} must be finite and > 0."));
        }

        if (StartTimeYears is { } start)
        {
            if (!(double.IsFinite(start) && start >= 0))
            {
                problems.Add(Invariant($"{nameof(StartTimeYears)} = {start} must be finite and ≥ 0."));
            }
            else if (Evidence is not null && Evidence.All(e => e is not null && double.IsFinite(e.TimeYears)) && start < LatestEvidenceYears)
            {
                problems.Add(Invariant($"{nameof(StartTimeYears)} = {start} is before the latest evidence at {LatestEvidenceYears} years."));
            }
        }

        if (problems.Count == 0 && EffectiveStartYears >= EndOfServiceYears)
        {
            problems.Add(Invariant($"Planning starts at {EffectiveStartYears} years, at or after {nameof(EndOfServiceYears)} = {EndOfServiceYears}: nothing to plan."));
        }

        if (!Enum.IsDefined(AfterDetection)) problems.Add(Invariant($"{nameof(AfterDetection)} = {(int)AfterDetection} is not a known branch (monitor or repair)."));
        if (AssumedRepairInputs is null)
        {
            problems.Add($"{nameof(AssumedRepairInputs)} is missing (use an empty dictionary).");
        }
        else if (Model is not null)
        {
            foreach (var key in AssumedRepairInputs.Keys.Where(k => !Model.RenewedOnRepair.Contains(k)))
            {
                problems.Add(Invariant($"{nameof(AssumedRepairInputs)} names '{key}', which model '{Model.Name}' does not renew on repair."));
            }
        }

        if (Options is null) problems.Add($"{nameof(Options)} is missing.");
        else problems.AddRange(Options.Problems().Select(p => $"{nameof(Options)}.{p}"));
        return problems;
    }

    /// <summary>Throws one <see cref="ArgumentException"/> listing every problem, if there is any.</summary>
    internal void ThrowIfInvalid(string parameterName)
    {
        var problems = Problems();
        if (problems.Count > 0)
        {
            throw new ArgumentException("The planning request is not valid:" + Environment.NewLine + "- " +
                string.Join(Environment.NewLine + "- ", problems), parameterName);
        }
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
