using InspectionUpdate.Probability;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Tests.Updating.Sampling;

public class RandomStreamTests
{
    private const int Count = 200_000;

    [Fact]
    [Reference("Kolmogorov–Smirnov one-sample test against the uniform CDF; asymptotic 0.1 % critical value 1.95/√n (Kolmogorov distribution, from memory); mean 1/2 and variance 1/12 of U(0, 1) within five standard errors")]
    public void Xoshiro_doubles_are_uniform_on_the_unit_interval_and_follow_the_seed()
    {
        var rng = new Xoshiro256StarStar(42);
        var values = new double[Count];
        for (var i = 0; i < Count; i++) values[i] = rng.NextDouble();
        Assert.All(values, v => Assert.InRange(v, 0.0, 0.9999999999999999));
        Assert.True(KolmogorovSmirnov(values, v => v) < 1.95 / Math.Sqrt(Count));
        Assert.Equal(0.5, values.Average(), 5 * Math.Sqrt(1.0 / 12 / Count));
        Assert.Equal(1.0 / 12, values.Select(v => (v - 0.5) * (v - 0.5)).Average(), 5 * Math.Sqrt(1.0 / 180 / Count));

        var again = new Xoshiro256StarStar(42);
        Assert.Equal(values[..100], Enumerable.Range(0, 100).Select(_ => again.NextDouble()));
        var other = new Xoshiro256StarStar(43);
        Assert.NotEqual(values[..100], Enumerable.Range(0, 100).Select(_ => other.NextDouble()));
    }

    [Theory]
    [InlineData(Count)]
    [InlineData(Count + 3)]
    [Reference("Kolmogorov–Smirnov against Φ (0.1 % critical value 1.95/√n, from memory); Box–Muller pairs independent: correlation of consecutive values within five standard errors (1/√n); N(0, 1) moments")]
    public void Block_normals_are_standard_normal_and_uncorrelated(int count)
    {
        var normals = new double[count];
        VectorKernels.StandardNormals(new Xoshiro256StarStar(7), normals);
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
