namespace InspectionUpdate.Reliability;

/// <summary>Settings of the FORM design-point search. Immutable; validated when a solve starts.</summary>
/// <remarks>
/// The defaults suit limit states that are smooth and evaluated to near machine precision. For a limit state with
/// numerical noise (an inner solver, a table lookup) loosen both tolerances and raise <see cref="RelativeStep"/>.
/// </remarks>
public sealed record FormOptions
{
    /// <summary>
    /// Iteration cap of the improved HL-RF search (≥ 0). Zero evaluates the start point only: the result then
    /// reports the linearization there and is converged only if the start point already meets both criteria.
    /// </summary>
    public int MaxIterations { get; init; } = 100;

    /// <summary>
    /// Tolerance on |G(u)| / G_scale, finite and &gt; 0. G_scale is <see cref="LimitStateScale"/> when given, else
    /// |G(0)| (the value at the median point), else ‖∇G‖ at the start point when G(0) = 0.
    /// </summary>
    public double LimitStateTolerance { get; init; } = 1e-6;

    /// <summary>
    /// Tolerance on the alignment of u with the gradient, finite and &gt; 0:
    /// ‖u − (αᵀu)α‖ ≤ tol·max(‖u‖, 1), i.e. the sine of the angle between u and α.
    /// </summary>
    /// <remarks>
    /// The default 10⁻⁵ leaves an error in β of second order (about ½·tol²·β, below 10⁻⁹) and in α and u* of
    /// first order (about tol and tol·β). HL-RF converges linearly on curved surfaces, so each further decade costs
    /// a few iterations.
    /// </remarks>
    public double AlignmentTolerance { get; init; } = 1e-5;

    /// <summary>How the gradient is computed.</summary>
    public GradientMethod Gradient { get; init; } = GradientMethod.Automatic;

    /// <summary>
    /// Relative finite-difference step in (0, 0.1]: the step on xᵢ is RelativeStep·max(|xᵢ|, σᵢ) with σᵢ the
    /// standard deviation of the variable. Used by forward and central differences alike.
    /// </summary>
    public double RelativeStep { get; init; } = 1e-6;

    /// <summary>
    /// Start point in standard normal space (warm start), one entry per random variable in the order of the model's
    /// random indices; null starts at the origin. Entries must be finite.
    /// </summary>
    public IReadOnlyList<double>? StartPoint { get; init; }

    /// <summary>
    /// Scale of G for the convergence test on |G|, finite and &gt; 0; null takes |G(0)|. With a warm start and no
    /// scale the solver spends one extra evaluation at the origin; time-stepped runs pass the scale of the first
    /// step to save it.
    /// </summary>
    public double? LimitStateScale { get; init; }

    /// <summary>The default settings.</summary>
    public static FormOptions Default { get; } = new();

    /// <summary>Throws when a setting is out of range (the message names the setting and its value).</summary>
    /// <param name="standardDimension">Number of random variables of the problem, for the start point check.</param>
    /// <exception cref="ArgumentOutOfRangeException">A numeric setting is out of range.</exception>
    /// <exception cref="ArgumentException">The start point has the wrong length or a non-finite entry.</exception>
    public void Validate(int standardDimension)
    {
        if (MaxIterations < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(MaxIterations), MaxIterations, "FormOptions.MaxIterations must be ≥ 0.");
        }

        RequirePositive(nameof(LimitStateTolerance), LimitStateTolerance);
        RequirePositive(nameof(AlignmentTolerance), AlignmentTolerance);
        if (!(RelativeStep > 0 && RelativeStep <= 0.1))
        {
            throw new ArgumentOutOfRangeException(nameof(RelativeStep), RelativeStep, "FormOptions.RelativeStep must lie in (0, 0.1].");
        }

        if (!Enum.IsDefined(Gradient))
        {
            throw new ArgumentOutOfRangeException(nameof(Gradient), Gradient, "FormOptions.Gradient is not a defined gradient method.");
        }

        if (LimitStateScale is { } scale) RequirePositive(nameof(LimitStateScale), scale);

        if (StartPoint is { } start)
        {
            if (start.Count != standardDimension)
            {
                throw new ArgumentException(
                    $"FormOptions.StartPoint has {start.Count} entries; the problem has {standardDimension} random variables.",
                    nameof(StartPoint));
            }

            for (var i = 0; i < start.Count; i++)
            {
                if (!double.IsFinite(start[i]))
                {
                    throw new ArgumentException(
                        FormattableString.Invariant($"FormOptions.StartPoint[{i}] = {start[i]} is not finite."), nameof(StartPoint));
                }
            }
        }
    }

    private static void RequirePositive(string name, double value)
    {
        if (!(double.IsFinite(value) && value > 0))
        {
            throw new ArgumentOutOfRangeException(name, value, $"FormOptions.{name} must be finite and > 0.");
        }
    }
}
