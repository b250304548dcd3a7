using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Tests.Updating.Sampling;

public class RandomStreamTests
{
    private const int Count = 200_000;

    [Theory]
    [InlineData(Count)]
    [InlineData(Count + 3)]
    [Reference("Kolmogorov–Smirnov against Φ (0.1 % critical value 1.95/√n, from memory); Box–Muller pairs independent: correlation of consecutive values within five standard errors (1/√n); N(0, 1) moments")]
    public void Block_normals_are_standard_normal_and_uncorrelated(int count)
    {
        var normals = new double[count];
        VectorKernels.StandardNormals(new SampleStream(7), normals);
        Assert.All(normals, v => Assert.True(double.IsFinite(v)));
        Assert.True(KolmogorovSmirnov(normals, StandardNormal.Cdf) < 1.95 / Math.Sqrt(count));
        Assert.Equal(0, normals.Average(), 5 / Math.Sqrt(count));
        Assert.Equal(1, normals.Select(v => v * v).Average(), 5 * Math.Sqrt(2.0 / count));
        var lag = 0.0;
        for (var i = 0; i + 1 < count; i += 2) lag += normals[i] * normals[i + 1];
        Assert.Equal(0, lag / (count / 2), 5 / Math.Sqrt(count / 2));
    }

    private static double KolmogorovSmirnov(double[] values, Func<double, double> cdf)
    {
        var sorted = values.Order().ToArray();
        var d = 0.0;
        for (var i = 0; i < sorted.Length; i++)
        {
            var f = cdf(sorted[i]);
            d = Math.Max(d, Math.Max((i + 1.0) / sorted.Length - f, f - (double)i / sorted.Length));
        }

        return d;
    }
}
