namespace InspectionUpdate.Reliability.Simulation;

/// <summary>
/// A seeded stream of uniform and standard normal numbers: xoshiro256** (Blackman &amp; Vigna 2018; ACM TOMS 47(4), 2021) seeded through
/// SplitMix64 (Steele, Lea &amp; Flood 2014), normals by the Box–Muller transform (Box &amp; Muller 1958).
/// </summary>
/// <remarks>Not thread-safe: one stream per block. Its output is fixed by the seed on every platform.</remarks>
internal sealed class SampleStream
{
    private const double TwoPi = 2 * Math.PI;
    private ulong _s0;
    private ulong _s1;
    private ulong _s2;
    private ulong _s3;
    private double _spare;
    private bool _hasSpare;

    /// <summary>A stream from a 64-bit seed.</summary>
    public SampleStream(ulong seed)
    {
        var sm = seed;
        _s0 = SplitMix(ref sm);
        _s1 = SplitMix(ref sm);
        _s2 = SplitMix(ref sm);
        _s3 = SplitMix(ref sm);
    }

    /// <summary>The stream of block <paramref name="block"/> of a run with seed <paramref name="seed"/>.</summary>
    public static SampleStream ForBlock(int seed, long block)
    {
        // Mix seed and block so neighbouring blocks and seeds start far apart.
        var sm = unchecked(((ulong)(uint)seed << 32) ^ 0x9E3779B97F4A7C15UL);
        var a = SplitMix(ref sm);
        var mixed = unchecked(a ^ ((ulong)block * 0xD1B54A32D192ED03UL));
        return new SampleStream(mixed);
    }

    /// <summary>Uniform on [0, 1) with 53 random bits.</summary>
    public double NextUniform() => (Next() >> 11) * (1.0 / (1UL << 53));

    /// <summary>A standard normal number.</summary>
    public double NextStandardNormal()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spare;
        }

        // 1 − U lies in (0, 1], so the logarithm is finite.
        var r = Math.Sqrt(-2.0 * Math.Log(1.0 - NextUniform()));
        var (sin, cos) = Math.SinCos(TwoPi * NextUniform());
        _spare = r * sin;
        _hasSpare = true;
        return r * cos;
    }

    /// <summary>Fills <paramref name="u"/> with independent standard normal numbers.</summary>
    public void NextStandardNormal(Span<double> u)
    {
        for (var i = 0; i < u.Length; i++) u[i] = NextStandardNormal();
    }

    private ulong Next()
    {
        var result = unchecked(RotateLeft(_s1 * 5, 7) * 9);
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

    private static ulong SplitMix(ref ulong state)
    {
        unchecked
        {
            state += 0x9E3779B97F4A7C15UL;
            var z = state;
            z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
            z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
            return z ^ (z >> 31);
        }
    }
}
