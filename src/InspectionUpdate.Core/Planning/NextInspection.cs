namespace InspectionUpdate.Planning;

/// <summary>What the search for the next inspection found.</summary>
public enum NextInspectionStatus
{
    /// <summary>The annual measure reaches the target inside the window: the inspection is due at the date found.</summary>
    Due,

    /// <summary>The annual measure is already at or above the target at the start: the inspection is overdue.</summary>
    AlreadyExceeded,

    /// <summary>The annual measure stays below the target until the end of the service life.</summary>
    NotReachedBeforeEndOfService,
}

/// <summary>
/// The latest date for the next inspection: the first time after the start (by default the last finding) at which
/// the updated annual measure reaches the target. Immutable.
/// </summary>
public sealed record NextInspection
{
    /// <summary>What was found.</summary>
    public required NextInspectionStatus Status { get; init; }

    /// <summary>The target planned against.</summary>
    public required AnnualTarget Target { get; init; }

    /// <summary>Start of the search (years since entry into service).</summary>
    public required double FromYears { get; init; }

    /// <summary>Calendar date of the start.</summary>
    public required DateOnly FromDate { get; init; }

    /// <summary>End of the search: the end of the service life (years).</summary>
    public required double ToYears { get; init; }

    /// <summary>
    /// Due time (years): the last time, to within the tolerance, at which the measure is still below the target.
    /// The start when <see cref="NextInspectionStatus.AlreadyExceeded"/>; the end of service when not reached.
    /// </summary>
    public required double TimeYears { get; init; }

    /// <summary>Calendar date of <see cref="TimeYears"/>.</summary>
    public required DateOnly Date { get; init; }

    /// <summary>Annual measures, cumulative Pf and β at <see cref="TimeYears"/>.</summary>
    public required AnnualValue At { get; init; }

    /// <summary>When already exceeded: the time (years) the measure rose through the target, searching back from the start; null otherwise or when it was above since <see cref="CrossedNoLaterThanYears"/>.</summary>
    public double? CrossedAtYears { get; init; }

    /// <summary>Calendar date of <see cref="CrossedAtYears"/>.</summary>
    public DateOnly? CrossedDate { get; init; }

    /// <summary>When already exceeded and no crossing was found back to the entry into service or last repair: that time (years).</summary>
    public double? CrossedNoLaterThanYears { get; init; }

    /// <summary>When already exceeded: how long before the start the target was crossed (years).</summary>
    public double? ExceededForYears { get; init; }

    /// <summary>One plain sentence saying what was found.</summary>
    public required string Message { get; init; }

    /// <summary>The assumptions behind the result, as sentences.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed.</summary>
    public required ComputationSummary Computation { get; init; }
}
