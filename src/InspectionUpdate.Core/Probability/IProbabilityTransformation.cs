namespace InspectionUpdate.Probability;

/// <summary>
/// A one-to-one map between the physical input vector x and independent standard normal variables u.
/// </summary>
/// <remarks>Implementations are immutable and thread-safe; the span methods do not allocate.</remarks>
public interface IProbabilityTransformation
{
    /// <summary>The inputs this transformation maps.</summary>
    StochasticModel Model { get; }

    /// <summary>Length of u.</summary>
    int StandardDimension { get; }

    /// <summary>Length of x.</summary>
    int PhysicalDimension { get; }

    /// <summary>x = T⁻¹(u). <paramref name="x"/> receives the physical vector (deterministic entries included).</summary>
    void ToPhysical(ReadOnlySpan<double> u, Span<double> x);

    /// <summary>u = T(x).</summary>
    void ToStandard(ReadOnlySpan<double> x, Span<double> u);

    /// <summary>
    /// The Jacobian J = ∂x/∂u at u, row-major, PhysicalDimension × StandardDimension (rows of deterministic
    /// variables are zero). The gradient in u is ∇ᵤG = Jᵀ ∇ₓg.
    /// </summary>
    void JacobianPhysicalByStandard(ReadOnlySpan<double> u, Span<double> jacobian);

    /// <summary>
    /// Where u's coordinate k moves x only through one physical entry (independent inputs), sets that entry of
    /// <paramref name="x"/> (a physical vector of some u) to its value at uₖ = <paramref name="uk"/> and returns true;
    /// otherwise leaves x alone and returns false. Lets a finite-difference gradient transform one entry per step
    /// instead of the whole vector, with the same numbers.
    /// </summary>
    bool TryMoveStandardCoordinate(int k, double uk, Span<double> x) => false;
}
