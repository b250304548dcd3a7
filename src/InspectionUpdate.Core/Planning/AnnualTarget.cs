using System.Globalization;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Planning;

/// <summary>Which annual quantity a target (or a reported annual number) refers to.</summary>
/// <remarks>
/// Both are measured over the year that ends at t. For small probabilities they agree to within Pf(t − 1) in
/// relative terms, but a number must always say which one it is (JCSS Probabilistic Model Code Part 1, Annex B:
/// targets may refer to the failure rate or to the failure-time density).
/// </remarks>
public enum AnnualMeasure
{
    /// <summary>ΔPf(t) = Pf(t) − Pf(t − 1): the unconditional probability of failing in the year ending at t.</summary>
    IntervalPf,

    /// <summary>ΔPf(t) / (1 − Pf(t − 1)): the probability of failing in the year ending at t given survival to its start.</summary>
    Hazard,
}

/// <summary>
/// A target for the annual failure probability: the planner keeps the chosen <see cref="Measure"/> at or below
/// <see cref="AnnualPf"/>. Immutable; built through the factories, which validate.
/// </summary>
public sealed record AnnualTarget
{
    private AnnualTarget(double annualPf, AnnualMeasure measure, string source)
    {
        AnnualPf = annualPf;
        Measure = measure;
        Source = source;
    }

    /// <summary>Target annual failure probability, in (0, 0.5).</summary>
    public double AnnualPf { get; }

    /// <summary>The equivalent annual reliability index −Φ⁻¹(<see cref="AnnualPf"/>), positive.</summary>
    public double AnnualBeta => StandardNormal.InverseCcdf(AnnualPf);

    /// <summary>Which annual quantity the target applies to.</summary>
    public AnnualMeasure Measure { get; }

    /// <summary>Where the value comes from: a table with its row and column, or "user value".</summary>
    public string Source { get; }

    /// <summary>A target given as an annual failure probability.</summary>
    /// <param name="annualPf">Target annual failure probability, finite, in (0, 0.5).</param>
    /// <param name="measure">Whether it bounds ΔPf or the hazard.</param>
    /// <param name="source">Where the value comes from; "user value" when the user typed it.</param>
    /// <exception cref="ArgumentOutOfRangeException">annualPf is NaN, not in (0, 0.5), or measure is undefined.</exception>
    /// <exception cref="ArgumentException">source is empty.</exception>
    public static AnnualTarget FromAnnualPf(double annualPf, AnnualMeasure measure, string source = "user value")
    {
        if (!(annualPf > 0 && annualPf < 0.5))
        {
            throw new ArgumentOutOfRangeException(nameof(annualPf), annualPf,
                "The target annual failure probability must lie in (0, 0.5), e.g. 1e-4.");
        }

        return new AnnualTarget(annualPf, RequireDefined(measure), RequireSource(source));
    }

    /// <summary>A target given as an annual reliability index β (annual Pf = Φ(−β)).</summary>
    /// <param name="annualBeta">Target annual reliability index, finite and &gt; 0 (β = 3.7 ↔ Pf ≈ 1.08e-4).</param>
    /// <param name="measure">Whether it bounds ΔPf or the hazard.</param>
    /// <param name="source">Where the value comes from; "user value" when the user typed it.</param>
    /// <exception cref="ArgumentOutOfRangeException">annualBeta is not finite or not &gt; 0, or gives a Pf that underflows.</exception>
    public static AnnualTarget FromAnnualBeta(double annualBeta, AnnualMeasure measure, string source = "user value")
    {
        if (!(double.IsFinite(annualBeta) && annualBeta > 0 && annualBeta < 37))
        {
            throw new ArgumentOutOfRangeException(nameof(annualBeta), annualBeta,
                "The target annual reliability index must be finite and lie in (0, 37), e.g. 3.7.");
        }

        return new AnnualTarget(StandardNormal.Ccdf(annualBeta), RequireDefined(measure), RequireSource(source));
    }

    /// <summary>
    /// A target given as a reliability index for a reference period of <paramref name="referencePeriodYears"/>
    /// years, converted to the annual index by Φ(β_n) = Φ(β₁)ⁿ (independent years; JCSS Probabilistic Model Code
    /// Part 1, §7, via ISO 2394 practice).
    /// </summary>
    /// <param name="beta">Reliability index for the reference period, finite and &gt; 0.</param>
    /// <param name="referencePeriodYears">Reference period n in years, finite and ≥ 1.</param>
    /// <param name="measure">Whether the annual value bounds ΔPf or the hazard.</param>
    /// <param name="source">Where the value comes from.</param>
    public static AnnualTarget FromReferencePeriodBeta(double beta, double referencePeriodYears, AnnualMeasure measure,
        string source = "user value")
    {
        if (!(double.IsFinite(beta) && beta > 0 && beta < 37))
        {
            throw new ArgumentOutOfRangeException(nameof(beta), beta, "The reliability index must be finite and lie in (0, 37).");
        }

        if (!(double.IsFinite(referencePeriodYears) && referencePeriodYears >= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(referencePeriodYears), referencePeriodYears,
                "The reference period must be finite and at least 1 year.");
        }

        // 1 − Φ(β₁) = 1 − Φ(β_n)^(1/n), computed without cancellation as −expm1(log1p(−Q(β_n)) / n).
        var logPhi = MathNet.Numerics.SpecialFunctions.Log1p(-StandardNormal.Ccdf(beta));
        var annualPf = -MathNet.Numerics.SpecialFunctions.Expm1(logPhi / referencePeriodYears);
        var converted = string.Create(CultureInfo.InvariantCulture,
            $"{RequireSource(source)}; β = {beta:0.###} over {referencePeriodYears:0.###} years converted to one year by Φ(β_n) = Φ(β₁)^n");
        return FromAnnualPf(annualPf, measure, converted);
    }

    /// <summary>One-line description, e.g. "annual ΔPf ≤ 1.0E-004 (β ≥ 3.72); source: user value".</summary>
    public string Describe() => string.Create(CultureInfo.InvariantCulture,
        $"annual {MeasureName(Measure)} ≤ {AnnualPf:0.0##E+000} (β ≥ {AnnualBeta:0.00}); source: {Source}");

    /// <summary>Short name of a measure for messages: "ΔPf" or "hazard".</summary>
    public static string MeasureName(AnnualMeasure measure) => measure switch
    {
        AnnualMeasure.IntervalPf => "ΔPf",
        AnnualMeasure.Hazard => "hazard",
        _ => throw new ArgumentOutOfRangeException(nameof(measure), measure, "Unknown annual measure."),
    };

    private static AnnualMeasure RequireDefined(AnnualMeasure measure) =>
        Enum.IsDefined(measure) ? measure : throw new ArgumentOutOfRangeException(nameof(measure), measure, "Unknown annual measure.");

    private static string RequireSource(string source) =>
        string.IsNullOrWhiteSpace(source) ? throw new ArgumentException("A target needs a source (\"user value\" if typed by the user).", nameof(source)) : source;
}
