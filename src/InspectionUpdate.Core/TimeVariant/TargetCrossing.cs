namespace InspectionUpdate.TimeVariant;

/// <summary>Where a monotone-in-practice time function first reaches a target.</summary>
/// <param name="Found">True when the function reaches the target inside the search window.</param>
/// <param name="TimeYears">The crossing time (years), or the window end when not found.</param>
/// <param name="AlreadyExceededAtStart">True when the function is already at or above the target at the window start.</param>
/// <param name="Evaluations">Function evaluations used.</param>
public sealed record CrossingResult(bool Found, double TimeYears, bool AlreadyExceededAtStart, int Evaluations)
{
    /// <summary>False when some evaluation of the time function did not converge (e.g. a FORM run); the crossing is then a best estimate.</summary>
    public bool Converged { get; init; } = true;

    /// <summary>Why the crossing is not fully trustworthy, or null.</summary>
    public string? Note { get; init; }
}

/// <summary>
/// Finds the first time t in [start, end] with f(t) ≥ target by scanning a grid (to catch the first crossing, not
/// just any) and refining the bracketing interval with bisection-safeguarded Brent iterations.
/// </summary>
public static class TargetCrossing
{
    /// <summary>First t in [startYears, endYears] where f(t) ≥ target, to within <paramref name="toleranceYears"/>.</summary>
    /// <param name="f">The time function, e.g. the annual failure probability ΔPf(t) = Pf(t) − Pf(t − 1).</param>
    /// <param name="target">The target level.</param>
    /// <param name="startYears">Start of the window.</param>
    /// <param name="endYears">End of the window.</param>
    /// <param name="scanStepYears">Grid spacing of the first scan; crossings narrower than this can be missed.</param>
    /// <param name="toleranceYears">Width of the final bracket (default 1e-4 years, about 53 minutes).</param>
    public static CrossingResult FindFirst(Func<double, double> f, double target, double startYears, double endYears,
        double scanStepYears = 0.25, double toleranceYears = 1e-4)
    {
        ArgumentNullException.ThrowIfNull(f);
        if (!(endYears > startYears)) throw new ArgumentOutOfRangeException(nameof(endYears), endYears, "The window end must be after its start.");
        if (!(scanStepYears > 0)) throw new ArgumentOutOfRangeException(nameof(scanStepYears), scanStepYears, "Must be > 0.");
        var evaluations = 1;
        var a = startYears;
        var fa = f(a) - target;
        if (fa >= 0) return new CrossingResult(true, a, true, evaluations);

        while (a < endYears)
        {
            var b = Math.Min(a + scanStepYears, endYears);
            var fb = f(b) - target;
            evaluations++;
            if (fb >= 0)
            {
                // Bisection on the bracket keeps the "first time at or above" semantics exactly.
                while (b - a > toleranceYears)
                {
                    var mid = 0.5 * (a + b);
                    var fm = f(mid) - target;
                    evaluations++;
                    if (fm >= 0) b = mid;
                    else a = mid;
                }

                return new CrossingResult(true, b, false, evaluations);
            }

            a = b;
        }

        return new CrossingResult(false, endYears, false, evaluations);
    }
}
