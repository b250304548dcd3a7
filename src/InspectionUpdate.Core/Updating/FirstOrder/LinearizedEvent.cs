namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>
/// An event linearized in standard normal space: h(u) ≈ ‖∇h‖(β − αᵀu), so {h ≤ 0} ≈ {Z ≤ −β} and {h = 0} ≈
/// {Z = −β} with Z = −αᵀU standard normal.
/// </summary>
/// <param name="Name">Event name.</param>
/// <param name="IsEquality">True for h = 0.</param>
/// <param name="Beta">Signed distance of the linearized surface from the origin.</param>
/// <param name="Alpha">Unit normal α = −∇h/‖∇h‖ at the linearization point.</param>
/// <param name="PointU">The linearization point (the design point, or the joint design point).</param>
/// <param name="GradientNorm">‖∇ᵤh‖ at the linearization point.</param>
/// <param name="Converged">False when the design-point search did not converge.</param>
/// <param name="Diagnostic">Why not converged, or null.</param>
/// <param name="Evaluations">Function evaluations spent.</param>
internal sealed record LinearizedEvent(string Name, bool IsEquality, double Beta, double[] Alpha, double[] PointU,
    double GradientNorm, bool Converged, string? Diagnostic, int Evaluations);
