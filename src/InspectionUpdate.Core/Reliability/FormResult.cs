namespace InspectionUpdate.Reliability;

/// <summary>
/// Outcome of a FORM analysis. Check <see cref="Converged"/> before using <see cref="Beta"/>: a run that did not
/// converge reports its last iterate and says why in <see cref="Diagnostic"/>.
/// </summary>
public sealed record FormResult
{
    /// <summary>Signed reliability index β = αᵀu*: negative when the median point u = 0 fails.</summary>
    public required double Beta { get; init; }

    /// <summary>Φ(−β).</summary>
    public required double FailureProbability { get; init; }

    /// <summary>Design point in standard normal space.</summary>
    public required IReadOnlyList<double> DesignPointU { get; init; }

    /// <summary>Design point in physical space (all variables, deterministic included).</summary>
    public required IReadOnlyList<double> DesignPointX { get; init; }

    /// <summary>α = −∇G(u*)/‖∇G(u*)‖ in standard normal space (unit length).</summary>
    public required IReadOnlyList<double> Alpha { get; init; }

    /// <summary>
    /// Importance factors per random variable (order of the model's random indices): αᵢ² for independent inputs,
    /// the squared entries of the importance vector γ accounting for correlation otherwise. They sum to 1.
    /// </summary>
    public required IReadOnlyList<double> ImportanceFactors { get; init; }

    /// <summary>Names of the random variables, matching <see cref="Alpha"/> and <see cref="ImportanceFactors"/>.</summary>
    public required IReadOnlyList<string> VariableNames { get; init; }

    /// <summary>Iterations used.</summary>
    public required int Iterations { get; init; }

    /// <summary>Limit-state evaluations used (gradient evaluations by finite differences included).</summary>
    public required int LimitStateEvaluations { get; init; }

    /// <summary>True when both convergence criteria were met within the iteration cap.</summary>
    public required bool Converged { get; init; }

    /// <summary>Why the run did not converge, or null.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>Name of the algorithm, e.g. "FORM (iHL-RF)".</summary>
    public string Method { get; init; } = "FORM (iHL-RF)";
}
