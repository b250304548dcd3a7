using InspectionUpdate.Reliability.Multinormal;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>
/// First-order updating on linearized events (Madsen 1987; DESIGN §3): with Z_i = −α_iᵀU, ρ_ij = α_iᵀα_j, the
/// equalities fix Z_E = −β_E; the others are conditionally normal with mean R_OE R_EE⁻¹(−β_E) and covariance
/// R_OO − R_OE R_EE⁻¹ R_EO, and P(F | I, E) = P(F ∩ I | E) / P(I | E) are multinormal orthant probabilities
/// (<see cref="MultivariateNormal.Cdf"/>).
/// </summary>
internal static class GaussianConditioning
{
    /// <summary>Result of one conditioning.</summary>
    /// <param name="Joint">P(F ∩ I | E) (or P(I | E) without a failure event).</param>
    /// <param name="Evidence">P(I | E) (1 without inequalities).</param>
    /// <param name="Error">Integration error bound of <see cref="Joint"/>/<see cref="Evidence"/> (relative, combined).</param>
    /// <param name="Problem">Why the computation is not valid, or null.</param>
    public sealed record Result(double Joint, double Evidence, double Error, string? Problem)
    {
        public double Conditional => Joint / Evidence;
    }

    /// <summary>P(F ∩ I | E) and P(I | E) with F, I, E linearized. <paramref name="failure"/> null gives P(I | E) twice.</summary>
    /// <remarks><paramref name="denominator"/>, when given, is P(I | E) computed before (it does not depend on time).</remarks>
    public static Result Evaluate(LinearizedEvent? failure, IReadOnlyList<LinearizedEvent> inequalities, IReadOnlyList<LinearizedEvent> equalities,
        (double Value, double Error, string? Problem)? denominator = null, double relativeError = 5e-3)
    {
        var others = new List<LinearizedEvent>();
        if (failure is not null) others.Add(failure);
        others.AddRange(inequalities);
        var (joint, e1, p1) = Orthant(others, equalities, relativeError);
        if (p1 is not null) return new Result(joint, double.NaN, double.NaN, p1);
        if (failure is null) return new Result(joint, joint, e1, null);
        var (evidence, e2, p2) = denominator ?? Orthant(inequalities, equalities);
        if (p2 is not null) return new Result(joint, evidence, double.NaN, p2);
        if (!(evidence > 0))
        {
            return new Result(joint, evidence, double.NaN, "The linearized evidence has probability 0: the findings contradict the model at first order.");
        }

        var rel = (joint > 0 ? e1 / joint : 0) + e2 / evidence;
        return new Result(joint, evidence, rel, null);
    }

    /// <summary>P(Z_I ≤ −β_I | Z_E = −β_E) with its error, or the reason it cannot be computed.</summary>
    public static (double Value, double Error, string? Problem) Orthant(IReadOnlyList<LinearizedEvent> ineq, IReadOnlyList<LinearizedEvent> eq, double relativeError = 5e-3)
    {
        var m = eq.Count;
        var n = ineq.Count;
        if (n == 0) return (1.0, 0.0, null);
        var mean = new double[n];
        var cov = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) cov[i, j] = Dot(ineq[i].Alpha, ineq[j].Alpha);

        if (m > 0)
        {
            var ree = Matrix<double>.Build.Dense(m, m, (i, j) => Dot(eq[i].Alpha, eq[j].Alpha));
            var roe = Matrix<double>.Build.Dense(n, m, (i, j) => Dot(ineq[i].Alpha, eq[j].Alpha));
            var zE = Vector<double>.Build.Dense(m, j => -eq[j].Beta);
            var evd = ree.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
            var minEig = evd.EigenValues.Real().Minimum();
            if (!(minEig > 1e-10))
            {
                return (double.NaN, double.NaN, FormattableString.Invariant(
                    $"The equality events are (nearly) linearly dependent at first order (smallest eigenvalue of their correlation matrix {minEig:G3}): two measurements carry the same information without independent errors."));
            }

            // R_EE is small (one row per sized finding): a plain Cholesky solve here, because the library's solve with
            // a matrix right-hand side spins up parallel workers that cost more than the arithmetic.
            var lower = CholeskyLower(ree);
            var w = SolveWith(lower, zE.ToArray());
            for (var i = 0; i < n; i++)
            {
                var row = new double[m];
                for (var j = 0; j < m; j++) row[j] = roe[i, j];
                var k = SolveWith(lower, row); // R_EE⁻¹ R_EOᵀ, column i
                for (var j = 0; j < m; j++) mean[i] += roe[i, j] * w[j];
                for (var b = 0; b < n; b++)
                {
                    for (var j = 0; j < m; j++) cov[b, i] -= roe[b, j] * k[j];
                }
            }
        }

