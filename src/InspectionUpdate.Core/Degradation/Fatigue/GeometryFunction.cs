namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>
/// The geometry function Y(a/T) of the stress-intensity factor ΔK = Y·Δσ·√(πa): a constant, or a table of
/// (a/T, Y) pairs interpolated linearly and held constant beyond its ends. The model multiplies it by the
/// random input geometryFactor.
/// </summary>
public sealed class GeometryFunction
{
    private readonly double[] _ratios;
    private readonly double[] _values;

    private GeometryFunction(double[] ratios, double[] values)
    {
        _ratios = ratios;
        _values = values;
    }

    /// <summary>Y = 1 everywhere; the model's geometryFactor input is then Y itself.</summary>
    public static GeometryFunction Constant { get; } = new([], []);

    /// <summary>True when Y does not depend on the depth (a closed-form growth law then exists).</summary>
    public bool IsConstant => _ratios.Length == 0;

    /// <summary>The depth ratios a/T of the table (empty when constant).</summary>
    public IReadOnlyList<double> Ratios => _ratios;

    /// <summary>The table values Y (empty when constant).</summary>
    public IReadOnlyList<double> Values => _values;

    /// <summary>A tabulated Y(a/T).</summary>
    /// <exception cref="ArgumentException">Fewer than two points, ratios not strictly increasing or negative, or a value not finite and &gt; 0 (the message names the point).</exception>
    public static GeometryFunction Tabulated(IReadOnlyList<double> depthRatios, IReadOnlyList<double> values)
    {
        ArgumentNullException.ThrowIfNull(depthRatios);
        ArgumentNullException.ThrowIfNull(values);
        if (depthRatios.Count != values.Count) throw new ArgumentException($"The geometry table has {depthRatios.Count} ratios but {values.Count} values.", nameof(values));
        if (depthRatios.Count < 2) throw new ArgumentException("A geometry table needs at least two points.", nameof(depthRatios));
        for (var i = 0; i < depthRatios.Count; i++)
        {
            if (!(double.IsFinite(depthRatios[i]) && depthRatios[i] >= 0))
                throw new ArgumentException(FormattableString.Invariant($"Geometry table point {i}: a/T = {depthRatios[i]} must be finite and ≥ 0."), nameof(depthRatios));
            if (i > 0 && !(depthRatios[i] > depthRatios[i - 1]))
                throw new ArgumentException(FormattableString.Invariant($"Geometry table point {i}: a/T = {depthRatios[i]} must exceed the previous ratio {depthRatios[i - 1]}."), nameof(depthRatios));
            if (!(double.IsFinite(values[i]) && values[i] > 0))
                throw new ArgumentException(FormattableString.Invariant($"Geometry table point {i}: Y = {values[i]} must be finite and > 0."), nameof(values));
        }

        return new GeometryFunction(depthRatios.ToArray(), values.ToArray());
    }

    /// <summary>Y at depth ratio a/T (1 when constant).</summary>
    public double Evaluate(double depthRatio)
    {
        if (_ratios.Length == 0) return 1.0;
        if (depthRatio <= _ratios[0]) return _values[0];
        var last = _ratios.Length - 1;
        if (depthRatio >= _ratios[last]) return _values[last];
        var j = Array.BinarySearch(_ratios, depthRatio);
        if (j >= 0) return _values[j];
        j = ~j; // first index above
        var w = (depthRatio - _ratios[j - 1]) / (_ratios[j] - _ratios[j - 1]);
        return _values[j - 1] + w * (_values[j] - _values[j - 1]);
    }
}
