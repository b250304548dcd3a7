using System.Text;

namespace InspectionUpdate.Reporting.Html;

public static partial class HtmlReportWriter
{
    /// <summary>CSS class of a mark's span, e.g. "flag flag-above_target".</summary>
    public static string FlagClass(ReportMark flag) => "flag flag-" + ReportMarks.Key(flag);

    /// <summary>The marks of a component as HTML spans (one per mark, same words on every page); "none" when it has none.</summary>
    public static string FlagMarks(ReportMark flags)
    {
        if (flags == ReportMark.None) return "<span class=\"flag-none\">none</span>";
        var h = new StringBuilder();
        foreach (var f in ReportMarks.Split(flags))
        {
            if (h.Length > 0) h.Append(' ');
            h.Append("<span class=\"").Append(FlagClass(f)).Append("\" title=\"").Append(E(ReportMarks.Meaning(f))).Append("\">")
                .Append(E(ReportMarks.Words(f))).Append("</span>");
        }

        return h.ToString();
    }

    /// <summary>The legend: what each mark means, with the count where given.</summary>
    private static void Legend(StringBuilder h, IReadOnlyDictionary<ReportMark, int>? counts = null)
    {
        h.Append("<div class=\"legend\" id=\"legend\"><p><strong>Marks</strong> (the same on every page, in register.json and in the CSV exports, column <code>flags</code>):</p><dl>");
        foreach (var f in ReportMarks.All)
        {
            h.Append("<dt><span class=\"").Append(FlagClass(f)).Append("\">").Append(E(ReportMarks.Words(f))).Append("</span></dt><dd>")
                .Append(E(ReportMarks.Meaning(f)));
            if (counts is not null) h.Append(" (").Append(T(counts[f].ToString(System.Globalization.CultureInfo.InvariantCulture))).Append(')');
            h.Append("</dd>");
        }

        h.Append("</dl></div>\n");
    }

    /// <summary>The document-control block under the title: every field, "not set" where none was given, and the history.</summary>
    private static void DocumentControlBlock(StringBuilder h, ReportDocumentControl d)
    {
        static string V(string? v) => string.IsNullOrWhiteSpace(v) ? "not set" : v;
        h.Append("<table class=\"doc-control\" id=\"document-control\"><tbody>");
        foreach (var (k, v) in new[]
                 {
                     ("Title", V(d.Title)), ("Owner", V(d.Owner)), ("Author", V(d.Author)), ("Checker", V(d.Checker)), ("Approver", V(d.Approver)),
                     ("Revision", V(d.Revision) + (d.RevisionDate is { } date ? " of " + date.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture) : string.Empty)),
                     ("Target source", V(d.TargetSource)),
                 })
        {
            h.Append("<tr><th>").Append(E(k)).Append("</th><td>").Append(T(v)).Append("</td></tr>");
        }

        h.Append("</tbody></table>\n");
        if (d.History.Count > 0)
        {
            h.Append("<details class=\"small\"><summary>Document-control history</summary>");
            List(h, d.History);
            h.Append("</details>\n");
        }
    }

    private static string? FlagRowClass(ReportMark flags) =>
        flags.HasFlag(ReportMark.NotConverged) ? "not-converged" : flags.HasFlag(ReportMark.AboveTarget) || flags.HasFlag(ReportMark.Overdue) ? "above-target" : null;

    private static void FlagCards(StringBuilder h, IReadOnlyDictionary<ReportMark, int> counts)
    {
        foreach (var f in ReportMarks.All)
        {
            h.Append("<div class=\"card card-flag\"><div class=\"k\"><span class=\"").Append(FlagClass(f)).Append("\">").Append(E(ReportMarks.Words(f)))
                .Append("</span></div><div class=\"v\">").Append(T(counts[f].ToString(System.Globalization.CultureInfo.InvariantCulture))).Append("</div></div>");
        }
    }
}
