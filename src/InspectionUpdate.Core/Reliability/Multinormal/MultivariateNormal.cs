using System.Globalization;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// Multivariate standard normal probabilities Φₙ(b; R) = P(X ≤ b) and rectangle probabilities P(a ≤ X ≤ b) for a
/// correlation matrix R (unit diagonal, positive semi-definite; singular matrices allowed).
/// </summary>
/// <remarks>
/// <para>Closed forms and deterministic quadrature where they exist: n = 1 (Φ), n = 2 (<see cref="BivariateNormal"/>),
/// n = 3 (Plackett's reduction to a one-dimensional integral, as in Genz 2004).</para>
/// <para>Otherwise Genz's (1992, J. Comput. Graph. Stat. 1:141–150) separation of variables: a Cholesky factor
/// turns the integral into one over the unit cube of dimension rank − 1, integrated by an embedded rank-1 lattice rule
/// (component-by-component generating vector, Cools, Kuo &amp; Nuyens 2006) with random shifts, a polynomial smoothing
/// of the two leading coordinates and the baker's (tent) transform of the others; the error estimate comes from the
/// spread over the shifts. The variables are reordered while factorizing (Genz &amp; Bretz 2009, §4.1.3: at each step
/// the variable with the smallest conditional probability comes next). The factorization is rank-revealing: a
/// variable whose conditional variance falls below <see cref="MultinormalOptions.SingularityTolerance"/> (e.g. two
/// events with the same α) is a linear combination of earlier ones, and its bounds are folded into the bounds of the
/// last variable it depends on instead of dividing by a zero pivot.</para>
/// <para>Bounds of ±∞ are allowed. A variable with bounds (−∞, +∞) is dropped; a bound pair with a ≥ b gives 0.</para>
/// </remarks>
public static class MultivariateNormal
{
    private const double MaxBound = 38.5;

    /// <summary>Φₙ(b; R) = P(X₁ ≤ b₁, …, Xₙ ≤ bₙ).</summary>
    /// <param name="upper">Upper bounds b (±∞ allowed, NaN not).</param>
    /// <param name="correlation">Correlation matrix R, n × n, symmetric, unit diagonal, positive semi-definite.</param>
    /// <param name="options">Integration settings; null for <see cref="MultinormalOptions.Default"/>.</param>
    /// <exception cref="ArgumentException">Sizes differ, a bound is NaN, or R is not a valid correlation matrix (the message names the entry).</exception>
    public static MultinormalResult Cdf(IReadOnlyList<double> upper, double[,] correlation, MultinormalOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(upper);
        var lower = new double[upper.Count];
        Array.Fill(lower, double.NegativeInfinity);
        return Probability(lower, upper, correlation, options);
    }

    /// <summary>P(X₁ &gt; a₁, …, Xₙ &gt; aₙ) = Φₙ(−a; R).</summary>
    /// <exception cref="ArgumentException">See <see cref="Cdf"/>.</exception>
    public static MultinormalResult UpperCdf(IReadOnlyList<double> lower, double[,] correlation, MultinormalOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(lower);
        return Cdf(lower.Select(a => -a).ToArray(), correlation, options);
    }

    /// <summary>The orthant probability P(X ≤ 0) = P(X &gt; 0).</summary>
    /// <exception cref="ArgumentException">See <see cref="Cdf"/>.</exception>
    public static MultinormalResult Orthant(double[,] correlation, MultinormalOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        return Cdf(new double[correlation.GetLength(0)], correlation, options);
    }

    /// <summary>The rectangle probability P(a ≤ X ≤ b).</summary>
    /// <param name="lower">Lower bounds a (−∞ allowed).</param>
    /// <param name="upper">Upper bounds b (+∞ allowed).</param>
    /// <param name="correlation">Correlation matrix R.</param>
    /// <param name="options">Integration settings.</param>
    /// <exception cref="ArgumentException">See <see cref="Cdf"/>.</exception>
    public static MultinormalResult Probability(IReadOnlyList<double> lower, IReadOnlyList<double> upper, double[,] correlation, MultinormalOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(lower);
        ArgumentNullException.ThrowIfNull(upper);
        ArgumentNullException.ThrowIfNull(correlation);
        options ??= MultinormalOptions.Default;
        options.Validate();
        var n = upper.Count;
        if (lower.Count != n)
        {
            throw new ArgumentException($"The lower bounds have {lower.Count} entries but the upper bounds have {n}.", nameof(lower));
        }

        ValidateCorrelation(correlation, n);

        var keep = new List<int>(n);
        for (var i = 0; i < n; i++)
        {
            if (double.IsNaN(lower[i])) throw new ArgumentException($"Lower bound [{i}] is NaN.", nameof(lower));
            if (double.IsNaN(upper[i])) throw new ArgumentException($"Upper bound [{i}] is NaN.", nameof(upper));
            if (lower[i] >= upper[i] || upper[i] == double.NegativeInfinity || lower[i] == double.PositiveInfinity)
            {
                return new MultinormalResult(0, 0, "exact (empty interval)", 0) { StandardError = 0 };
            }

            if (lower[i] > double.NegativeInfinity || upper[i] < double.PositiveInfinity) keep.Add(i);
        }

        var m = keep.Count;
        var a = new double[m];
        var b = new double[m];
        var r = new double[m, m];
        for (var i = 0; i < m; i++)
        {
            a[i] = lower[keep[i]];
            b[i] = upper[keep[i]];
            for (var j = 0; j < m; j++) r[i, j] = correlation[keep[i], keep[j]];
        }

        return Integrate(a, b, r, options);
    }

