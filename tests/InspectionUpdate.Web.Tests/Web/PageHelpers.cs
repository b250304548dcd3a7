using System.Text.RegularExpressions;

namespace InspectionUpdate.Tests.Web;

/// <summary>Requests the tests repeat: forms with their anti-forgery token, and a component page once its background run is done.</summary>
internal static partial class PageHelpers
{
    /// <summary>Posts a form as a browser would: the token from <paramref name="formPage"/>, the cookie from the client.</summary>
    public static async Task<HttpResponseMessage> PostForm(HttpClient client, string formPage, string action, IEnumerable<KeyValuePair<string, string>> fields)
    {
        var html = await client.GetStringAsync(formPage);
        var all = fields.Append(new("__iu_token", DemoRegisters.Token(html)));
        return await client.PostAsync(action, new FormUrlEncodedContent(all));
    }

    /// <summary>The component page once its assessment for the current register state is shown (the background run polled as the page's script does).</summary>
    public static async Task<string> Computed(HttpClient client, string code)
    {
        var deadline = DateTime.UtcNow.AddMinutes(5);
        while (true)
        {
            var html = await client.GetStringAsync("/components/" + code);
            if (html.Contains("id=\"summary\"", StringComparison.Ordinal) && !html.Contains("are being computed", StringComparison.Ordinal)) return html;
            if (html.Contains("id=\"run-error\"", StringComparison.Ordinal)) throw new InvalidOperationException("the run failed: " + Text(html));
            if (DateTime.UtcNow > deadline) throw new TimeoutException("component page of " + code + " not computed in 5 minutes");
            await Task.Delay(400);
        }
    }

    /// <summary>The text of the element with id <paramref name="id"/> (tags removed, entities decoded).</summary>
    public static string? ById(string html, string id)
    {
        var m = Regex.Match(html, "id=\"" + Regex.Escape(id) + "\"[^>]*>(.*?)</(td|dd|span|p|div)>", RegexOptions.Singleline);
        return m.Success ? Text(m.Groups[1].Value).Trim() : null;
    }

    /// <summary>Tags removed, entities decoded.</summary>
    public static string Text(string html) => System.Net.WebUtility.HtmlDecode(Tags().Replace(html, " "));

    [GeneratedRegex("<[^>]+>")]
    private static partial Regex Tags();
}
