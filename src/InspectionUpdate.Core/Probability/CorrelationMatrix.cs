namespace InspectionUpdate.Probability;

/// <summary>
/// A symmetric, positive definite correlation matrix with unit diagonal and off-diagonal entries in (−1, 1).
/// Immutable; validated on construction.
/// </summary>
public sealed class CorrelationMatrix
{
    private readonly double[,] _values;

    /// <summary>Validates and stores the matrix.</summary>
    /// <param name="values">Square matrix.</param>
    /// <param name="label">Used in error messages, e.g. "correlation" or "fictive correlation".</param>
    /// <exception cref="DistributionParameterException">Not square, not symmetric, diagonal ≠ 1, an entry outside (−1, 1), or not positive definite.</exception>
    public CorrelationMatrix(double[,] values, string label = "correlation")
    {
        ArgumentNullException.ThrowIfNull(values);
        var n = values.GetLength(0);
        if (n != values.GetLength(1))
        {
            throw new DistributionParameterException(label, "matrix", $"it is {n}×{values.GetLength(1)}, not square");
        }

        for (var i = 0; i < n; i++)
        {
            if (Math.Abs(values[i, i] - 1.0) > 1e-12)
            {
                throw new DistributionParameterException(label, $"[{i},{i}]", values[i, i], "must equal 1 on the diagonal");
            }

            for (var j = 0; j < i; j++)
            {
                var a = values[i, j];
                if (!double.IsFinite(a) || a <= -1 || a >= 1)
                {
                    throw new DistributionParameterException(label, $"[{i},{j}]", a, "must lie strictly between -1 and 1");
                }

                if (Math.Abs(a - values[j, i]) > 1e-12)
                {
                    throw new DistributionParameterException(label, $"[{i},{j}]", a,
                        FormattableString.Invariant($"must equal the symmetric entry [{j},{i}] = {values[j, i]:R}"));
                }
            }
        }

        _values = (double[,])values.Clone();
        CholeskyLower = Cholesky(_values, label);
    }

    /// <summary>Number of rows (and columns).</summary>
    public int Dimension => _values.GetLength(0);

    /// <summary>Entry (i, j).</summary>
    public double this[int i, int j] => _values[i, j];

    /// <summary>Lower Cholesky factor L with R = L Lᵀ (a copy is not made: do not modify).</summary>
    internal double[,] CholeskyLower { get; }

    /// <summary>True when all off-diagonal entries are zero.</summary>
    public bool IsIdentity
    {
        get
        {
            for (var i = 0; i < Dimension; i++)
                for (var j = 0; j < i; j++)
                {
                    if (_values[i, j] != 0) return false;
                }

            return true;
        }
    }

    /// <summary>Copy of the entries.</summary>
    public double[,] ToArray() => (double[,])_values.Clone();

    /// <summary>The identity of size n.</summary>
    public static CorrelationMatrix Identity(int n)
    {
        var m = new double[n, n];
        for (var i = 0; i < n; i++) m[i, i] = 1;
        return new CorrelationMatrix(m);
    }

    private static double[,] Cholesky(double[,] a, string label)
    {
        var n = a.GetLength(0);
        var l = new double[n, n];
        for (var j = 0; j < n; j++)
        {
            var d = a[j, j];
            for (var k = 0; k < j; k++) d -= l[j, k] * l[j, k];
            if (!(d > 1e-12))
            {
                throw new DistributionParameterException(label, "matrix",
                    FormattableString.Invariant($"it is not positive definite (pivot {j} = {d:G4})"));
            }

            l[j, j] = Math.Sqrt(d);
            for (var i = j + 1; i < n; i++)
            {
                var s = a[i, j];
                for (var k = 0; k < j; k++) s -= l[i, k] * l[j, k];
                l[i, j] = s / l[j, j];
            }
        }

        return l;
    }
}
