namespace InspectionUpdate.Degradation.Definition;

/// <summary>A named set of crack-growth law constants that fills inputs a definition does not give itself.</summary>
/// <param name="Key">Key used in definitions.</param>
/// <param name="Law">"oneStage" or "twoStage".</param>
/// <param name="Inputs">The inputs it supplies (units N and mm).</param>
/// <param name="Source">Publication and clause; "from memory" where recalled.</param>
public sealed record CrackGrowthPreset(string Key, string Law, IReadOnlyList<InputSpec> Inputs, string Source);

/// <summary>Published crack-growth constants as presets (da/dN in mm/cycle, ΔK in N·mm^−3/2).</summary>
public static class CrackGrowthPresets
{
    private static InputSpec Fixed(string name, double value) => new(name, "Deterministic", new Dictionary<string, double> { ["value"] = value });

    private static InputSpec Ln(string name, double mean, double cov) => new(name, "Lognormal", new Dictionary<string, double> { ["mean"] = mean, ["cov"] = cov });

    /// <summary>The presets by key.</summary>
    public static IReadOnlyDictionary<string, CrackGrowthPreset> All { get; } = new[]
    {
        new CrackGrowthPreset("bs7910-simplified-air", "oneStage",
            [Fixed("parisC", 5.21e-13), Fixed("parisM", 3)],
            "BS 7910 simplified law for steels in air, mean + 2 SD: A = 5.21e-13, m = 3 (from memory)"),
        new CrackGrowthPreset("jcss-two-stage-air", "twoStage",
            [Ln("parisC1", 4.80e-18, 1.70), Fixed("parisM1", 5.10), Ln("parisC2", 5.86e-13, 0.60), Fixed("parisM2", 2.88)],
            "JCSS Probabilistic Model Code, Part 3, fatigue models, two-stage law in air, R ≥ 0.5 (read); the mean laws coincide with BS 7910's two-stage law"),
        new CrackGrowthPreset("jcss-two-stage-marine-cp", "twoStage",
            [Ln("parisC1", 5.37e-14, 1.10), Fixed("parisM1", 3.42), Ln("parisC2", 5.67e-7, 0.16), Fixed("parisM2", 1.11)],
            "JCSS Probabilistic Model Code, Part 3, fatigue models, two-stage law in marine environment with cathodic protection (read)"),
    }.ToDictionary(p => p.Key, StringComparer.Ordinal);
}
