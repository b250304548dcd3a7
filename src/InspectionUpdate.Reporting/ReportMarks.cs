using System.Globalization;

namespace InspectionUpdate.Reporting;

/// <summary>The marks a component can carry on every page and in every export.</summary>
[Flags]
public enum ReportMark
{
    /// <summary>No mark.</summary>
    None = 0,

    /// <summary>Some number behind the component's row (a profile step or a planning estimate) did not converge.</summary>
    NotConverged = 1,

    /// <summary>The latest date of the next inspection is on or before the evidence date.</summary>
    Overdue = 2,

    /// <summary>The annual Pf now (the number shown beside it) is at or above the target.</summary>
    AboveTarget = 4,
}

/// <summary>
/// One rule for the marks, so that the register page, the component pages, register.json and the CSV exports say the
/// same thing of the same component.
/// </summary>
public static class ReportMarks
{
    /// <summary>Every mark, in the order they are written.</summary>
    public static IReadOnlyList<ReportMark> All { get; } = [ReportMark.NotConverged, ReportMark.Overdue, ReportMark.AboveTarget];

    /// <summary>The marks of one component.</summary>
    /// <param name="allConverged">Whether every number behind the row converged (profiles and plan).</param>
    /// <param name="annualPfNow">The annual Pf now as shown in the row (null: not computed).</param>
    /// <param name="nextDue">Latest date of the next inspection (null: not planned).</param>
    /// <param name="targetAnnualPf">The target (null: none).</param>
    /// <param name="evidenceDate">The evidence date of the run.</param>
    public static ReportMark Of(bool allConverged, double? annualPfNow, DateOnly? nextDue, double? targetAnnualPf, DateOnly evidenceDate)
    {
        var f = ReportMark.None;
        if (!allConverged) f |= ReportMark.NotConverged;
        if (nextDue is { } d && d <= evidenceDate) f |= ReportMark.Overdue;
        if (annualPfNow is { } p && targetAnnualPf is { } t && p >= t) f |= ReportMark.AboveTarget;
        return f;
    }

    /// <summary>Stable key of a mark in exports: <c>not_converged</c>, <c>overdue</c>, <c>above_target</c>.</summary>
    public static string Key(ReportMark flag) => flag switch
    {
        ReportMark.NotConverged => "not_converged",
        ReportMark.Overdue => "overdue",
        ReportMark.AboveTarget => "above_target",
        _ => throw new ArgumentOutOfRangeException(nameof(flag), flag, "one mark expected"),
    };

    /// <summary>The words of a mark as every page shows them.</summary>
    public static string Words(ReportMark flag) => flag switch
    {
        ReportMark.NotConverged => "not converged",
        ReportMark.Overdue => "overdue",
        ReportMark.AboveTarget => "above target",
        _ => throw new ArgumentOutOfRangeException(nameof(flag), flag, "one mark expected"),
    };

    /// <summary>What a mark means (the legend).</summary>
    public static string Meaning(ReportMark flag) => flag switch
    {
        ReportMark.NotConverged => "some number behind this component (a profile step or a planning estimate) did not converge: its numbers are best estimates only",
        ReportMark.Overdue => "the latest date of the next inspection is on or before the evidence date: inspect now",
        ReportMark.AboveTarget => "the annual Pf now (the value shown) is at or above the target annual Pf",
        _ => throw new ArgumentOutOfRangeException(nameof(flag), flag, "one mark expected"),
    };

    /// <summary>The single marks set in <paramref name="flags"/>, in the order of <see cref="All"/>.</summary>
    public static IReadOnlyList<ReportMark> Split(ReportMark flags) => All.Where(f => flags.HasFlag(f)).ToArray();

    /// <summary>The keys of the marks set, e.g. ["not_converged", "above_target"] (empty when none).</summary>
    public static IReadOnlyList<string> Keys(ReportMark flags) => Split(flags).Select(Key).ToArray();

    /// <summary>The keys joined by ';' for a CSV cell (empty when none).</summary>
    public static string CsvCell(ReportMark flags) => string.Join(';', Keys(flags));

    /// <summary>Counts of each mark over a set of components.</summary>
    public static IReadOnlyDictionary<ReportMark, int> Counts(IEnumerable<ReportMark> flags)
    {
        var list = flags.ToArray();
        return All.ToDictionary(f => f, f => list.Count(x => x.HasFlag(f)));
    }

    /// <summary>"2 not converged, 1 overdue" etc. for a text line.</summary>
    public static string Describe(ReportMark flags) =>
        flags == ReportMark.None ? "none" : string.Join(", ", Split(flags).Select(Words));

    internal static string CountText(int n) => n.ToString(CultureInfo.InvariantCulture);
}
