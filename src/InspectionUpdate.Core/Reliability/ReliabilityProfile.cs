namespace InspectionUpdate.Reliability;

/// <summary>How one number of a profile was computed.</summary>
public enum ComputationRoute
{
    /// <summary>First-order reliability method (linearized limit state or events).</summary>
    FirstOrder,

    /// <summary>Second-order correction of FORM.</summary>
    SecondOrder,

    /// <summary>Crude Monte Carlo.</summary>
    MonteCarlo,

    /// <summary>Importance sampling.</summary>
    ImportanceSampling,

    /// <summary>Subset simulation (or BUS with subset simulation for updating).</summary>
    SubsetSimulation,

    /// <summary>Exact or closed form.</summary>
    Exact,
}

/// <summary>One time step of a reliability profile. Probabilities are cumulative unless named annual.</summary>
public sealed record ProfilePoint
{
    /// <summary>Time in years since the component entered service.</summary>
    public required double TimeYears { get; init; }

    /// <summary>Generalized reliability index β = −Φ⁻¹(Pf(t)).</summary>
    public required double Beta { get; init; }

    /// <summary>Cumulative failure probability Pf(t) = P(failure by t).</summary>
    public required double CumulativePf { get; init; }

    /// <summary>ΔPf over the step ending at t: Pf(t) − Pf(t_prev). On a yearly grid this is the annual failure probability.</summary>
    public required double IntervalPf { get; init; }

    /// <summary>
    /// Coefficient of variation of <see cref="IntervalPf"/> when it was estimated directly from one sample set (not as
    /// the difference of two estimates); null otherwise.
    /// </summary>
    public double? IntervalCoefficientOfVariation { get; init; }

    /// <summary>Hazard over the step: ΔPf / (1 − Pf(t_prev)); NaN (with a note) where Pf(t_prev) = 1 leaves it undefined.</summary>
    public required double Hazard { get; init; }

    /// <summary>Route that produced <see cref="CumulativePf"/>.</summary>
    public required ComputationRoute Route { get; init; }

    /// <summary>False when the computation did not converge (the number is then a best estimate, flagged).</summary>
    public required bool Converged { get; init; }

    /// <summary>Coefficient of variation of a simulated Pf, null for first order.</summary>
    public double? CoefficientOfVariation { get; init; }

    /// <summary>Set where <see cref="CumulativePf"/> is only bounded from above (with three standard errors); null otherwise.</summary>
    public double? UpperBound { get; init; }

    /// <summary>Limit-state evaluations spent on this step.</summary>
    public int Evaluations { get; init; }

    /// <summary>Direction cosines at the design point (first order only), matching the profile's variable names.</summary>
    public IReadOnlyList<double>? Alpha { get; init; }

    /// <summary>Design point in physical space (first order only).</summary>
    public IReadOnlyList<double>? DesignPointX { get; init; }

    /// <summary>Any note about this step (e.g. why it fell back to simulation).</summary>
    public string? Note { get; init; }
}

/// <summary>A time-stepped reliability result: Pf(t), ΔPf(t), β(t) and the design points, prior or updated.</summary>
public sealed record ReliabilityProfile
{
    /// <summary>e.g. "prior" or "updated with 3 findings to 2026-03-01".</summary>
    public required string Label { get; init; }

    /// <summary>Names of the random variables matching each point's α.</summary>
    public required IReadOnlyList<string> VariableNames { get; init; }

    /// <summary>Time steps in increasing time.</summary>
    public required IReadOnlyList<ProfilePoint> Points { get; init; }

    /// <summary>True when every step converged.</summary>
    public bool AllConverged => Points.All(p => p.Converged);
}
