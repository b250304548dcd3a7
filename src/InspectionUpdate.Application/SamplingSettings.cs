using System.Globalization;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Application;

/// <summary>
/// What a user sets of the sampling route: the target coefficient of variation of each cumulative Pf, the largest
/// number of samples, and the seed. Every number of the automatic and simulation routes is reproducible from them.
/// </summary>
/// <param name="TargetCoefficientOfVariation">Target CoV of a cumulative Pf, in (0, 1); default 0.05.</param>
/// <param name="MaxSamples">Sample cap per component and set of findings; default 128,000.</param>
/// <param name="Seed">Random-number seed; default 1.</param>
public sealed record SamplingSettings(double TargetCoefficientOfVariation = 0.05, int MaxSamples = 128_000, int Seed = 1)
{
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

        return problems;
    }

    /// <summary>Short text for reports and result keys, e.g. "target CoV 0.05, at most 128000 samples, seed 1".</summary>
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"target CoV {TargetCoefficientOfVariation}, at most {MaxSamples} samples, seed {Seed}");

    /// <summary>The core's options for a route and horizon.</summary>
    internal SampleSetOptions ToOptions(bool automatic, double horizonYears) => SampleSetOptions.Default with
    {
        TargetCoefficientOfVariation = TargetCoefficientOfVariation,
        MaxSamples = MaxSamples,
        Samples = Math.Min(SampleSetOptions.Default.Samples, MaxSamples),
        Seed = Seed,
        FirstOrderBelowResolution = automatic,
        HorizonYears = Math.Max(1, Math.Ceiling(horizonYears)),
    };
}
