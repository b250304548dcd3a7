using System.Text;
using System.Text.RegularExpressions;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// Reads, from a PDF chromium printed, on which pages each table row was drawn. Chromium's print-to-PDF writes a tagged
/// PDF (ISO 32000-1 §14.7 logical structure, §14.8.4.3.4 table elements): every &lt;tr&gt; is a structure element
/// /S /TR whose leaf descendants name the page of each piece of marked content they own (/Pg on the element, or on
/// each marked-content reference /MCR). A row whose contents were drawn on two pages was split by the page break.
/// </summary>
/// <remarks>
/// Why this route: it reads the pagination chromium itself produced, not a re-derivation of it (print-media emulation
/// in a browser lays a page out as one long sheet, so DOM boxes say nothing of where pages break), and needs no PDF
/// library: chromium's writer (Skia) keeps structure elements as plain, uncompressed objects. Limits: a row is seen
/// through its marked content (text, images, rules drawn inside its cells); a row with no content at all cannot be
/// seen, and only its background or border crossing a break would go unnoticed. A column-header row (every cell a
/// /TH with /Scope /Column) is repeated on each page by `thead { display: table-header-group }` on purpose and is
/// left out. If chromium stops writing a structure tree, <see cref="Read"/> finds no row and the caller's row count
/// check fails, saying so.
/// </remarks>
internal static class PrintedRows
{
    /// <summary>One table row: its place among the rows of the document, the pages (object numbers) it was drawn on, and whether it is a column-header row.</summary>
    internal sealed record Row(int Index, IReadOnlySet<int> Pages, bool ColumnHeader);

    private static readonly Regex ObjectPattern = new(@"(\d+) 0 obj\s*(.*?)\s*endobj", RegexOptions.Singleline | RegexOptions.CultureInvariant);
    private static readonly Regex KidsPattern = new(@"/K\s*(\[.*?\]|\d+ 0 R)", RegexOptions.Singleline | RegexOptions.CultureInvariant);
    private static readonly Regex ReferencePattern = new(@"(\d+) 0 R", RegexOptions.CultureInvariant);
    private static readonly Regex PagePattern = new(@"/Pg (\d+) 0 R", RegexOptions.CultureInvariant);

    /// <summary>Every /TR structure element of the PDF, in document order.</summary>
    public static IReadOnlyList<Row> Read(byte[] pdf)
    {
        var text = Encoding.Latin1.GetString(pdf);
        var objects = new Dictionary<int, string>();
        foreach (Match m in ObjectPattern.Matches(text)) objects[int.Parse(m.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture)] = m.Groups[2].Value;

        static string? Type(string body) => Regex.Match(body, @"/S /(\w+)", RegexOptions.CultureInvariant) is { Success: true } m ? m.Groups[1].Value : null;

        IEnumerable<int> Kids(string body) => KidsPattern.Match(body) is { Success: true } m
            ? ReferencePattern.Matches(m.Groups[1].Value).Select(r => int.Parse(r.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture))
            : [];

        HashSet<int> Pages(int id, int depth)
        {
            var body = objects.GetValueOrDefault(id, string.Empty);
            // /Pg of the element and of its inline marked-content references.
            var pages = PagePattern.Matches(body).Select(m => int.Parse(m.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture)).ToHashSet();
            if (depth < 64)
            {
                foreach (var kid in Kids(body).Where(k => objects.GetValueOrDefault(k, string.Empty).Contains("/StructElem", StringComparison.Ordinal)
                    || objects.GetValueOrDefault(k, string.Empty).Contains("/MCR", StringComparison.Ordinal)))
                {
                    pages.UnionWith(Pages(kid, depth + 1));
                }
            }

            return pages;
        }

        // Object numbers follow the structure tree's order as chromium writes it (parents before children, rows in order).
        return objects.Where(o => Type(o.Value) == "TR").OrderBy(o => o.Key).Select((o, i) =>
        {
            var cells = Kids(o.Value).Select(k => objects.GetValueOrDefault(k, string.Empty)).ToArray();
            var header = cells.Length > 0 && cells.All(c => Type(c) == "TH" && c.Contains("/Scope /Column", StringComparison.Ordinal));
            return new Row(i + 1, Pages(o.Key, 0), header);
        }).ToArray();
    }

    /// <summary>Number of pages of the PDF (page objects).</summary>
    public static int PageCount(byte[] pdf) => Regex.Count(Encoding.Latin1.GetString(pdf), @"/Type\s*/Page[^s]");
}
