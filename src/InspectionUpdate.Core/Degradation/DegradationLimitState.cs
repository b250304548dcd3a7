using InspectionUpdate.Reliability;

namespace InspectionUpdate.Degradation;

/// <summary>The limit state g(x) = g(x, t) of a degradation model frozen at one time t, for FORM and simulation.</summary>
public sealed class DegradationLimitState : ILimitState
{
    private readonly IDegradationModel _model;
    private readonly IDegradationMarginGradient? _gradient;

    /// <summary>Freezes <paramref name="model"/> at <paramref name="timeYears"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The time is not finite.</exception>
    public DegradationLimitState(IDegradationModel model, double timeYears)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (!double.IsFinite(timeYears))
        {
            throw new ArgumentOutOfRangeException(nameof(timeYears), timeYears, "The time must be finite.");
        }

        _model = model;
        _gradient = model is IDegradationMarginGradient { HasMarginGradient: true } g ? g : null;
        TimeYears = timeYears;
        Name = FormattableString.Invariant($"{model.Name} at t = {timeYears:0.###} years");
    }

    /// <summary>The frozen time in years.</summary>
    public double TimeYears { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public bool HasGradient => _gradient is not null;

    /// <inheritdoc />
    public double Evaluate(ReadOnlySpan<double> x) => _model.Margin(x, TimeYears);

    /// <inheritdoc />
    public double EvaluateWithGradient(ReadOnlySpan<double> x, Span<double> gradient) =>
        _gradient is null
            ? throw new InvalidOperationException($"Model '{_model.Name}' has no analytic gradient.")
            : _gradient.MarginWithGradient(x, TimeYears, gradient);
}
