namespace InspectionUpdate.Reliability;

/// <summary>A limit-state function g(x): failure when g(x) ≤ 0.</summary>
/// <param name="x">The physical input vector, in the order of the stochastic model's variables.</param>
public delegate double LimitStateFunction(ReadOnlySpan<double> x);

/// <summary>g(x) and its gradient ∂g/∂x written into <paramref name="gradient"/>.</summary>
public delegate double LimitStateWithGradient(ReadOnlySpan<double> x, Span<double> gradient);

/// <summary>
/// A limit-state function of the physical inputs, optionally with an analytic gradient. Failure is g(x) ≤ 0.
/// </summary>
/// <remarks>Implementations must be thread-safe: simulation evaluates them from several threads.</remarks>
public interface ILimitState
{
    /// <summary>Name shown in results and reports.</summary>
    string Name { get; }

    /// <summary>True when <see cref="EvaluateWithGradient"/> returns an analytic gradient.</summary>
    bool HasGradient { get; }

    /// <summary>g(x).</summary>
    double Evaluate(ReadOnlySpan<double> x);

    /// <summary>g(x) and ∂g/∂x. Only called when <see cref="HasGradient"/> is true.</summary>
    double EvaluateWithGradient(ReadOnlySpan<double> x, Span<double> gradient);
}

/// <summary>A limit state built from delegates.</summary>
public sealed class LimitState : ILimitState
{
    private readonly LimitStateFunction _function;
    private readonly LimitStateWithGradient? _withGradient;

    /// <summary>Creates a limit state from g and, optionally, g with its gradient.</summary>
    public LimitState(string name, LimitStateFunction function, LimitStateWithGradient? withGradient = null)
    {
        ArgumentNullException.ThrowIfNull(function);
        Name = name;
        _function = function;
        _withGradient = withGradient;
    }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public bool HasGradient => _withGradient is not null;

    /// <inheritdoc />
    public double Evaluate(ReadOnlySpan<double> x) => _function(x);

    /// <inheritdoc />
    public double EvaluateWithGradient(ReadOnlySpan<double> x, Span<double> gradient) =>
        _withGradient is null
            ? throw new InvalidOperationException($"Limit state '{Name}' has no analytic gradient.")
            : _withGradient(x, gradient);
}
