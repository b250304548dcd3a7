using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>The demo run once with --schedule; its pages and exports are read by the checks below.</summary>
public sealed class DemoReportFixture : IDisposable
{
    private readonly CliRunner cli = new();

    public DemoReportFixture()
    {
        Run = cli.Run("demo", "--out", "demo", "--schedule", "--json");
        Assert.True(Run.ExitCode == ExitCodes.Ok, Run.Error);
        Json = Run.Json();
        Folder = Path.GetDirectoryName(Json.GetProperty("portfolio_report").GetString()!)!;
        Index = File.ReadAllText(Path.Combine(Folder, "index.html"));
        Register = JsonDocument.Parse(File.ReadAllText(Path.Combine(Folder, "register.json"))).RootElement.Clone();
        Scenario = JsonDocument.Parse(File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "sample-data", "scenario.json"))).RootElement.Clone();
    }

    internal CliRun Run { get; }

    public JsonElement Json { get; }

    public string Folder { get; }

    public string Index { get; }

    public JsonElement Register { get; }

    public JsonElement Scenario { get; }

    public IEnumerable<JsonElement> Components => Register.GetProperty("components").EnumerateArray();

    public string Page(string code) => File.ReadAllText(Path.Combine(Folder, code + ".html"));

    /// <summary>The marks' keys of a set of flag spans in an HTML fragment.</summary>
    public static string[] Marks(string html) =>
        Regex.Matches(html, "<span class=\"flag flag-([a-z_]+)\"").Select(m => m.Groups[1].Value).ToArray();

    /// <summary>The HTML of the table row of <paramref name="code"/> in the section <paramref name="section"/> of a page.</summary>
    public static string Row(string html, string section, string code)
    {
        var start = html.IndexOf("<section id=\"" + section + "\">", StringComparison.Ordinal);
        Assert.True(start >= 0, section);
        var end = html.IndexOf("</section>", start, StringComparison.Ordinal);
        var rows = Regex.Matches(html[start..end], "<tr[^>]*>.*?</tr>", RegexOptions.Singleline).Select(m => m.Value);
        return Assert.Single(rows, r => r.Contains("<td>" + code + "</td>", StringComparison.Ordinal));
    }

    public void Dispose() => cli.Dispose();
}

