using InspectionUpdate.Degradation;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>
/// The failure probability of a component at time t given inspection evidence:
/// P(F(t) | E) = P(F(t) ∩ E) / P(E) (see docs/methods.md). Implemented by the updating layer; consumed by the
/// planner and the reports.
/// </summary>
public interface IReliabilityUpdater
{
    /// <summary>Cumulative failure probability at <paramref name="timeYears"/> given all of <paramref name="evidence"/>.</summary>
    UpdatedEstimate Estimate(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double timeYears);

    /// <summary>The updated profile on a time grid (years since entry into service), ΔPf and hazard between grid points.</summary>
    ReliabilityProfile Profile(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, IReadOnlyList<double> timesYears, string label);
}

/// <summary>One updated failure probability and how it was obtained.</summary>
public sealed record UpdatedEstimate
{
    /// <summary>P(F(t) | E), cumulative.</summary>
    public required double CumulativePf { get; init; }

    /// <summary>−Φ⁻¹(CumulativePf).</summary>
    public required double Beta { get; init; }

    /// <summary>P(E), the probability of the inequality evidence (the likelihood of equalities is not a probability: NaN then).</summary>
    public required double EvidenceProbability { get; init; }

    /// <summary>Route that produced the number.</summary>
    public required ComputationRoute Route { get; init; }

    /// <summary>False when the computation did not converge.</summary>
    public required bool Converged { get; init; }

    /// <summary>Coefficient of variation when simulated.</summary>
    public double? CoefficientOfVariation { get; init; }

    /// <summary>
    /// Set where the number is only bounded: the true value lies at or below this (with three standard errors), and the
    /// reported value is the best estimate under it. Null for an ordinary estimate.
    /// </summary>
    public double? UpperBound { get; init; }

    /// <summary>Why the route was chosen, or what went wrong.</summary>
    public string? Note { get; init; }
}
