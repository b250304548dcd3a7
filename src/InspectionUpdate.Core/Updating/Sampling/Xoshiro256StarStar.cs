namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// xoshiro256** (Blackman &amp; Vigna 2021, "Scrambled linear pseudorandom number generators", ACM TOMS 47(4)), seeded
/// by SplitMix64 from a 32-bit seed: the sample set's uniforms. A seeded <see cref="Random"/> runs the runtime's legacy
/// subtractive generator, about five times slower per double; this one keeps the stream a function of the seed alone
/// and fast enough that drawing is no longer a large share of a sample's cost.
/// </summary>
internal sealed class Xoshiro256StarStar : Random
{
    private ulong _s0, _s1, _s2, _s3;

    public Xoshiro256StarStar(int seed)
    {
        var x = unchecked((ulong)(uint)seed);
        _s0 = SplitMix64(ref x);
        _s1 = SplitMix64(ref x);
        _s2 = SplitMix64(ref x);
        _s3 = SplitMix64(ref x);
    }

    /// <summary>A uniform double in [0, 1) with 53 random bits.</summary>
    public override double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));

    protected override double Sample() => NextDouble();

    public override int Next() => (int)(NextUInt64() >> 33);

    public override int Next(int maxValue)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(maxValue);
        return (int)(NextDouble() * maxValue);
    }

    public override int Next(int minValue, int maxValue)
    {
        ArgumentOutOfRangeException.ThrowIfGreaterThan(minValue, maxValue);
        return (int)(minValue + (long)(NextDouble() * ((long)maxValue - minValue)));
    }

    public override void NextBytes(Span<byte> buffer)
    {
        for (var i = 0; i < buffer.Length; i++) buffer[i] = (byte)(NextUInt64() >> 56);
    }

    public override void NextBytes(byte[] buffer) => NextBytes(buffer.AsSpan());

    private ulong NextUInt64()
    {
        var result = RotateLeft(_s1 * 5, 7) * 9;
        var t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = RotateLeft(_s3, 45);
        return result;
    }

    private static ulong RotateLeft(ulong x, int k) => (x << k) | (x >> (64 - k));

    private static ulong SplitMix64(ref ulong x)
    {
        var z = unchecked(x += 0x9E3779B97F4A7C15UL);
        z = unchecked((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL);
        z = unchecked((z ^ (z >> 27)) * 0x94D049BB133111EBUL);
        return z ^ (z >> 31);
    }
}
