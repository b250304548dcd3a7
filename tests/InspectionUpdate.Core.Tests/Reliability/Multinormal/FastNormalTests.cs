using System.Runtime.Intrinsics;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Tests.Reliability.Multinormal;

public class FastNormalTests
{
    [Fact]
    [Reference("Independent computation: StandardNormal (MathNet erfc) on a dense grid; relative error in the tail that is evaluated")]
    public void Cdf_agrees_with_the_erfc_based_distribution_function()
    {
        var worst = 0.0;
        for (var z = -37.0; z <= 8.5; z += 0.0137)
        {
            var expected = StandardNormal.Cdf(z);
            var tail = z <= 0 ? FastNormal.Cdf(z) : 1 - FastNormal.Ccdf(z);
            worst = Math.Max(worst, Math.Abs(FastNormal.Cdf(z) - expected) / expected);
            Assert.Equal(StandardNormal.Ccdf(z), FastNormal.Ccdf(z), Math.Max(1e-16, 1e-14 * StandardNormal.Ccdf(z)));
            Assert.Equal(expected, tail, 2e-16 + 1e-14 * expected);
        }

        Assert.True(worst < 3e-14, $"worst relative error {worst:G3}");
    }

    [Fact]
    [Reference("Independent computation: StandardNormal.InverseCdf (MathNet erfc⁻¹) on a grid from 1e-300 to 1 − 1e-16")]
    public void InverseCdf_agrees_with_the_erfc_inverse()
    {
        for (var e = -300.0; e < -0.31; e += 0.37)
        {
            var p = Math.Pow(10, e);
            var expected = StandardNormal.InverseCdf(p);
            Assert.Equal(expected, FastNormal.InverseCdf(p), 1e-14 * Math.Max(1, Math.Abs(expected)));
            if (p > 1e-10)
            {
                Assert.Equal(StandardNormal.InverseCdf(1 - p), FastNormal.InverseCdf(1 - p), 1e-13 * Math.Max(1, Math.Abs(expected)));
            }
        }

        for (var p = 0.01; p < 0.99; p += 0.0123)
        {
            Assert.Equal(StandardNormal.InverseCdf(p), FastNormal.InverseCdf(p), 5e-15);
        }
    }

    [Fact]
    [Reference("Independent computation: StandardNormal (MathNet erfc) on a dense grid, lanes in mixed regions")]
    public void Vector_Cdf_agrees_with_the_erfc_based_distribution_function()
    {
        for (var z = -40.0; z <= 40; z += 0.0173)
        {
            // Lanes straddle the cutoff and the clamping bound so the scalar fallback mixes with the vector form.
            double[] lanes = [z, -z * 0.37, z * 0.11 + 2.9, -3.05 + z * 1e-3];
            var result = FastNormal.Cdf(Vector256.Create(lanes), 38.5);
            for (var i = 0; i < 4; i++)
            {
                var x = lanes[i];
                var expected = x <= -38.5 ? 0 : x >= 38.5 ? 1 : StandardNormal.Cdf(x);
                Assert.Equal(expected, result[i], 2e-16 + 1e-14 * expected);
            }
        }
    }

    [Fact]
    [Reference("Independent computation: StandardNormal.InverseCdf (MathNet erfc⁻¹) from 1e-300 to 1 − 1e-16, clamped to ±38.5")]
    public void Vector_InverseCdf_agrees_with_the_erfc_inverse()
    {
        for (var e = -300.0; e < -0.31; e += 0.37)
        {
            var p = Math.Pow(10, e);
            double[] lanes = [p, 1 - p, 0.5 + 0.4 * p, Math.Min(0.999, 1000 * p)];
            var result = FastNormal.InverseCdf(Vector256.Create(lanes), 38.5);
            for (var i = 0; i < 4; i++)
            {
                var q = lanes[i];
                var expected = q >= 1 ? 38.5 : Math.Clamp(StandardNormal.InverseCdf(q), -38.5, 38.5);
                Assert.Equal(expected, result[i], 1e-13 * Math.Max(1, Math.Abs(expected)));
            }
        }

        var edges = FastNormal.InverseCdf(Vector256.Create(0.0, 1.0, -0.1, 0.5), 38.5);
        Assert.Equal(-38.5, edges[0]);
        Assert.Equal(38.5, edges[1]);
        Assert.Equal(-38.5, edges[2]);
        Assert.Equal(0, edges[3], 1e-16);
    }
}
