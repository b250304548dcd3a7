using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The loops that run over every sample, in vector lanes: exponentials of log density ratios, the weighted sum of the
/// ratios and the standard normal draws. Vector256.Exp, Log and SinCos are the runtime's own (within a few units in the
/// last place of Math.Exp, Math.Log and Math.SinCos); scalar tails use the Math functions, so a machine without 256-bit
/// vectors draws the same stream up to those last places.
/// </summary>
internal static class VectorKernels
{
    /// <summary>values[i] ← exp(values[i]).</summary>
    public static void ExpInPlace(Span<double> values)
    {
        var i = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            var lanes = MemoryMarshal.Cast<double, Vector256<double>>(values);
            for (var k = 0; k < lanes.Length; k++) lanes[k] = Vector256.Exp(lanes[k]);
            i = lanes.Length * Vector256<double>.Count;
        }

        for (; i < values.Length; i++) values[i] = Math.Exp(values[i]);
    }

    /// <summary>sum[i] ← sum[i] + a·x[i].</summary>
    public static void MultiplyAdd(ReadOnlySpan<double> x, double a, Span<double> sum)
    {
        var i = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            var xs = MemoryMarshal.Cast<double, Vector256<double>>(x);
            var ss = MemoryMarshal.Cast<double, Vector256<double>>(sum[..x.Length]);
            var va = Vector256.Create(a);
            for (var k = 0; k < xs.Length; k++) ss[k] += va * xs[k];
            i = xs.Length * Vector256<double>.Count;
        }

        for (; i < x.Length; i++) sum[i] += a * x[i];
    }

    /// <summary>
    /// Fills <paramref name="target"/> with independent standard normals by Box–Muller (both values of each pair):
    /// r = √(−2 ln U₁), (r cos 2πU₂, r sin 2πU₂) with U₁ = 1 − U ∈ (0, 1] and U₂ = U′ from the stream, the pairs'
    /// uniforms drawn in order. About a fifth of the cost of one Box–Muller value per call.
    /// </summary>
    public static void StandardNormals(SampleStream rng, Span<double> target)
    {
        var pairs = (target.Length + 1) / 2;
        var radius = new double[pairs];
        var angle = new double[pairs];
        for (var k = 0; k < pairs; k++)
        {
            radius[k] = 1.0 - rng.NextUniform();
            angle[k] = 2 * Math.PI * rng.NextUniform();
        }

        var sin = new double[pairs];
        var cos = new double[pairs];
        var i = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            var rs = MemoryMarshal.Cast<double, Vector256<double>>(radius.AsSpan());
            var an = MemoryMarshal.Cast<double, Vector256<double>>(angle.AsSpan());
            var ss = MemoryMarshal.Cast<double, Vector256<double>>(sin.AsSpan());
            var cs = MemoryMarshal.Cast<double, Vector256<double>>(cos.AsSpan());
            var minus2 = Vector256.Create(-2.0);
            for (var k = 0; k < rs.Length; k++)
            {
                rs[k] = Vector256.Sqrt(minus2 * Vector256.Log(rs[k]));
                (ss[k], cs[k]) = Vector256.SinCos(an[k]);
            }

            i = rs.Length * Vector256<double>.Count;
        }

        for (; i < pairs; i++)
        {
            radius[i] = Math.Sqrt(-2 * Math.Log(radius[i]));
            (sin[i], cos[i]) = Math.SinCos(angle[i]);
        }

        for (var k = 0; k < pairs; k++)
        {
            target[2 * k] = radius[k] * cos[k];
            if (2 * k + 1 < target.Length) target[2 * k + 1] = radius[k] * sin[k];
        }
    }
}
