using InspectionUpdate.TimeVariant;

namespace InspectionUpdate.Planning;

/// <summary>Where a curve crosses a level, found with <see cref="TargetCrossing"/>.</summary>
/// <param name="Found">True when the level is reached inside the window.</param>
/// <param name="LastBelowYears">
/// The last time found still below the level (within the tolerance of the crossing): the latest safe date.
/// The window end when not found.
/// </param>
/// <param name="FirstAtOrAboveYears">The first time found at or above the level (NaN when not found).</param>
/// <param name="AlreadyAtOrAbove">True when the curve is already at or above the level at the window start.</param>
internal readonly record struct Crossing(bool Found, double LastBelowYears, double FirstAtOrAboveYears, bool AlreadyAtOrAbove);

/// <summary>Wraps <see cref="TargetCrossing"/> for the planner: NaN counts as above the level, and a backward search.</summary>
internal static class CrossingSearch
{
    /// <summary>First crossing of <paramref name="level"/> in [start, end], scanning forward.</summary>
    public static Crossing Forward(Func<double, double> f, double level, double startYears, double endYears, PlanningOptions options)
    {
        // A failed estimate (NaN) counts as reaching the target, so it can only make a due date earlier.
        double Safe(double t) => f(t) is var v && double.IsNaN(v) ? double.PositiveInfinity : v;

        if (!(endYears > startYears))
        {
            var atStart = Safe(startYears) >= level;
            return new Crossing(atStart, startYears, atStart ? startYears : double.NaN, atStart);
        }

        var r = TargetCrossing.FindFirst(Safe, level, startYears, endYears, options.ScanStepYears, options.ToleranceYears);
        if (!r.Found) return new Crossing(false, endYears, double.NaN, false);
        if (r.AlreadyExceededAtStart) return new Crossing(true, startYears, startYears, true);

        // TargetCrossing returns the upper end b of a bracket no wider than the tolerance whose lower end is below
        // the level. Step back by the tolerance; confirm, since the curve need not be monotone inside the bracket.
        var lastBelow = Math.Max(startYears, r.TimeYears - options.ToleranceYears);
        while (lastBelow > startYears && Safe(lastBelow) >= level)
        {
            lastBelow = Math.Max(startYears, lastBelow - options.ToleranceYears);
        }

        return new Crossing(true, lastBelow, r.TimeYears, false);
    }

    /// <summary>
    /// Given f(start) ≥ level, searches backwards towards <paramref name="lowerYears"/> for the time at which f rose
    /// to the level and stayed there until start. Found = false when f is at or above the level all the way back.
    /// </summary>
    public static Crossing Backward(Func<double, double> f, double level, double startYears, double lowerYears, PlanningOptions options)
    {
        double Safe(double t) => f(t) is var v && double.IsNaN(v) ? double.PositiveInfinity : v;
        if (!(startYears > lowerYears)) return new Crossing(false, lowerYears, lowerYears, true);

        // Mirror time (τ = start − t) and the sign, so "first τ with −f ≥ −level" is the latest t with f ≤ level.
        var r = TargetCrossing.FindFirst(tau => -Safe(startYears - tau), -level, 0, startYears - lowerYears,
            options.ScanStepYears, options.ToleranceYears);
        if (!r.Found) return new Crossing(false, lowerYears, lowerYears, true);
        var lastBelow = startYears - r.TimeYears;
        return new Crossing(true, lastBelow, Math.Min(startYears, lastBelow + options.ToleranceYears), true);
    }
}
