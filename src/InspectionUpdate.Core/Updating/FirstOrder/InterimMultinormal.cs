using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>
/// Multinormal orthant probabilities P(Z ≤ b), Z ~ N(0, R) with unit variances, for the first-order updating route.
/// n ≥ 3 is interim: to be replaced by the Reliability layer's multinormal integrator when it lands.
/// </summary>
/// <remarks>
/// n = 1: Φ. n = 2: <see cref="BivariateNormal.Cdf"/> (Genz 2004). n ≥ 3: Genz (1992) separation of variables with a
/// randomly shifted Richtmyer lattice (tent-transformed), fixed shifts so results are reproducible; the error is
/// three standard errors over the shifts.
/// </remarks>
internal static class InterimMultinormal
{
    /// <summary>P(Z ≤ b) and an error estimate (0 for n ≤ 2).</summary>
    public static (double Value, double Error) Cdf(double[] b, double[,] r, int latticePoints = 4096, int shifts = 8)
    {
        var n = b.Length;
        if (n == 0) return (1.0, 0.0);
        if (n == 1) return (StandardNormal.Cdf(b[0]), 0.0);
        if (n == 2) return (BivariateNormal.Cdf(b[0], b[1], Math.Clamp(r[0, 1], -1.0, 1.0)), 0.0);
        return Genz(b, r, latticePoints, shifts);
    }

    private static readonly int[] Primes = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97, 101, 103, 107, 109, 113];

    private static (double, double) Genz(double[] bIn, double[,] rIn, int points, int shifts)
    {
        var n = bIn.Length;
        if (n - 1 > Primes.Length) throw new NotSupportedException($"Multinormal probabilities of dimension {n} are not supported (at most {Primes.Length + 1}).");
        // Most restrictive limits first: a cheap form of the Genz–Bretz reordering that lowers the variance.
        var order = Enumerable.Range(0, n).OrderBy(i => bIn[i]).ToArray();
        var b = order.Select(i => bIn[i]).ToArray();
        var c = new double[n, n];
        for (var j = 0; j < n; j++)
        {
            var d = 1.0;
            for (var k = 0; k < j; k++) d -= c[j, k] * c[j, k];
            if (d <= 1e-14) d = 1e-14; // semidefinite: the variable is (almost) a combination of the earlier ones
            c[j, j] = Math.Sqrt(d);
            for (var i = j + 1; i < n; i++)
            {
                var s = rIn[order[i], order[j]];
                for (var k = 0; k < j; k++) s -= c[i, k] * c[j, k];
                c[i, j] = s / c[j, j];
            }
        }

        var alpha = new double[n - 1];
        for (var i = 0; i < n - 1; i++) alpha[i] = Math.Sqrt(Primes[i]) % 1.0;
        var rng = new Random(20260101);
        var y = new double[n];
        var means = new double[shifts];
        var e1 = StandardNormal.Cdf(b[0] / c[0, 0]);
        for (var s = 0; s < shifts; s++)
        {
            var shift = new double[n - 1];
            for (var i = 0; i < n - 1; i++) shift[i] = rng.NextDouble();
            var sum = 0.0;
            for (var p = 1; p <= points; p++)
            {
                var f = e1;
                var e = e1;
                for (var i = 1; i < n && f > 0; i++)
                {
                    // Baker's tent transform of the lattice point keeps the rule accurate for non-periodic integrands.
                    var w = (p * alpha[i - 1] + shift[i - 1]) % 1.0;
                    w = 1 - Math.Abs(2 * w - 1);
                    var q = Math.Clamp(w * e, 1e-300, 1 - 1e-16);
                    y[i - 1] = StandardNormal.InverseCdf(q);
                    var t = b[i];
                    for (var j = 0; j < i; j++) t -= c[i, j] * y[j];
                    e = StandardNormal.Cdf(t / c[i, i]);
                    f *= e;
                }

                sum += f;
            }

            means[s] = sum / points;
        }

        var mean = means.Average();
        var variance = shifts > 1 ? means.Sum(m => (m - mean) * (m - mean)) / (shifts - 1) : 0.0;
        return (mean, 3.0 * Math.Sqrt(variance / shifts));
    }
}
