using System.Globalization;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// Genz's (1992) separation-of-variables transform of a multivariate normal rectangle probability, with the
/// prioritized, rank-revealing Cholesky factorization and integration by a randomly shifted embedded lattice rule.
/// </summary>
internal sealed class SeparationOfVariables
{
    private const double MaxBound = 38.5;
    private const double CoefficientFloor = 1e-10;

    private readonly int _rank;
    private readonly int[] _groupStart;
    private readonly double[] _lower;
    private readonly double[] _upper;

    // Row k's coefficients at [k·rank, k·rank + level]; the reciprocal of its last (pivot) coefficient apart.
    private readonly double[] _flatCoefficients;
    private readonly double[] _inverseDiagonal;

    private SeparationOfVariables(int rank, int[] groupStart, double[][] coefficients, double[] lower, double[] upper)
    {
        _rank = rank;
        _groupStart = groupStart;
        _lower = lower;
        _upper = upper;
        _flatCoefficients = new double[coefficients.Length * rank];
        _inverseDiagonal = new double[coefficients.Length];
        for (var k = 0; k < coefficients.Length; k++)
        {
            var coef = coefficients[k];
            coef.CopyTo(_flatCoefficients, k * rank);
            _inverseDiagonal[k] = 1 / coef[^1];
        }
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
            var exact = sov.Evaluate(ReadOnlySpan<double>.Empty, Span<double>.Empty);
            return new MultinormalResult(exact, 1e-15, "exact (rank 1 after pivoted Cholesky)", 1) { Rank = 1, StandardError = 1e-15, Diagnostic = note };
        }

