using System.Net;
using System.Text.RegularExpressions;
using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Web;

/// <summary>The register page: components, sites, stored results, flags, sorting and the site filter.</summary>
public sealed partial class RegisterPageTests
{
    [Fact]
    [Reference("sample-data/scenario.json: the demo's components and their sites")]
    public async Task Lists_every_component_of_the_register_with_its_site()
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var html = await factory.Client().GetStringAsync("/");
        foreach (var c in DemoRegisters.Scenario.Components)
        {
            var row = Regex.Match(html, "<tr data-code=\"" + Regex.Escape(c.Id) + "\">(.*?)</tr>", RegexOptions.Singleline);
            Assert.True(row.Success, c.Id + " is listed");
            Assert.Contains(">" + c.Site + "<", row.Groups[1].Value, StringComparison.Ordinal);
            Assert.Contains("not assessed", row.Groups[1].Value, StringComparison.Ordinal);
        }

        Assert.Contains(Reporting.Cautions.Line, html, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("sample-data/scenario.json: HR1-J112 and HR1-J118 are the components of site HR-1")]
    public async Task Site_filter_shows_only_the_components_of_that_site()
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var html = await factory.Client().GetStringAsync("/?site=HR-1");
        var listed = Codes(html);
        var expected = DemoRegisters.Scenario.Components.Where(c => c.Site == "HR-1").Select(c => c.Id).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(expected, listed.Order(StringComparer.Ordinal).ToArray());
    }

    [Fact]
    [Reference("the register's stored results read back directly (docs/register.md, Stored results): the page shows them, sorted and flagged")]
    public async Task A_whole_register_run_in_the_background_fills_the_annual_pf_sorted_and_flagged_as_stored()
    {
        var path = DemoRegisters.Create();
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var client = factory.Client();
        var response = await PageHelpers.PostForm(client, "/", "/register/assess", []);
        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        var jobUrl = "/jobs/" + response.Headers.Location!.OriginalString.Split("job=")[1];
        var deadline = DateTime.UtcNow.AddMinutes(5);
        string state;
        do
        {
            await Task.Delay(500);
            state = await client.GetStringAsync(jobUrl);
            Assert.True(DateTime.UtcNow < deadline, "register run did not finish: " + state);
        }
        while (!state.Contains("\"done\"", StringComparison.Ordinal) && !state.Contains("\"failed\"", StringComparison.Ordinal));
        Assert.Contains("\"done\"", state, StringComparison.Ordinal);

        var html = await client.GetStringAsync("/?sort=annual_pf&dir=desc");
        using var store = Registers.Open(path, RegisterOpenMode.OpenExistingToRead, DemoRegisters.Clock);
        var stored = store.Results(DemoRegisters.EvidenceDate).ToDictionary(r => r.ComponentCode);
        Assert.Equal(DemoRegisters.Scenario.Components.Count, stored.Count);
        var expectedOrder = stored.Values.OrderByDescending(r => r.AnnualPf ?? double.NegativeInfinity).Select(r => r.ComponentCode).ToArray();
        Assert.Equal(expectedOrder, Codes(html));
        foreach (var r in stored.Values)
        {
            var row = Regex.Match(html, "<tr data-code=\"" + Regex.Escape(r.ComponentCode) + "\">(.*?)</tr>", RegexOptions.Singleline).Groups[1].Value;
            Assert.Contains(InspectionUpdate.Web.Html.P(r.AnnualPf), row, StringComparison.Ordinal);
            Assert.Contains(InspectionUpdate.Web.Html.D(r.NextDue), row, StringComparison.Ordinal);
            Assert.Equal(r.AnnualPf > DemoRegisters.Scenario.TargetAnnualPf, row.Contains("above target", StringComparison.Ordinal));
            Assert.Equal(r.Status == ResultStatus.NotConverged, row.Contains("not converged", StringComparison.Ordinal));
            Assert.DoesNotContain("not assessed", row, StringComparison.Ordinal);
        }
    }

    [Fact]
    [Reference("ASP.NET Core anti-forgery: a POST without the form's token is refused (common practice, no source)")]
    public async Task A_post_without_its_anti_forgery_token_is_refused()
    {
        using var factory = new WebViewFactory(DemoRegisters.Options(DemoRegisters.Create()));
        var client = factory.Client();
        _ = await client.GetStringAsync("/");
        var response = await client.PostAsync("/register/assess", new FormUrlEncodedContent([]));
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Contains("nothing was written", await response.Content.ReadAsStringAsync(), StringComparison.Ordinal);
    }

    private static string[] Codes(string html) => RowCode().Matches(html).Select(m => m.Groups[1].Value).ToArray();

    [GeneratedRegex("<tr data-code=\"([^\"]+)\">")]
    private static partial Regex RowCode();
}
