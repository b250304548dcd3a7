using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Reliability.Systems;

/// <summary>
/// Probabilities of intersections (parallel systems) and unions (series systems) of linearized events
/// {αᵢᵀU ≥ βᵢ} in standard normal space: the first-order system reliability of Hohenbichler &amp; Rackwitz (1983) and
/// Madsen, Krenk &amp; Lind (1986, Methods of Structural Safety, ch. 8) [from memory]. With Zᵢ = −αᵢᵀU the Zᵢ are
/// standard normal with correlations ρᵢⱼ = αᵢᵀαⱼ, so P(∩ᵢ Fᵢ) = Φₙ(−β; R).
/// </summary>
/// <remarks>
/// The union is computed as a sum of disjoint pieces, P(∪Fᵢ) = Σᵢ P(Fᵢ ∩ F₁ᶜ ∩ … ∩ Fᵢ₋₁ᶜ), each a rectangle
/// probability, with the events ordered by decreasing probability. This keeps relative accuracy for small union
/// probabilities, where 1 − Φₙ(β; R) would cancel. This is the entry point the updating layer uses for linearized
/// inspection events.
/// </remarks>
public static class FirstOrderSystem
{
    /// <summary>The correlation matrix ρᵢⱼ = αᵢᵀαⱼ of the events' linear forms (diagonal exactly 1, entries clamped to [−1, 1]).</summary>
    /// <exception cref="ArgumentException">An event has a non-finite β, α of the wrong length, or α not of unit length.</exception>
    public static double[,] Correlation(IReadOnlyList<LinearizedEvent> events)
    {
        ArgumentNullException.ThrowIfNull(events);
        var n = events.Count;
        if (n == 0) throw new ArgumentException("At least one event is needed.", nameof(events));
        var d = events[0].Alpha?.Count ?? 0;
        for (var i = 0; i < n; i++) events[i].Validate(i, d);
        var r = new double[n, n];
        for (var i = 0; i < n; i++)
        {
            r[i, i] = 1;
            for (var j = 0; j < i; j++)
            {
                var s = 0.0;
                for (var k = 0; k < d; k++) s += events[i].Alpha[k] * events[j].Alpha[k];
                r[i, j] = r[j, i] = Math.Clamp(s, -1, 1);
            }
        }

        return r;
    }

    /// <summary>P(∩ᵢ {αᵢᵀU ≥ βᵢ}) = Φₙ(−β; R): the first-order probability of a parallel system.</summary>
    /// <exception cref="ArgumentException">See <see cref="Correlation"/>.</exception>
    public static MultinormalResult Intersection(IReadOnlyList<LinearizedEvent> events, MultinormalOptions? options = null)
    {
        var r = Correlation(events);
        var upper = events.Select(e => -e.Beta).ToArray();
        return MultivariateNormal.Cdf(upper, r, options);
    }

    /// <summary>P(∪ᵢ {αᵢᵀU ≥ βᵢ}): the first-order probability of a series system, as a sum of disjoint rectangle probabilities.</summary>
    /// <exception cref="ArgumentException">See <see cref="Correlation"/>.</exception>
    public static MultinormalResult Union(IReadOnlyList<LinearizedEvent> events, MultinormalOptions? options = null)
    {
        var rAll = Correlation(events);
        var n = events.Count;
        // Largest event first: the first piece carries most of the probability.
        var order = Enumerable.Range(0, n).OrderBy(i => events[i].Beta).ToArray();
        double total = 0, error = 0, variance = 0;
        long evaluations = 0;
        var converged = true;
        var methods = new HashSet<string>(StringComparer.Ordinal);
        string? diagnostic = null;
        var rank = 0;
        for (var m = 0; m < n; m++)
        {
            var lower = new double[m + 1];
            var upper = new double[m + 1];
            var r = new double[m + 1, m + 1];
            for (var p = 0; p <= m; p++)
            {
                var ep = events[order[p]];
                // Zₚ = −αₚᵀU: the event Fₚ is Zₚ ≤ −βₚ, its complement Zₚ > −βₚ.
                if (p < m)
                {
                    lower[p] = -ep.Beta;
                    upper[p] = double.PositiveInfinity;
                }
                else
                {
                    lower[p] = double.NegativeInfinity;
                    upper[p] = -ep.Beta;
                }

                for (var q = 0; q <= m; q++) r[p, q] = rAll[order[p], order[q]];
            }

            var piece = MultivariateNormal.Probability(lower, upper, r, options);
            total += piece.Value;
            error += piece.ErrorEstimate;
            variance += piece.StandardError * piece.StandardError;
            evaluations += piece.Evaluations;
            converged &= piece.Converged;
            methods.Add(piece.Method);
            diagnostic ??= piece.Diagnostic;
            rank = Math.Max(rank, piece.Rank);
        }

        var method = "union as a sum of disjoint pieces: " + string.Join("; ", methods);
        return new MultinormalResult(Math.Clamp(total, 0, 1), error, method, evaluations)
        {
            Converged = converged,
            Diagnostic = diagnostic,
            Rank = rank,
            StandardError = Math.Sqrt(variance),
        };
    }

    /// <summary>Generalized reliability index −Φ⁻¹(p).</summary>
    internal static double GeneralizedBeta(double p) => -StandardNormal.InverseCdf(Math.Clamp(p, 0, 1));
}
