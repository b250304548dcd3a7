using System.Buffers.Binary;
using System.Text.RegularExpressions;
using SkiaSharp;

namespace InspectionUpdate.Tests.Reporting;

/// <summary>Checks that a PNG decodes, has the stated size and is not blank.</summary>
internal static partial class PngCheck
{
    // PNG signature, ISO/IEC 15948 §5.2: 89 50 4E 47 0D 0A 1A 0A; IHDR width and height are the big-endian
    // 32-bit integers at bytes 16–23.
    private static readonly byte[] Signature = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];

    public static (int Width, int Height, double LumaVariance) Inspect(byte[] png)
    {
        Assert.True(png.Length > 33, "PNG too short");
        Assert.Equal(Signature, png[..8]);
        Assert.Equal("IHDR", System.Text.Encoding.ASCII.GetString(png, 12, 4));
        var width = BinaryPrimitives.ReadInt32BigEndian(png.AsSpan(16, 4));
        var height = BinaryPrimitives.ReadInt32BigEndian(png.AsSpan(20, 4));
        using var bitmap = SKBitmap.Decode(png);
        Assert.NotNull(bitmap);
        Assert.Equal(width, bitmap.Width);
        Assert.Equal(height, bitmap.Height);
        double sum = 0, sumSq = 0;
        var n = 0;
        for (var y = 0; y < bitmap.Height; y += 2)
        {
            for (var x = 0; x < bitmap.Width; x += 2)
            {
                var c = bitmap.GetPixel(x, y);
                var luma = 0.299 * c.Red + 0.587 * c.Green + 0.114 * c.Blue;
                sum += luma;
                sumSq += luma * luma;
                n++;
            }
        }

        var mean = sum / n;
        return (width, height, sumSq / n - mean * mean);
    }

    public static IReadOnlyList<byte[]> EmbeddedImages(string html) =>
        DataUri().Matches(html).Select(m => Convert.FromBase64String(m.Groups[1].Value)).ToArray();

    [GeneratedRegex("src=\"data:image/png;base64,([A-Za-z0-9+/=]+)\"")]
    private static partial Regex DataUri();
}