    private static MultinormalResult Integrate(double[] a, double[] b, double[,] r, MultinormalOptions options)
    {
        var n = a.Length;
        var lowerInfinite = a.All(double.IsNegativeInfinity);
        switch (n)
        {
            case 0:
                return new MultinormalResult(1, 0, "exact (no constraint)", 0) { Rank = 0 };
            case 1:
                return new MultinormalResult(IntervalMass(a[0], b[0]), 1e-16, "exact (univariate)", 0) { Rank = 1, StandardError = 1e-16 };
            case 2:
                {
                    var p = lowerInfinite
                        ? BivariateNormal.Cdf(b[0], b[1], r[0, 1])
                        : BivariateRectangle(a, b, r[0, 1]);
                    var rank = Math.Abs(r[0, 1]) == 1 ? 1 : 2;
                    return new MultinormalResult(Math.Clamp(p, 0, 1), 1e-15, "bivariate (Genz 2004)", 0) { Rank = rank, StandardError = 1e-15 };
                }

            case 3 when lowerInfinite && IsSafelyPositiveDefinite3(r):
                {
                    // A nearly singular matrix can make the one-dimensional integrand too steep for the quadrature's
                    // budget: then separation of variables below takes over.
                    var (p, err, converged) = TrivariateNormal.Cdf(b, r);
                    if (converged)
                    {
                        return new MultinormalResult(p, err, "trivariate (Plackett reduction, adaptive Gauss–Kronrod)", 0) { Rank = 3, StandardError = err };
                    }

                    break;
                }
        }

        return SeparationOfVariables.Integrate(a, b, r, options);
    }

    /// <summary>P(a ≤ X ≤ b) for a pair by inclusion–exclusion of bivariate CDFs.</summary>
    private static double BivariateRectangle(double[] a, double[] b, double rho) =>
        BivariateNormal.Cdf(b[0], b[1], rho) - BivariateNormal.Cdf(a[0], b[1], rho)
        - BivariateNormal.Cdf(b[0], a[1], rho) + BivariateNormal.Cdf(a[0], a[1], rho);

    private static bool IsSafelyPositiveDefinite3(double[,] r)
    {
        var det = 1 - r[0, 1] * r[0, 1] - r[0, 2] * r[0, 2] - r[1, 2] * r[1, 2] + 2 * r[0, 1] * r[0, 2] * r[1, 2];
        return det > 1e-10 && Math.Abs(r[0, 1]) < 1 && Math.Abs(r[0, 2]) < 1 && Math.Abs(r[1, 2]) < 1;
    }

    /// <summary>P(lo ≤ X ≤ hi) computed in the tail where it does not cancel.</summary>
    internal static double IntervalMass(double lo, double hi)
    {
        if (hi <= lo) return 0;
        return lo > 0 ? StandardNormal.Ccdf(lo) - StandardNormal.Ccdf(hi) : StandardNormal.Cdf(hi) - StandardNormal.Cdf(lo);
    }

    internal static void ValidateCorrelation(double[,] correlation, int n)
    {
        if (correlation.GetLength(0) != n || correlation.GetLength(1) != n)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"The correlation matrix is {correlation.GetLength(0)}×{correlation.GetLength(1)} but there are {n} bounds."),
                nameof(correlation));
        }

        for (var i = 0; i < n; i++)
        {
            if (Math.Abs(correlation[i, i] - 1) > 1e-12)
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"Correlation [{i},{i}] = {correlation[i, i]} must equal 1."), nameof(correlation));
            }

            for (var j = 0; j < i; j++)
            {
                var v = correlation[i, j];
                if (!(v >= -1 && v <= 1))
                {
                    throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"Correlation [{i},{j}] = {v} must lie in [-1, 1]."), nameof(correlation));
                }

                if (Math.Abs(v - correlation[j, i]) > 1e-12)
                {
                    throw new ArgumentException(
                        string.Create(CultureInfo.InvariantCulture, $"Correlation [{i},{j}] = {v} differs from the symmetric entry [{j},{i}] = {correlation[j, i]}."),
                        nameof(correlation));
                }
            }
        }
    }

    internal static double ClampBound(double x) => Math.Clamp(x, -MaxBound, MaxBound);
}
