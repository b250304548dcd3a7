namespace InspectionUpdate.Reliability.Simulation;

/// <summary>Settings of subset simulation. Immutable; validated when a run starts.</summary>
public sealed record SubsetSimulationOptions
{
    /// <summary>Samples per level N (≥ 100; N·p0 and 1/p0 must be whole numbers). Default 1000.</summary>
    public int SamplesPerLevel { get; init; } = 1000;

    /// <summary>Intermediate conditional probability p0 in (0, 0.5]. Default 0.1 (Au &amp; Beck 2001).</summary>
    public double LevelProbability { get; init; } = 0.1;

    /// <summary>Cap on the number of levels; reaching it without hitting the failure domain is reported as not converged. Default 30.</summary>
    public int MaxLevels { get; init; } = 30;

    /// <summary>Random-number seed; the same seed and settings give the same result on any machine and thread count.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>Target mean acceptance rate of the adaptive conditional sampler (Papaioannou et al. 2015 recommend 0.44).</summary>
    public double TargetAcceptance { get; init; } = 0.44;

    /// <summary>Initial scaling λ of the proposal spread σᵢ = min(1, λ·σ̂ᵢ) (Papaioannou et al. 2015 start at 0.6).</summary>
    public double InitialScaling { get; init; } = 0.6;

    /// <summary>Fraction of the chains after which the scaling is adapted (Papaioannou et al. 2015 use 0.1).</summary>
    public double AdaptationFraction { get; init; } = 0.1;

    /// <summary>Threads to use (≥ 1); null uses every core. Does not change the result.</summary>
    public int? MaxDegreeOfParallelism { get; init; }

    /// <summary>Keep the samples of the last level that lie in the failure domain (e.g. posterior samples in BUS).</summary>
    public bool KeepFailureSamples { get; init; }

    /// <summary>The default settings.</summary>
    public static SubsetSimulationOptions Default { get; } = new();

    /// <summary>Throws when a setting is out of range; the message names it.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A setting is out of range.</exception>
    public void Validate()
    {
        if (!(LevelProbability > 0 && LevelProbability <= 0.5))
            throw new ArgumentOutOfRangeException(nameof(LevelProbability), LevelProbability, "SubsetSimulationOptions.LevelProbability must lie in (0, 0.5].");
        if (SamplesPerLevel < 100)
            throw new ArgumentOutOfRangeException(nameof(SamplesPerLevel), SamplesPerLevel, "SubsetSimulationOptions.SamplesPerLevel must be at least 100.");
        var seeds = SamplesPerLevel * LevelProbability;
        var chainLength = 1 / LevelProbability;
        if (Math.Abs(seeds - Math.Round(seeds)) > 1e-9 || Math.Abs(chainLength - Math.Round(chainLength)) > 1e-9)
            throw new ArgumentOutOfRangeException(nameof(SamplesPerLevel), SamplesPerLevel, "SubsetSimulationOptions: SamplesPerLevel × LevelProbability and 1 / LevelProbability must be whole numbers.");
        if (MaxLevels is < 1 or > 200)
            throw new ArgumentOutOfRangeException(nameof(MaxLevels), MaxLevels, "SubsetSimulationOptions.MaxLevels must lie in [1, 200].");
        if (!(TargetAcceptance > 0.05 && TargetAcceptance < 0.95))
            throw new ArgumentOutOfRangeException(nameof(TargetAcceptance), TargetAcceptance, "SubsetSimulationOptions.TargetAcceptance must lie in (0.05, 0.95).");
        if (!(InitialScaling > 0 && InitialScaling <= 1))
            throw new ArgumentOutOfRangeException(nameof(InitialScaling), InitialScaling, "SubsetSimulationOptions.InitialScaling must lie in (0, 1].");
        if (!(AdaptationFraction > 0 && AdaptationFraction <= 1))
            throw new ArgumentOutOfRangeException(nameof(AdaptationFraction), AdaptationFraction, "SubsetSimulationOptions.AdaptationFraction must lie in (0, 1].");
        if (MaxDegreeOfParallelism is < 1)
            throw new ArgumentOutOfRangeException(nameof(MaxDegreeOfParallelism), MaxDegreeOfParallelism, "SubsetSimulationOptions.MaxDegreeOfParallelism must be ≥ 1 (or null).");
    }
}

/// <summary>One level of a subset simulation run.</summary>
/// <param name="Threshold">Intermediate threshold bⱼ of G (0 at the last level).</param>
/// <param name="ConditionalProbability">P(G ≤ bⱼ | G ≤ bⱼ₋₁) as estimated.</param>
/// <param name="CoefficientOfVariation">CoV of that estimate, with the chain-correlation factor (1 + γⱼ) of Au &amp; Beck (2001).</param>
/// <param name="Gamma">The correlation factor γⱼ (0 at level 0, which uses independent samples).</param>
/// <param name="AcceptanceRate">Mean acceptance rate of the conditional sampler that produced the level's samples (NaN at level 0).</param>
/// <param name="Scaling">Final scaling λ of the sampler at this level (NaN at level 0).</param>
public readonly record struct SubsetLevel(double Threshold, double ConditionalProbability, double CoefficientOfVariation, double Gamma, double AcceptanceRate, double Scaling);

/// <summary>Result of a subset simulation run: the shared simulation result plus per-level details.</summary>
public sealed record SubsetSimulationResult
{
    /// <summary>The estimate in the shared form (Pf, CoV, samples, seed, convergence).</summary>
    public required SimulationResult Simulation { get; init; }

    /// <summary>Levels in order, starting with the direct Monte Carlo level.</summary>
    public required IReadOnlyList<SubsetLevel> Levels { get; init; }

    /// <summary>Samples of the last level with G ≤ 0 (u-space), when requested; otherwise empty.</summary>
    public IReadOnlyList<double[]> FailureSamplesU { get; init; } = [];

    /// <summary>Shortcut to <see cref="SimulationResult.FailureProbability"/>.</summary>
    public double FailureProbability => Simulation.FailureProbability;
}
