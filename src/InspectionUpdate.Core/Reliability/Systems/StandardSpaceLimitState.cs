using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability.Systems;

/// <summary>
/// G(u) = g(T⁻¹(u)) of one limit state over a transformation, with its gradient (analytic through the Jacobian when
/// the limit state has one, else central differences in u) and its Hessian by central differences in u.
/// Not thread-safe (scratch buffers); cheap to create.
/// </summary>
internal sealed class StandardSpaceLimitState
{
    private readonly IProbabilityTransformation _t;
    private readonly ILimitState _g;
    private readonly double[] _x;
    private readonly double[] _gradX;
    private readonly double[] _jac;
    private readonly double[] _work;

    public StandardSpaceLimitState(IProbabilityTransformation transformation, ILimitState limitState, double step = 1e-4)
    {
        _t = transformation;
        _g = limitState;
        Dimension = transformation.StandardDimension;
        Step = step;
        _x = new double[transformation.PhysicalDimension];
        _gradX = new double[transformation.PhysicalDimension];
        _jac = new double[transformation.PhysicalDimension * Dimension];
        _work = new double[Dimension];
    }

    public int Dimension { get; }

    /// <summary>Finite-difference step in u (standard deviations).</summary>
    public double Step { get; }

    public long Evaluations { get; private set; }

    public double Value(ReadOnlySpan<double> u)
    {
        _t.ToPhysical(u, _x);
        Evaluations++;
        return _g.Evaluate(_x);
    }

    /// <summary>G(u) and ∇G(u) written to <paramref name="gradient"/>.</summary>
    public double ValueAndGradient(ReadOnlySpan<double> u, Span<double> gradient)
    {
        if (_g.HasGradient)
        {
            _t.ToPhysical(u, _x);
            Evaluations++;
            var g = _g.EvaluateWithGradient(_x, _gradX);
            _t.JacobianPhysicalByStandard(u, _jac);
            gradient.Clear();
            var m = _x.Length;
            for (var i = 0; i < m; i++)
            {
                var gi = _gradX[i];
                if (gi == 0) continue;
                for (var k = 0; k < Dimension; k++) gradient[k] += _jac[i * Dimension + k] * gi;
            }

            return g;
        }

        var value = Value(u);
        u.CopyTo(_work);
        for (var k = 0; k < Dimension; k++)
        {
            var h = Step * Math.Max(1, Math.Abs(u[k]));
            _work[k] = u[k] + h;
            var gp = Value(_work);
            _work[k] = u[k] - h;
            var gm = Value(_work);
            _work[k] = u[k];
            gradient[k] = (gp - gm) / (2 * h);
        }

        return value;
    }

    /// <summary>The Hessian ∂²G/∂uᵢ∂uⱼ at u by central differences of the function values (symmetric, row-major).</summary>
    public double[,] Hessian(ReadOnlySpan<double> u)
    {
        var n = Dimension;
        var hess = new double[n, n];
        var p = u.ToArray();
        var g0 = Value(u);
        var h = new double[n];
        for (var i = 0; i < n; i++) h[i] = Step * 10 * Math.Max(1, Math.Abs(u[i]));
        for (var i = 0; i < n; i++)
        {
            p[i] = u[i] + h[i];
            var gp = Value(p);
            p[i] = u[i] - h[i];
            var gm = Value(p);
            p[i] = u[i];
            hess[i, i] = (gp - 2 * g0 + gm) / (h[i] * h[i]);
            for (var j = 0; j < i; j++)
            {
                p[i] = u[i] + h[i];
                p[j] = u[j] + h[j];
                var gpp = Value(p);
                p[j] = u[j] - h[j];
                var gpm = Value(p);
                p[i] = u[i] - h[i];
                var gmm = Value(p);
                p[j] = u[j] + h[j];
                var gmp = Value(p);
                p[i] = u[i];
                p[j] = u[j];
                hess[i, j] = hess[j, i] = (gpp - gpm - gmp + gmm) / (4 * h[i] * h[j]);
            }
        }

        return hess;
    }
}
