namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>
/// Closed forms of Paris' law da/dN = C(ΔK)^m with ΔK = Y·Δσ·√(πa) and a constant geometry function Y.
/// Units: a in mm, Δσ in MPa (N/mm²), C in mm/cycle per (N·mm^−3/2)^m.
/// </summary>
/// <remarks>
/// Separating variables gives a(N)^(1−m/2) = a₀^(1−m/2) + (1 − m/2)·C·Y^m·π^(m/2)·E[Δσ^m]·N for m ≠ 2 and
/// a(N) = a₀·exp(C·Y²·π·E[Δσ²]·N) for m = 2 (JCSS Probabilistic Model Code, Part 1, Annex B prints the form).
/// For m &gt; 2 the bracket reaches zero after finitely many cycles: the crack is then unstable (+∞).
/// </remarks>
public static class ParisLaw
{
    /// <summary>Depth after <paramref name="cycles"/> constant-amplitude cycles of range <paramref name="stressRangeMPa"/>.</summary>
    public static double DepthAfterCycles(double initialDepthMm, double c, double m, double geometryFactor, double stressRangeMPa, double cycles)
    {
        Validate(initialDepthMm, c, m, geometryFactor, stressRangeMPa);
        if (!(cycles >= 0)) throw new ArgumentOutOfRangeException(nameof(cycles), cycles, "Must be ≥ 0.");
        return DepthAfterCyclesForMoment(initialDepthMm, c, m, geometryFactor, Math.Pow(stressRangeMPa, m), cycles);
    }

    /// <summary>Cycles to grow from <paramref name="initialDepthMm"/> to <paramref name="finalDepthMm"/> under a constant range.</summary>
    public static double CyclesToGrow(double initialDepthMm, double finalDepthMm, double c, double m, double geometryFactor, double stressRangeMPa)
    {
        Validate(initialDepthMm, c, m, geometryFactor, stressRangeMPa);
        if (!(finalDepthMm > 0)) throw new ArgumentOutOfRangeException(nameof(finalDepthMm), finalDepthMm, "Must be > 0.");
        return CyclesToGrowForMoment(initialDepthMm, finalDepthMm, c, m, geometryFactor, Math.Pow(stressRangeMPa, m));
    }

    /// <summary>The depth after N cycles for a stress-range moment S = E[Δσ^m] (variable amplitude, no threshold).</summary>
    internal static double DepthAfterCyclesForMoment(double a0, double c, double m, double y, double moment, double cycles)
    {
        if (m == 3)
        {
            // The usual exponent for steel in air (BS 7910): the same formula with p = −1/2 in square roots, no powers.
            var k3 = c * y * y * y * PiToThreeHalves * moment;
            var b = 1 / Math.Sqrt(a0) - 0.5 * k3 * cycles;
            return b <= 0 ? double.PositiveInfinity : 1 / (b * b);
        }

        var k = c * Math.Pow(y, m) * Math.Pow(Math.PI, 0.5 * m) * moment;
        var p = 1 - 0.5 * m;
        if (Math.Abs(p) < 1e-12) return a0 * Math.Exp(k * cycles);
        var bracket = Math.Pow(a0, p) + p * k * cycles;
        if (bracket <= 0) return double.PositiveInfinity;
        return Math.Pow(bracket, 1 / p);
    }

    /// <summary>Cycles between two depths for S = E[Δσ^m]: ψ(a₀, a₁)/(C·Y^m·π^(m/2)·S), ψ = ∫ a^(−m/2) da.</summary>
    internal static double CyclesToGrowForMoment(double a0, double a1, double c, double m, double y, double moment) =>
        m == 3
            ? DepthIntegral(a0, a1, m) / (c * y * y * y * PiToThreeHalves * moment)
            : DepthIntegral(a0, a1, m) / (c * Math.Pow(y, m) * Math.Pow(Math.PI, 0.5 * m) * moment);

    /// <summary>π^(3/2).</summary>
    private const double PiToThreeHalves = 5.5683279968317078453;

    /// <summary>ψ(a₀, a₁) = ∫_{a₀}^{a₁} a^(−m/2) da, written as a₀^p·L·expm1(pL)/(pL) with p = 1 − m/2 and L = ln(a₁/a₀) so m near 2 stays accurate.</summary>
    internal static double DepthIntegral(double a0, double a1, double m)
    {
        var p = 1 - 0.5 * m;
        var l = Math.Log(a1 / a0);
        var z = p * l;
        if (m == 3 && a1 > 1.5 * a0) return 2 * (1 / Math.Sqrt(a0) - 1 / Math.Sqrt(a1)); // no cancellation away from a₁ ≈ a₀
        var ratio = Math.Abs(z) < 1e-8 ? 1 + 0.5 * z : MathNet.Numerics.SpecialFunctions.Expm1(z) / z;
        return Math.Pow(a0, p) * l * ratio;
    }

    private static void Validate(double a0, double c, double m, double y, double s)
    {
        if (!(double.IsFinite(a0) && a0 > 0)) throw new ArgumentOutOfRangeException("initialDepthMm", a0, "Must be finite and > 0.");
        if (!(double.IsFinite(c) && c > 0)) throw new ArgumentOutOfRangeException(nameof(c), c, "Must be finite and > 0.");
        if (!(double.IsFinite(m) && m > 0)) throw new ArgumentOutOfRangeException(nameof(m), m, "Must be finite and > 0.");
        if (!(double.IsFinite(y) && y > 0)) throw new ArgumentOutOfRangeException("geometryFactor", y, "Must be finite and > 0.");
        if (!(double.IsFinite(s) && s > 0)) throw new ArgumentOutOfRangeException("stressRangeMPa", s, "Must be finite and > 0.");
    }
}
