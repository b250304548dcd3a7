using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.TimeVariant;

/// <summary>A union (series system) probability with how it was computed.</summary>
/// <param name="Probability">P(E₁ ∪ … ∪ Eₙ).</param>
/// <param name="Route">How it was computed.</param>
/// <param name="Converged">False when the number is only a bound or the computation did not meet its accuracy.</param>
/// <param name="Method">Name of the method.</param>
/// <param name="ErrorEstimate">Absolute error estimate, when the method gives one.</param>
/// <param name="Note">Anything the reader should know.</param>
public sealed record SeriesEstimate(double Probability, ComputationRoute Route, bool Converged, string Method,
    double? ErrorEstimate = null, string? Note = null);

/// <summary>
/// Computes the first-order probability of a union of linearized events Eᵢ = {βᵢ − αᵢᵀU ≤ 0}:
/// P(∪Eᵢ) = 1 − Φₙ(β; R) with Rᵢⱼ = αᵢᵀαⱼ. The time-stepped runs use it for the yearly events of an annual-maximum
/// load; the system engine of the reliability layer plugs in here.
/// </summary>
public interface ISeriesSystemEngine
{
    /// <summary>The union probability of the events with reliability indices <paramref name="betas"/> and correlation <paramref name="correlation"/>.</summary>
    SeriesEstimate Union(IReadOnlyList<double> betas, double[,] correlation);
}

/// <summary>
/// Interim engine until the multinormal system engine is wired in: the first-order bounds
/// maxᵢ Pᵢ ≤ P(∪Eᵢ) ≤ min(1, ΣPᵢ) (Boole). It returns the upper (conservative) bound, flagged not converged, and
/// both bounds in the note. Exact when the events are fully dependent (lower) or disjoint (upper).
/// </summary>
public sealed class UnionBoundsEngine : ISeriesSystemEngine
{
    /// <summary>The shared instance.</summary>
    public static UnionBoundsEngine Instance { get; } = new();

    /// <inheritdoc />
    public SeriesEstimate Union(IReadOnlyList<double> betas, double[,] correlation)
    {
        ArgumentNullException.ThrowIfNull(betas);
        if (betas.Count == 0) return new SeriesEstimate(0, ComputationRoute.Exact, true, "empty union");
        var lower = 0.0;
        var sum = 0.0;
        foreach (var b in betas)
        {
            var p = StandardNormal.Cdf(-b);
            lower = Math.Max(lower, p);
            sum += p;
        }

        if (betas.Count == 1) return new SeriesEstimate(lower, ComputationRoute.FirstOrder, true, "single event");
        var upper = Math.Min(1, sum);
        return new SeriesEstimate(upper, ComputationRoute.FirstOrder, false, "first-order simple bounds (upper bound reported)",
            upper - lower, FormattableString.Invariant($"union bounds [{lower:G4}, {upper:G4}]; the multinormal system engine narrows them"));
    }
}

/// <summary>Union of nested events (each contains the previous ones): the probability of the largest, i.e. the smallest β.</summary>
internal sealed class NestedEventsEngine : ISeriesSystemEngine
{
    public static NestedEventsEngine Instance { get; } = new();

    public SeriesEstimate Union(IReadOnlyList<double> betas, double[,] correlation) =>
        new(StandardNormal.Cdf(-betas.Min()), ComputationRoute.FirstOrder, true, "nested events (deterministic load)");
}
