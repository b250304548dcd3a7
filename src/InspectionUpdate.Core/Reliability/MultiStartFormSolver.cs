using System.Globalization;

namespace InspectionUpdate.Reliability;

/// <summary>Settings of the multi-start FORM search. Immutable; validated when a solve starts.</summary>
public sealed record MultiStartFormOptions
{
    /// <summary>Settings of each single search (its start point is replaced by the multi-start points).</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>
    /// Starts besides the origin (≥ 0). They lie at the distance r = max(1, |β₀|) of the search from the origin (3 when
    /// it gave no finite β): first on the coordinate axes of u, ±r·eᵢ, the axes taken in the order of decreasing |αᵢ|
    /// of that search, then, when starts remain, on the four diagonals of the first two axes. Default 8.
    /// </summary>
    public int AdditionalStarts { get; init; } = 8;

    /// <summary>
    /// Two converged design points are the same when ‖u₁* − u₂*‖ ≤ this × max(1, |β|), finite and &gt; 0. Default 0.05.
    /// </summary>
    public double DistinctTolerance { get; init; } = 0.05;

    /// <summary>
    /// Another distinct design point is reported as significant (and the result flagged) when its Φ(−β) is at least
    /// this fraction of the kept point's Φ(−β), in (0, 1]. Default 0.01.
    /// </summary>
    public double SignificantFraction { get; init; } = 0.01;

    /// <summary>The default settings.</summary>
    public static MultiStartFormOptions Default { get; } = new();

    /// <summary>Throws when a setting is out of range; the message names the setting and its value.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A setting is out of range.</exception>
    public void Validate()
    {
        if (AdditionalStarts < 0)
            throw new ArgumentOutOfRangeException(nameof(AdditionalStarts), AdditionalStarts, "MultiStartFormOptions.AdditionalStarts must be ≥ 0.");
        if (!(double.IsFinite(DistinctTolerance) && DistinctTolerance > 0))
            throw new ArgumentOutOfRangeException(nameof(DistinctTolerance), DistinctTolerance, "MultiStartFormOptions.DistinctTolerance must be finite and > 0.");
        if (!(SignificantFraction > 0 && SignificantFraction <= 1))
            throw new ArgumentOutOfRangeException(nameof(SignificantFraction), SignificantFraction, "MultiStartFormOptions.SignificantFraction must lie in (0, 1].");
    }
}

/// <summary>Outcome of a multi-start FORM search.</summary>
public sealed record MultiStartFormResult
{
    /// <summary>The converged search with the smallest β (the largest Φ(−β)); the origin's search when none converged.</summary>
    public required FormResult Best { get; init; }

    /// <summary>The other converged design points, distinct from <see cref="Best"/> and from each other, by increasing β.</summary>
    public required IReadOnlyList<FormResult> OtherDesignPoints { get; init; }

    /// <summary>
    /// The other design points whose Φ(−β) is at least <see cref="MultiStartFormOptions.SignificantFraction"/> of the
    /// kept one's: where they exist a single design point misses part of the failure domain.
    /// </summary>
    public required IReadOnlyList<FormResult> SignificantOtherDesignPoints { get; init; }

    /// <summary>Every search, the origin's first.</summary>
    public required IReadOnlyList<FormResult> Searches { get; init; }

    /// <summary>Limit-state evaluations of all searches together.</summary>
    public required long LimitStateEvaluations { get; init; }

    /// <summary>True when the kept search converged.</summary>
    public bool Converged => Best.Converged;

    /// <summary>
    /// A warning when significant other design points exist (a single-point FORM or SORM estimate then understates
    /// Pf), or when a later start found a smaller β than the origin's search (the origin's search was fooled); else null.
    /// </summary>
    public string? Warning { get; init; }
}

