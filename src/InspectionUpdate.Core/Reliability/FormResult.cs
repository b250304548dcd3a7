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

    /// <summary>
    /// The signed importance vector γ (unit length, order of the model's random indices): equal to α for independent
    /// inputs; for correlated inputs γ = αᵀJ_{u,x}D̂ / ‖αᵀJ_{u,x}D̂‖ (Der Kiureghian 2005). Null only when a
    /// result was built by hand without it.
    /// </summary>
    public IReadOnlyList<double>? ImportanceVector { get; init; }

    /// <summary>Names of the random variables, matching <see cref="Alpha"/> and <see cref="ImportanceFactors"/>.</summary>
    public required IReadOnlyList<string> VariableNames { get; init; }

    /// <summary>Iterations used.</summary>
    public required int Iterations { get; init; }

    /// <summary>
    /// Limit-state evaluations used: every call of g, the finite-difference calls included; a call that returns g
    /// with its analytic gradient counts once.
    /// </summary>
    public required int LimitStateEvaluations { get; init; }

    /// <summary>True when both convergence criteria were met within the iteration cap.</summary>
    public required bool Converged { get; init; }

    /// <summary>Why the run did not converge, or null.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>G at the reported design point (in the units of g); close to 0 when converged.</summary>
    public double LimitStateValue { get; init; } = double.NaN;

    /// <summary>|G|/G_scale at the reported design point, G_scale being the scale of the solver's |G| criterion.</summary>
    public double RelativeLimitStateValue { get; init; } = double.NaN;

    /// <summary>|G|/G_scale below which a search that did not converge still counts as ended on the limit state.</summary>
    public const double OnLimitStateTolerance = 1e-3;

    /// <summary>
    /// True when the run ended on the limit state (|G|/G_scale ≤ <see cref="OnLimitStateTolerance"/>), converged or
    /// not: a search stopped there short of its alignment tolerance still marks the failure region, e.g. as a
    /// sampling centre, where one that ran off elsewhere does not.
    /// </summary>
    public bool EndsOnLimitState => RelativeLimitStateValue <= OnLimitStateTolerance;

    /// <summary>‖∇ᵤG‖ at the reported design point (units of g per standard deviation).</summary>
    public double GradientNorm { get; init; } = double.NaN;

    /// <summary>The gradient route actually used: Analytic, ForwardDifference or CentralDifference.</summary>
    public GradientMethod GradientMethod { get; init; } = GradientMethod.Automatic;

    /// <summary>Name of the algorithm, e.g. "FORM (iHL-RF)".</summary>
    public string Method { get; init; } = "FORM (iHL-RF)";
}
