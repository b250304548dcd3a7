using InspectionUpdate.Probability;

namespace InspectionUpdate.Updating.Simulation;

/// <summary>
/// x = T(m + C v): a standard normal v mapped through the Laplace approximation N(m, CCᵀ) of the posterior in u-space,
/// then through the prior transformation T. FORM in v measures distance in the posterior's own units.
/// </summary>
internal sealed class ShiftedTransformation : IProbabilityTransformation
{
    private readonly IProbabilityTransformation _inner;
    private readonly double[] _m;
    private readonly double[,] _c;

    public ShiftedTransformation(IProbabilityTransformation inner, double[] mean, double[,] lowerFactor)
    {
        _inner = inner;
        _m = mean;
        _c = lowerFactor;
    }

    public StochasticModel Model => _inner.Model;

    public int StandardDimension => _inner.StandardDimension;

    public int PhysicalDimension => _inner.PhysicalDimension;

    public void ToU(ReadOnlySpan<double> v, Span<double> u)
    {
        var n = _m.Length;
        for (var i = 0; i < n; i++)
        {
            var s = _m[i];
            for (var j = 0; j <= i; j++) s += _c[i, j] * v[j];
            u[i] = s;
        }
    }

    public void ToPhysical(ReadOnlySpan<double> u, Span<double> x)
    {
        Span<double> w = _m.Length <= 64 ? stackalloc double[_m.Length] : new double[_m.Length];
        ToU(u, w);
        _inner.ToPhysical(w, x);
    }

    public void ToStandard(ReadOnlySpan<double> x, Span<double> u)
    {
        var n = _m.Length;
        Span<double> w = n <= 64 ? stackalloc double[n] : new double[n];
        _inner.ToStandard(x, w);
        for (var i = 0; i < n; i++)
        {
            var s = w[i] - _m[i];
            for (var j = 0; j < i; j++) s -= _c[i, j] * u[j];
            u[i] = s / _c[i, i];
        }
    }

    public void JacobianPhysicalByStandard(ReadOnlySpan<double> v, Span<double> jacobian)
    {
        var n = _m.Length;
        var m = PhysicalDimension;
        Span<double> w = n <= 64 ? stackalloc double[n] : new double[n];
        ToU(v, w);
        var inner = new double[m * n];
        _inner.JacobianPhysicalByStandard(w, inner);
        for (var r = 0; r < m; r++)
            for (var k = 0; k < n; k++)
            {
                var s = 0.0;
                for (var j = k; j < n; j++) s += inner[r * n + j] * _c[j, k];
                jacobian[r * n + k] = s;
            }
    }
}
