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
            var result = FastNormalLanes<Vector256<double>, Lanes256>.Cdf(Vector256.Create(lanes), 38.5);
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
            var result = FastNormalLanes<Vector256<double>, Lanes256>.InverseCdf(Vector256.Create(lanes), 38.5);
            for (var i = 0; i < 4; i++)
            {
                var q = lanes[i];
                var expected = q >= 1 ? 38.5 : Math.Clamp(StandardNormal.InverseCdf(q), -38.5, 38.5);
                Assert.Equal(expected, result[i], 1e-13 * Math.Max(1, Math.Abs(expected)));
            }
        }

        var edges = FastNormalLanes<Vector256<double>, Lanes256>.InverseCdf(Vector256.Create(0.0, 1.0, -0.1, 0.5), 38.5);
        Assert.Equal(-38.5, edges[0]);
        Assert.Equal(38.5, edges[1]);
        Assert.Equal(-38.5, edges[2]);
        Assert.Equal(0, edges[3], 1e-16);
    }

    [Fact]
    [Reference("Independent computation: Math.Exp (the runtime's scalar exponential) from −708 to 0 and on the clamp")]
    public void Vector_exponential_agrees_with_the_runtime_exponential()
    {
        var worst = 0.0;
        for (var x = -708.0; x <= 1; x += 0.01731)
        {
            double[] lanes = [x, x * 0.5, x * 1e-3, -0.5 * x * x / 700];
            var result = FastNormalLanes<Vector256<double>, Lanes256>.Exp(Vector256.Create(lanes));
            for (var i = 0; i < 4; i++) worst = Math.Max(worst, Math.Abs(result[i] - Math.Exp(lanes[i])) / Math.Exp(lanes[i]));
        }

        Assert.True(worst < 5e-16, $"worst relative error {worst:G3}");
        // Below −708 the argument is clamped: a positive normal number, never a subnormal, NaN or ∞.
        var clamped = FastNormalLanes<Vector256<double>, Lanes256>.Exp(Vector256.Create(-800.0));
        Assert.Equal(Math.Exp(-708), clamped[0], Math.Exp(-708) * 1e-15);
    }

    [Fact]
    [Reference("Independent computation: Math.Log (the runtime's scalar logarithm) from 1e-300 to 1e300 and around √2")]
    public void Vector_logarithm_agrees_with_the_runtime_logarithm()
    {
        var worst = 0.0;
        for (var e = -300.0; e <= 300; e += 0.0137)
        {
            var x = Math.Pow(10, e);
            double[] lanes = [x, 1.4142135623730951 * (1 + 1e-3 * Math.Sin(e)), 1 + 1e-6 * e, 0.5 + 0.49 * Math.Cos(e)];
            var result = FastNormalLanes<Vector256<double>, Lanes256>.Log(Vector256.Create(lanes));
            for (var i = 0; i < 4; i++)
            {
                var expected = Math.Log(lanes[i]);
                worst = Math.Max(worst, Math.Abs(result[i] - expected) / Math.Max(Math.Abs(expected), 1e-300));
            }
        }

        Assert.True(worst < 1e-15, $"worst relative error {worst:G3}");
        Assert.Equal(0, FastNormalLanes<Vector256<double>, Lanes256>.Log(Vector256.Create(1.0))[0]);
    }

    [Fact]
    [Reference("Independent computation: StandardNormal (MathNet erfc and its inverse) in every lane of the eight-lane form")]
    public void Eight_lane_forms_agree_with_the_erfc_based_functions()
    {
        for (var e = -300.0; e < -0.31; e += 0.37)
        {
            var p = Math.Pow(10, e);
            double[] probabilities = [p, 1 - p, 0.5 + 0.4 * p, Math.Min(0.999, 1000 * p), 0.3, 1e-12, 0.93, 0.0];
            double[] arguments = [e / 8, -e / 8, 2.9, -3.1, e / 300, -38.6, 0, 5];
            var inverse = FastNormalLanes<Vector512<double>, Lanes512>.InverseCdf(Vector512.Create(probabilities), 38.5);
            var cdf = FastNormalLanes<Vector512<double>, Lanes512>.Cdf(Vector512.Create(arguments), 38.5);
            for (var i = 0; i < 8; i++)
            {
                var q = probabilities[i];
                var expected = q <= 0 ? -38.5 : q >= 1 ? 38.5 : Math.Clamp(StandardNormal.InverseCdf(q), -38.5, 38.5);
                Assert.Equal(expected, inverse[i], 1e-13 * Math.Max(1, Math.Abs(expected)));
                var x = arguments[i];
                var phi = x <= -38.5 ? 0 : StandardNormal.Cdf(x);
                Assert.Equal(phi, cdf[i], 2e-16 + 1e-14 * phi);
            }
        }
    }
}
