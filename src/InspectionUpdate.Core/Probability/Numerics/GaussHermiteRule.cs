using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Gauss–Hermite quadrature for the standard normal weight: E[g(Z)] ≈ Σᵢ wᵢ g(zᵢ), Σ wᵢ = 1, exact for polynomials
/// of degree ≤ 2n − 1.
/// </summary>
/// <remarks>
/// Nodes and weights by the Golub–Welsch method (Golub &amp; Welsch 1969, Math. Comp. 23:221–230): the nodes are the
/// eigenvalues of the symmetric Jacobi matrix of the probabilists' Hermite polynomials (zero diagonal,
/// off-diagonal √k), the weights the squared first components of its normalized eigenvectors. Immutable once built.
/// </remarks>
internal sealed class GaussHermiteRule
{
    /// <summary>48 nodes: the per-axis rule of the two-dimensional Nataf integral.</summary>
    public static readonly GaussHermiteRule Nodes48 = new(48);

    /// <summary>128 nodes: the one-dimensional integrals (factors with one normal marginal, correlation bounds).</summary>
    public static readonly GaussHermiteRule Nodes128 = new(128);

    private readonly double[] _nodes;
    private readonly double[] _weights;

    /// <summary>Builds the n-point rule.</summary>
    public GaussHermiteRule(int n)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(n, 1);
        var jacobi = Matrix<double>.Build.Dense(n, n);
        for (var k = 1; k < n; k++)
        {
            jacobi[k, k - 1] = Math.Sqrt(k);
            jacobi[k - 1, k] = Math.Sqrt(k);
        }

        var evd = jacobi.Evd(Symmetricity.Symmetric);
        var order = Enumerable.Range(0, n).OrderBy(i => evd.EigenValues[i].Real).ToArray();
        _nodes = new double[n];
        _weights = new double[n];
        for (var i = 0; i < n; i++)
        {
            var c = order[i];
            _nodes[i] = evd.EigenValues[c].Real;
            var v0 = evd.EigenVectors[0, c];
            _weights[i] = v0 * v0;
        }

        // Symmetrize: the exact rule is symmetric about 0; averaging removes eigen-solver noise.
        for (var i = 0; i < n / 2; i++)
        {
            var z = 0.5 * (_nodes[n - 1 - i] - _nodes[i]);
            var w = 0.5 * (_weights[n - 1 - i] + _weights[i]);
            _nodes[i] = -z;
            _nodes[n - 1 - i] = z;
            _weights[i] = w;
            _weights[n - 1 - i] = w;
        }

        if (n % 2 == 1) _nodes[n / 2] = 0;
        var sum = _weights.Sum();
        for (var i = 0; i < n; i++) _weights[i] /= sum;
    }

    /// <summary>Number of nodes.</summary>
    public int Count => _nodes.Length;

    /// <summary>Nodes zᵢ in increasing order.</summary>
    public ReadOnlySpan<double> Nodes => _nodes;

    /// <summary>Weights wᵢ (sum 1).</summary>
    public ReadOnlySpan<double> Weights => _weights;
}
