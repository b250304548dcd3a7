namespace InspectionUpdate.Degradation;

/// <summary>
/// Optional companion of <see cref="IDegradationModel"/>: the limit state with its analytic gradient ∂g/∂x.
/// FORM uses it instead of finite differences, which saves n limit-state evaluations per iteration.
/// </summary>
public interface IDegradationMarginGradient
{
    /// <summary>False when this instance has no analytic gradient after all (e.g. a crack-growth model that integrates numerically).</summary>
    bool HasMarginGradient { get; }

    /// <summary>g(x, t) and ∂g/∂x written into <paramref name="gradient"/> (length = number of inputs, deterministic ones included).</summary>
    double MarginWithGradient(ReadOnlySpan<double> x, double timeYears, Span<double> gradient);
}
