using System.Globalization;
using System.Text.RegularExpressions;

namespace InspectionUpdate.Reporting.Html;

/// <summary>
/// Splits the per-step notes of a profile into numbers that get their own columns (effective failure samples, the
/// first-order check value) and sentences written once under the table as numbered footnotes.
/// </summary>
internal sealed partial class ProfileNotes
{
    private readonly List<string> texts = [];

    /// <summary>Distinct footnotes in order of first use (footnote n is Texts[n − 1]).</summary>
    public IReadOnlyList<string> Texts => texts;

    /// <summary>The effective failure samples ("462 of 16000"), the first-order value, and the footnote numbers of the rest.</summary>
    public (string? Samples, double? FirstOrder, IReadOnlyList<int> Refs) Split(string? note)
    {
        if (string.IsNullOrWhiteSpace(note)) return (null, null, []);
        string? samples = null;
        double? firstOrder = null;
        var refs = new List<int>();
        var rest = Samples().Replace(note, m =>
        {
            samples = m.Groups[1].Value + " of " + m.Groups[2].Value;
            return ";";
        });
        rest = FirstOrder().Replace(rest, m =>
        {
            firstOrder = double.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture);
            return "; first order (column “first order (check)”)" + m.Groups[2].Value;
        });
        foreach (var part in rest.Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var text = part.TrimEnd(',', ' ');
            if (text.Length == 0) continue;
            var at = texts.IndexOf(text);
            if (at < 0)
            {
                texts.Add(text);
                at = texts.Count - 1;
            }

            if (!refs.Contains(at + 1)) refs.Add(at + 1);
        }

        return (samples, firstOrder, refs);
    }

    [GeneratedRegex(@"[;,]?\s*(\d+) effective failure samples of (\d+)")]
    private static partial Regex Samples();

    [GeneratedRegex(@"first order gives ([-+0-9.Ee]+)([^;]*)")]
    private static partial Regex FirstOrder();
}
