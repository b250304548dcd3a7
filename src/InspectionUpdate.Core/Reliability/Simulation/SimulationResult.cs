namespace InspectionUpdate.Reliability.Simulation;

/// <summary>
/// A simulated failure probability with its statistical uncertainty. Reproducible from <see cref="Seed"/>.
/// </summary>
public sealed record SimulationResult
{
    /// <summary>Estimated failure probability.</summary>
    public required double FailureProbability { get; init; }

    /// <summary>Estimated coefficient of variation of the estimator (standard error / estimate); +∞ when no failure was seen.</summary>
    public required double CoefficientOfVariation { get; init; }

    /// <summary>−Φ⁻¹(FailureProbability).</summary>
    public required double GeneralizedBeta { get; init; }

    /// <summary>Number of samples drawn (all levels together for subset simulation).</summary>
    public required long Samples { get; init; }

    /// <summary>Limit-state evaluations used.</summary>
    public required long LimitStateEvaluations { get; init; }

    /// <summary>Random-number seed used.</summary>
    public required int Seed { get; init; }

    /// <summary>Name of the method, e.g. "crude Monte Carlo".</summary>
    public required string Method { get; init; }

    /// <summary>False when the target accuracy or sample budget was not met (e.g. no failures observed).</summary>
    public required bool Converged { get; init; }

    /// <summary>Explanation when not converged, or any note.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>Standard error = CoV × estimate.</summary>
    public double StandardError => CoefficientOfVariation * FailureProbability;
}
