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
}
