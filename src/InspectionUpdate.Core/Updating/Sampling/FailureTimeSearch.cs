using InspectionUpdate.Degradation;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// T_f(x) = inf{t ∈ [0, H] : g(x, t) ≤ 0} for one realization x: the model's closed form where it has one
/// (<see cref="IFailureTimeModel"/>); else, where g never increases in t, one bracket [0, H] and a root; else the first
/// sign change on a grid of <c>stepsPerYear</c> steps per year, then a root inside that step. +∞ when g stays positive.
/// </summary>
/// <remarks>
/// The grid search finds the first passage up to the grid's resolution: a limit state that dips below zero and
/// recovers within one step is missed (documented in docs/methods-updating.md). Roots by Illinois regula falsi to
/// 1e-7 years.
/// </remarks>
internal static class FailureTimeSearch
{
    private const double ToleranceYears = 1e-7;

    /// <summary>
    /// T_f(x), with <c>exact</c> true when the time is T_f itself wherever it lies (a closed form, or a root found within
    /// the horizon) and false when the search stopped at the horizon with g still positive, so that its +∞ only says
    /// "not by the horizon".
    /// </summary>
    public static double Find(IDegradationModel model, ReadOnlySpan<double> x, double horizonYears, int stepsPerYear, out int evaluations, out bool exact)
    {
        var t = Search(model, x, horizonYears, stepsPerYear, out evaluations, out var closedForm);
        exact = closedForm || t <= horizonYears;
        return t;
    }

    private static double Search(IDegradationModel model, ReadOnlySpan<double> x, double horizonYears, int stepsPerYear, out int evaluations, out bool closedForm)
    {
        evaluations = 0;
        closedForm = false;
        var closed = model as IFailureTimeModel;
        if (closed is not null)
        {
            var t = closed.FailureTimeYears(x);
            evaluations = 1;
            closedForm = !double.IsNaN(t);
            if (closedForm) return t;
        }

        var g0 = model.Margin(x, 0);
        evaluations++;
        if (!(g0 > 0)) return 0;
        if (closed is not null && closed.MarginNeverIncreases(x))
        {
            var gh = model.Margin(x, horizonYears);
            evaluations++;
            return gh > 0 ? double.PositiveInfinity : Root(model, x, 0, horizonYears, g0, gh, ref evaluations);
        }

        var steps = Math.Max(1, (int)Math.Ceiling(horizonYears * stepsPerYear));
        var tPrev = 0.0;
        var gPrev = g0;
        for (var k = 1; k <= steps; k++)
        {
            var t = horizonYears * k / steps;
            var g = model.Margin(x, t);
            evaluations++;
            if (!(g > 0)) return Root(model, x, tPrev, t, gPrev, g, ref evaluations);
            tPrev = t;
            gPrev = g;
        }

        return double.PositiveInfinity;
    }

    /// <summary>Illinois regula falsi on g(lo) &gt; 0 ≥ g(hi); returns the upper end of the final bracket (a failed time).</summary>
    private static double Root(IDegradationModel model, ReadOnlySpan<double> x, double lo, double hi, double gLo, double gHi, ref int evaluations)
    {
        if (double.IsNaN(gHi) || double.IsInfinity(gHi) || double.IsInfinity(gLo)) return Bisect(model, x, lo, hi, ref evaluations);
        var side = 0;
        for (var it = 0; it < 100 && hi - lo > ToleranceYears; it++)
        {
            var t = hi - gHi * (hi - lo) / (gHi - gLo);
            if (!(t > lo && t < hi)) t = 0.5 * (lo + hi);
            var g = model.Margin(x, t);
            evaluations++;
            if (double.IsNaN(g)) return Bisect(model, x, lo, hi, ref evaluations);
            if (g > 0)
            {
                lo = t;
                gLo = g;
                if (side == -1) gHi *= 0.5;
                side = -1;
            }
            else
            {
                hi = t;
                gHi = g;
                if (side == 1) gLo *= 0.5;
                side = 1;
            }
        }

        return hi;
    }

    private static double Bisect(IDegradationModel model, ReadOnlySpan<double> x, double lo, double hi, ref int evaluations)
    {
        while (hi - lo > ToleranceYears)
        {
            var t = 0.5 * (lo + hi);
            evaluations++;
            if (model.Margin(x, t) > 0) lo = t;
            else hi = t;
        }

        return hi;
    }
}
