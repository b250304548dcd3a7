namespace InspectionUpdate.Reliability.Simulation;

/// <summary>Settings of crude Monte Carlo and importance sampling. Immutable; validated when a run starts.</summary>
/// <remarks>
/// Samples are drawn in fixed blocks of <see cref="BlockSize"/>; block b has its own generator seeded from
/// (<see cref="Seed"/>, b), and the stopping rule is checked after each block in block order. The result therefore
/// depends on the seed, the block size, the target and the cap, never on the number of threads.
/// </remarks>
public sealed record SamplingOptions
{
    /// <summary>Random-number seed; the same seed and settings give the same result on any machine.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>
    /// Stop as soon as the estimated coefficient of variation of Pf is at or below this value (finite, in (0, 1]);
    /// null draws exactly <see cref="MaxSamples"/> samples.
    /// </summary>
    public double? TargetCoefficientOfVariation { get; init; } = 0.05;

    /// <summary>Sample cap (≥ 1). Reaching it before the target CoV is reported as not converged.</summary>
    public long MaxSamples { get; init; } = 1_000_000;

    /// <summary>Samples per block (1 … 1 048 576): the unit of reproducibility and of the stopping check.</summary>
    public int BlockSize { get; init; } = 4096;

    /// <summary>Threads to use (≥ 1); null uses every core. Does not change the result.</summary>
    public int? MaxDegreeOfParallelism { get; init; }

    /// <summary>The default settings (seed 1, target CoV 0.05, at most 10⁶ samples).</summary>
    public static SamplingOptions Default { get; } = new();

    /// <summary>Throws when a setting is out of range; the message names the setting and its value.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A setting is out of range.</exception>
    public void Validate()
    {
        if (TargetCoefficientOfVariation is { } cov && !(cov > 0 && cov <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(TargetCoefficientOfVariation), cov,
                "SamplingOptions.TargetCoefficientOfVariation must lie in (0, 1] (or be null for a fixed sample count).");
        }

        if (MaxSamples < 1)
        {
            throw new ArgumentOutOfRangeException(nameof(MaxSamples), MaxSamples, "SamplingOptions.MaxSamples must be ≥ 1.");
        }

        if (BlockSize is < 1 or > 1 << 20)
        {
            throw new ArgumentOutOfRangeException(nameof(BlockSize), BlockSize, "SamplingOptions.BlockSize must lie in [1, 1048576].");
        }

        if (MaxDegreeOfParallelism is < 1)
        {
            throw new ArgumentOutOfRangeException(nameof(MaxDegreeOfParallelism), MaxDegreeOfParallelism,
                "SamplingOptions.MaxDegreeOfParallelism must be ≥ 1 (or null for every core).");
        }
    }
}
