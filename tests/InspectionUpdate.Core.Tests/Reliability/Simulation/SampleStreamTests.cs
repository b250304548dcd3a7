using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.Tests.Reliability.Simulation;

public class SampleStreamTests
{
    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Standard normal moments: mean 0 (SE 1/√N), variance 1 (SE √(2/N)), P(U ≤ −1.96) = 0.025; within 4 standard errors")]
    public void Normal_numbers_have_the_standard_normal_moments()
    {
        const int n = 200_000;
        var stream = SampleStream.ForBlock(123, 0);
        double sum = 0, sum2 = 0;
        var below = 0;
        for (var i = 0; i < n; i++)
        {
            var z = stream.NextStandardNormal();
            sum += z;
            sum2 += z * z;
            if (z <= -1.959963984540054) below++;
        }

        var mean = sum / n;
        var variance = sum2 / n - mean * mean;
        Assert.InRange(mean, -4 / Math.Sqrt(n), 4 / Math.Sqrt(n));
        Assert.InRange(variance, 1 - 4 * Math.Sqrt(2.0 / n), 1 + 4 * Math.Sqrt(2.0 / n));
        var p = below / (double)n;
        var se = Math.Sqrt(0.025 * 0.975 / n);
        Assert.InRange(p, 0.025 - 4 * se, 0.025 + 4 * se);
    }

    [Fact]
    public void Uniform_numbers_lie_in_the_half_open_unit_interval()
    {
        var stream = SampleStream.ForBlock(1, 1);
        for (var i = 0; i < 100_000; i++) Assert.InRange(stream.NextUniform(), 0.0, 1.0 - 1e-17);
    }

    [Fact]
    public void Blocks_and_seeds_give_distinct_reproducible_streams()
    {
        static double[] Draw(int seed, long block)
        {
            var s = SampleStream.ForBlock(seed, block);
            return Enumerable.Range(0, 8).Select(_ => s.NextStandardNormal()).ToArray();
        }

        Assert.Equal(Draw(5, 3), Draw(5, 3));
        Assert.NotEqual(Draw(5, 3), Draw(5, 4));
        Assert.NotEqual(Draw(5, 3), Draw(6, 3));
        Assert.NotEqual(Draw(-1, 0), Draw(0, 0));
    }
}
