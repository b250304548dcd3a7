using System.Globalization;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Application;

/// <summary>
/// What a user sets of the sampling route: the target coefficient of variation of each cumulative Pf, the largest
/// number of samples, the seed and the decision floor. Every number of the automatic and simulation routes is
/// reproducible from them.
/// </summary>
/// <param name="TargetCoefficientOfVariation">Target CoV of a cumulative Pf, in (0, 1); default 0.05.</param>
/// <param name="MaxSamples">Sample cap per component and set of findings; default 128,000.</param>
/// <param name="Seed">Random-number seed; default 1.</param>
/// <param name="DecisionFloor">
/// A sampled cumulative Pf(t) whose failure region is covered and whose value plus three standard errors lies below this
/// level is converged even above the target CoV (its CoV is still reported): Pf(t) bounds every annual Pf up to t, so
/// no annual target at or above ten times the floor can be reached there. Default 1e-5, a tenth of the default annual
/// target 1e-4; a plan against a lower target lowers it to a tenth of that target (<see cref="For"/>).
/// </param>
public sealed record SamplingSettings(double TargetCoefficientOfVariation = 0.05, int MaxSamples = 128_000, int Seed = 1, double DecisionFloor = SamplingSettings.DefaultDecisionFloor)
{
    /// <summary>Default decision floor: a tenth of the default annual target 1e-4.</summary>
    public const double DefaultDecisionFloor = 1e-5;

    /// <summary>Lowest decision floor accepted (the sample set's negligible level).</summary>
    public const double LowestDecisionFloor = 1e-9;

    /// <summary>
    /// These settings for decisions against <paramref name="target"/>: the decision floor at most a tenth of the
    /// target's annual Pf (never below <see cref="LowestDecisionFloor"/>), so every year where the annual Pf could reach
    /// the target is resolved to the target CoV.
    /// </summary>
    public SamplingSettings For(Planning.AnnualTarget? target) =>
        target is null ? this : this with { DecisionFloor = Math.Max(LowestDecisionFloor, Math.Min(DecisionFloor, target.AnnualPf / 10)) };

    /// <summary>The defaults.</summary>
    public static SamplingSettings Default { get; } = new();

    /// <summary>Every problem with the settings, each naming the option and the value; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(TargetCoefficientOfVariation >= 0.005 && TargetCoefficientOfVariation <= 0.5))
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture, $"--target-cov '{TargetCoefficientOfVariation}' must lie between 0.005 and 0.5."));
        }

        if (MaxSamples is < 8_000 or > 10_000_000)
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture, $"--max-samples '{MaxSamples}' must lie between 8000 and 10000000."));
        }

        if (!(DecisionFloor >= LowestDecisionFloor && DecisionFloor <= 1e-4))
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture, $"--decision-floor '{DecisionFloor}' must lie between 1e-9 and 1e-4."));
        }

        return problems;
    }

    /// <summary>Short text for reports and result keys, e.g. "target CoV 0.05, at most 128000 samples, seed 1, decision floor 1E-05".</summary>
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"target CoV {TargetCoefficientOfVariation}, at most {MaxSamples} samples, seed {Seed}, decision floor {DecisionFloor:0.###E+00}");

    /// <summary>The core's options for a route and horizon.</summary>
    internal SampleSetOptions ToOptions(bool automatic, double horizonYears) => SampleSetOptions.Default with
    {
        TargetCoefficientOfVariation = TargetCoefficientOfVariation,
        MaxSamples = MaxSamples,
        Samples = Math.Min(SampleSetOptions.Default.Samples, MaxSamples),
        Seed = Seed,
        DecisionFloor = DecisionFloor,
        FirstOrderBelowResolution = automatic,
        HorizonYears = Math.Max(1, Math.Ceiling(horizonYears)),
    };
}
