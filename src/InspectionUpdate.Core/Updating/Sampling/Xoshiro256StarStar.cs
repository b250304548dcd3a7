using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The project's xoshiro256** stream (<see cref="SampleStream"/>, seeded through SplitMix64 from the 32-bit seed) seen
/// as a <see cref="Random"/>: the sample set's uniforms. A seeded <see cref="Random"/> runs the runtime's legacy
/// subtractive generator, several times slower per double; this keeps the stream a function of the seed alone and fast
/// enough that drawing is no longer a large share of a sample's cost.
/// </summary>
internal sealed class Xoshiro256StarStar(int seed) : Random
{
    private readonly SampleStream _stream = new(unchecked((ulong)(uint)seed));

    /// <summary>A uniform double in [0, 1) with 53 random bits.</summary>
    public override double NextDouble() => _stream.NextUniform();

    protected override double Sample() => _stream.NextUniform();

    public override int Next() => (int)(_stream.NextUniform() * int.MaxValue);

    public override int Next(int maxValue)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(maxValue);
        return (int)(_stream.NextUniform() * maxValue);
    }

    public override int Next(int minValue, int maxValue)
    {
        ArgumentOutOfRangeException.ThrowIfGreaterThan(minValue, maxValue);
        return (int)(minValue + (long)(_stream.NextUniform() * ((long)maxValue - minValue)));
    }

    public override void NextBytes(Span<byte> buffer)
    {
        for (var i = 0; i < buffer.Length; i++) buffer[i] = (byte)(_stream.NextUniform() * 256);
    }

    public override void NextBytes(byte[] buffer) => NextBytes(buffer.AsSpan());
}
