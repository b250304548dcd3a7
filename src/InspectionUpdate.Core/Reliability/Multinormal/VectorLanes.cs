using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// The operations the vectorized integrand needs on a vector of doubles, so that one generic implementation serves
/// both 256-bit (four lanes, AVX2) and 512-bit (eight lanes, AVX-512) registers.
/// </summary>
/// <remarks>
/// The implementations are structs: the JIT compiles a separate copy of every generic method for each of them and
/// inlines these one-line members, so the generic code runs as fast as code written for one width (checked in the
/// benchmark). Masks are vectors whose lanes have all bits set (true) or none (false), as the comparisons return them.
/// </remarks>
/// <typeparam name="TV">The vector type.</typeparam>
internal interface IVectorLanes<TV>
    where TV : struct
{
    /// <summary>Number of lanes.</summary>
    static abstract int Count { get; }

    /// <summary>True when the hardware executes this width natively.</summary>
    static abstract bool IsHardwareAccelerated { get; }

    static abstract TV Broadcast(double value);

    static abstract TV Add(TV a, TV b);

    static abstract TV Subtract(TV a, TV b);

    static abstract TV Multiply(TV a, TV b);

    static abstract TV Divide(TV a, TV b);

    static abstract TV Negate(TV a);

    static abstract TV And(TV a, TV b);

    static abstract TV Or(TV a, TV b);

    /// <summary>a &amp; ~b.</summary>
    static abstract TV AndNot(TV a, TV b);

    static abstract TV MultiplyAdd(TV a, TV b, TV c);

    static abstract TV Max(TV a, TV b);

    static abstract TV Min(TV a, TV b);

    static abstract TV Abs(TV a);

    static abstract TV Sqrt(TV a);

    static abstract TV Round(TV a);

    static abstract TV Select(TV mask, TV whenTrue, TV whenFalse);

    static abstract TV GreaterThan(TV a, TV b);

    static abstract TV GreaterThanOrEqual(TV a, TV b);

    static abstract TV LessThan(TV a, TV b);

    static abstract TV LessThanOrEqual(TV a, TV b);

    static abstract bool AllLessThanOrEqual(TV a, TV b);

    static abstract bool AllGreaterThanOrEqual(TV a, TV b);

    /// <summary>Bit i set when lane i of the mask is true.</summary>
    static abstract uint MaskBits(TV mask);

    static abstract double Get(TV v, int lane);

    static abstract TV With(TV v, int lane, double value);

    /// <summary>2^n for integral n in [−1022, 1023], built in the exponent bits.</summary>
    static abstract TV TwoToThe(TV n);

    /// <summary>For positive normal x: x = 2^e·m with m in [1, 2); returns e as a double and m.</summary>
    static abstract TV SplitExponent(TV x, out TV mantissa);

    /// <summary>The vector whose lanes are lane j of quads[first], quads[first + 1], … (four lanes each).</summary>
    static abstract TV FromQuads(Vector256<double>[][] quads, int first, int j);
}

