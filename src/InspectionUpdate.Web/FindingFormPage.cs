using System.Text;
using InspectionUpdate.Application;
using InspectionUpdate.Register;
using static InspectionUpdate.Web.Html;

namespace InspectionUpdate.Web;

/// <summary>The forms that write findings: log one, correct one (a new revision), withdraw one; the register's problems are shown next to their fields.</summary>
public static class FindingFormPage
{
    /// <summary>The form fields, each with the register's field name, its label and a hint.</summary>
    private static readonly (string Field, string Label, string Hint)[] Fields =
    [
        ("inspection_date", "Inspection date", "yyyy-MM-dd; not before entry into service, not in the future"),
        ("kind", "Outcome", "what the inspection found"),
        ("method", "Method", "the inspection method (none for in-service)"),
        ("measured_size_mm", "Measured size (mm)", "sized indication only: depth of the defect, within the wall"),
        ("remaining_wall_mm", "Remaining wall (mm)", "wall-thickness reading only"),
        ("location", "Location", "where on the component, e.g. \"joint 311, 5 o'clock\""),
        ("note", "Note", "free text"),
    ];

    /// <summary>The log form (empty, or with the values and problems of a refused submission).</summary>
    public static string Log(HttpContext context, ComponentRecords records, FindingInput input, IReadOnlyList<ValidationProblem> problems)
    {
        ArgumentNullException.ThrowIfNull(records);
        ArgumentNullException.ThrowIfNull(input);
        var code = records.Component.Code;
        var b = new StringBuilder();
        b.Append("<h1>Log a finding on ").Append(E(code)).Append("</h1><p>").Append(E(records.Component.Description)).Append(" · in service since ")
            .Append(E(D(records.Component.InstallDate))).Append(records.Component.WallThicknessMm is { } w ? " · nominal wall " + E(N(w)) + " mm" : string.Empty).Append("</p>");
        Problems(b, problems);
        b.Append("<form class=\"entry\" method=\"post\" action=\"/components/").Append(Seg(code)).Append("/findings\" id=\"finding-form\" novalidate>").Append(Token(context));
        FieldRows(b, input, records.Methods, problems);
        b.Append("<span></span><div><button type=\"submit\">Log the finding</button> <a href=\"/components/").Append(Seg(code)).Append("\">Cancel</a></div><span></span></form>");
        b.Append("<p class=\"muted\">Nothing is written when any field has a problem. Recorded by: the signed-in user of the register where it knows one, else the operating-system user running the view.</p>");
        return Page(context, "Log a finding on " + code, b.ToString());
    }

    /// <summary>The correction page: the correct form and the withdraw form of one finding.</summary>
    public static string Correct(HttpContext context, FindingRecord finding, ComponentRecords records, FindingInput input, string? reason,
        IReadOnlyList<ValidationProblem> problems, string? withdrawReason, IReadOnlyList<ValidationProblem> withdrawProblems)
    {
        ArgumentNullException.ThrowIfNull(finding);
        ArgumentNullException.ThrowIfNull(records);
        var cur = finding.Current;
        var b = new StringBuilder();
        b.Append("<h1>Correct finding F-").Append(E(cur.FindingId)).Append(" on <a href=\"/components/").Append(Seg(cur.ComponentCode)).Append("\">").Append(E(cur.ComponentCode)).Append("</a></h1>");
        b.Append("<p>Current revision ").Append(E(cur.Revision)).Append(": ").Append(E(FindingWords.Of(cur.Kind))).Append(" on ").Append(E(D(cur.InspectionDate)))
            .Append(cur.MethodName is null ? string.Empty : " with " + E(cur.MethodName)).Append(". A correction is a new revision; the old one stays in the history.</p>");
        Problems(b, problems);
        b.Append("<form class=\"entry\" method=\"post\" action=\"/findings/").Append(E(cur.FindingId)).Append("/correct\" id=\"correct-form\" novalidate>").Append(Token(context));
        FieldRows(b, input, records.Methods, problems);
        Row(b, "reason", "Reason for the correction", "required: why the record changes", $"<textarea name=\"reason\" id=\"f-reason\" rows=\"2\"{Invalid(problems, "reason")}>{E(reason)}</textarea>", problems);
        b.Append("<span></span><div><button type=\"submit\">Save the correction</button> <a href=\"/components/").Append(Seg(cur.ComponentCode)).Append("\">Cancel</a></div><span></span></form>");

        b.Append("<h2>Withdraw this finding</h2><p>For a finding logged in error: a new revision marks it withdrawn; it no longer counts as evidence and stays in the history.</p>");
        Problems(b, withdrawProblems);
        b.Append("<form class=\"entry\" method=\"post\" action=\"/findings/").Append(E(cur.FindingId)).Append("/withdraw\" id=\"withdraw-form\" novalidate>").Append(Token(context));
        Row(b, "withdraw-reason", "Reason for the withdrawal", "required", $"<textarea name=\"reason\" id=\"f-withdraw-reason\" rows=\"2\"{Invalid(withdrawProblems, "reason")}>{E(withdrawReason)}</textarea>",
            withdrawProblems.Select(p => p.Field == "reason" ? p with { Field = "withdraw-reason" } : p).ToArray());
        b.Append("<span></span><div><button type=\"submit\" class=\"quiet\">Withdraw the finding</button></div><span></span></form>");
        return Page(context, "Correct finding F-" + cur.FindingId, b.ToString());
    }

