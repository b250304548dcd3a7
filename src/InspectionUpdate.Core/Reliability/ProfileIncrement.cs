namespace InspectionUpdate.Reliability;

/// <summary>
/// ΔPf between two times of a profile, checked against monotonicity: for monotone degradation F(t_prev) ⊂ F(t), so
/// the exact cumulative Pf never falls between renewals. A fall within the two estimates' own uncertainty is
/// numerical noise and becomes 0 (with a note); a larger fall means the later estimate cannot be right.
/// </summary>
internal static class ProfileIncrement
{
    /// <summary>Falls of the cumulative Pf smaller than this are noise whatever the estimates' own uncertainty.</summary>
    public const double AbsoluteFloor = 1e-12;

    /// <summary>The increment, whether it is consistent, and a note when it was changed or is inconsistent.</summary>
    /// <param name="pf">Cumulative Pf at t.</param>
    /// <param name="cov">CoV of <paramref name="pf"/> when simulated, else null.</param>
    /// <param name="previousPf">Cumulative Pf at the previous time (0 after a renewal).</param>
    /// <param name="previousCov">CoV of <paramref name="previousPf"/> when simulated, else null.</param>
    public static (double Interval, bool Consistent, string? Note) Of(double pf, double? cov, double previousPf, double? previousCov)
    {
        var interval = pf - previousPf;
        if (!(interval < 0)) return (interval, true, null);

        // Three standard deviations of each simulated estimate; a deterministic (first-order, quadrature) estimate
        // is trusted to 1e-3 relative, the accuracy of the multinormal integrals behind it; and an absolute floor of
        // 1e-12, a millionth of the smallest annual target in use (about 1e-6), below which no decision changes.
        var noise = 3 * (Spread(pf, cov) + Spread(previousPf, previousCov)) + 1e-3 * previousPf + AbsoluteFloor;
        if (-interval <= noise)
        {
            return (0, true, FormattableString.Invariant($"ΔPf {interval:G3} is below 0 by less than the estimates' uncertainty: shown as 0"));
        }

        return (interval, false, FormattableString.Invariant(
            $"the cumulative Pf fell from {previousPf:G4} to {pf:G4}, impossible for monotone degradation: this step's estimate is not reliable"));
    }

    // One standard deviation of an estimate; a simulated 0 has CoV ∞ and no spread, and a non-finite CoV on a
    // positive value is taken as the value itself (never NaN, which would make every comparison false).
    private static double Spread(double p, double? cov) =>
        p <= 0 || cov is null ? 0 : double.IsFinite(cov.Value) ? cov.Value * p : p;
}
