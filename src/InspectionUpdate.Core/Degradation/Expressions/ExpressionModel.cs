using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation.Expressions;

/// <summary>Settings of a user-defined model besides its expressions.</summary>
public sealed record ExpressionModelSettings
{
    /// <summary>Name shown in results.</summary>
    public string Name { get; init; } = "User-defined limit state";

    /// <summary>What the size expression measures, with unit.</summary>
    public string SizeQuantity { get; init; } = "size_mm";

    /// <summary>Inputs that restart after a repair.</summary>
    public IReadOnlyList<string> RenewedOnRepair { get; init; } = [];

    /// <summary>An input renewed each year as an annual maximum, or null.</summary>
    public string? AnnualMaximumInput { get; init; }

    /// <summary>Largest possible size in mm (+∞ when unbounded).</summary>
    public double MaximumSizeMm { get; init; } = double.PositiveInfinity;
}

/// <summary>
/// A degradation model written as expressions over its named inputs and t (years): the limit state g(x, t) and,
/// optionally, the size an inspection sees. Compiled once with <see cref="ExpressionCompiler"/>.
/// </summary>
public sealed class ExpressionModel : IDegradationModel
{
    [ThreadStatic]
    private static double[]? _buffer;

    private readonly CompiledExpression _margin;
    private readonly CompiledExpression? _size;
    private readonly int _n;

    /// <summary>Compiles the expressions over the input names of <paramref name="inputs"/>.</summary>
    /// <exception cref="ExpressionParseException">An expression does not parse (position and token named).</exception>
    /// <exception cref="ArgumentException">A setting names an unknown input, or an input name is not usable in expressions.</exception>
    public ExpressionModel(StochasticModel inputs, string limitStateExpression, string? sizeExpression = null, ExpressionModelSettings? settings = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        settings ??= new ExpressionModelSettings();
        var names = inputs.Variables.Select(v => v.Name).ToArray();
        foreach (var r in settings.RenewedOnRepair)
        {
            if (!names.Contains(r)) throw new ArgumentException($"RenewedOnRepair names '{r}', which is not an input.", nameof(settings));
        }

        if (settings.AnnualMaximumInput is { } am && !names.Contains(am))
        {
            throw new ArgumentException($"AnnualMaximumInput names '{am}', which is not an input.", nameof(settings));
        }

        if (!(settings.MaximumSizeMm > 0)) throw new ArgumentOutOfRangeException(nameof(settings), settings.MaximumSizeMm, "MaximumSizeMm must be > 0.");
        _margin = ExpressionCompiler.Compile(limitStateExpression, names, "limitState");
        _size = sizeExpression is null ? null : ExpressionCompiler.Compile(sizeExpression, names, "size");
        _n = names.Length;
        Inputs = inputs;
        Settings = settings;
        LimitStateExpression = limitStateExpression;
        SizeExpression = sizeExpression;
    }

    /// <summary>The limit-state expression text.</summary>
    public string LimitStateExpression { get; }

    /// <summary>The size expression text, or null.</summary>
    public string? SizeExpression { get; }

    /// <summary>The settings.</summary>
    public ExpressionModelSettings Settings { get; }

    /// <inheritdoc />
    public string Name => Settings.Name;

    /// <inheritdoc />
    public StochasticModel Inputs { get; }

    /// <inheritdoc />
    public string SizeQuantity => Settings.SizeQuantity;

    /// <inheritdoc />
    public IReadOnlyList<string> RenewedOnRepair => Settings.RenewedOnRepair;

    /// <inheritdoc />
    public string? AnnualMaximumInput => Settings.AnnualMaximumInput;

    /// <inheritdoc />
    public double MaximumSizeMm => Settings.MaximumSizeMm;

    /// <inheritdoc />
    /// <exception cref="InvalidOperationException">The model has no size expression.</exception>
    public double Size(ReadOnlySpan<double> x, double timeYears) =>
        _size is null
            ? throw new InvalidOperationException($"Model '{Name}' has no size expression, so inspections cannot be related to it.")
            : _size(Copy(x), timeYears);

    /// <inheritdoc />
    public double Margin(ReadOnlySpan<double> x, double timeYears) => _margin(Copy(x), timeYears);

    private double[] Copy(ReadOnlySpan<double> x)
    {
        if (x.Length != _n) throw new ArgumentException($"Expected {_n} inputs, got {x.Length}.", nameof(x));
        var b = _buffer;
        if (b is null || b.Length != _n) _buffer = b = new double[_n];
        x.CopyTo(b);
        return b;
    }
}
