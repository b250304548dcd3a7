namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The components a sample set draws from, in the standard normal space of the model inputs: the prior N(0, I) (the
/// defensive component, Hesterberg 1995, Technometrics 37(2):185–194, which keeps every weight φ/q ≤ 1/w₀) and
/// Gaussians N(cⱼ, κ²S) sharing the Laplace covariance S of the posterior, inflated by κ. Each batch of samples draws
/// from its own weights over these components; every batch's density is then a mixture of the same components, and so
/// is the balance-heuristic density of all batches together (the weights averaged by batch size). A sample's
/// log density under each component is computed once and kept, so adding a batch or a component never re-evaluates
/// the others.
/// </summary>
internal sealed class SamplingMixture
{
    private const double HalfLog2Pi = 0.91893853320467274178;
    private readonly List<double[]?> _centres = [null];
    private readonly List<double[]?> _whiteCentres = [];
    private readonly double[,] _lower;
    private readonly double _logNorm;
    private readonly int _d;

    /// <param name="lower">Lower Cholesky factor of κ²S.</param>
    /// <param name="logDet">ln det(κ²S).</param>
    public SamplingMixture(double[,] lower, double logDet)
    {
        _d = lower.GetLength(0);
        _lower = lower;
        _logNorm = -_d * HalfLog2Pi - 0.5 * logDet;
    }

    private SamplingMixture(SamplingMixture other)
    {
        _d = other._d;
        _lower = other._lower;
        _logNorm = other._logNorm;
        _centres.Clear();
        _centres.AddRange(other._centres);
        _whiteCentres.AddRange(other._whiteCentres);
    }

    /// <summary>A copy that can take further components without changing this one (centres are never mutated).</summary>
    public SamplingMixture Copy() => new(this);

    /// <summary>Number of components, the prior (index 0) included.</summary>
    public int Count => _centres.Count;

    /// <summary>Centre of component j (u-space); the prior's is the origin.</summary>
    public double[] Centre(int j) => _centres[j] ?? new double[_d];

    /// <summary>Adds a Gaussian component N(centre, κ²S); returns its index.</summary>
    public int Add(double[] centre)
    {
        _centres.Add(centre);
        return _centres.Count - 1;
    }

    /// <summary>The component a uniform <paramref name="pick"/> selects under the cumulative weights (last entry 1).</summary>
    public static int Pick(double pick, ReadOnlySpan<double> cumulativeWeights)
    {
        var j = 0;
        while (j < cumulativeWeights.Length - 1 && pick >= cumulativeWeights[j]) j++;
        return j;
    }

    /// <summary>
    /// u = cⱼ + L·z from standard normals z, and its whitened coordinates L⁻¹u: for a non-prior component simply
    /// L⁻¹cⱼ + z, so only prior draws (u = z) need the triangular solve.
    /// </summary>
    public void FromNormals(int j, ReadOnlySpan<double> z, Span<double> u, Span<double> whitened)
    {
        if (_centres[j] is not { } c)
        {
            z.CopyTo(u);
            Whiten(u, whitened);
            return;
        }

        for (var i = 0; i < _d; i++)
        {
            var s = c[i];
            for (var k = 0; k <= i; k++) s += _lower[i, k] * z[k];
            u[i] = s;
        }

        var m = WhiteCentre(j);
        for (var i = 0; i < _d; i++) whitened[i] = m[i] + z[i];
    }

    /// <summary>ln of component j's density at u.</summary>
    public double LogDensity(int j, ReadOnlySpan<double> u)
    {
        if (_centres[j] is null) return LogPrior(u);
        Span<double> z = stackalloc double[_d];
        Whiten(u, z);
        var m = WhiteCentre(j);
        var q = 0.0;
        for (var i = 0; i < _d; i++) q += (z[i] - m[i]) * (z[i] - m[i]);
        return _logNorm - 0.5 * q;
    }

    /// <summary>z = L⁻¹u, the coordinates in which every non-prior component is N(L⁻¹cⱼ, I).</summary>
    public void Whiten(ReadOnlySpan<double> u, Span<double> z)
    {
        for (var i = 0; i < _d; i++)
        {
            var s = u[i];
            for (var k = 0; k < i; k++) s -= _lower[i, k] * z[k];
            z[i] = s / _lower[i, i];
        }
    }

    /// <summary>
    /// Appends φⱼ(uᵢ)/φ(uᵢ) (component j's density over the prior's) for samples <paramref name="first"/> to
    /// <paramref name="count"/> − 1, from their whitened coordinates zᵢ = L⁻¹uᵢ (d per sample) and ln φ(uᵢ).
    /// </summary>
    /// <remarks>All components share L, so ‖zᵢ − mⱼ‖² is one dot product per sample; the exponentials run in vector lanes.</remarks>
    public void AppendRatios(int j, ReadOnlySpan<double> whitened, ReadOnlySpan<double> logPrior, int first, int count, List<double> column)
    {
        var m = WhiteCentre(j);
        var start = column.Count;
        System.Runtime.InteropServices.CollectionsMarshal.SetCount(column, start + count - first);
        var target = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(column)[start..];
        for (var i = first; i < count; i++)
        {
            var z = whitened.Slice(i * _d, _d);
            var q = 0.0;
            for (var k = 0; k < _d; k++) q += (z[k] - m[k]) * (z[k] - m[k]);
            target[i - first] = _logNorm - 0.5 * q - logPrior[i];
        }

        VectorKernels.ExpInPlace(target);
    }

    /// <summary>L⁻¹cⱼ, computed once per component.</summary>
    private double[] WhiteCentre(int j)
    {
        while (_whiteCentres.Count <= j) _whiteCentres.Add(null);
        if (_whiteCentres[j] is { } known) return known;
        var m = new double[_d];
        Whiten(_centres[j] ?? new double[_d], m);
        _whiteCentres[j] = m;
        return m;
    }

    /// <summary>ln φ(u) of the standard normal prior.</summary>
    public static double LogPrior(ReadOnlySpan<double> u)
    {
        var s = -u.Length * HalfLog2Pi;
        foreach (var v in u) s -= 0.5 * v * v;
        return s;
    }

}