/// <summary>Four lanes in a 256-bit register.</summary>
internal readonly struct Lanes256 : IVectorLanes<Vector256<double>>
{
    public static int Count => Vector256<double>.Count;

    public static bool IsHardwareAccelerated => Vector256.IsHardwareAccelerated;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Broadcast(double value) => Vector256.Create(value);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Add(Vector256<double> a, Vector256<double> b) => a + b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Subtract(Vector256<double> a, Vector256<double> b) => a - b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Multiply(Vector256<double> a, Vector256<double> b) => a * b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Divide(Vector256<double> a, Vector256<double> b) => a / b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Negate(Vector256<double> a) => -a;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> And(Vector256<double> a, Vector256<double> b) => a & b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Or(Vector256<double> a, Vector256<double> b) => a | b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> AndNot(Vector256<double> a, Vector256<double> b) => Vector256.AndNot(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> MultiplyAdd(Vector256<double> a, Vector256<double> b, Vector256<double> c) => Vector256.FusedMultiplyAdd(a, b, c);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Max(Vector256<double> a, Vector256<double> b) => Vector256.Max(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Min(Vector256<double> a, Vector256<double> b) => Vector256.Min(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Abs(Vector256<double> a) => Vector256.Abs(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Sqrt(Vector256<double> a) => Vector256.Sqrt(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Round(Vector256<double> a) => Vector256.Round(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> Select(Vector256<double> mask, Vector256<double> whenTrue, Vector256<double> whenFalse) => Vector256.ConditionalSelect(mask, whenTrue, whenFalse);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> GreaterThan(Vector256<double> a, Vector256<double> b) => Vector256.GreaterThan(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> GreaterThanOrEqual(Vector256<double> a, Vector256<double> b) => Vector256.GreaterThanOrEqual(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> LessThan(Vector256<double> a, Vector256<double> b) => Vector256.LessThan(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> LessThanOrEqual(Vector256<double> a, Vector256<double> b) => Vector256.LessThanOrEqual(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool AllLessThanOrEqual(Vector256<double> a, Vector256<double> b) => Vector256.LessThanOrEqualAll(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool AllGreaterThanOrEqual(Vector256<double> a, Vector256<double> b) => Vector256.GreaterThanOrEqualAll(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static uint MaskBits(Vector256<double> mask) => mask.ExtractMostSignificantBits();

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Get(Vector256<double> v, int lane) => v.GetElement(lane);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> With(Vector256<double> v, int lane, double value) => v.WithElement(lane, value);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> TwoToThe(Vector256<double> n) => ((Vector256.ConvertToInt64(n) + Vector256.Create(1023L)) << 52).AsDouble();

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> SplitExponent(Vector256<double> x, out Vector256<double> mantissa)
    {
        var bits = x.AsInt64();
        mantissa = ((bits & Vector256.Create(0x000FFFFFFFFFFFFFL)) | Vector256.Create(0x3FF0000000000000L)).AsDouble();
        return Vector256.ConvertToDouble((bits >>> 52) - Vector256.Create(1023L));
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector256<double> FromQuads(Vector256<double>[][] quads, int first, int j) => quads[first][j];
}

/// <summary>Eight lanes in a 512-bit register.</summary>
internal readonly struct Lanes512 : IVectorLanes<Vector512<double>>
{
    public static int Count => Vector512<double>.Count;

    public static bool IsHardwareAccelerated => Vector512.IsHardwareAccelerated;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Broadcast(double value) => Vector512.Create(value);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Add(Vector512<double> a, Vector512<double> b) => a + b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Subtract(Vector512<double> a, Vector512<double> b) => a - b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Multiply(Vector512<double> a, Vector512<double> b) => a * b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Divide(Vector512<double> a, Vector512<double> b) => a / b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Negate(Vector512<double> a) => -a;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> And(Vector512<double> a, Vector512<double> b) => a & b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Or(Vector512<double> a, Vector512<double> b) => a | b;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> AndNot(Vector512<double> a, Vector512<double> b) => Vector512.AndNot(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> MultiplyAdd(Vector512<double> a, Vector512<double> b, Vector512<double> c) => Vector512.FusedMultiplyAdd(a, b, c);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Max(Vector512<double> a, Vector512<double> b) => Vector512.Max(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Min(Vector512<double> a, Vector512<double> b) => Vector512.Min(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Abs(Vector512<double> a) => Vector512.Abs(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Sqrt(Vector512<double> a) => Vector512.Sqrt(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Round(Vector512<double> a) => Vector512.Round(a);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> Select(Vector512<double> mask, Vector512<double> whenTrue, Vector512<double> whenFalse) => Vector512.ConditionalSelect(mask, whenTrue, whenFalse);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> GreaterThan(Vector512<double> a, Vector512<double> b) => Vector512.GreaterThan(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> GreaterThanOrEqual(Vector512<double> a, Vector512<double> b) => Vector512.GreaterThanOrEqual(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> LessThan(Vector512<double> a, Vector512<double> b) => Vector512.LessThan(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> LessThanOrEqual(Vector512<double> a, Vector512<double> b) => Vector512.LessThanOrEqual(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool AllLessThanOrEqual(Vector512<double> a, Vector512<double> b) => Vector512.LessThanOrEqualAll(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool AllGreaterThanOrEqual(Vector512<double> a, Vector512<double> b) => Vector512.GreaterThanOrEqualAll(a, b);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static uint MaskBits(Vector512<double> mask) => (uint)mask.ExtractMostSignificantBits();

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Get(Vector512<double> v, int lane) => v.GetElement(lane);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> With(Vector512<double> v, int lane, double value) => v.WithElement(lane, value);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> TwoToThe(Vector512<double> n) => ((Vector512.ConvertToInt64(n) + Vector512.Create(1023L)) << 52).AsDouble();

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> SplitExponent(Vector512<double> x, out Vector512<double> mantissa)
    {
        var bits = x.AsInt64();
        mantissa = ((bits & Vector512.Create(0x000FFFFFFFFFFFFFL)) | Vector512.Create(0x3FF0000000000000L)).AsDouble();
        return Vector512.ConvertToDouble((bits >>> 52) - Vector512.Create(1023L));
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector512<double> FromQuads(Vector256<double>[][] quads, int first, int j) => Vector512.Create(quads[first][j], quads[first + 1][j]);
}
