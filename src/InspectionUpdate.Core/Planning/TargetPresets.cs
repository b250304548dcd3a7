using System.Globalization;

namespace InspectionUpdate.Planning;

/// <summary>Relative cost of a safety measure, the row of JCSS Probabilistic Model Code Part 1, §7, Table 1.</summary>
public enum RelativeCostOfSafetyMeasure
{
    /// <summary>Large relative cost of safety measure (lowest β).</summary>
    Large,

    /// <summary>Normal relative cost of safety measure.</summary>
    Normal,

    /// <summary>Small relative cost of safety measure (highest β).</summary>
    Small,
}

/// <summary>
/// Consequence class, the column of JCSS Probabilistic Model Code Part 1, §7, Table 1, by
/// ρ = (construction cost + direct failure cost) / construction cost.
/// </summary>
public enum ConsequenceClass
{
    /// <summary>Minor consequences, ρ &lt; 2.</summary>
    Minor,

    /// <summary>Moderate consequences, 2 &lt; ρ &lt; 5.</summary>
    Moderate,

    /// <summary>Large consequences, 5 &lt; ρ &lt; 10.</summary>
    Large,
}

/// <summary>Safety class of an offshore pipeline (low, medium, high).</summary>
public enum PipelineSafetyClass
{
    /// <summary>Low safety class.</summary>
    Low,

    /// <summary>Medium safety class.</summary>
    Medium,

    /// <summary>High safety class.</summary>
    High,
}

/// <summary>
/// Published target annual reliability levels. Each preset names its table, row and column in
/// <see cref="AnnualTarget.Source"/>.
/// </summary>
public static class TargetPresets
{
    // JCSS Probabilistic Model Code Part 1 (2001), §7, Table 1: target annual β for ultimate limit states,
    // rows = relative cost of safety measure (large, normal, small), columns = consequences (minor, moderate, large).
    private static readonly double[,] JcssAnnualBeta =
    {
        { 3.1, 3.3, 3.7 },
        { 3.7, 4.2, 4.4 },
        { 4.2, 4.4, 4.7 },
    };

    /// <summary>
    /// The JCSS target annual reliability index for ultimate limit states (JCSS Probabilistic Model Code Part 1,
    /// 2001, §7, Table 1; one-year reference period; ISO 2394 carries the same values).
    /// </summary>
    /// <param name="cost">Relative cost of the safety measure (table row).</param>
    /// <param name="consequence">Consequence class (table column).</param>
    /// <param name="measure">
    /// What the annual value bounds. Defaults to the hazard: JCSS Part 1 Annex B relates annual targets to the
    /// failure rate r(t) = p_F(t)/(1 − P_F(t)).
    /// </param>
    /// <exception cref="ArgumentOutOfRangeException">An enum value is undefined.</exception>
    public static AnnualTarget Jcss(RelativeCostOfSafetyMeasure cost, ConsequenceClass consequence,
        AnnualMeasure measure = AnnualMeasure.Hazard)
    {
        if (!Enum.IsDefined(cost)) throw new ArgumentOutOfRangeException(nameof(cost), cost, "Unknown relative cost of safety measure.");
        if (!Enum.IsDefined(consequence)) throw new ArgumentOutOfRangeException(nameof(consequence), consequence, "Unknown consequence class.");
        var beta = JcssAnnualBeta[(int)cost, (int)consequence];
        var source = string.Create(CultureInfo.InvariantCulture,
            $"JCSS Probabilistic Model Code Part 1 (2001), §7, Table 1, ultimate limit states, one-year reference period: " +
            $"relative cost of safety measure {cost.ToString().ToLowerInvariant()}, {consequence.ToString().ToLowerInvariant()} consequences " +
            $"({RhoRange(consequence)}), β = {beta:0.0}");
        return AnnualTarget.FromAnnualBeta(beta, measure, source);
    }

    /// <summary>
    /// Target annual failure probability of an offshore pipeline by safety class: 1e-3 (low), 1e-4 (medium),
    /// 1e-5 (high). These values are recalled from offshore pipeline design guidance, not read from a retrieved
    /// copy: the source text says so, and the user should check them against the edition that applies.
    /// </summary>
    /// <param name="safetyClass">The pipeline's safety class.</param>
    /// <param name="measure">What the annual value bounds; defaults to ΔPf (annual probability of failure).</param>
    /// <exception cref="ArgumentOutOfRangeException">The safety class is undefined.</exception>
    public static AnnualTarget OffshorePipeline(PipelineSafetyClass safetyClass, AnnualMeasure measure = AnnualMeasure.IntervalPf)
    {
        var pf = safetyClass switch
        {
            PipelineSafetyClass.Low => 1e-3,
            PipelineSafetyClass.Medium => 1e-4,
            PipelineSafetyClass.High => 1e-5,
            _ => throw new ArgumentOutOfRangeException(nameof(safetyClass), safetyClass, "Unknown pipeline safety class."),
        };
        var source = string.Create(CultureInfo.InvariantCulture,
            $"offshore pipeline design guidance (DNV offshore pipeline standard), annual failure probability per pipeline, " +
            $"{safetyClass.ToString().ToLowerInvariant()} safety class, Pf = {pf:0E+0}; from memory: check against the edition that applies");
        return AnnualTarget.FromAnnualPf(pf, measure, source);
    }

    /// <summary>Every preset, for listing in a user interface.</summary>
    public static IReadOnlyList<AnnualTarget> All()
    {
        var list = new List<AnnualTarget>();
        foreach (var cost in Enum.GetValues<RelativeCostOfSafetyMeasure>())
        {
            foreach (var consequence in Enum.GetValues<ConsequenceClass>())
            {
                list.Add(Jcss(cost, consequence));
            }
        }

        foreach (var safetyClass in Enum.GetValues<PipelineSafetyClass>())
        {
            list.Add(OffshorePipeline(safetyClass));
        }

        return list;
    }

    private static string RhoRange(ConsequenceClass consequence) => consequence switch
    {
        ConsequenceClass.Minor => "ρ < 2",
        ConsequenceClass.Moderate => "2 < ρ < 5",
        _ => "5 < ρ < 10",
    };
}
