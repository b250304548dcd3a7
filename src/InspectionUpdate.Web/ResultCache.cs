using System.Collections.Concurrent;
using InspectionUpdate.Application;
using InspectionUpdate.Reporting.Plots;
using InspectionUpdate.Time;

namespace InspectionUpdate.Web;

/// <summary>The few numbers shown before → after a change.</summary>
/// <param name="AnnualPf">Current annual Pf (updated ΔPf of the grid year ending at or after the evidence date).</param>
/// <param name="NextDue">Latest date of the next inspection.</param>
/// <param name="Route">Route key of the annual Pf.</param>
/// <param name="Converged">Whether every number behind it converged.</param>
/// <param name="Key">Result key.</param>
public sealed record ResultSummary(double? AnnualPf, DateOnly? NextDue, string? Route, bool Converged, string Key)
{
    /// <summary>The summary of a full result.</summary>
    public static ResultSummary Of(ComponentResult r)
    {
        ArgumentNullException.ThrowIfNull(r);
        return new(r.Stored.AnnualPf, r.Stored.NextDue, r.Stored.Route, r.Stored.Converged, r.Key);
    }

    /// <summary>The summary of a stored row.</summary>
    public static ResultSummary Of(InspectionUpdate.Register.StoredResult r)
    {
        ArgumentNullException.ThrowIfNull(r);
        return new(r.AnnualPf, r.NextDue, r.Route, r.Converged, r.ResultKey);
    }
}

/// <summary>A write that changes a component's numbers, and what they were before it.</summary>
/// <param name="What">What was written, in words (e.g. "finding 12 logged (no-indication on 2025-06-01)").</param>
/// <param name="AtUtc">When.</param>
/// <param name="Before">The last numbers computed before the write, or null when the component had none.</param>
public sealed record ComponentChange(string What, DateTimeOffset AtUtc, ResultSummary? Before);

/// <summary>A computed component with its plots rendered once (PNG, base64).</summary>
public sealed class CachedResult
{
    private readonly Lazy<string> _annual;
    private readonly Lazy<string> _beta;

    /// <summary>Wraps a result.</summary>
    public CachedResult(ComponentResult result, double targetAnnualPf)
    {
        ArgumentNullException.ThrowIfNull(result);
        Result = result;
        var c = result.Context;
        var markers = new ChartMarkers(
            c.Findings.Where(f => !f.Superseded).Select(f => f.TimeYears).ToArray(),
            c.Repairs.Select(r => r.TimeYears).ToArray(),
            result.Plan?.Schedule?.Inspections.Select(i => i.TimeYears).ToArray() ?? (result.Plan is { } p ? [p.Next.TimeYears] : []));
        _annual = new(() => Convert.ToBase64String(ReportCharts.Profile(ProfileQuantity.AnnualPf, result.Outcome.Prior, result.Outcome.Updated, targetAnnualPf, markers)));
        _beta = new(() => Convert.ToBase64String(ReportCharts.Profile(ProfileQuantity.Beta, result.Outcome.Prior, result.Outcome.Updated, null, markers)));
    }

    /// <summary>The result.</summary>
    public ComponentResult Result { get; }

    /// <summary>Annual Pf plot, prior against updated, with the target line.</summary>
    public string AnnualPfPng => _annual.Value;

    /// <summary>β(t) plot, prior against updated.</summary>
    public string BetaPng => _beta.Value;

    /// <summary>Years since entry into service of a date.</summary>
    public double Years(DateOnly date) => ServiceTime.YearsSince(Result.Context.InServiceDate, date);
}

/// <summary>The latest computed result of each component and the latest change written to it (in memory; the register holds the stored rows).</summary>
public sealed class ResultCache
{
    private readonly ConcurrentDictionary<string, CachedResult> _results = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, ComponentChange> _changes = new(StringComparer.Ordinal);

    /// <summary>Keeps a result (replacing the component's earlier one).</summary>
    public void Put(CachedResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        _results[result.Result.Context.Id] = result;
    }

    /// <summary>The latest result of a component, whatever its key.</summary>
    public CachedResult? Latest(string code) => _results.GetValueOrDefault(code);

    /// <summary>Records a change with the numbers before it.</summary>
    public void Changed(string code, ComponentChange change) => _changes[code] = change;

    /// <summary>The latest change of a component, or null.</summary>
    public ComponentChange? LastChange(string code) => _changes.GetValueOrDefault(code);
}
