using System.Numerics;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// An embedded (extensible) rank-1 lattice sequence in base 2: point k is frac(φ₂(k)·z), where φ₂ is the base-2
/// radical inverse, so the first 2^m points of the sequence are exactly the rank-1 lattice with 2^m points and
/// generating vector z (Cools, Kuo &amp; Nuyens 2006, SIAM J. Sci. Comput. 28:2162–2188). Doubling the number of
/// points therefore reuses every point already evaluated.
/// </summary>
/// <remarks>
/// The generating vector was computed with <see cref="Construct"/> (component-by-component, Nuyens &amp; Cools 2006,
/// with Cools, Kuo &amp; Nuyens's criterion for embedded rules): 2^16 points, at most 64 coordinates, product weights
/// γⱼ = 1/j in the Korobov space of smoothness 2 (kernel 1 + γⱼ·2π²B₂(x)), each coordinate minimizing the largest
/// ratio of its shift-averaged worst-case error to the best one attainable, over the rules with 2^6 … 2^16 points.
/// A unit test re-runs the construction for the leading coordinates and compares.
/// </remarks>
internal static class LatticeSequence
{
    /// <summary>log₂ of the number of points after which the sequence repeats.</summary>
    public const int Log2Points = 16;

    /// <summary>Smallest rule size the embedded criterion takes into account.</summary>
    public const int Log2MinPoints = 6;

    /// <summary>Number of points after which the sequence repeats (2^16).</summary>
    public const int Points = 1 << Log2Points;

    /// <summary>Coordinates of the stored generating vector; coordinates beyond use a Kronecker sequence instead.</summary>
    public static int Dimension => GeneratingVector.Length;

    /// <summary>The generating vector z (odd integers below 2^15), from <see cref="Construct"/>(16, 64, 6).</summary>
    public static ReadOnlySpan<uint> GeneratingVector =>
    [
        1, 22831, 5595, 25195, 26485, 12855, 22287, 3557, 22623, 12199,
        5653, 32189, 19753, 4465, 6313, 12803, 3753, 1727, 30969, 1035,
        23561, 10325, 22331, 19031, 9497, 29341, 17765, 27669, 22199, 19221,
        19005, 14411, 13443, 7355, 13753, 18665, 17975, 4217, 10891, 25279,
        1357, 11053, 26175, 17697, 8925, 29723, 17081, 27011, 19589, 30693,
        20513, 31073, 7825, 10685, 20865, 11023, 11727, 32365, 14837, 29431,
        19193, 21511, 32115, 31543,
    ];

    /// <summary>The numerator of coordinate j of point k (0 ≤ k &lt; 2^16): the point is numerator / 2^16.</summary>
    public static uint Numerator(uint radicalInverse, uint z) => (radicalInverse * z) & (Points - 1);

    /// <summary>The base-2 radical inverse of k (0 ≤ k &lt; 2^16) as a 16-bit integer: the bits of k reversed.</summary>
    public static uint RadicalInverse(uint k)
    {
        // Swap adjacent bits, pairs, nibbles, bytes and half-words: a 32-bit reversal; the 16 bits of k end up on top.
        k = ((k >> 1) & 0x55555555u) | ((k & 0x55555555u) << 1);
        k = ((k >> 2) & 0x33333333u) | ((k & 0x33333333u) << 2);
        k = ((k >> 4) & 0x0F0F0F0Fu) | ((k & 0x0F0F0F0Fu) << 4);
        k = ((k >> 8) & 0x00FF00FFu) | ((k & 0x00FF00FFu) << 8);
        k = (k >> 16) | (k << 16);
        return k >> (32 - Log2Points);
    }

    /// <summary>
    /// Component-by-component construction of an embedded lattice generating vector for 2^<paramref name="log2Points"/>
    /// points: coordinate j is the odd z &lt; 2^(m−1) that minimizes max over m' in [<paramref name="log2MinPoints"/>, m]
    /// of e²(m', z) / min over z' of e²(m', z'), e² being the squared shift-averaged worst-case error of the rule with
    /// 2^m' points in the Korobov space of smoothness 2 with product weights γⱼ = 1/j. Ties go to the smaller z.
    /// </summary>
    /// <remarks>O(d·N²) work for N = 2^m points (about a second per coordinate for N = 2^16 on two cores).</remarks>
    internal static uint[] Construct(int log2Points, int dimension, int log2MinPoints)
    {
        var n = 1 << log2Points;
        var mask = (uint)(n - 1);
        var omega = new double[n];
        for (var k = 0; k < n; k++)
        {
            var x = (double)k / n;
            omega[k] = 2 * Math.PI * Math.PI * (x * x - x + 1.0 / 6);
        }

        // product[k] = Π over the chosen coordinates of (1 + γⱼ ω(k zⱼ / N)).
        var product = new double[n];
        Array.Fill(product, 1.0);
        var z = new uint[dimension];
        var candidates = n / 4;
        var errors = new double[candidates][];
        for (var j = 0; j < dimension; j++)
        {
            var gamma = 1.0 / (j + 1.0);
            if (j == 0 || n < 4)
            {
                z[j] = 1;
            }
            else
            {
                Parallel.For(0, candidates, c =>
                {
                    var zc = (uint)(2 * c + 1);
                    // bucket[t]: sum over the k whose lowest set bit is t (k = 0 in bucket m); the rule with 2^m' points
                    // uses the k divisible by 2^(m − m'), i.e. buckets t ≥ m − m'.
                    var bucket = new double[log2Points + 1];
                    var index = 0u;
                    for (var k = 0; k < n; k++)
                    {
                        var t = k == 0 ? log2Points : BitOperations.TrailingZeroCount(k);
                        bucket[t] += product[k] * (1 + gamma * omega[index]);
                        index = (index + zc) & mask;
                    }

                    var e = new double[log2Points + 1];
                    var s = 0.0;
                    for (var m = 0; m <= log2Points; m++)
                    {
                        s += bucket[log2Points - m];
                        e[m] = s / (1 << m) - 1;
                    }

                    errors[c] = e;
                });

                var best = new double[log2Points + 1];
                Array.Fill(best, double.PositiveInfinity);
                for (var c = 0; c < candidates; c++)
                {
                    for (var m = log2MinPoints; m <= log2Points; m++) best[m] = Math.Min(best[m], errors[c][m]);
                }

                var chosen = 0;
                var chosenRatio = double.PositiveInfinity;
                for (var c = 0; c < candidates; c++)
                {
                    var ratio = 0.0;
                    for (var m = log2MinPoints; m <= log2Points; m++) ratio = Math.Max(ratio, errors[c][m] / best[m]);
                    if (ratio < chosenRatio)
                    {
                        chosenRatio = ratio;
                        chosen = c;
                    }
                }

                z[j] = (uint)(2 * chosen + 1);
            }

            var idx = 0u;
            for (var k = 0; k < n; k++)
            {
                product[k] *= 1 + gamma * omega[idx];
                idx = (idx + z[j]) & mask;
            }
        }

        return z;
    }
}