    private static void Problems(StringBuilder b, IReadOnlyList<ValidationProblem> problems)
    {
        if (problems.Count == 0) return;
        b.Append("<div class=\"box error\" id=\"problems\" role=\"alert\"><strong>Nothing was written.</strong> ")
            .Append(problems.Count == 1 ? "One problem:" : E(problems.Count) + " problems:").Append("<ul>");
        foreach (var p in problems) b.Append("<li>").Append(E(Registers.Sentence(p))).Append("</li>");
        b.Append("</ul></div>");
    }

    private static void FieldRows(StringBuilder b, FindingInput input, IReadOnlyList<string> methods, IReadOnlyList<ValidationProblem> problems)
    {
        foreach (var (field, label, hint) in Fields)
        {
            var value = field switch
            {
                "inspection_date" => input.InspectionDate,
                "kind" => input.Kind,
                "method" => input.Method,
                "measured_size_mm" => input.MeasuredSizeMm,
                "remaining_wall_mm" => input.RemainingWallMm,
                "location" => input.Location,
                _ => input.Note,
            };
            string control;
            if (field == "kind")
            {
                var s = new StringBuilder($"<select name=\"kind\" id=\"f-kind\"{Invalid(problems, field)}>");
                foreach (var k in FindingEntries.Kinds)
                {
                    var words = FindingEntries.Words(k);
                    s.Append("<option value=\"").Append(E(k)).Append('"').Append(k == value ? " selected" : string.Empty).Append('>').Append(E(k + " – " + words)).Append("</option>");
                }

                control = s.Append("</select>").ToString();
            }
            else if (field == "method")
            {
                var s = new StringBuilder($"<select name=\"method\" id=\"f-method\"{Invalid(problems, field)}><option value=\"\">(none)</option>");
                foreach (var m in methods) s.Append("<option value=\"").Append(E(m)).Append('"').Append(m == value ? " selected" : string.Empty).Append('>').Append(E(m)).Append("</option>");
                // A value the register does not know stays visible, so that its problem can be read next to it.
                if (!string.IsNullOrEmpty(value) && !methods.Contains(value)) s.Append("<option selected value=\"").Append(E(value)).Append("\">").Append(E(value)).Append("</option>");
                control = s.Append("</select>").ToString();
            }
            else
            {
                control = $"<input type=\"text\" name=\"{field}\" id=\"f-{field}\" value=\"{E(value)}\"{Invalid(problems, field)}{(field.EndsWith("_mm", StringComparison.Ordinal) ? " inputmode=\"decimal\"" : string.Empty)}>";
            }

            Row(b, field, label, hint, control, problems);
        }
    }

    private static string Invalid(IReadOnlyList<ValidationProblem> problems, string field) =>
        problems.Any(p => p.Field == field) ? $" aria-invalid=\"true\" aria-describedby=\"err-{field}\"" : string.Empty;

    private static void Row(StringBuilder b, string field, string label, string hint, string control, IReadOnlyList<ValidationProblem> problems)
    {
        b.Append("<label for=\"f-").Append(field).Append("\">").Append(E(label)).Append("</label><div>").Append(control).Append("<div class=\"hint\">").Append(E(hint)).Append("</div></div>");
        var mine = problems.Where(p => p.Field == field).ToArray();
        if (mine.Length == 0) b.Append("<span></span>");
        else b.Append("<p class=\"field-error\" id=\"err-").Append(field).Append("\">").Append(string.Join("<br>", mine.Select(p => E(p.Message.TrimEnd('.') + "."))))
            .Append("</p>");
    }
}