/// <summary>
/// FORM from several start points: the origin and points on the coordinate axes of u. Keeps the converged design point
/// with the smallest β and reports the other distinct design points, so that a search fooled by a limit state with
/// several local minima of ‖u‖ (symmetric failure domains, series systems, a branch that dominates near the origin)
/// is flagged instead of presented as the answer.
/// </summary>
/// <remarks>
/// Multi-start is the usual remedy for FORM's single-point search on limit states with several design points (Der
/// Kiureghian &amp; Dakessian 1998, Structural Safety 20:37–49, find further points by deflation; the start points
/// here are simpler; from memory). It cannot find a design point that no start leads to, and it does not repair FORM
/// where the design-point concept fails (e.g. high dimensions with a failing median point): compare with simulation.
/// </remarks>
public static class MultiStartFormSolver
{
    /// <summary>Runs the searches. Never throws for non-convergence.</summary>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    /// <exception cref="ArgumentException">The problem has no random variables.</exception>
    public static MultiStartFormResult Solve(ReliabilityProblem problem, MultiStartFormOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= MultiStartFormOptions.Default;
        options.Validate();
        var n = problem.Transformation.StandardDimension;
        var formOptions = options.Form with { StartPoint = null };
        var first = FormSolver.Solve(problem, formOptions);
        var searches = new List<FormResult> { first };

        var radius = double.IsFinite(first.Beta) && Math.Abs(first.Beta) >= 1 ? Math.Abs(first.Beta) : 3.0;
        var axes = Enumerable.Range(0, n)
            .OrderByDescending(i => first.Alpha.Count == n && double.IsFinite(first.Alpha[i]) ? Math.Abs(first.Alpha[i]) : 0.0)
            .ThenBy(i => i)
            .ToArray();
        foreach (var start in StartPoints(axes, radius, options.AdditionalStarts))
        {
            searches.Add(FormSolver.Solve(problem, formOptions with { StartPoint = start }));
        }

        var converged = searches.Where(r => r.Converged && double.IsFinite(r.Beta)).OrderBy(r => r.Beta).ToList();
        var best = converged.Count > 0 ? converged[0] : first;
        var distinct = new List<FormResult>();
        foreach (var r in converged.Skip(1))
        {
            if (IsSame(r, best, options) || distinct.Any(d => IsSame(r, d, options))) continue;
            distinct.Add(r);
        }

        var bestPf = best.FailureProbability;
        var significant = distinct.Where(d => d.FailureProbability >= options.SignificantFraction * bestPf).ToArray();
        string? warning = null;
        if (significant.Length > 0)
        {
            warning = string.Create(CultureInfo.InvariantCulture,
                $"{significant.Length + 1} design points contribute (β = {string.Join(", ", new[] { best }.Concat(significant).Select(d => d.Beta.ToString("0.###", CultureInfo.InvariantCulture)))}): a single-point FORM or SORM estimate understates Pf; use simulation or a system of the design points.");
        }
        else if (best != first && first.Converged && best.Beta < first.Beta - options.DistinctTolerance * Math.Max(1, Math.Abs(best.Beta)))
        {
            warning = string.Create(CultureInfo.InvariantCulture,
                $"The search from the origin converged to β = {first.Beta:0.###}; another start found β = {best.Beta:0.###}, which is kept.");
        }

        return new MultiStartFormResult
        {
            Best = best,
            OtherDesignPoints = distinct,
            SignificantOtherDesignPoints = significant,
            Searches = searches,
            LimitStateEvaluations = searches.Sum(r => (long)r.LimitStateEvaluations),
            Warning = warning,
        };
    }

    /// <summary>±r·eᵢ along the axes in order, then the diagonals r(±eᵢ ± eⱼ)/√2 of the first two axes, up to <paramref name="count"/> points.</summary>
    private static IEnumerable<double[]> StartPoints(int[] axes, double radius, int count)
    {
        var n = axes.Length;
        var made = 0;
        for (var k = 0; k < 2 * n && made < count; k++, made++)
        {
            var start = new double[n];
            start[axes[k / 2]] = k % 2 == 0 ? radius : -radius;
            yield return start;
        }

        if (n < 2) yield break;
        var d = radius / Math.Sqrt(2);
        foreach (var (a, b) in new[] { (1.0, 1.0), (-1.0, -1.0), (1.0, -1.0), (-1.0, 1.0) })
        {
            if (made++ >= count) yield break;
            var start = new double[n];
            start[axes[0]] = a * d;
            start[axes[1]] = b * d;
            yield return start;
        }
    }

    private static bool IsSame(FormResult a, FormResult b, MultiStartFormOptions options)
    {
        var d2 = 0.0;
        for (var i = 0; i < a.DesignPointU.Count; i++)
        {
            var d = a.DesignPointU[i] - b.DesignPointU[i];
            d2 += d * d;
        }

        return Math.Sqrt(d2) <= options.DistinctTolerance * Math.Max(1, Math.Max(Math.Abs(a.Beta), Math.Abs(b.Beta)));
    }
}
