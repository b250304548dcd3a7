using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The two loops that run over every sample for every mixture component, in vector lanes: exponentials of log density
/// ratios and the weighted sum of the ratios. Vector256.Exp is the runtime's own (within a few units in the last place
/// of Math.Exp); the scalar tail uses Math.Exp.
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
}
