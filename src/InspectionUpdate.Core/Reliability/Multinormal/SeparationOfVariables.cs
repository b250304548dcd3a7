using System.Globalization;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// Genz's (1992) separation-of-variables transform of a multivariate normal rectangle probability, with the
/// prioritized, rank-revealing Cholesky factorization and randomized Richtmyer lattice integration.
/// </summary>
internal sealed class SeparationOfVariables
{
    private const double MaxBound = 38.5;
    private const double CoefficientFloor = 1e-10;

    private readonly int _rank;
    private readonly int[] _groupStart;
    private readonly double[][] _coefficients;
    private readonly double[] _lower;
    private readonly double[] _upper;

    private SeparationOfVariables(int rank, int[] groupStart, double[][] coefficients, double[] lower, double[] upper)
    {
        _rank = rank;
        _groupStart = groupStart;
        _coefficients = coefficients;
        _lower = lower;
        _upper = upper;
    }

    public static MultinormalResult Integrate(double[] a, double[] b, double[,] r, MultinormalOptions options)
    {
        var sov = Factorize(a, b, r, options.SingularityTolerance);
        var note = sov._rank < a.Length
            ? string.Create(CultureInfo.InvariantCulture, $"The correlation matrix has numerical rank {sov._rank} < {a.Length}; dependent variables were folded into the bounds of the ones they repeat.")
            : null;
        var dimension = sov._rank - 1;
        if (dimension == 0)
        {
            var exact = sov.Evaluate([], []);
            return new MultinormalResult(exact, 1e-15, "exact (rank 1 after pivoted Cholesky)", 1) { Rank = 1, StandardError = 1e-15, Diagnostic = note };
        }

        return sov.RandomizedLattice(dimension, options, note);
    }

    /// <summary>
    /// Pivoted Cholesky with Genz &amp; Bretz's prioritization: the next variable is the one whose conditional
    /// probability, given the truncated means of those before it, is smallest. Variables whose conditional variance is
    /// below the tolerance join the constraint group of the last variable they depend on.
    /// </summary>
    private static SeparationOfVariables Factorize(double[] a, double[] b, double[,] r, double tolerance)
    {
        var n = a.Length;
        var c = new double[n, n];
        var variance = new double[n];
        Array.Fill(variance, 1.0);
        var active = new bool[n];
        Array.Fill(active, true);
        var level = new int[n];
        var yBar = new double[n];
        var rank = 0;
        var remaining = n;

        while (remaining > 0)
        {
            for (var i = 0; i < n; i++)
            {
                if (!active[i]) continue;
                if (variance[i] < -1e-8)
                {
                    throw new ArgumentException(
                        string.Create(CultureInfo.InvariantCulture, $"The correlation matrix is not positive semi-definite (conditional variance of variable {i} is {variance[i]:G4})."),
                        "correlation");
                }

                if (variance[i] > tolerance) continue;
                var last = -1;
                for (var l = rank - 1; l >= 0; l--)
                {
                    if (Math.Abs(c[i, l]) > CoefficientFloor)
                    {
                        last = l;
                        break;
                    }
                }

                if (last < 0)
                {
                    throw new ArgumentException(
                        string.Create(CultureInfo.InvariantCulture, $"Variable {i} has vanishing conditional variance but no dependence on earlier variables: the correlation matrix is not valid."),
                        "correlation");
                }

                level[i] = last;
                active[i] = false;
                remaining--;
            }

            if (remaining == 0) break;

            var best = -1;
            var bestMass = double.PositiveInfinity;
            double bestLo = 0, bestHi = 0;
            for (var i = 0; i < n; i++)
            {
                if (!active[i]) continue;
                var sigma = Math.Sqrt(variance[i]);
                var s = 0.0;
                for (var l = 0; l < rank; l++) s += c[i, l] * yBar[l];
                var lo = (a[i] - s) / sigma;
                var hi = (b[i] - s) / sigma;
                var mass = MultivariateNormal.IntervalMass(lo, hi);
                if (mass < bestMass)
                {
                    bestMass = mass;
                    best = i;
                    bestLo = lo;
                    bestHi = hi;
                }
            }

            var pivot = Math.Sqrt(variance[best]);
            c[best, rank] = pivot;
            for (var i = 0; i < n; i++)
            {
                if (!active[i] || i == best) continue;
                var s = r[i, best];
                for (var l = 0; l < rank; l++) s -= c[i, l] * c[best, l];
                c[i, rank] = s / pivot;
                variance[i] -= c[i, rank] * c[i, rank];
            }

            yBar[rank] = TruncatedMean(bestLo, bestHi, bestMass);
            level[best] = rank;
            active[best] = false;
            remaining--;
            rank++;
        }

        // Rows sorted by level; a row's coefficients run over levels 0..its level.
        var rows = Enumerable.Range(0, n).OrderBy(i => level[i]).ThenBy(i => i).ToArray();
        var groupStart = new int[rank + 1];
        var coefficients = new double[n][];
        var lower = new double[n];
        var upper = new double[n];
        for (var k = 0; k < n; k++)
        {
            var i = rows[k];
            var lv = level[i];
            var coef = new double[lv + 1];
            for (var l = 0; l <= lv; l++) coef[l] = c[i, l];
            coefficients[k] = coef;
            lower[k] = a[i];
            upper[k] = b[i];
            groupStart[lv + 1] = k + 1;
        }

        for (var j = 1; j <= rank; j++) groupStart[j] = Math.Max(groupStart[j], groupStart[j - 1]);
        return new SeparationOfVariables(rank, groupStart, coefficients, lower, upper);
    }

