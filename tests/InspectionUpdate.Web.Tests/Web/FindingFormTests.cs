using System.Net;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Web;

/// <summary>Logging, correcting and withdrawing findings through the forms: the register's validation per field, nothing written on error.</summary>
public sealed class FindingFormTests
{
    private const string Code = "IL3-KP42";

    [Fact]
    [Reference("docs/register.md, findings: inspection date not before the install date (2008-05-01 in sample-data/scenario.json), a known method, a size within the wall (12.7 mm)")]
    public async Task A_refused_finding_shows_each_problem_next_to_its_field_and_writes_nothing()
    {
        var path = DemoRegisters.Create();
        var before = DemoRegisters.AllRevisions(path, Code).Count;
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var response = await PageHelpers.PostForm(factory.Client(), $"/components/{Code}/findings/new", $"/components/{Code}/findings",
        [
            new("inspection_date", "1999-03-01"), new("kind", "sized-indication"), new("method", "NO-SUCH-METHOD"), new("measured_size_mm", "99"),
        ]);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
        var html = await response.Content.ReadAsStringAsync();
        Assert.Contains("before the component's install date 2008-05-01", PageHelpers.ById(html, "err-inspection_date"), StringComparison.Ordinal);
        Assert.Contains("no inspection method with this name", PageHelpers.ById(html, "err-method"), StringComparison.Ordinal);
        Assert.NotNull(PageHelpers.ById(html, "err-measured_size_mm"));
        Assert.Contains("Nothing was written", html, StringComparison.Ordinal);
        Assert.Contains("value=\"1999-03-01\"", html, StringComparison.Ordinal);
        Assert.Equal(before, DemoRegisters.AllRevisions(path, Code).Count);
    }

    [Fact]
    [Reference("ISO 8601 dates and invariant decimal numbers (docs/register.md, CSV import of findings)")]
    public async Task Text_that_is_not_a_date_or_a_number_is_refused_against_its_field()
    {
        var path = DemoRegisters.Create();
        var before = DemoRegisters.AllRevisions(path, Code).Count;
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var response = await PageHelpers.PostForm(factory.Client(), $"/components/{Code}/findings/new", $"/components/{Code}/findings",
        [
            new("inspection_date", "30/06/2025"), new("kind", "sized-indication"), new("method", "MFL-ILI"), new("measured_size_mm", "2,5"),
        ]);
        Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
        var html = await response.Content.ReadAsStringAsync();
        Assert.Contains("not an ISO 8601 date", PageHelpers.ById(html, "err-inspection_date"), StringComparison.Ordinal);
        Assert.Contains("not a number", PageHelpers.ById(html, "err-measured_size_mm"), StringComparison.Ordinal);
        Assert.Null(PageHelpers.ById(html, "err-method"));
        Assert.Equal(before, DemoRegisters.AllRevisions(path, Code).Count);
    }

    [Fact]
    [Reference("ASP.NET Core anti-forgery: a POST without the form's token is refused (common practice, no source)")]
    public async Task A_finding_without_the_anti_forgery_token_is_refused_and_not_written()
    {
        var path = DemoRegisters.Create();
        var before = DemoRegisters.AllRevisions(path, Code).Count;
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var client = factory.Client();
        _ = await client.GetStringAsync($"/components/{Code}/findings/new");
        var response = await client.PostAsync($"/components/{Code}/findings", new FormUrlEncodedContent(
            [new("inspection_date", "2025-06-01"), new("kind", "no-indication"), new("method", "UT-CMAP")]));
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Equal(before, DemoRegisters.AllRevisions(path, Code).Count);
    }

