using System.Net;
using System.Text.RegularExpressions;
using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Web;

/// <summary>The component page: records with every revision, the computed numbers, encoding of what the register holds.</summary>
public sealed class ComponentPageTests
{
    [Fact]
    [Reference("sample-data/scenario.json: the 2019-06-18 MFL-ILI finding of IL3-KP42 was corrected from 1.6 mm (findings.csv) to 2.1 mm")]
    public async Task Shows_every_revision_of_a_finding_with_the_superseded_one_struck_through()
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var html = await factory.Client().GetStringAsync("/components/IL3-KP42");
        var rows = Regex.Matches(html, "<tr data-finding=\"(\\d+)\" data-revision=\"(\\d)\"( class=\"superseded\")?>(.*?)</tr>", RegexOptions.Singleline);
        var corrected = rows.Where(r => r.Groups[4].Value.Contains("2019-06-18", StringComparison.Ordinal)).ToArray();
        Assert.Equal(2, corrected.Length);
        var (first, second) = (corrected.Single(r => r.Groups[2].Value == "1"), corrected.Single(r => r.Groups[2].Value == "2"));
        Assert.True(first.Groups[3].Success, "revision 1 is marked superseded");
        Assert.Contains("<s>1.6</s>", first.Groups[4].Value, StringComparison.Ordinal);
        Assert.False(second.Groups[3].Success, "revision 2 is current");
        Assert.Contains("<td>2.1</td>", second.Groups[4].Value, StringComparison.Ordinal);
        Assert.Contains("field verification dig", second.Groups[4].Value, StringComparison.Ordinal);
        Assert.Contains(Reporting.Cautions.Line, html, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("sample-data/scenario.json: the landfall spool of IL3-KP38 was replaced on 2021-10-05")]
    public async Task Shows_the_repairs_of_the_component()
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var html = await factory.Client().GetStringAsync("/components/IL3-KP38");
        var repairs = Regex.Match(html, "<table id=\"repairs\">(.*?)</table>", RegexOptions.Singleline);
        Assert.True(repairs.Success);
        Assert.Contains("2021-10-05", repairs.Groups[1].Value, StringComparison.Ordinal);
        Assert.Contains("cut out and replaced", repairs.Groups[1].Value, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("the application layer's own run (ComponentRefresh, as `register assess` and `plan` use it) on a second copy of the register: the page shows the engine's numbers, not numbers of its own")]
    public async Task The_computed_page_shows_the_annual_pf_and_due_date_the_application_layer_computes()
    {
        var options = DemoRegisters.Options(DemoRegisters.Create());
        using var factory = new WebViewFactory(options);
        var html = await PageHelpers.Computed(factory.Client(), "HR1-J112");

        var copy = DemoRegisters.Create();
        using var store = Registers.Open(copy, RegisterOpenMode.OpenExisting, DemoRegisters.Clock);
        var direct = ComponentRefresh.Run(store, "HR1-J112", options.Run(DemoRegisters.EvidenceDate), schedule: false, _ => { });
        Assert.StartsWith(InspectionUpdate.Web.Html.P(direct.Stored.AnnualPf), PageHelpers.ById(html, "annual-pf"), StringComparison.Ordinal);
        Assert.Equal(InspectionUpdate.Web.Html.D(direct.Stored.NextDue), PageHelpers.ById(html, "next-due"));
        Assert.Contains("first order", PageHelpers.ById(html, "annual-pf"), StringComparison.Ordinal);
        Assert.Contains("data:image/png;base64,", html, StringComparison.Ordinal);
        // HR1-J112 has a sized indication (sample-data/findings.csv, 2022-08-15) and no repair since: the branch the plan
        // assumes (monitor by default) is stated with the detection.
        Assert.StartsWith("monitor", PageHelpers.ById(html, "after-detection"), StringComparison.Ordinal);
        Assert.Contains("Branch assumed after the last detection (a defect sized at 1.1 mm", PageHelpers.ById(html, "after-detection"), StringComparison.Ordinal);
        // The run stored its result: the register page shows it without computing.
        var list = await factory.Client().GetStringAsync("/");
        var row = Regex.Match(list, "<tr data-code=\"HR1-J112\">(.*?)</tr>", RegexOptions.Singleline).Groups[1].Value;
        Assert.Contains(InspectionUpdate.Web.Html.D(direct.Stored.NextDue), row, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("HTML encoding of register text (OWASP cross-site scripting prevention, rule 1: encode before inserting untrusted data into element content; from memory)")]
    public async Task Markup_in_a_component_name_or_finding_note_shows_as_text()
    {
        const string evil = "<script>alert('x')</script><b>bold</b> & \"quoted\"";
        var path = DemoRegisters.Create(store =>
        {
            var model = ModelFiles.Read(Path.Combine(DemoRegisters.SampleData, DemoRegisters.Scenario.Components[0].Model));
            Registers.Require(store.AddComponent(new NewComponent("SF-IL3", "IL3-MARKUP", evil, new DateOnly(2010, 1, 1), 12.7, model, "test"), "test"), "component");
            Registers.Require(store.AddFinding(new NewFinding("IL3-MARKUP", new DateOnly(2020, 1, 1), FindingKind.InService, null, Location: "<img src=x onerror=alert(1)>", Note: evil), "test", "test"), "finding");
        });
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        foreach (var page in new[] { "/components/IL3-MARKUP", "/" })
        {
            var html = await factory.Client().GetStringAsync(page);
            Assert.DoesNotContain("<script>alert", html, StringComparison.Ordinal);
            Assert.DoesNotContain("<b>bold</b>", html, StringComparison.Ordinal);
            Assert.DoesNotContain("<img src=x", html, StringComparison.Ordinal);
            Assert.Contains("&lt;script&gt;alert(&#x27;x&#x27;)&lt;/script&gt;&lt;b&gt;bold&lt;/b&gt; &amp; &quot;quoted&quot;", html, StringComparison.Ordinal);
        }
    }

    [Theory]
    [InlineData("/components/NO-SUCH")]
    [InlineData("/components/..%2F..%2F..%2Fetc%2Fpasswd")]
    [InlineData("/components/%2Fetc%2Fpasswd/findings/new")]
    [InlineData("/findings/999999/correct")]
    [Reference("no request path reaches the file system: a path is only ever a component code or finding id looked up in the register (common practice, no source)")]
    public async Task An_unknown_component_or_a_path_is_not_found_and_reads_no_file(string url)
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var response = await factory.Client().GetAsync(url);
        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
        var body = await response.Content.ReadAsStringAsync();
        Assert.DoesNotContain("root:", body, StringComparison.Ordinal);
        Assert.Contains("is not in the register", body, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("/assets/../demo.register")]
    [InlineData("/demo.register")]
    [InlineData("/sample-data/scenario.json")]
    [Reference("no static-file middleware: only the view's own style sheet and script are served (common practice, no source)")]
    public async Task Files_beside_the_register_or_the_program_are_not_served(string url)
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var response = await factory.Client().GetAsync(url);
        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
    }
}
