namespace InspectionUpdate.Planning;

/// <summary>When one limit is reached without further inspection.</summary>
public sealed record LifeLimit
{
    /// <summary>What the limit is, e.g. "annual ΔPf ≤ 1.0E-004" or "cumulative Pf ≤ 1.0E-003".</summary>
    public required string Limit { get; init; }

    /// <summary>True when the limit is reached inside the horizon (or already at the start).</summary>
    public required bool Reached { get; init; }

    /// <summary>True when the limit is already reached at the start.</summary>
    public required bool AlreadyReached { get; init; }

    /// <summary>The last time still under the limit (years since entry into service); the horizon when not reached.</summary>
    public required double TimeYears { get; init; }

    /// <summary>Calendar date of <see cref="TimeYears"/>.</summary>
    public required DateOnly Date { get; init; }

    /// <summary>Years from the start to <see cref="TimeYears"/>: the remaining life, or a lower bound on it when not reached.</summary>
    public required double RemainingYears { get; init; }
}

/// <summary>Remaining life without further inspection, against the annual target and, optionally, a cumulative limit. Immutable.</summary>
public sealed record RemainingLife
{
    /// <summary>Start (years since entry into service).</summary>
    public required double FromYears { get; init; }

    /// <summary>Calendar date of the start.</summary>
    public required DateOnly FromDate { get; init; }

    /// <summary>End of the search (years).</summary>
    public required double HorizonYears { get; init; }

    /// <summary>Time until the annual measure reaches the target.</summary>
    public required LifeLimit UntilAnnualTarget { get; init; }

    /// <summary>Time until the cumulative Pf reaches <see cref="CumulativePfLimit"/>, when one was given.</summary>
    public LifeLimit? UntilCumulativeLimit { get; init; }

    /// <summary>The user's limit on the cumulative Pf, if any.</summary>
    public double? CumulativePfLimit { get; init; }

    /// <summary>Plain sentences saying what was found.</summary>
    public required string Message { get; init; }

    /// <summary>The assumptions behind the result.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed.</summary>
    public required ComputationSummary Computation { get; init; }
}
