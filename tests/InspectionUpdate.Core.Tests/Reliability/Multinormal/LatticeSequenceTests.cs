using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Tests.Reliability.Multinormal;

public class LatticeSequenceTests
{
    [Fact]
    [Reference("Definition of an embedded rank-1 lattice (Cools, Kuo & Nuyens 2006): the first 2^m points are {frac(k·z/2^m)}, k < 2^m")]
    public void The_first_2_to_the_m_points_are_the_lattice_with_2_to_the_m_points()
    {
        var z = LatticeSequence.GeneratingVector;
        for (var m = 0; m <= 10; m++)
        {
            var n = 1 << m;
            var expected = new HashSet<string>();
            var actual = new HashSet<string>();
            for (var k = 0; k < n; k++)
            {
                var lattice = new long[4];
                var sequence = new long[4];
                var r = LatticeSequence.RadicalInverse((uint)k);
                for (var j = 0; j < 4; j++)
                {
                    // Numerators over 2^16: the lattice point k·z/2^m has numerator (k·z mod 2^m)·2^(16−m).
                    lattice[j] = (k * (long)z[j] % n) << (LatticeSequence.Log2Points - m);
                    sequence[j] = LatticeSequence.Numerator(r, z[j]);
                }

                expected.Add(string.Join(",", lattice));
                actual.Add(string.Join(",", sequence));
            }

            Assert.Equal(n, actual.Count);
            Assert.True(expected.SetEquals(actual), $"m = {m}");
        }
    }

    [Fact]
    [Reference("Reproduction: the documented component-by-component construction, re-run for the leading coordinates")]
    public void The_stored_generating_vector_is_the_documented_construction()
    {
        var z = LatticeSequence.Construct(LatticeSequence.Log2Points, 3, LatticeSequence.Log2MinPoints);
        Assert.Equal(LatticeSequence.GeneratingVector[..3].ToArray(), z);
    }

    [Fact]
    [Reference("Closed form: a rank-1 lattice rule with N points integrates exp(2πi h·x) to 1 if h·z ≡ 0 (mod N), else 0; " +
        "so for f = Π(1 + 2π² B₂(xⱼ)) (integral 1) the error is the sum over the dual lattice, which for a good vector is small")]
    public void Good_vector_integrates_a_smooth_periodic_product_better_than_a_poor_one()
    {
        // f(x) = Π (1 + 2π²γⱼ B₂(xⱼ)) with B₂(x) = x² − x + 1/6 has integral exactly 1 over the unit cube.
        static double Error(ReadOnlySpan<uint> z, int m)
        {
            var n = 1 << m;
            var sum = 0.0;
            for (var k = 0; k < n; k++)
            {
                var f = 1.0;
                for (var j = 0; j < z.Length; j++)
                {
                    var x = (double)(k * (long)z[j] % n) / n;
                    f *= 1 + 2 * Math.PI * Math.PI / ((j + 1.0) * (j + 1.0)) * (x * x - x + 1.0 / 6);
                }

                sum += f;
            }

            return Math.Abs(sum / n - 1);
        }

        var good = LatticeSequence.GeneratingVector[..8];
        uint[] poor = [1, 1, 1, 1, 1, 1, 1, 1];
        for (var m = 8; m <= 12; m++)
        {
            Assert.True(Error(good, m) < 0.1 * Error(poor, m), $"m = {m}: {Error(good, m):G3} vs {Error(poor, m):G3}");
        }

        // The error here is the squared worst-case error, which decays like N^(−2+δ) for a good vector (Sloan & Joe
        // 1994); from 2^8 to 2^12 points it must fall by more than 16^1.3, a Monte Carlo-like or merely N⁻¹ rate would not.
        Assert.True(Error(good, 12) < Error(good, 8) / Math.Pow(16, 1.3), $"{Error(good, 8):G3} → {Error(good, 12):G3}");
    }
}