        // Standardize; an event whose conditional variance vanishes is decided by the equalities.
        var limits = new List<double>();
        var keep = new List<int>();
        for (var i = 0; i < n; i++)
        {
            var variance = cov[i, i];
            var limit = -ineq[i].Beta - mean[i];
            if (variance < 1e-14)
            {
                if (limit < 0) return (0.0, 0.0, null);
                continue;
            }

            keep.Add(i);
            limits.Add(limit / Math.Sqrt(variance));
        }

        var r = new double[keep.Count, keep.Count];
        for (var a = 0; a < keep.Count; a++)
            for (var b = 0; b < keep.Count; b++)
            {
                r[a, b] = a == b ? 1.0 : Math.Clamp(cov[keep[a], keep[b]] / Math.Sqrt(cov[keep[a], keep[a]] * cov[keep[b], keep[b]]), -1.0, 1.0);
            }

        // Limits above 8.5 hold with probability above 1 − 1e-17: dropping them keeps the dimension down.
        var kept = Enumerable.Range(0, limits.Count).Where(i => !(limits[i] > 8.5)).ToArray();
        if (kept.Length == 0) return (1.0, 0.0, null);
        var rk = new double[kept.Length, kept.Length];
        for (var a = 0; a < kept.Length; a++)
            for (var b = 0; b < kept.Length; b++) rk[a, b] = r[kept[a], kept[b]];
        // Fixed seed (common random numbers): the lattice error is smooth in t, so ΔPf differences stay clean.
        var options = new MultinormalOptions { RelativeTolerance = relativeError, AbsoluteTolerance = 1e-300, MaxEvaluations = 400_000 };
        var result = MultivariateNormal.Cdf(kept.Select(i => limits[i]).ToArray(), rk, options);
        return result.Converged || result.ErrorEstimate <= 0.05 * result.Value
            ? (result.Value, result.ErrorEstimate, null)
            : (result.Value, result.ErrorEstimate, "The multinormal integration did not reach its tolerance: " + result.Diagnostic);
    }

    internal static double Dot(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        var s = 0.0;
        for (var i = 0; i < a.Count; i++) s += a[i] * b[i];
        return s;
    }

    /// <summary>Lower Cholesky factor of a symmetric positive definite matrix (checked positive definite by the caller).</summary>
    private static double[,] CholeskyLower(Matrix<double> a)
    {
        var m = a.RowCount;
        var l = new double[m, m];
        for (var i = 0; i < m; i++)
        {
            for (var j = 0; j <= i; j++)
            {
                var s = a[i, j];
                for (var k = 0; k < j; k++) s -= l[i, k] * l[j, k];
                l[i, j] = i == j ? Math.Sqrt(s) : s / l[j, j];
            }
        }

        return l;
    }

    /// <summary>x with L Lᵀ x = b.</summary>
    private static double[] SolveWith(double[,] l, double[] b)
    {
        var m = b.Length;
        var y = new double[m];
        for (var i = 0; i < m; i++)
        {
            var s = b[i];
            for (var k = 0; k < i; k++) s -= l[i, k] * y[k];
            y[i] = s / l[i, i];
        }

        var x = new double[m];
        for (var i = m - 1; i >= 0; i--)
        {
            var s = y[i];
            for (var k = i + 1; k < m; k++) s -= l[k, i] * x[k];
            x[i] = s / l[i, i];
        }

        return x;
    }
}
