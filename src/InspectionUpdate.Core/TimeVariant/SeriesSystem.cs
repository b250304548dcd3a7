using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Multinormal;

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

    /// <summary>P(E₁ ∪ … ∪ Eₖ) for every k = 1…n (events in time order); by default one union per prefix.</summary>
    IReadOnlyList<SeriesEstimate> CumulativeUnions(IReadOnlyList<double> betas, double[,] correlation)
    {
        ArgumentNullException.ThrowIfNull(betas);
        ArgumentNullException.ThrowIfNull(correlation);
        var list = new List<SeriesEstimate>(betas.Count);
        for (var k = 1; k <= betas.Count; k++)
        {
            var r = new double[k, k];
            for (var i = 0; i < k; i++)
                for (var j = 0; j < k; j++) r[i, j] = correlation[i, j];
            list.Add(Union(betas.Take(k).ToArray(), r));
        }

        return list;
    }
}

/// <summary>
/// First-order series system by the system engine's multivariate normal integration, decomposed in time order into
/// disjoint pieces: P(E₁ ∪ … ∪ Eₖ) = Σⱼ≤ₖ P(Eⱼ ∩ E₁ᶜ ∩ … ∩ Eⱼ₋₁ᶜ). Each piece is the probability of failing first in
/// year j, so the cumulative unions of every prefix cost one rectangle probability per event and keep relative
/// accuracy for small pieces (no 1 − Φₙ cancellation).
/// </summary>
public sealed class MultinormalSeriesEngine(MultinormalOptions? options = null) : ISeriesSystemEngine
{
    /// <summary>The shared instance with default integration settings.</summary>
    public static MultinormalSeriesEngine Instance { get; } = new();

    /// <summary>The integration settings.</summary>
    public MultinormalOptions Options { get; } = options ?? MultinormalOptions.Default;

    /// <inheritdoc />
    public SeriesEstimate Union(IReadOnlyList<double> betas, double[,] correlation) => CumulativeUnions(betas, correlation)[^1];

    /// <inheritdoc />
    public IReadOnlyList<SeriesEstimate> CumulativeUnions(IReadOnlyList<double> betas, double[,] correlation)
    {
        ArgumentNullException.ThrowIfNull(betas);
        ArgumentNullException.ThrowIfNull(correlation);
        var n = betas.Count;
        var list = new List<SeriesEstimate>(n);
        double total = 0, error = 0;
        var converged = true;
        string? note = null;
        for (var k = 0; k < n; k++)
        {
            // Zᵢ = −αᵢᵀU: event Eᵢ is Zᵢ ≤ −βᵢ, its complement Zᵢ > −βᵢ.
            var lower = new double[k + 1];
            var upper = new double[k + 1];
            var r = new double[k + 1, k + 1];
            for (var i = 0; i <= k; i++)
            {
                lower[i] = i < k ? -betas[i] : double.NegativeInfinity;
                upper[i] = i < k ? double.PositiveInfinity : -betas[k];
                for (var j = 0; j <= k; j++) r[i, j] = i == j ? 1 : Math.Clamp(correlation[i, j], -1, 1);
            }

            var piece = MultivariateNormal.Probability(lower, upper, r, Options);
            total += piece.Value;
            error += piece.ErrorEstimate;
            if (!piece.Converged)
            {
                converged = false;
                note ??= FormattableString.Invariant($"the piece of event {k + 1} did not converge ({piece.Diagnostic})");
            }

            list.Add(new SeriesEstimate(Math.Min(total, 1), ComputationRoute.FirstOrder, converged,
                "first-order series system (multivariate normal, disjoint pieces in time order)", error, note));
        }

        return list;
    }
}

/// <summary>
/// The first-order simple bounds
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
            upper - lower, FormattableString.Invariant($"union bounds [{lower:G4}, {upper:G4}]; MultinormalSeriesEngine gives the first-order value"));
    }
}

/// <summary>Union of nested events (each contains the previous ones): the probability of the largest, i.e. the smallest β.</summary>
/// <remarks>Used when the annual maximum is deterministic: monotone degradation then makes each year's event contain the earlier ones.</remarks>
internal sealed class NestedEventsEngine : ISeriesSystemEngine
{
    public static NestedEventsEngine Instance { get; } = new();

    public SeriesEstimate Union(IReadOnlyList<double> betas, double[,] correlation) =>
        new(StandardNormal.Cdf(-betas.Min()), ComputationRoute.FirstOrder, true, "nested events (deterministic load)");
}
