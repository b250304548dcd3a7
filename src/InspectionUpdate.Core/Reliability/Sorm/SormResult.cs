namespace InspectionUpdate.Reliability.Sorm;

/// <summary>One second-order estimate of Pf.</summary>
/// <param name="Method">e.g. "Breitung (1984)".</param>
/// <param name="FailureProbability">The estimate; NaN when <paramref name="Valid"/> is false.</param>
/// <param name="GeneralizedBeta">−Φ⁻¹(Pf); NaN when not valid.</param>
/// <param name="Valid">False when a curvature makes the formula invalid (a factor 1 − βκ ≤ 0, or its analogue).</param>
/// <param name="Note">Why it is invalid, or null.</param>
public sealed record SormEstimate(string Method, double FailureProbability, double GeneralizedBeta, bool Valid, string? Note);

/// <summary>Outcome of a SORM analysis around a FORM design point.</summary>
public sealed record SormResult
{
    /// <summary>The FORM result the curvatures were taken at.</summary>
    public required FormResult Form { get; init; }

    /// <summary>
    /// Principal curvatures κᵢ (n − 1 of them, ascending) of the limit-state surface at the design point, in the
    /// convention of Breitung's formula: positive when the surface curves towards the origin (the failure domain is
    /// larger than the FORM half-space and Pf exceeds Φ(−β)). Units: 1/(standard deviations).
    /// </summary>
    public required IReadOnlyList<double> Curvatures { get; init; }

    /// <summary>‖∇G(u*)‖ used to scale the Hessian.</summary>
    public required double GradientNorm { get; init; }

    /// <summary>Breitung (1984): Φ(−β)∏(1 − βκᵢ)^(−1/2).</summary>
    public required SormEstimate Breitung { get; init; }

    /// <summary>Hohenbichler, Gollwitzer, Kruse &amp; Rackwitz (1987): Φ(−β)∏(1 − κᵢφ(β)/Φ(−β))^(−1/2).</summary>
    public required SormEstimate HohenbichlerRackwitz { get; init; }

    /// <summary>Tvedt's (1990) three-term formula.</summary>
    public required SormEstimate Tvedt { get; init; }

    /// <summary>All estimates, in the order Breitung, Hohenbichler–Rackwitz, Tvedt.</summary>
    public IReadOnlyList<SormEstimate> Estimates => [Breitung, HohenbichlerRackwitz, Tvedt];

    /// <summary>False when FORM did not converge or the Hessian is not finite.</summary>
    public required bool Converged { get; init; }

    /// <summary>What went wrong, or a note (e.g. curvatures that invalidate a formula), or null.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>
    /// Set by <see cref="SormSolver.SolveWithCurvatureCheck"/> when the curvatures taken with two finite-difference
    /// steps disagree (a kink, a branch switch or noise near the design point): the SORM estimates are then not to be
    /// trusted even where the formulas are valid. Null when the check passed or was not run.
    /// </summary>
    public string? CurvatureWarning { get; init; }

    /// <summary>Limit-state evaluations for the Hessian (FORM's own are in <see cref="Form"/>).</summary>
    public required long LimitStateEvaluations { get; init; }
}
