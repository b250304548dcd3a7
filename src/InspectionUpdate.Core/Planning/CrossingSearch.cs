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

        // TargetCrossing scans for the first bracket only (tolerance = scan step); the refinement below uses
        // regula falsi (Illinois) on ln f, which needs fewer estimates than bisection on smooth curves.
        var r = TargetCrossing.FindFirst(Safe, level, startYears, endYears, options.ScanStepYears, options.ScanStepYears * (1 + 1e-9));
        if (!r.Found) return new Crossing(false, endYears, double.NaN, false);
        if (r.AlreadyExceededAtStart) return new Crossing(true, startYears, startYears, true);

        var a = Math.Max(startYears, r.TimeYears - options.ScanStepYears);
        if (Safe(a) >= level)
        {
            // Only when the last scan step was shortened at the window end: fall back to TargetCrossing's bisection.
            var full = TargetCrossing.FindFirst(Safe, level, startYears, r.TimeYears, options.ScanStepYears, options.ToleranceYears);
            var below = Math.Max(startYears, full.TimeYears - options.ToleranceYears);
            while (below > startYears && Safe(below) >= level) below = Math.Max(startYears, below - options.ToleranceYears);
            return new Crossing(true, below, full.TimeYears, false);
        }

        var (lastBelow, firstAbove) = Refine(Safe, level, a, r.TimeYears, options.ToleranceYears);
        return new Crossing(true, lastBelow, firstAbove, false);
    }

    /// <summary>
    /// Narrows a bracket with f(a) &lt; level ≤ f(b) to width ≤ tolerance by the Illinois variant of regula falsi on
    /// g = ln f − ln level (bisection where g is not finite or the bracket stops halving). Returns the final (a, b).
    /// </summary>
    /// <remarks>
    /// Dowell &amp; Jarratt (1971), BIT 11:168–174, the Illinois modification (citation from memory). Each new point keeps at least half a
    /// tolerance from the bracket ends, so the bracket shrinks every step and ends straddling the crossing.
    /// </remarks>
    internal static (double A, double B) Refine(Func<double, double> f, double level, double a, double b, double tolerance)
    {
        double G(double t) => f(t) is var v && v > 0 ? Math.Log(v / level) : double.NegativeInfinity;
        var ga = G(a);
        var gb = G(b);
        var side = 0;
        var widthAtCheck = b - a;
        for (var iteration = 1; b - a > tolerance && iteration <= 100; iteration++)
        {
            var mid = 0.5 * (a + b);
            var x = double.IsFinite(ga) && double.IsFinite(gb) && gb > ga ? b - gb * (b - a) / (gb - ga) : mid;
            if (iteration % 3 == 0)
            {
                // Guarantee progress: if three steps did not halve the bracket, bisect.
                if (b - a > 0.5 * widthAtCheck) x = mid;
                widthAtCheck = b - a;
            }

            x = Math.Clamp(x, a + 0.5 * tolerance, b - 0.5 * tolerance);
            var gx = G(x);
            if (gx >= 0)
            {
                b = x;
                gb = gx;
                if (side == 1) ga *= 0.5;
                side = 1;
            }
            else
            {
                a = x;
                ga = gx;
                if (side == -1) gb *= 0.5;
                side = -1;
            }
        }

        return (a, b);
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
