using System.Globalization;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>How the updated failure probabilities behind a planning result were computed.</summary>
public sealed record ComputationSummary
{
    /// <summary>Every route that produced an estimate used here, in first-use order.</summary>
    public required IReadOnlyList<ComputationRoute> Routes { get; init; }

    /// <summary>Number of updated estimates requested from the updater.</summary>
    public required int Estimates { get; init; }

    /// <summary>False when any estimate did not converge or was not a finite probability: the result is then flagged, not final.</summary>
    public required bool AllConverged { get; init; }

    /// <summary>Largest coefficient of variation of a simulated estimate, or null when none was simulated.</summary>
    public double? MaxCoefficientOfVariation { get; init; }

    /// <summary>Notes from the updater about non-converged or unusual estimates (at most a few, with their times).</summary>
    public required IReadOnlyList<string> Notes { get; init; }

    /// <summary>The summary of several computations together.</summary>
    public static ComputationSummary Combine(IEnumerable<ComputationSummary> parts)
    {
        ArgumentNullException.ThrowIfNull(parts);
        var list = parts.ToList();
        return new ComputationSummary
        {
            Routes = list.SelectMany(p => p.Routes).Distinct().ToArray(),
            Estimates = list.Sum(p => p.Estimates),
            AllConverged = list.All(p => p.AllConverged),
            MaxCoefficientOfVariation = list.Select(p => p.MaxCoefficientOfVariation).Where(c => c.HasValue).DefaultIfEmpty(null).Max(),
            Notes = list.SelectMany(p => p.Notes).Distinct().Take(EstimateLog.MaxNotes).ToArray(),
        };
    }
}

/// <summary>Collects the route, convergence and CoV of every estimate one planning call uses. Not thread-safe.</summary>
internal sealed class EstimateLog
{
    internal const int MaxNotes = 8;
    private readonly List<ComputationRoute> _routes = [];
    private readonly List<string> _notes = [];
    private int _count;
    private bool _allConverged = true;
    private double? _maxCov;

    public void Add(UpdatedEstimate estimate, double timeYears)
    {
        _count++;
        if (!_routes.Contains(estimate.Route)) _routes.Add(estimate.Route);
        var finite = double.IsFinite(estimate.CumulativePf) && estimate.CumulativePf is >= 0 and <= 1;
        if (!estimate.Converged || !finite)
        {
            _allConverged = false;
            var why = !finite
                ? string.Create(CultureInfo.InvariantCulture, $"Pf = {estimate.CumulativePf} is not a probability")
                : estimate.Note ?? "not converged";
            AddNote(string.Create(CultureInfo.InvariantCulture, $"t = {timeYears:0.###} years: {why}"));
        }

        if (estimate.CoefficientOfVariation is { } cov && double.IsFinite(cov))
        {
            _maxCov = _maxCov is { } m ? Math.Max(m, cov) : cov;
        }
    }

    public void AddNote(string note)
    {
        if (_notes.Count < MaxNotes && !_notes.Contains(note)) _notes.Add(note);
    }

    public ComputationSummary Summary() => new()
    {
        Routes = _routes.ToArray(),
        Estimates = _count,
        AllConverged = _allConverged,
        MaxCoefficientOfVariation = _maxCov,
        Notes = _notes.ToArray(),
    };
}