    private static double TruncatedMean(double lo, double hi, double mass)
    {
        lo = Math.Max(lo, -MaxBound);
        hi = Math.Min(hi, MaxBound);
        if (mass > 1e-300)
        {
            var mean = (StandardNormal.Pdf(lo) - StandardNormal.Pdf(hi)) / mass;
            return Math.Clamp(mean, lo, hi);
        }

        return lo > 0 ? lo : hi;
    }

    /// <summary>The separated integrand at w ∈ [0,1]^(rank−1); <paramref name="y"/> is scratch of length rank.</summary>
    private double Evaluate(ReadOnlySpan<double> w, Span<double> y)
    {
        var product = 1.0;
        for (var j = 0; j < _rank; j++)
        {
            var lo = double.NegativeInfinity;
            var hi = double.PositiveInfinity;
            for (var k = _groupStart[j]; k < _groupStart[j + 1]; k++)
            {
                var coef = _coefficients[k];
                var s = 0.0;
                for (var l = 0; l < j; l++) s += coef[l] * y[l];
                var cj = coef[j];
                var ak = (_lower[k] - s) / cj;
                var bk = (_upper[k] - s) / cj;
                if (cj < 0) (ak, bk) = (bk, ak);
                if (ak > lo) lo = ak;
                if (bk < hi) hi = bk;
            }

            if (!(hi > lo)) return 0;
            double mass;
            if (lo > 0)
            {
                var qLo = FastNormal.Ccdf(lo);
                var qHi = hi < MaxBound ? FastNormal.Ccdf(hi) : 0;
                mass = qLo - qHi;
                if (j < _rank - 1) y[j] = -InverseCdf(qLo - w[j] * mass);
            }
            else
            {
                var pLo = lo > -MaxBound ? FastNormal.Cdf(lo) : 0;
                var pHi = hi < MaxBound ? FastNormal.Cdf(hi) : 1;
                mass = pHi - pLo;
                if (j < _rank - 1) y[j] = InverseCdf(pLo + w[j] * mass);
            }

            product *= mass;
            if (!(product > 0)) return 0;
        }

        return product;
    }

