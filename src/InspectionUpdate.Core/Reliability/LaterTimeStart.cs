namespace InspectionUpdate.Reliability;

/// <summary>
/// A start for FORM at a time t whose search from the origin runs off because the median point lies in a flat region
/// of the limit state (e.g. before corrosion typically initiates, where the rate has no effect): the design point of
/// a later time, where the median point has left that region.
/// </summary>
internal static class LaterTimeStart
{
    /// <summary>Times tried: 2, 4, 8 and 16 times t.</summary>
    public const int MaxDoublings = 4;

    /// <summary>The first converged FORM run at 2^k·t, k = 1 … <see cref="MaxDoublings"/>, with its k; or null.</summary>
    /// <param name="timeYears">t (no later time is tried for t ≤ 0).</param>
    /// <param name="solveAt">FORM from the origin at a given time.</param>
    public static (int Doublings, FormResult Form)? Find(double timeYears, Func<double, FormResult> solveAt)
    {
        if (!(timeYears > 0)) return null;
        for (var k = 1; k <= MaxDoublings; k++)
        {
            var form = solveAt(timeYears * (1 << k));
            if (form.Converged && form.DesignPointU.All(double.IsFinite)) return (k, form);
        }

        return null;
    }
}