        return Vector512.IsHardwareAccelerated
            ? sov.RandomizedLattice<Vector512<double>, Lanes512>(dimension, options, note)
            : sov.RandomizedLattice<Vector256<double>, Lanes256>(dimension, options, note);
    }

    /// <summary><see cref="Integrate"/> with the vector width chosen by the caller (tests compare the widths).</summary>
    internal static MultinormalResult Integrate<TV, TL>(double[] a, double[] b, double[,] r, MultinormalOptions options)
        where TV : struct
        where TL : struct, IVectorLanes<TV>
    {
        var sov = Factorize(a, b, r, options.SingularityTolerance);
        if (sov._rank < 2) throw new ArgumentException("Only for rank 2 or more.", nameof(r));
        return sov.RandomizedLattice<TV, TL>(sov._rank - 1, options, null);
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
        var rank = _rank;
        var coefficients = _flatCoefficients;
        var inverseDiagonal = _inverseDiagonal;
        var lower = _lower;
        var upper = _upper;
        for (var j = 0; j < rank; j++)
        {
            var lo = double.NegativeInfinity;
            var hi = double.PositiveInfinity;
            var yj = y[..j];
            for (var k = _groupStart[j]; k < _groupStart[j + 1]; k++)
            {
                var row = coefficients.AsSpan(k * rank, j);
                var s = 0.0;
                for (var l = 0; l < row.Length; l++) s += row[l] * yj[l];
                // Multiplying by the stored reciprocal instead of dividing: the pivots do not change between points.
                var inverse = inverseDiagonal[k];
                var ak = (lower[k] - s) * inverse;
                var bk = (upper[k] - s) * inverse;
                if (inverse < 0) (ak, bk) = (bk, ak);
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
                if (j < rank - 1) y[j] = -InverseCdf(qLo - w[j] * mass);
            }
            else
            {
                var pLo = lo > -MaxBound ? FastNormal.Cdf(lo) : 0;
                var pHi = hi < MaxBound ? FastNormal.Cdf(hi) : 1;
                mass = pHi - pLo;
                if (j < rank - 1) y[j] = InverseCdf(pLo + w[j] * mass);
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

    /// <summary>
    /// Randomly shifted embedded lattice rule (<see cref="LatticeSequence"/>): each of the independent replicates adds
    /// its own uniform shift to the same points, so the replicate means are independent and unbiased, and their spread
    /// is an honest error estimate. The number of points per replicate doubles until three standard errors meet the
    /// tolerance; doubling keeps the rule a complete lattice and reuses the points already evaluated.
    /// </summary>
    private MultinormalResult RandomizedLattice<TV, TL>(int dimension, MultinormalOptions options, string? note)
        where TV : struct
        where TL : struct, IVectorLanes<TV>
    {
        var integrand = new LaneIntegrand<TV, TL>(_rank, _groupStart, _flatCoefficients, _inverseDiagonal, _lower, _upper, MaxBound);
        var stored = Math.Min(dimension, LatticeSequence.Dimension);
        var generator = LatticeSequence.GeneratingVector[..stored].ToArray();
        var kronecker = KroneckerGenerator(dimension);
        var replicates = options.RandomShifts;
        var random = new Random(options.Seed);
        // shifts[b][s]: shift of replicate s for the b-th pass through the 2^16 lattice points. Passes after the first
        // use fresh shifts, so the replicates stay independent when more points are needed than the lattice has.
        var shifts = new List<double[][]>();
        AddPass(shifts, random, replicates, dimension);

        var sums = new double[replicates];
        long points = 0;
        long target = 1L << LatticeSequence.Log2MinPoints;
        var maxPoints = Math.Max(options.MaxEvaluations / replicates, 1);
        double estimate, standardError;
        var converged = false;

        while (true)
        {
            var from = points;
            var to = Math.Min(target, maxPoints);
            while (((to - 1) >> LatticeSequence.Log2Points) >= shifts.Count) AddPass(shifts, random, replicates, dimension);

            // Each replicate's sum runs over the points in the same order whichever thread computes it, so the result
            // does not depend on the number of threads. Small rounds are not worth the cost of starting tasks.
            if ((to - from) * replicates >= ParallelThreshold)
            {
                Parallel.For(0, replicates, () => new Scratch<TV, TL>(dimension, _rank), (s, _, scratch) =>
                {
                    sums[s] += SumOverPoints(integrand, s, from, to, generator, kronecker, shifts, scratch);
                    return scratch;
                }, _ => { });
            }
            else
            {
                var scratch = new Scratch<TV, TL>(dimension, _rank);
                for (var s = 0; s < replicates; s++) sums[s] += SumOverPoints(integrand, s, from, to, generator, kronecker, shifts, scratch);
            }

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

        var method = string.Create(CultureInfo.InvariantCulture, $"Genz separation of variables, randomly shifted embedded lattice rule ({replicates} shifts, dimension {dimension})");
        var diagnostic = converged
            ? note
            : string.Create(CultureInfo.InvariantCulture, $"Tolerance not met within {options.MaxEvaluations} evaluations (error estimate {3 * standardError:G3}).") + (note is null ? "" : " " + note);
        return new MultinormalResult(Math.Clamp(estimate, 0, 1), 3 * standardError, method, points * replicates)
        {
            Converged = converged,
            Diagnostic = diagnostic,
            Rank = _rank,
            StandardError = standardError,
        };
    }

    private const long ParallelThreshold = 4096;

    /// <summary>
    /// Coordinates transformed by the cubic w = x²(3 − 2x) (weight 6x(1 − x)) instead of the baker's transform.
    /// </summary>
    /// <remarks>
    /// The separated integrand has unbounded derivatives where wⱼ → 0 or 1 (Φ⁻¹ grows faster than the later
    /// conditional probabilities flatten), worst in the leading coordinates that every later factor depends on. The
    /// cubic's vanishing derivative at both ends smooths those out; on all coordinates its weight would multiply the
    /// variance instead (measured on the n = 10 equicorrelated cases: two coordinates halved the points needed for
    /// 1e-5, all coordinates made it worse).
    /// </remarks>
    private const int SmoothedCoordinates = 2;

    private double SumOverPoints<TV, TL>(LaneIntegrand<TV, TL> integrand, int replicate, long from, long to, uint[] generator, double[] kronecker, List<double[][]> shifts, Scratch<TV, TL> scratch)
        where TV : struct
        where TL : struct, IVectorLanes<TV>
    {
        const int quadLanes = 4;
        var lanes = TL.Count;
        var quadsPerGroup = lanes / quadLanes;
        var quads = scratch.Quads;
        var weights = scratch.Weights;
        var sum = 0.0;
        var k = from;
        for (; k + 2 * lanes <= to; k += 2 * lanes)
        {
            for (var q = 0; q < quads.Length; q++) weights[q] = Fill(replicate, k + q * quadLanes, generator, kronecker, shifts, quads[q]);
            for (var j = 0; j < scratch.WA.Length; j++)
            {
                scratch.WA[j] = TL.FromQuads(quads, 0, j);
                scratch.WB[j] = TL.FromQuads(quads, quadsPerGroup, j);
            }

            integrand.Evaluate(scratch.WA, scratch.WB, scratch.YA, scratch.YB, out var fA, out var fB);
            // Added lane by lane in point order, so the sum is the same as one point at a time would give.
            for (var i = 0; i < lanes; i++) sum += weights[i / quadLanes][i % quadLanes] * TL.Get(fA, i);
            for (var i = 0; i < lanes; i++) sum += weights[quadsPerGroup + i / quadLanes][i % quadLanes] * TL.Get(fB, i);
        }

        for (; k < to; k++)
        {
            var weight = Transform(replicate, k, generator, kronecker, shifts, scratch.W, 1, 0);
            if (weight > 0) sum += weight * Evaluate(scratch.W, scratch.Y);
        }

        return sum;
    }

    /// <summary>Points k … k + 3 into the lanes of <paramref name="w4"/>; returns their weights.</summary>
    private static Vector256<double> Fill(int replicate, long k, uint[] generator, double[] kronecker, List<double[][]> shifts, Vector256<double>[] w4)
    {
        var dimension = w4.Length;
        if (generator.Length == dimension && (k >> LatticeSequence.Log2Points) == ((k + 3) >> LatticeSequence.Log2Points))
        {
            return Transform4(replicate, k, generator, shifts, w4);
        }

        // Coordinate j of lane i goes to lanes[4j + i], i.e. into element i of w4[j].
        var lanes = MemoryMarshal.Cast<Vector256<double>, double>(w4.AsSpan());
        const int stride = 4;
        return Vector256.Create(
            Transform(replicate, k, generator, kronecker, shifts, lanes, stride, 0),
            Transform(replicate, k + 1, generator, kronecker, shifts, lanes, stride, 1),
            Transform(replicate, k + 2, generator, kronecker, shifts, lanes, stride, 2),
            Transform(replicate, k + 3, generator, kronecker, shifts, lanes, stride, 3));
    }

    /// <summary>
    /// <see cref="Transform"/> for points k … k + 3 of one pass through the lattice, all coordinates from the stored
    /// vector, one point per lane; the same operations in the same order, so the same numbers.
    /// </summary>
    private static Vector256<double> Transform4(int replicate, long k, uint[] generator, List<double[][]> shifts, Span<Vector256<double>> w)
    {
        const double scale = 1.0 / LatticeSequence.Points;
        var delta = shifts[(int)(k >> LatticeSequence.Log2Points)][replicate];
        const uint mask = LatticeSequence.Points - 1;
        var radicalInverse = Vector256.Create(
            (ulong)LatticeSequence.RadicalInverse((uint)(k & mask)),
            LatticeSequence.RadicalInverse((uint)((k + 1) & mask)),
            LatticeSequence.RadicalInverse((uint)((k + 2) & mask)),
            LatticeSequence.RadicalInverse((uint)((k + 3) & mask)));
        var smoothed = Math.Min(SmoothedCoordinates, delta.Length);
        var weight = Vector256<double>.One;
        var one = Vector256<double>.One;
        for (var j = 0; j < delta.Length; j++)
        {
            var numerator = (radicalInverse * Vector256.Create((ulong)generator[j])) & Vector256.Create((ulong)mask);
            var x = Vector256.ConvertToDouble(numerator) * Vector256.Create(scale) + Vector256.Create(delta[j]);
            x -= Vector256.Floor(x);
            if (j < smoothed)
            {
                weight *= Vector256.Create(6.0) * x * (one - x);
                w[j] = x * x * (Vector256.Create(3.0) - Vector256.Create(2.0) * x);
            }
            else
            {
                w[j] = Vector256.Abs(Vector256.Create(2.0) * x - one);
            }
        }

        return weight;
    }

    /// <summary>
    /// Point k of a replicate, shifted and transformed; coordinate j goes to w[stride·j + offset]. Returns the point's
    /// weight (the Jacobian of the transform).
    /// </summary>
    private static double Transform(int replicate, long k, uint[] generator, double[] kronecker, List<double[][]> shifts, Span<double> w, int stride, int offset)
    {
        const double scale = 1.0 / LatticeSequence.Points;
        var delta = shifts[(int)(k >> LatticeSequence.Log2Points)][replicate];
        var radicalInverse = LatticeSequence.RadicalInverse((uint)(k & (LatticeSequence.Points - 1)));
        var stored = generator.Length;
        var dimension = delta.Length;
        var smoothed = Math.Min(SmoothedCoordinates, dimension);
        var weight = 1.0;
        for (var j = 0; j < dimension; j++)
        {
            var x = j < stored
                ? LatticeSequence.Numerator(radicalInverse, generator[j]) * scale + delta[j]
                : k * kronecker[j] + delta[j];
            x -= Math.Floor(x);
            if (j < smoothed)
            {
                weight *= 6 * x * (1 - x);
                w[stride * j + offset] = x * x * (3 - 2 * x);
            }
            else
            {
                // Baker's (tent) transform: lets the lattice rule's error behaviour for periodic integrands carry
                // over to a non-periodic one (Hickernell 2002).
                w[stride * j + offset] = Math.Abs(2 * x - 1);
            }
        }

        return weight;
    }

    private static void AddPass(List<double[][]> shifts, Random random, int replicates, int dimension)
    {
        var pass = new double[replicates][];
        for (var s = 0; s < replicates; s++)
        {
            pass[s] = new double[dimension];
            for (var j = 0; j < dimension; j++) pass[s][j] = random.NextDouble();
        }

        shifts.Add(pass);
    }

    private sealed class Scratch<TV, TL>(int dimension, int rank)
        where TV : struct
        where TL : struct, IVectorLanes<TV>
    {
        public double[] W { get; } = new double[dimension];

        public double[] Y { get; } = new double[rank];

        /// <summary>Points in groups of four, as the lattice is generated: two vector groups' worth.</summary>
        public Vector256<double>[][] Quads { get; } = Enumerable.Range(0, 2 * TL.Count / 4).Select(_ => new Vector256<double>[dimension]).ToArray();

        public Vector256<double>[] Weights { get; } = new Vector256<double>[2 * TL.Count / 4];

        public TV[] WA { get; } = new TV[dimension];

        public TV[] WB { get; } = new TV[dimension];

        public TV[] YA { get; } = new TV[rank];

        public TV[] YB { get; } = new TV[rank];
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

    /// <summary>
    /// Richtmyer's generator, fractional parts of the square roots of the first primes, for the coordinates beyond the
    /// stored lattice vector (only those entries are used).
    /// </summary>
    private static double[] KroneckerGenerator(int dimension)
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
