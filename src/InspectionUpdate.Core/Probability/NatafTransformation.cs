namespace InspectionUpdate.Probability;

/// <summary>
/// The Nataf transformation (Liu &amp; Der Kiureghian 1986): z = Φ⁻¹(F(x)) componentwise, z = L₀u with L₀ the
/// lower Cholesky factor of the fictive correlation matrix R₀. For independent inputs L₀ = I.
/// </summary>
/// <remarks>
/// R₀ comes from <see cref="FictiveCorrelations"/> (closed forms where exact, Gauss–Hermite quadrature and Brent's
/// method otherwise). Deterministic variables have no u coordinate; their correlations are ignored. The Jacobian is
/// ∂xᵢ/∂uⱼ = L₀[k, j]·φ(zₖ)/fᵢ(xᵢ) for the k-th random variable i. Immutable after construction: every method
/// may be called from many threads at once; <see cref="ToPhysical"/> and <see cref="JacobianPhysicalByStandard"/>
/// allocate nothing, <see cref="ToStandard"/> allocates only beyond 64 random variables.
/// </remarks>
public sealed class NatafTransformation : IProbabilityTransformation
{
    private readonly RandomVariable[] _variables;
    private readonly int[] _randomIndices;
    private readonly double[] _deterministicValues;
    private readonly double[,]? _l0; // over random variables only; null when independent
    private readonly double[,]? _l0Inverse;

    /// <summary>Builds the transformation, computing the fictive correlation matrix where the inputs are correlated.</summary>
    /// <exception cref="DistributionParameterException">
    /// A physical correlation is not attainable for its pair of marginals (ParamName is the entry, e.g. "[2,0]"), or
    /// the fictive correlation matrix is not positive definite (VariableName "fictive correlation").
    /// </exception>
    public NatafTransformation(StochasticModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        Model = model;
        _variables = model.Variables.ToArray();
        _randomIndices = model.RandomIndices.ToArray();
        _deterministicValues = _variables.Select(v => v.IsDeterministic ? v.Mean : double.NaN).ToArray();
        if (model.Correlation is { IsIdentity: false } r)
        {
            FictiveCorrelation = FictiveCorrelations.Compute(model, r);
            _l0 = FictiveCorrelation.CholeskyLower;
            _l0Inverse = InvertLower(_l0);
        }
    }

    /// <inheritdoc />
    public StochasticModel Model { get; }

    /// <summary>The fictive correlation matrix R₀ of z over the random variables, or null when independent.</summary>
    public CorrelationMatrix? FictiveCorrelation { get; }

    /// <inheritdoc />
    public int StandardDimension => _randomIndices.Length;

    /// <inheritdoc />
    public int PhysicalDimension => _variables.Length;

    /// <inheritdoc />
    public void ToPhysical(ReadOnlySpan<double> u, Span<double> x)
    {
        var n = _randomIndices.Length;
        for (var i = 0; i < _variables.Length; i++)
        {
            if (_variables[i].IsDeterministic) x[i] = _deterministicValues[i];
        }

        for (var k = 0; k < n; k++)
        {
            var i = _randomIndices[k];
            x[i] = _variables[i].FromStandardNormal(Correlated(u, k));
        }
    }

    /// <inheritdoc />
    public void ToStandard(ReadOnlySpan<double> x, Span<double> u)
    {
        var n = _randomIndices.Length;
        Span<double> z = n <= 64 ? stackalloc double[n] : new double[n];
        for (var k = 0; k < n; k++)
        {
            var i = _randomIndices[k];
            z[k] = _variables[i].ToStandardNormal(x[i]);
        }

        if (_l0Inverse is null)
        {
            z.CopyTo(u);
            return;
        }

        for (var k = 0; k < n; k++)
        {
            var s = 0.0;
            for (var j = 0; j <= k; j++) s += _l0Inverse[k, j] * z[j];
            u[k] = s;
        }
    }

    /// <inheritdoc />
    public void JacobianPhysicalByStandard(ReadOnlySpan<double> u, Span<double> jacobian)
    {
        var n = _randomIndices.Length;
        var m = _variables.Length;
        jacobian[..(m * n)].Clear();
        for (var k = 0; k < n; k++)
        {
            var z = Correlated(u, k);
            var i = _randomIndices[k];
            var x = _variables[i].FromStandardNormal(z);
            // dx/dz = φ(z)/f(x); guard the far tails where both vanish.
            var f = _variables[i].Pdf(x);
            var dxdz = f > 0 ? StandardNormal.Pdf(z) / f : 0.0;
            if (_l0 is null)
            {
                jacobian[i * n + k] = dxdz;
            }
            else
            {
                for (var j = 0; j <= k; j++) jacobian[i * n + j] = dxdz * _l0[k, j];
            }
        }
    }

    /// <summary>zₖ = (L₀u)ₖ, the k-th correlated standard normal coordinate (uₖ itself when independent).</summary>
    /// <inheritdoc />
    public bool TryMoveStandardCoordinate(int k, double uk, Span<double> x)
    {
        if (_l0 is not null) return false;
        var i = _randomIndices[k];
        x[i] = _variables[i].FromStandardNormal(uk);
        return true;
    }

    private double Correlated(ReadOnlySpan<double> u, int k)
    {
        if (_l0 is null) return u[k];
        var z = 0.0;
        for (var j = 0; j <= k; j++) z += _l0[k, j] * u[j];
        return z;
    }

    private static double[,] InvertLower(double[,] l)
    {
        var n = l.GetLength(0);
        var inv = new double[n, n];
        for (var i = 0; i < n; i++)
        {
            inv[i, i] = 1.0 / l[i, i];
            for (var j = 0; j < i; j++)
            {
                var s = 0.0;
                for (var k = j; k < i; k++) s -= l[i, k] * inv[k, j];
                inv[i, j] = s / l[i, i];
            }
        }

        return inv;
    }
}
