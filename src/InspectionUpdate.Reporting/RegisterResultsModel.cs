namespace InspectionUpdate.Reporting;

/// <summary>One component's stored result as the register report shows it (read from the register, not computed here).</summary>
/// <param name="ComponentId">Component code.</param>
/// <param name="Site">Site code.</param>
/// <param name="Status">assessed, not-converged or failed.</param>
/// <param name="AnnualPf">Annual Pf of the grid year at or after the evidence date, or null.</param>
/// <param name="YearEnding">End of that grid year.</param>
/// <param name="Beta">Reliability index at that time.</param>
/// <param name="Route">Route of that number.</param>
/// <param name="NextDue">Latest date of the next inspection, or null.</param>
/// <param name="YearsToTarget">Years until the annual Pf reaches the target, or null (not reached within the horizon, or not planned).</param>
/// <param name="TargetReached">Whether the target is reached before the horizon (null: not planned).</param>
/// <param name="Error">Why it failed, or null.</param>
public sealed record RegisterResultRow(string ComponentId, string Site, string Status, double? AnnualPf, DateOnly? YearEnding, double? Beta, string? Route,
    DateOnly? NextDue, double? YearsToTarget, bool? TargetReached, string? Error)
{
    /// <summary>Relative path of the component's own page, when one was written in this run.</summary>
    public string? ReportFile { get; init; }

    /// <summary>The component's marks (<see cref="ReportMarks.Of"/> of the stored result).</summary>
    public ReportMark Flags { get; init; }
}

/// <summary>Everything the register report from stored results shows.</summary>
public sealed record RegisterResultsReportData
{
    /// <summary>Title, e.g. the register name.</summary>
    public required string Title { get; init; }

    /// <summary>One row per component with a stored result for the run's evidence date and options.</summary>
    public required IReadOnlyList<RegisterResultRow> Rows { get; init; }

    /// <summary>Target annual failure probability of the run.</summary>
    public required double TargetAnnualPf { get; init; }

    /// <summary>The options the results were computed under (as stored).</summary>
    public required string OptionsKey { get; init; }

    /// <summary>Rows shown at the top of each list (the CSV has them all).</summary>
    public int Top { get; init; } = 100;

    /// <summary>Components in service on the evidence date without a stored result for these options.</summary>
    public IReadOnlyList<string> Missing { get; init; } = [];

    /// <summary>Stored results whose keys no longer match the register (shown, flagged stale).</summary>
    public IReadOnlyList<string> Stale { get; init; } = [];

    /// <summary>File name of the CSV with every row.</summary>
    public string? CsvFile { get; init; }

    /// <summary>Assumptions behind the numbers.</summary>
    public IReadOnlyList<string> Assumptions { get; init; } = [];

    /// <summary>Provenance.</summary>
    public required ReportProvenance Provenance { get; init; }

    /// <summary>Document control (title, owner, author, checker, approver, revision, target source).</summary>
    public ReportDocumentControl DocumentControl { get; init; } = new();

    /// <summary>The stored results as rows of the risk section: consequence class, its target, cost of failure, marks.</summary>
    public IReadOnlyList<PortfolioRow> RiskRows { get; init; } = [];

    /// <summary>The owner's consequence classes, one line each.</summary>
    public IReadOnlyList<string> ConsequenceClasses { get; init; } = [];
}