public sealed class DemoReportTests(DemoReportFixture demo) : IClassFixture<DemoReportFixture>
{
    [Fact]
    public void Every_component_carries_the_same_marks_on_the_register_page_its_own_page_register_json_and_both_csv_files()
    {
        var csv = File.ReadAllLines(Path.Combine(demo.Folder, "register.csv"));
        var header = csv[0].Split(',');
        var flagsColumn = Array.IndexOf(header, "flags");
        Assert.True(flagsColumn >= 0);
        foreach (var c in demo.Components)
        {
            var code = c.GetProperty("component_id").GetString()!;
            var json = c.GetProperty("flags").EnumerateArray().Select(f => f.GetString()!).ToArray();
            Assert.Equal(json, DemoReportFixture.Marks(DemoReportFixture.Row(demo.Index, "ranking", code)));
            Assert.Equal(json, DemoReportFixture.Marks(DemoReportFixture.Row(demo.Index, "due-dates", code)));
            var page = demo.Page(code);
            var header0 = page[..page.IndexOf("</header>", StringComparison.Ordinal)];
            Assert.Equal(json, DemoReportFixture.Marks(header0));
            var export = JsonDocument.Parse(File.ReadAllText(Path.Combine(demo.Folder, code + ".json"))).RootElement;
            Assert.Equal(json, export.GetProperty("flags").EnumerateArray().Select(f => f.GetString()!).ToArray());
            var line = Assert.Single(csv, l => l.StartsWith(code + ",", StringComparison.Ordinal));
            Assert.Contains("," + string.Join(';', json) + ",", line, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void The_marks_follow_the_numbers_in_register_json_and_the_command_lines_convergence_verdict()
    {
        // The rule written out (docs/reports.md): above target ⇔ annual Pf now ≥ target; overdue ⇔ next due ≤ evidence date;
        // not converged ⇔ the command line's all_converged is false.
        var target = demo.Register.GetProperty("target_annual_pf").GetDouble();
        var asOf = DateOnly.Parse(demo.Register.GetProperty("assessed_as_of").GetString()!, CultureInfo.InvariantCulture);
        var cliConverged = demo.Json.GetProperty("summary").EnumerateArray()
            .ToDictionary(r => r.GetProperty("component_id").GetString()!, r => r.GetProperty("all_converged").GetBoolean());
        foreach (var c in demo.Components)
        {
            var code = c.GetProperty("component_id").GetString()!;
            var flags = c.GetProperty("flags").EnumerateArray().Select(f => f.GetString()).ToHashSet();
            var pf = c.GetProperty("current_annual_pf").GetDouble();
            Assert.Equal(pf >= target, flags.Contains("above_target"));
            var due = c.GetProperty("next_due").GetString() is { } d ? DateOnly.Parse(d, CultureInfo.InvariantCulture) : (DateOnly?)null;
            Assert.Equal(due <= asOf, flags.Contains("overdue"));
            Assert.Equal(!cliConverged[code], flags.Contains("not_converged"));
            // The command line's --json carries the same marks.
            var cliFlags = demo.Json.GetProperty("summary").EnumerateArray().Single(r => r.GetProperty("component_id").GetString() == code)
                .GetProperty("flags").EnumerateArray().Select(f => f.GetString()).ToHashSet();
            Assert.Equal(flags, cliFlags);
            // The register page never calls a component converged that the command line calls not converged.
            var rowText = Regex.Replace(DemoReportFixture.Row(demo.Index, "ranking", code), "<[^>]+>", " ");
            if (!cliConverged[code]) Assert.DoesNotContain("converged", rowText.Replace("not converged", string.Empty, StringComparison.Ordinal), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void The_summary_cards_count_each_mark_and_a_legend_explains_them()
    {
        var summary = demo.Index[demo.Index.IndexOf("<section id=\"summary\">", StringComparison.Ordinal)..demo.Index.IndexOf("<section id=\"ranking\">", StringComparison.Ordinal)];
        foreach (var key in new[] { "not_converged", "overdue", "above_target" })
        {
            var expected = demo.Components.Count(c => c.GetProperty("flags").EnumerateArray().Any(f => f.GetString() == key));
            var card = Regex.Match(summary, "<div class=\"card card-flag\"><div class=\"k\"><span class=\"flag flag-" + key + "\">[^<]*</span></div><div class=\"v\"><span class=\"num\">(\\d+)</span></div>");
            Assert.True(card.Success, key);
            Assert.Equal(expected, int.Parse(card.Groups[1].Value, CultureInfo.InvariantCulture));
            Assert.Matches("<dt><span class=\"flag flag-" + key + "\">[^<]+</span></dt><dd>[^<]{20,}", summary);
        }

        // The demo has a component above its target (HR1-J118 at the evidence date): the check above is not vacuous.
        Assert.Contains(demo.Components, c => c.GetProperty("flags").EnumerateArray().Any(f => f.GetString() == "above_target"));
    }

    [Fact]
    public void Sister_components_sharing_a_model_file_carry_their_own_names()
    {
        // HR1-J112/HR1-J118 share one crack-growth file titled for J-112; IL3-KP42/IL3-KP38 one corrosion file titled for KP 4.2.
        foreach (var (code, other) in new[] { ("HR1-J118", "J-112"), ("IL3-KP38", "KP 4.2") })
        {
            var name = demo.Scenario.GetProperty("components").EnumerateArray().Single(c => c.GetProperty("id").GetString() == code).GetProperty("name").GetString()!;
            var page = Regex.Replace(demo.Page(code), "data:image/png;base64,[A-Za-z0-9+/=]+", string.Empty);
            Assert.Contains(System.Net.WebUtility.HtmlEncode(name), page, StringComparison.Ordinal);
            Assert.DoesNotContain(other, page, StringComparison.Ordinal);
            Assert.DoesNotContain(other, File.ReadAllText(Path.Combine(demo.Folder, code + ".json")), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Every_number_in_the_pages_text_sits_in_one_unbreakable_span_and_no_page_uses_another_number_format()
    {
        foreach (var file in Directory.GetFiles(demo.Folder, "*.html"))
        {
            var html = Regex.Replace(File.ReadAllText(file), "<img[^>]*>", string.Empty);
            var body = html[html.IndexOf("<main>", StringComparison.Ordinal)..];
            body = Regex.Replace(body, "<script.*?</script>", string.Empty, RegexOptions.Singleline);
            // The CSS rule that makes the span unbreakable is on the page.
            Assert.Contains(".num { white-space: nowrap; }", html, StringComparison.Ordinal);
            // Inside tables and the summary cards, no number is left outside a span.
            foreach (Match table in Regex.Matches(body, "<tbody>.*?</tbody>|<div class=\"v\">.*?</div>", RegexOptions.Singleline))
            {
                var text = Regex.Replace(table.Value, "<span class=\"num\">[^<]*</span>", " ");
                text = Regex.Replace(text, "<[^>]+>", " ");
                var loose = Regex.Match(text, @"(?<![\w.\-#&;])\d+(?:\.\d+)?(?:e-?\d+)?(?![\w])");
                Assert.False(loose.Success, $"{Path.GetFileName(file)}: unwrapped number '{loose.Value}' in: {text.Trim()[..Math.Min(200, text.Trim().Length)]}");
            }

            // One format: no E-notation with a padded exponent (1.0E-004) or capital E anywhere in the visible text.
            var visible = System.Net.WebUtility.HtmlDecode(Regex.Replace(body, "<[^>]+>", " "));
            Assert.DoesNotMatch(@"\d[.\d]*E[-+]?\d", visible);
            // A number never ends a line with its exponent on the next: "2.45e-" is always followed by its digits in the same span.
            Assert.DoesNotMatch(@"\de-</span>", html);
        }
    }

    [Fact]
    public void The_plan_of_a_component_above_its_target_never_claims_to_keep_the_target()
    {
        foreach (var c in demo.Components.Where(c => c.GetProperty("flags").EnumerateArray().Any(f => f.GetString() == "above_target")))
        {
            var code = c.GetProperty("component_id").GetString()!;
            var plan = ReportRunFixture.Section(demo.Page(code), "plan");
            Assert.DoesNotContain("keep the annual ΔPf under the target 1.00e-4 (largest ratio", plan, StringComparison.Ordinal);
            Assert.Contains("do NOT keep", plan, StringComparison.Ordinal);
        }
    }

    [Fact]
    [Reference("RFC 5545 (iCalendar), parsed back with Ical.Net; the expected dates are the plans' own, read from each component's plan CSV")]
    public void The_calendar_parses_back_with_ical_net_and_holds_every_due_date_of_the_plans_overdue_first()
    {
        var asOf = DateOnly.Parse(demo.Register.GetProperty("assessed_as_of").GetString()!, CultureInfo.InvariantCulture);
        var expected = new List<(string Code, DateOnly Date)>();
        foreach (var c in demo.Components)
        {
            var code = c.GetProperty("component_id").GetString()!;
            var lines = File.ReadAllLines(Path.Combine(demo.Folder, code + ".plan.csv"));
            var date = Array.IndexOf(lines[0].Split(','), "date");
            expected.AddRange(lines.Skip(1).Select(l => (code, DateOnly.Parse(l.Split(',')[date], CultureInfo.InvariantCulture))));
        }

        Assert.True(expected.Count > demo.Components.Count(), "the demo with --schedule plans more than the next inspections");
        var calendar = Ical.Net.Calendar.Load(File.ReadAllText(Path.Combine(demo.Folder, "calendar.ics")))!;
        var events = calendar.Events.ToArray();
        Assert.Equal(expected.Count, events.Length);
        foreach (var (code, date) in expected)
        {
            var day = date <= asOf ? asOf : date;
            Assert.Single(events, e => e.Summary!.Contains(code, StringComparison.Ordinal) && e.Summary.Contains("by " + date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), StringComparison.Ordinal)
                && e.Start!.Year == day.Year && e.Start.Month == day.Month && e.Start.Day == day.Day && (date <= asOf) == e.Summary.StartsWith("OVERDUE", StringComparison.Ordinal));
        }

        // The CSV holds the same dates, overdue first, then by site and date.
        var calendarLines = File.ReadAllLines(Path.Combine(demo.Folder, "calendar.csv"));
        var header = calendarLines[0].Split(',');
        var csv = calendarLines.Skip(1).Select(l => l.Split(',')).ToArray();
        Assert.Equal(expected.Count, csv.Length);
        var status = csv.Select(r => r[Array.IndexOf(header, "status")]).ToArray();
        Assert.Equal(status.OrderBy(s => s == "overdue" ? 0 : 1), status);
        var due = csv.Where(r => r[Array.IndexOf(header, "status")] == "due").Select(r => (Site: r[Array.IndexOf(header, "site")], Date: r[Array.IndexOf(header, "date")])).ToArray();
        Assert.Equal(due.OrderBy(d => d.Site, StringComparer.Ordinal).ThenBy(d => d.Date, StringComparer.Ordinal), due);
        Assert.Contains(status, s => s == "overdue");
    }

    [Fact]
    public void Every_page_and_json_export_carries_the_registers_document_control()
    {
        // The demo records invented document control in its register (DemoCommand); every page and JSON export shows it.
        foreach (var file in Directory.GetFiles(demo.Folder, "*.html"))
        {
            var block = Regex.Match(File.ReadAllText(file), "<table class=\"doc-control\".*?</table>", RegexOptions.Singleline).Value;
            Assert.False(string.IsNullOrEmpty(block), Path.GetFileName(file));
            foreach (var text in new[] { "demo.approver (invented approver)", "demo.checker (invented checker)", "demo.integrity (invented author)", "Sandwick and Hollin integrity owner (invented)" })
            {
                Assert.Contains(text, block, StringComparison.Ordinal);
            }
        }

        foreach (var file in Directory.GetFiles(demo.Folder, "*.json"))
        {
            var control = JsonDocument.Parse(File.ReadAllText(file)).RootElement.GetProperty("document_control");
            Assert.Equal("demo.approver (invented approver)", control.GetProperty("approver").GetString());
            Assert.Equal("1", control.GetProperty("revision").GetString());
            Assert.Contains("demo choice", control.GetProperty("target_source").GetString(), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void The_register_page_ranks_risk_by_probability_and_the_owners_consequence_class_with_a_chart()
    {
        var start = demo.Index.IndexOf("<section id=\"risk\">", StringComparison.Ordinal);
        Assert.True(start >= 0);
        var risk = demo.Index[start..demo.Index.IndexOf("</section>", start, StringComparison.Ordinal)];
        Assert.Contains("<img", risk, StringComparison.Ordinal);
        Assert.Contains("Class 4: release reaching open water or the public (invented)", Regex.Replace(risk, "<span class=\"num\">([^<]*)</span>", "$1"), StringComparison.Ordinal);
        // The order of the table is the order of annual Pf now over its target, computed here from register.json.
        var expected = demo.Components.Where(c => c.GetProperty("consequence_class").ValueKind == JsonValueKind.Number)
            .OrderByDescending(c => c.GetProperty("current_annual_pf").GetDouble() / c.GetProperty("target_annual_pf").GetDouble())
            .Select(c => c.GetProperty("component_id").GetString()!).ToArray();
        var shown = Regex.Matches(risk, "<tr[^>]*><td><span class=\"num\">\\d+</span></td><td>([^<]+)</td>").Select(m => m.Groups[1].Value).ToArray();
        Assert.Equal(expected, shown);
        Assert.Equal(4, expected.Length);
    }

    [Fact]
    public void A_plan_after_a_sizing_states_the_branch_it_assumes_and_one_without_a_detection_does_not()
    {
        // IL3-KP42 has sized indications in sample-data/findings.csv; HR1-J118 only no-indication findings.
        Assert.Contains("Branch assumed after the last detection (a defect sized at", ReportRunFixture.Section(demo.Page("IL3-KP42"), "plan"), StringComparison.Ordinal);
        Assert.DoesNotContain("Branch assumed", ReportRunFixture.Section(demo.Page("HR1-J118"), "plan"), StringComparison.Ordinal);
    }

    /// <summary>Chromium on the PATH (Debian's package), or null.</summary>
    private static string? Chromium() =>
        new[] { "chromium", "chromium-browser", "google-chrome" }
            .SelectMany(n => (Environment.GetEnvironmentVariable("PATH") ?? string.Empty).Split(':').Select(d => Path.Combine(d, n)))
            .FirstOrDefault(File.Exists);

    private static string RunChromium(string chromium, params string[] args)
    {
        var start = new System.Diagnostics.ProcessStartInfo(chromium) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in new[] { "--headless", "--no-sandbox", "--disable-gpu", "--no-pdf-header-footer" }.Concat(args)) start.ArgumentList.Add(a);
        using var process = System.Diagnostics.Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        _ = process.StandardError.ReadToEndAsync();
        Assert.True(process.WaitForExit(120_000), "chromium did not finish in 2 minutes");
        return stdout.Result;
    }

    // A4 is 210 mm wide; with the page style's 12 mm margins 186 mm are printable, 703 CSS px at 96 px per inch
    // (Letter, 215.9 mm, is wider: A4 is the narrower bound). Common practice, no source.
    private const int A4PrintableWidthPx = 703;

    [SkippableFact]
    public void Every_page_fits_the_printable_width_of_A4_and_prints_to_pdf_on_A4_and_Letter_with_screenshots_kept_as_artefacts()
    {
        var chromium = Chromium();
        Skip.If(chromium is null, "chromium is not installed (apt-get install -y chromium)");
        var artefacts = Path.Combine(AppContext.BaseDirectory, "artefacts", "demo-report");
        Directory.CreateDirectory(artefacts);
        foreach (var file in Directory.GetFiles(demo.Folder, "*.html"))
        {
            // Layout probe: nothing (table, figure, image) reaches beyond the printable width.
            var probe = Path.Combine(demo.Folder, "probe-" + Path.GetFileName(file));
            File.WriteAllText(probe, File.ReadAllText(file).Replace("</body>",
                "<script>var w=[];document.querySelectorAll('table,figure,img,section').forEach(function(e){var r=e.getBoundingClientRect();if(r.right>window.innerWidth+1)w.push(e.tagName+(e.id?'#'+e.id:'')+':'+Math.round(r.right));});"
                + "document.body.setAttribute('data-wide',w.join(' ')||'none');</script></body>", StringComparison.Ordinal));
            var dom = RunChromium(chromium!, $"--window-size={A4PrintableWidthPx},1000", "--dump-dom", probe);
            File.Delete(probe);
            Assert.Contains("data-wide=\"none\"", dom, StringComparison.Ordinal);
        }

        foreach (var page in new[] { "index.html", "HR1-J118.html" })
        {
            var html = File.ReadAllText(Path.Combine(demo.Folder, page));
            var rowsInHtml = Regex.Count(html, "<tr[ >]");
            foreach (var size in new[] { "A4", "Letter" })
            {
                var bytes = PrintToPdf(chromium!, demo.Folder, html, size, Path.Combine(artefacts, Path.GetFileNameWithoutExtension(page) + "." + size + ".pdf"));
                // Printed, and not one figure or row per sheet: a page of this register fits on a handful of sheets.
                Assert.InRange(PrintedRows.PageCount(bytes), 1, 40);

                // No table row split by a page break: every row's contents on one page (PrintedRows says how it is read).
                var rows = PrintedRows.Read(bytes);
                Assert.True(rows.Count == rowsInHtml, $"{page} on {size}: {rows.Count} rows in the PDF's structure tree, {rowsInHtml} <tr> in the HTML (is the PDF still tagged?)");
                var split = rows.Where(r => !r.ColumnHeader && r.Pages.Count > 1).Select(r => $"row {r.Index} on {r.Pages.Count} pages").ToArray();
                Assert.True(split.Length == 0, $"{page} on {size}: " + string.Join("; ", split));
            }

            RunChromium(chromium!, "--window-size=1000,4000", "--screenshot=" + Path.Combine(artefacts, Path.GetFileNameWithoutExtension(page) + ".png"), Path.Combine(demo.Folder, page));
            Assert.True(new FileInfo(Path.Combine(artefacts, Path.GetFileNameWithoutExtension(page) + ".png")).Length > 10_000);
        }
    }

    [SkippableFact]
    public void The_split_row_check_sees_a_row_taller_than_a_page_split_across_pages()
    {
        // The control for the check above: a row taller than an A4 sheet cannot be kept whole (break-inside: avoid
        // only moves it), so chromium must split it, and PrintedRows must see it on two pages.
        var chromium = Chromium();
        Skip.If(chromium is null, "chromium is not installed (apt-get install -y chromium)");
        const string html = "<!DOCTYPE html><html><head><style>@page { margin: 12mm; } tr { break-inside: avoid; }</style></head><body><table>"
            + "<thead><tr><th>column</th></tr></thead><tbody><tr><td>short row</td></tr>"
            + "<tr><td><p>top of the tall row</p><div style=\"height:1500px\"></div><p>bottom of the tall row</p></td></tr>"
            + "<tr><td>after</td></tr></tbody></table></body></html>";
        var bytes = PrintToPdf(chromium!, demo.Folder, html, "A4", Path.Combine(demo.Folder, "control.A4.pdf"));
        var rows = PrintedRows.Read(bytes);

        Assert.Equal(4, rows.Count);
        Assert.True(rows[0].ColumnHeader);
        Assert.Single(rows[1].Pages);
        Assert.Equal(2, rows[2].Pages.Count);
        Assert.Single(rows[3].Pages);
    }

    /// <summary>Prints <paramref name="html"/> (written beside the demo pages, so its links resolve) on a sheet of <paramref name="size"/>.</summary>
    private static byte[] PrintToPdf(string chromium, string folder, string html, string size, string pdf)
    {
        var sized = Path.Combine(folder, size + "-print-" + Guid.NewGuid().ToString("N")[..8] + ".html");
        File.WriteAllText(sized, html.Replace("</style>", "@page { size: " + size + "; }</style>", StringComparison.Ordinal));
        RunChromium(chromium, "--print-to-pdf=" + pdf, sized);
        File.Delete(sized);
        return File.ReadAllBytes(pdf);
    }
}