    [Fact]
    [Reference("the numbers before the finding are those the page showed before it; the numbers after are those the page shows once recomputed (before → after)")]
    public async Task A_logged_finding_is_recorded_by_the_operating_system_user_and_the_page_shows_before_and_after()
    {
        var path = DemoRegisters.Create();
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var client = factory.Client();
        var first = await PageHelpers.Computed(client, Code);
        var dueBefore = PageHelpers.ById(first, "next-due");
        var annualBefore = PageHelpers.ById(first, "annual-pf")!.Split(' ')[0];

        var response = await PageHelpers.PostForm(client, $"/components/{Code}/findings/new", $"/components/{Code}/findings",
            [new("inspection_date", "2025-06-01"), new("kind", "no-indication"), new("method", "UT-CMAP"), new("location", "KP 4.2 joint 311")]);
        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        Assert.Equal($"/components/{Code}", response.Headers.Location!.OriginalString);
        var added = DemoRegisters.AllRevisions(path, Code).Single(f => f.InspectionDate == new DateOnly(2025, 6, 1));
        Assert.Equal(FindingKind.NoIndication, added.Kind);
        Assert.Equal(Environment.UserName, added.Recorded.RecordedBy);

        var after = await PageHelpers.Computed(client, Code);
        Assert.Equal(dueBefore, PageHelpers.ById(after, "before-due"));
        Assert.Equal(annualBefore, PageHelpers.ById(after, "before-annual"));
        Assert.Equal(PageHelpers.ById(after, "next-due"), PageHelpers.ById(after, "after-due"));
        Assert.Contains($"F-{added.FindingId} logged", after, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("docs/register.md: a correction is a new revision with who, when and why; the old one is kept")]
    public async Task A_correction_is_a_new_revision_and_needs_a_reason()
    {
        var path = DemoRegisters.Create();
        var target = DemoRegisters.AllRevisions(path, Code).First(f => f.Kind == FindingKind.NoIndication);
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var client = factory.Client();
        var page = $"/findings/{target.FindingId}/correct";
        var fields = new List<KeyValuePair<string, string>>
        {
            new("inspection_date", "2014-06-11"), new("kind", "no-indication"), new("method", target.MethodName!), new("location", target.Location),
        };

        var refused = await PageHelpers.PostForm(client, page, page, fields.Append(new("reason", "  ")));
        Assert.Equal(HttpStatusCode.UnprocessableEntity, refused.StatusCode);
        Assert.NotNull(PageHelpers.ById(await refused.Content.ReadAsStringAsync(), "err-reason"));
        Assert.Single(DemoRegisters.AllRevisions(path, Code), f => f.FindingId == target.FindingId);

        var accepted = await PageHelpers.PostForm(client, page, page, fields.Append(new("reason", "date from the pig run report")));
        Assert.Equal(HttpStatusCode.Redirect, accepted.StatusCode);
        var revisions = DemoRegisters.AllRevisions(path, Code).Where(f => f.FindingId == target.FindingId).OrderBy(f => f.Revision).ToArray();
        Assert.Equal([1, 2], revisions.Select(r => r.Revision));
        Assert.Equal(new DateOnly(2014, 6, 11), revisions[1].InspectionDate);
        Assert.Equal("date from the pig run report", revisions[1].Recorded.Reason);
        var html = await client.GetStringAsync($"/components/{Code}");
        Assert.Matches($"<tr data-finding=\"{target.FindingId}\" data-revision=\"1\" class=\"superseded\"><td><s>F-{target.FindingId}</s>", html);
    }

    [Fact]
    [Reference("docs/register.md: a withdrawal is a new revision marked withdrawn; nothing is deleted")]
    public async Task A_withdrawal_keeps_the_finding_as_a_withdrawn_revision()
    {
        var path = DemoRegisters.Create();
        var target = DemoRegisters.AllRevisions(path, Code).First(f => f.Kind == FindingKind.NoIndication);
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var response = await PageHelpers.PostForm(factory.Client(), $"/findings/{target.FindingId}/correct", $"/findings/{target.FindingId}/withdraw",
            [new("reason", "logged on the wrong joint")]);
        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        var revisions = DemoRegisters.AllRevisions(path, Code).Where(f => f.FindingId == target.FindingId).OrderBy(f => f.Revision).ToArray();
        Assert.Equal(2, revisions.Length);
        Assert.True(revisions[1].Withdrawn);
        Assert.False(revisions[0].Withdrawn);
    }
}
