namespace InspectionUpdate.Reliability;

/// <summary>Settings of the FORM design-point search.</summary>
public sealed record FormOptions
{
    /// <summary>Iteration cap of the improved HL-RF search.</summary>
    public int MaxIterations { get; init; } = 100;

    /// <summary>Tolerance on |G(u)| / |G(u₀)| (G(u₀) taken as 1 if it is 0).</summary>
    public double LimitStateTolerance { get; init; } = 1e-6;

    /// <summary>Tolerance on the alignment of u with the gradient: ‖u − (αᵀu)α‖ ≤ tol·max(‖u‖, 1).</summary>
    public double AlignmentTolerance { get; init; } = 1e-6;

    /// <summary>How the gradient is computed.</summary>
    public GradientMethod Gradient { get; init; } = GradientMethod.Automatic;

    /// <summary>Relative finite-difference step, applied to max(|xᵢ|, σᵢ).</summary>
    public double RelativeStep { get; init; } = 1e-6;

    /// <summary>Start point in standard normal space (warm start); null starts at the origin.</summary>
    public IReadOnlyList<double>? StartPoint { get; init; }

    /// <summary>The default settings.</summary>
    public static FormOptions Default { get; } = new();
}