    private static double InverseCdf(double p)
    {
        if (!(p > 0)) return -MaxBound;
        if (!(p < 1)) return MaxBound;
        return Math.Clamp(FastNormal.InverseCdf(p), -MaxBound, MaxBound);
    }

    private MultinormalResult RandomizedLattice(int dimension, MultinormalOptions options, string? note)
    {
        var generator = RichtmyerGenerator(dimension);
        var shifts = options.RandomShifts;
        var random = new Random(options.Seed);
        var shift = new double[shifts][];
        for (var s = 0; s < shifts; s++)
        {
            shift[s] = new double[dimension];
            for (var j = 0; j < dimension; j++) shift[s][j] = random.NextDouble();
        }

        var sums = new double[shifts];
        long points = 0;
        long target = 64;
        var perPointCost = 2L * shifts;
        var maxPoints = Math.Max(options.MaxEvaluations / perPointCost, 1);
        double estimate, standardError;
        var converged = false;

        while (true)
        {
            var from = points;
            var to = Math.Min(target, maxPoints);
            Parallel.For(0, shifts, () => (W: new double[dimension], V: new double[dimension], Y: new double[_rank]), (s, _, scratch) =>
            {
                var sum = 0.0;
                var delta = shift[s];
                for (var k = from + 1; k <= to; k++)
                {
                    for (var j = 0; j < dimension; j++)
                    {
                        var x = k * generator[j] + delta[j];
                        x -= Math.Floor(x);
                        // Baker's (tent) periodization; the antithetic point is 1 − w.
                        var t = Math.Abs(2 * x - 1);
                        scratch.W[j] = t;
                        scratch.V[j] = 1 - t;
                    }

                    sum += 0.5 * (Evaluate(scratch.W, scratch.Y) + Evaluate(scratch.V, scratch.Y));
                }

                sums[s] += sum;
                return scratch;
            }, _ => { });

            points = to;
            (estimate, standardError) = MeanAndStandardError(sums, points);
            var tolerance = Math.Max(options.AbsoluteTolerance, options.RelativeTolerance * estimate);
            if (3 * standardError <= tolerance)
            {
                converged = true;
                break;
            }

            if (points >= maxPoints) break;
            target = Math.Min(2 * points, maxPoints);
        }

        var method = string.Create(CultureInfo.InvariantCulture, $"Genz separation of variables, randomized Richtmyer lattice ({shifts} shifts, dimension {dimension})");
        var diagnostic = converged
            ? note
            : string.Create(CultureInfo.InvariantCulture, $"Tolerance not met within {options.MaxEvaluations} evaluations (error estimate {3 * standardError:G3}).") + (note is null ? "" : " " + note);
        return new MultinormalResult(Math.Clamp(estimate, 0, 1), 3 * standardError, method, points * perPointCost)
        {
            Converged = converged,
            Diagnostic = diagnostic,
            Rank = _rank,
            StandardError = standardError,
        };
    }

    private static (double Mean, double StandardError) MeanAndStandardError(double[] sums, long points)
    {
        var m = sums.Length;
        var mean = 0.0;
        for (var s = 0; s < m; s++) mean += sums[s] / points;
        mean /= m;
        var ss = 0.0;
        for (var s = 0; s < m; s++)
        {
            var d = sums[s] / points - mean;
            ss += d * d;
        }

        return (mean, Math.Sqrt(ss / (m - 1) / m));
    }

    /// <summary>Richtmyer's generator: fractional parts of the square roots of the first primes.</summary>
    private static double[] RichtmyerGenerator(int dimension)
    {
        var z = new double[dimension];
        var found = 0;
        for (var p = 2; found < dimension; p++)
        {
            var prime = true;
            for (var d = 2; d * d <= p; d++)
            {
                if (p % d == 0)
                {
                    prime = false;
                    break;
                }
            }

            if (!prime) continue;
            var root = Math.Sqrt(p);
            z[found++] = root - Math.Floor(root);
        }

        return z;
    }
}
