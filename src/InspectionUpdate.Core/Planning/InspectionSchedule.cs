namespace InspectionUpdate.Planning;

/// <summary>How a life-cycle schedule ended.</summary>
public enum ScheduleStatus
{
    /// <summary>The schedule reaches the end of the service life with the measure under the target throughout.</summary>
    Complete,

    /// <summary>
    /// Stopped: an inspection assumed to find nothing no longer brings the measure far enough below the target, so
    /// the intervals collapse. <see cref="InspectionSchedule.Message"/> says where and why.
    /// </summary>
    Degenerate,

    /// <summary>Stopped at <see cref="PlanningOptions.MaximumInspections"/>.</summary>
    InspectionLimitReached,
}

/// <summary>The branch in which a planned inspection finds an indication and the component is repaired.</summary>
public sealed record RepairBranch
{
    /// <summary>P(indication at this inspection | nothing found at the earlier planned ones, existing evidence) = 1 − P(E_k)/P(E_{k−1}).</summary>
    public required double ConditionalProbability { get; init; }

    /// <summary>P(the first indication of the plan is at this inspection | existing evidence) = (P(E_{k−1}) − P(E_k)) / P(E_0).</summary>
    public required double PathProbability { get; init; }

    /// <summary>The schedule after the repair (the indication and the repair appended), when the branch depth allows; else null.</summary>
    public InspectionSchedule? AfterRepair { get; init; }
}

/// <summary>One planned inspection.</summary>
public sealed record PlannedInspection
{
    /// <summary>1 for the first planned inspection.</summary>
    public required int Number { get; init; }

    /// <summary>Planned time (years since entry into service): the last time still under the target.</summary>
    public required double TimeYears { get; init; }

    /// <summary>Calendar date of <see cref="TimeYears"/>.</summary>
    public required DateOnly Date { get; init; }

    /// <summary>Years since the previous planned inspection (or since the start for the first).</summary>
    public required double IntervalYears { get; init; }

    /// <summary>The annual measure just before the inspection (given earlier evidence): close to the target.</summary>
    public required AnnualValue Before { get; init; }

    /// <summary>The annual measure at the inspection time once its "no indication" is part of the evidence.</summary>
    public required AnnualValue After { get; init; }

    /// <summary>The repair branch at this inspection, when <see cref="PlanningOptions.RepairBranchDepth"/> ≥ 1 and P(E) is available.</summary>
    public RepairBranch? Repair { get; init; }
}

/// <summary>The check that a schedule keeps the measure under the target between its inspections.</summary>
public sealed record ScheduleVerification
{
    /// <summary>Largest measure/target ratio on the check grid (both ends of every interval included).</summary>
    public required double MaxRatio { get; init; }

    /// <summary>Where <see cref="MaxRatio"/> occurs (years).</summary>
    public required double MaxRatioAtYears { get; init; }

    /// <summary>True when <see cref="MaxRatio"/> ≤ 1.</summary>
    public bool WithinTarget => MaxRatio <= 1;

    /// <summary>Grid spacing used (years).</summary>
    public required double GridStepYears { get; init; }

    /// <summary>Times checked.</summary>
    public required int PointsChecked { get; init; }
}

/// <summary>
/// A life-cycle schedule to the end of the service life: each planned inspection is assumed to find nothing with
/// <see cref="MethodName"/>, and the next is planned where the updated annual measure reaches the target again. Immutable.
/// </summary>
public sealed record InspectionSchedule
{
    /// <summary>The inspection method assumed at every planned inspection.</summary>
    public required string MethodName { get; init; }

    /// <summary>The target planned against.</summary>
    public required AnnualTarget Target { get; init; }

    /// <summary>Start (years since entry into service).</summary>
    public required double FromYears { get; init; }

    /// <summary>End of the service life (years).</summary>
    public required double ToYears { get; init; }

    /// <summary>How the schedule ended.</summary>
    public required ScheduleStatus Status { get; init; }

    /// <summary>True when the measure was already at or above the target at the start (the first inspection is then at the start).</summary>
    public required bool OverdueAtStart { get; init; }

    /// <summary>The planned inspections in time order.</summary>
    public required IReadOnlyList<PlannedInspection> Inspections { get; init; }

    /// <summary>The check of the measure between inspections (over the part of life the schedule covers).</summary>
    public required ScheduleVerification Verification { get; init; }

    /// <summary>
    /// Expected number of repairs over the remaining life from the repair branches followed (null when none were):
    /// Σ_k P(first indication at k)·(1 + expected repairs after it). A lower bound when <see cref="ExpectedRepairsTruncated"/>.
    /// </summary>
    public double? ExpectedRepairs { get; init; }

    /// <summary>True when the branch depth cut the event tree, so <see cref="ExpectedRepairs"/> counts only the repairs followed.</summary>
    public bool ExpectedRepairsTruncated { get; init; }

    /// <summary>P(no planned inspection finds anything | existing evidence) = P(E_n)/P(E_0), when P(E) is available.</summary>
    public double? ProbabilityNothingFound { get; init; }

    /// <summary>Plain sentences saying what was found (and, when degenerate, why the schedule stopped).</summary>
    public required string Message { get; init; }

    /// <summary>The assumptions behind the result.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed.</summary>
    public required ComputationSummary Computation { get; init; }
}
