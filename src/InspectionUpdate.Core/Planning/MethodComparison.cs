namespace InspectionUpdate.Planning;

/// <summary>One method's schedule in a comparison.</summary>
public sealed record MethodComparisonRow
{
    /// <summary>The method's name.</summary>
    public required string MethodName { get; init; }

    /// <summary>Planned inspections over the remaining life (up to the stop, when the schedule is degenerate).</summary>
    public required int InspectionCount { get; init; }

    /// <summary>Dates of the first (up to) three planned inspections.</summary>
    public required IReadOnlyList<DateOnly> FirstDates { get; init; }

    /// <summary>The same in years since entry into service.</summary>
    public required IReadOnlyList<double> FirstTimesYears { get; init; }

    /// <summary>How the schedule ended.</summary>
    public required ScheduleStatus Status { get; init; }

    /// <summary>The full schedule.</summary>
    public required InspectionSchedule Schedule { get; init; }
}

/// <summary>Several methods' schedules side by side, under one target and one body of evidence. Immutable.</summary>
public sealed record MethodComparison
{
    /// <summary>The target planned against.</summary>
    public required AnnualTarget Target { get; init; }

    /// <summary>Start (years since entry into service).</summary>
    public required double FromYears { get; init; }

    /// <summary>End of the service life (years).</summary>
    public required double ToYears { get; init; }

    /// <summary>One row per method, in the order given.</summary>
    public required IReadOnlyList<MethodComparisonRow> Rows { get; init; }

    /// <summary>The assumptions behind the comparison.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed (all rows together).</summary>
    public required ComputationSummary Computation { get; init; }
}
