using System.Text;
using InspectionUpdate.Application;
using InspectionUpdate.Register;
using static InspectionUpdate.Web.Html;

namespace InspectionUpdate.Web;

/// <summary>The CSV import page: the register's import (all rows or none), with a row-by-row list of problems.</summary>
public static class ImportPage
{
    /// <summary>Renders the page: the form, and the outcome of an upload when there is one.</summary>
    public static string Render(HttpContext context, ImportResult? result, string? fileName, string? error)
    {
        var b = new StringBuilder();
        b.Append("<h1>Import findings from a CSV file</h1>");
        b.Append("<p>The file is checked as a whole: every row is validated against the register, and either all rows are written as one batch or none is. ")
            .Append("Columns: <code>").Append(E(string.Join(",", FindingEntries.CsvColumns))).Append("</code> (UTF-8, header first; see docs/register.md).</p>");
        if (error is not null) b.Append("<div class=\"box error\" id=\"problems\" role=\"alert\"><strong>Nothing was written.</strong> ").Append(E(error)).Append("</div>");
        if (result is { Succeeded: true })
        {
            b.Append("<div class=\"box change\" id=\"imported\">Imported ").Append(E(result.Findings.Count)).Append(" finding(s) from <code>").Append(E(fileName))
                .Append("</code> as batch ").Append(E(result.ImportBatchId)).Append(" (SHA-256 ").Append(E(result.SourceSha256[..12])).Append("…). Components changed: ");
            b.Append(string.Join(", ", result.Findings.Select(f => f.ComponentCode).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal)
                .Select(c => $"<a href=\"/components/{Seg(c)}\">{E(c)}</a>"))).Append(".</div>");
        }
        else if (result is not null)
        {
            b.Append("<div class=\"box error\" id=\"problems\" role=\"alert\"><strong>Nothing was written:</strong> ").Append(E(result.Problems.Count)).Append(" problem(s) in <code>")
                .Append(E(fileName)).Append("</code>.</div>");
            b.Append("<table id=\"import-problems\"><thead><tr><th>Line</th><th>Field</th><th>Value</th><th>Problem</th></tr></thead><tbody>");
            foreach (var p in result.Problems.OrderBy(p => p.LineNumber ?? 0))
            {
                b.Append("<tr><td class=\"num\">").Append(E(p.LineNumber?.ToString(System.Globalization.CultureInfo.InvariantCulture) ?? "–")).Append("</td><td>").Append(E(p.Field))
                    .Append("</td><td>").Append(E(p.Value ?? "(empty)")).Append("</td><td>").Append(E(p.Message)).Append("</td></tr>");
            }

            b.Append("</tbody></table>");
        }

        b.Append("<form method=\"post\" action=\"/import\" enctype=\"multipart/form-data\" id=\"import-form\">").Append(Token(context))
            .Append("<p><label for=\"f-file\">CSV file</label> <input type=\"file\" name=\"file\" id=\"f-file\" accept=\".csv,text/csv\"></p>")
            .Append("<p><button type=\"submit\">Check and import</button></p></form>");
        return Page(context, "Import findings", b.ToString());
    }
}
