namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>
/// A bilinear S–N curve log₁₀N = log₁₀ā₁ − m₁·log₁₀Δσ for N ≤ N_tr, log₁₀ā₂ − m₂·log₁₀Δσ beyond, with the
/// thickness correction Δσ·(t/t_ref)^k for t &gt; t_ref (DNV-RP-C203 form).
/// </summary>
/// <param name="Name">Curve name, e.g. "DNV-RP-C203 D (air)".</param>
/// <param name="M1">Slope m₁ for N ≤ N_tr.</param>
/// <param name="Log10A1">log₁₀ā₁ (ā in cycles·MPa^m).</param>
/// <param name="M2">Slope m₂ for N &gt; N_tr.</param>
/// <param name="Log10A2">log₁₀ā₂.</param>
/// <param name="TransitionCycles">N_tr where the slope changes (10⁷ for the DNV-RP-C203 air curves).</param>
/// <param name="ThicknessExponent">k of the thickness correction.</param>
/// <param name="ReferenceThicknessMm">t_ref in mm.</param>
/// <param name="Source">Where the constants come from, with "from memory" where recalled.</param>
public sealed record SnCurve(string Name, double M1, double Log10A1, double M2, double Log10A2, double TransitionCycles,
    double ThicknessExponent, double ReferenceThicknessMm, string Source)
{
    private const string DnvSource = "DNV-RP-C203, Table 2-1, S–N curves in air (values from memory; internally consistent at 10^7 cycles)";

    /// <summary>DNV-RP-C203 curve C in air (from memory).</summary>
    public static SnCurve DnvC { get; } = new("DNV-RP-C203 C (air)", 3, 12.592, 5, 16.320, 1e7, 0.05, 25, DnvSource);

    /// <summary>DNV-RP-C203 curve D in air (from memory, docs/references.md).</summary>
    public static SnCurve DnvD { get; } = new("DNV-RP-C203 D (air)", 3, 12.164, 5, 15.606, 1e7, 0.20, 25, DnvSource);

    /// <summary>DNV-RP-C203 curve E in air (from memory).</summary>
    public static SnCurve DnvE { get; } = new("DNV-RP-C203 E (air)", 3, 12.010, 5, 15.350, 1e7, 0.20, 25, DnvSource);

    /// <summary>DNV-RP-C203 curve F in air (from memory).</summary>
    public static SnCurve DnvF { get; } = new("DNV-RP-C203 F (air)", 3, 11.855, 5, 15.091, 1e7, 0.25, 25, DnvSource);

    /// <summary>DNV-RP-C203 curve T in air for tubular joints (from memory: same constants as D, k = 0.25, t_ref = 32 mm).</summary>
    public static SnCurve DnvT { get; } = new("DNV-RP-C203 T (air, tubular joints)", 3, 12.164, 5, 15.606, 1e7, 0.25, 32, DnvSource);

    /// <summary>The presets by key, as used in component-model files.</summary>
    public static IReadOnlyDictionary<string, SnCurve> Presets { get; } = new Dictionary<string, SnCurve>(StringComparer.Ordinal)
    {
        ["dnv-c203-C-air"] = DnvC,
        ["dnv-c203-D-air"] = DnvD,
        ["dnv-c203-E-air"] = DnvE,
        ["dnv-c203-F-air"] = DnvF,
        ["dnv-c203-T-air"] = DnvT,
    };

    /// <summary>The stress range at the slope change, Δσ_tr = (ā₁/N_tr)^(1/m₁), in MPa.</summary>
    public double TransitionRangeMPa => Math.Pow(10, (Log10A1 - Math.Log10(TransitionCycles)) / M1);

    /// <summary>Checks the constants; returns the problems found (empty when valid).</summary>
    public IReadOnlyList<string> Problems()
    {
        var p = new List<string>();
        if (!(M1 > 0 && double.IsFinite(M1))) p.Add(FormattableString.Invariant($"m1 = {M1} must be finite and > 0"));
        if (!(M2 > 0 && double.IsFinite(M2))) p.Add(FormattableString.Invariant($"m2 = {M2} must be finite and > 0"));
        if (!double.IsFinite(Log10A1)) p.Add(FormattableString.Invariant($"log10A1 = {Log10A1} must be finite"));
        if (!double.IsFinite(Log10A2)) p.Add(FormattableString.Invariant($"log10A2 = {Log10A2} must be finite"));
        if (!(TransitionCycles > 1 && double.IsFinite(TransitionCycles))) p.Add(FormattableString.Invariant($"transitionCycles = {TransitionCycles} must be finite and > 1"));
        if (!(ThicknessExponent >= 0 && double.IsFinite(ThicknessExponent))) p.Add(FormattableString.Invariant($"thicknessExponent = {ThicknessExponent} must be finite and ≥ 0"));
        if (!(ReferenceThicknessMm > 0 && double.IsFinite(ReferenceThicknessMm))) p.Add(FormattableString.Invariant($"referenceThickness_mm = {ReferenceThicknessMm} must be finite and > 0"));
        if (p.Count == 0)
        {
            // The two segments must meet at N_tr.
            var s2 = Math.Pow(10, (Log10A2 - Math.Log10(TransitionCycles)) / M2);
            if (Math.Abs(s2 / TransitionRangeMPa - 1) > 5e-3)
            {
                p.Add(FormattableString.Invariant($"the segments do not meet at N_tr: {TransitionRangeMPa:G5} MPa from segment 1, {s2:G5} MPa from segment 2"));
            }
        }

        return p;
    }

    /// <summary>Thickness correction factor (t/t_ref)^k for t &gt; t_ref, else 1.</summary>
    public double ThicknessFactor(double thicknessMm) =>
        thicknessMm > ReferenceThicknessMm ? Math.Pow(thicknessMm / ReferenceThicknessMm, ThicknessExponent) : 1.0;

    /// <summary>Cycles to failure N(Δσ) at a constant range (MPa), thickness correction included.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The range or thickness is not finite and &gt; 0.</exception>
    public double CyclesToFailure(double stressRangeMPa, double thicknessMm)
    {
        if (!(double.IsFinite(stressRangeMPa) && stressRangeMPa > 0)) throw new ArgumentOutOfRangeException(nameof(stressRangeMPa), stressRangeMPa, "Must be finite and > 0.");
        if (!(double.IsFinite(thicknessMm) && thicknessMm > 0)) throw new ArgumentOutOfRangeException(nameof(thicknessMm), thicknessMm, "Must be finite and > 0.");
        var s = stressRangeMPa * ThicknessFactor(thicknessMm);
        return s >= TransitionRangeMPa
            ? Math.Pow(10, Log10A1 - M1 * Math.Log10(s))
            : Math.Pow(10, Log10A2 - M2 * Math.Log10(s));
    }
}
