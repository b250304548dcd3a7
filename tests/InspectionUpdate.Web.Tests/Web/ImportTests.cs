using System.Net;
using System.Net.Http.Headers;
using System.Text;
using System.Text.RegularExpressions;
using InspectionUpdate.Web;

namespace InspectionUpdate.Tests.Web;

/// <summary>CSV import through the page: the register's import, all rows or none, a row-by-row list of problems.</summary>
public sealed class ImportTests
{
    private const string Header = "component_code,inspection_date,kind,method,measured_size_mm,remaining_wall_mm,location,note\n";

    [Fact]
    [Reference("docs/register.md, CSV import of findings: all rows or none, each problem with its line; install dates from sample-data/scenario.json")]
    public async Task A_file_with_bad_rows_lists_each_row_and_writes_nothing()
    {
        var path = DemoRegisters.Create();
        var before = DemoRegisters.Scenario.Components.Sum(c => DemoRegisters.AllRevisions(path, c.Id).Count);
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var csv = Header
            + "IL3-KP42,2025-05-02,no-indication,UT-CMAP,,,KP 4.2 joint 312,good row\n"
            + "NO-SUCH,2025-05-02,no-indication,UT-CMAP,,,x,unknown component\n"
            + "HR1-J112,1999-01-01,no-indication,ACFM-SUB,,,brace,before entry into service\n";
        var response = await Upload(factory, csv, "campaign.csv");
        Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
        var html = await response.Content.ReadAsStringAsync();
        var table = Regex.Match(html, "<table id=\"import-problems\">(.*?)</table>", RegexOptions.Singleline).Groups[1].Value;
        var lines = Regex.Matches(table, "<tr><td class=\"num\">(\\d+)</td><td>([^<]+)</td>").Select(m => (m.Groups[1].Value, m.Groups[2].Value)).ToArray();
        Assert.Contains(("3", "component_code"), lines);
        Assert.Contains(("4", "inspection_date"), lines);
        Assert.DoesNotContain(lines, l => l.Item1 == "2");
        Assert.Equal(before, DemoRegisters.Scenario.Components.Sum(c => DemoRegisters.AllRevisions(path, c.Id).Count));
    }

    [Fact]
    [Reference("docs/register.md, CSV import of findings")]
    public async Task A_good_file_is_imported_as_one_batch_and_the_changed_components_are_named()
    {
        var path = DemoRegisters.Create();
        using var factory = new WebViewFactory(DemoRegisters.Options(path));
        var csv = Header
            + "IL3-KP42,2025-05-02,no-indication,UT-CMAP,,,KP 4.2 joint 312,campaign 2025\n"
            + "HR1-J118,2025-05-03,no-indication,ACFM-SUB,,,brace J-118,campaign 2025\n";
        var response = await Upload(factory, csv, "../../etc/campaign-2025.csv");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        var html = await response.Content.ReadAsStringAsync();
        Assert.Contains("Imported 2 finding(s) from <code>campaign-2025.csv</code>", html, StringComparison.Ordinal);
        Assert.Contains("href=\"/components/HR1-J118\"", html, StringComparison.Ordinal);
        Assert.Contains(DemoRegisters.AllRevisions(path, "HR1-J118"), f => f.InspectionDate == new DateOnly(2025, 5, 3) && f.Recorded.RecordedBy == Environment.UserName);
        var component = await factory.Client().GetStringAsync("/components/IL3-KP42");
        Assert.Contains("finding(s) imported from campaign-2025.csv", component, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("../../etc/passwd", "passwd")]
    [InlineData("C:\\data\\campaign.csv", "campaign.csv")]
    [InlineData("", "upload.csv")]
    [InlineData("a\u0000b.csv", "ab.csv")]
    [Reference("an uploaded file name is a label only, never a path (common practice, no source)")]
    public void An_uploaded_file_name_is_reduced_to_a_label(string name, string label) => Assert.Equal(label, WebView.SafeName(name));

    private static async Task<HttpResponseMessage> Upload(WebViewFactory factory, string csv, string fileName)
    {
        var client = factory.Client();
        var token = DemoRegisters.Token(await client.GetStringAsync("/import"));
        using var content = new MultipartFormDataContent
        {
            { new StringContent(token), "__iu_token" },
        };
        var file = new ByteArrayContent(Encoding.UTF8.GetBytes(csv));
        file.Headers.ContentType = new MediaTypeHeaderValue("text/csv");
        content.Add(file, "file", fileName);
        return await client.PostAsync("/import", content);
    }
}
