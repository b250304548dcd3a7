using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability;

/// <summary>Importance measures of the random inputs at a FORM design point.</summary>
/// <remarks>
/// <para>
/// For independent inputs the importance factors are αᵢ², the share of the variance of the linearized margin
/// contributed by each uᵢ, and uᵢ belongs to xᵢ alone.
/// </para>
/// <para>
/// For correlated inputs uᵢ mixes several xⱼ, so αᵢ² no longer belongs to one variable. The importance vector of
/// Der Kiureghian (2005, Engineering Design Reliability Handbook, ch. 14; formula from memory) linearizes the
/// transformation at u*, x̂ = x* + J_{x,u}(u − u*), and measures each equivalent normal x̂ᵢ:
/// γᵀ = αᵀJ_{u,x}D̂ / ‖αᵀJ_{u,x}D̂‖ with J_{u,x} = J_{x,u}⁻¹ and D̂ = diag(√(J_{x,u}J_{x,u}ᵀ)ᵢᵢ), the standard
/// deviations of x̂. Writing J_{x,u} = D̂Â with unit-norm rows of Â gives αᵀJ_{u,x}D̂ = αᵀÂ⁻¹; for the Nataf
/// transformation Â is the Cholesky factor L₀ of the fictive correlation matrix (its rows have unit norm), so
/// γ ∝ L₀⁻ᵀα exactly, even where the marginal densities underflow. γ = α when the inputs are independent.
/// γᵢ² sum to 1 and are reported as the importance factors.
/// </para>
/// </remarks>
public static class ImportanceFactors
{
    /// <summary>The importance factors γᵢ² (αᵢ² for independent inputs); they sum to 1.</summary>
    /// <param name="transformation">The transformation of the problem.</param>
    /// <param name="u">The design point in standard normal space (length StandardDimension).</param>
    /// <param name="alpha">α at the design point (unit length, same length as <paramref name="u"/>).</param>
    /// <exception cref="ArgumentException">A length does not match the transformation.</exception>
    public static double[] Compute(IProbabilityTransformation transformation, ReadOnlySpan<double> u, ReadOnlySpan<double> alpha)
    {
        var gamma = ImportanceVector(transformation, u, alpha);
        for (var i = 0; i < gamma.Length; i++) gamma[i] *= gamma[i];
        return gamma;
    }

    /// <summary>
    /// The signed importance vector γ (unit length). For a transformation other than Nataf whose Jacobian is singular
    /// at <paramref name="u"/> it falls back to α.
    /// </summary>
    /// <param name="transformation">The transformation of the problem.</param>
    /// <param name="u">The design point in standard normal space (length StandardDimension).</param>
    /// <param name="alpha">α at the design point (unit length, same length as <paramref name="u"/>).</param>
    /// <exception cref="ArgumentException">A length does not match the transformation.</exception>
    public static double[] ImportanceVector(IProbabilityTransformation transformation, ReadOnlySpan<double> u, ReadOnlySpan<double> alpha)
    {
        ArgumentNullException.ThrowIfNull(transformation);
        var n = transformation.StandardDimension;
        if (u.Length != n) throw new ArgumentException($"u has {u.Length} entries; the transformation has {n} random variables.", nameof(u));
        if (alpha.Length != n) throw new ArgumentException($"alpha has {alpha.Length} entries; the transformation has {n} random variables.", nameof(alpha));

        var y = alpha.ToArray();
        if (transformation.Model.Correlation is null or { IsIdentity: true })
        {
            return Normalized(y);
        }

        if (transformation is NatafTransformation { FictiveCorrelation: { } r0 })
        {
            SolveUpperFromLowerTransposed(r0.CholeskyLower, y);
            return Normalized(y);
        }

        return GeneralJacobian(transformation, u, y);
    }

    /// <summary>Solves Lᵀy = b in place (L lower triangular).</summary>
    private static void SolveUpperFromLowerTransposed(double[,] l, double[] y)
    {
        var n = y.Length;
        for (var i = n - 1; i >= 0; i--)
        {
            var s = y[i];
            for (var k = i + 1; k < n; k++) s -= l[k, i] * y[k];
            y[i] = s / l[i, i];
        }
    }

    private static double[] GeneralJacobian(IProbabilityTransformation t, ReadOnlySpan<double> u, double[] alpha)
    {
        var n = t.StandardDimension;
        var m = t.PhysicalDimension;
        var jac = new double[m * n];
        t.JacobianPhysicalByStandard(u, jac);
        var random = t.Model.RandomIndices;
        // Âᵀ with Â the random rows of J_{x,u}, each scaled to unit norm (the division by D̂).
        var a = new double[n, n];
        for (var k = 0; k < n; k++)
        {
            var row = random[k] * n;
            var norm2 = 0.0;
            for (var j = 0; j < n; j++) norm2 += jac[row + j] * jac[row + j];
            var norm = Math.Sqrt(norm2);
            if (!(norm > 0) || !double.IsFinite(norm)) return Normalized((double[])alpha.Clone());
            for (var j = 0; j < n; j++) a[j, k] = jac[row + j] / norm;
        }

        var y = (double[])alpha.Clone();
        return SolveInPlace(a, y) ? Normalized(y) : Normalized((double[])alpha.Clone());
    }

    /// <summary>Gaussian elimination with partial pivoting; false when the matrix is numerically singular.</summary>
    private static bool SolveInPlace(double[,] a, double[] b)
    {
        var n = b.Length;
        for (var col = 0; col < n; col++)
        {
            var pivot = col;
            for (var r = col + 1; r < n; r++)
            {
                if (Math.Abs(a[r, col]) > Math.Abs(a[pivot, col])) pivot = r;
            }

            if (!(Math.Abs(a[pivot, col]) > 1e-14)) return false;
            if (pivot != col)
            {
                for (var c = 0; c < n; c++) (a[col, c], a[pivot, c]) = (a[pivot, c], a[col, c]);
                (b[col], b[pivot]) = (b[pivot], b[col]);
            }

            for (var r = col + 1; r < n; r++)
            {
                var f = a[r, col] / a[col, col];
                if (f == 0) continue;
                for (var c = col; c < n; c++) a[r, c] -= f * a[col, c];
                b[r] -= f * b[col];
            }
        }

        for (var r = n - 1; r >= 0; r--)
        {
            var s = b[r];
            for (var c = r + 1; c < n; c++) s -= a[r, c] * b[c];
            b[r] = s / a[r, r];
        }

        return true;
    }

    private static double[] Normalized(double[] v)
    {
        var s = 0.0;
        foreach (var e in v) s += e * e;
        var norm = Math.Sqrt(s);
        if (norm > 0 && double.IsFinite(norm))
        {
            for (var i = 0; i < v.Length; i++) v[i] /= norm;
        }

        return v;
    }
}
