using InspectionUpdate.Web;
using Microsoft.AspNetCore.Builder;
using Microsoft.Playwright;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Web;

/// <summary>
/// Debian's chromium driven by Playwright (browser downloads are not possible here: Playwright is pointed at the
/// installed executable). Where chromium cannot start, the browser tests skip and say why.
/// </summary>
public sealed class ChromiumFixture : IAsyncLifetime
{
    /// <summary>Environment variable naming the chromium executable (default: /usr/bin/chromium).</summary>
    public const string ExecutableVariable = "INSPECTION_UPDATE_CHROMIUM";

    public IPlaywright? Playwright { get; private set; }

    public IBrowser? Browser { get; private set; }

    /// <summary>Why chromium cannot be used here, or null.</summary>
    public string? Unavailable { get; private set; }

    public async Task InitializeAsync()
    {
        var candidates = new[] { Environment.GetEnvironmentVariable(ExecutableVariable), "/usr/bin/chromium", "/usr/bin/chromium-browser" };
        var executable = candidates.FirstOrDefault(p => !string.IsNullOrWhiteSpace(p) && File.Exists(p));
        if (executable is null)
        {
            Unavailable = $"no chromium executable at {ExecutableVariable}, /usr/bin/chromium or /usr/bin/chromium-browser (install it with `apt-get install -y chromium`; .ci/run does)";
            return;
        }

        try
        {
            Playwright = await Microsoft.Playwright.Playwright.CreateAsync();
            Browser = await Playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
            {
                ExecutablePath = executable,
                Headless = true,
                // Root (as CI runs) needs --no-sandbox; small /dev/shm in containers needs the other.
                Args = ["--no-sandbox", "--disable-dev-shm-usage", "--disable-gpu"],
                Timeout = 60_000,
            });
        }
        catch (Exception e) when (e is PlaywrightException or TimeoutException or InvalidOperationException or IOException)
        {
            Unavailable = $"chromium at {executable} could not start: {e.Message.Split('\n')[0]}";
        }
    }

    public async Task DisposeAsync()
    {
        if (Browser is not null) await Browser.DisposeAsync();
        Playwright?.Dispose();
    }
}

/// <summary>The main flow in a real browser, with a screenshot of each page under the test output folder (screenshots/).</summary>
public sealed class BrowserFlowTests(ChromiumFixture chromium, ITestOutputHelper output) : IClassFixture<ChromiumFixture>
{
    private const string Code = "IL3-KP42";
    private const float Slow = 240_000;

    [SkippableFact]
    [Reference("sample-data/scenario.json (IL3-KP42 in service 2008-05-01, 12.7 mm wall); a no-indication finding with a method of PoD > 0 can only lower the updated failure probability, so the due date moves later (common practice, no source)")]
    public async Task Register_component_log_refuse_and_correct_in_chromium()
    {
        if (chromium.Browser is null) output.WriteLine("SKIPPED: " + chromium.Unavailable);
        Skip.If(chromium.Browser is null, chromium.Unavailable);
        var shots = Path.Combine(AppContext.BaseDirectory, "screenshots");
        Directory.CreateDirectory(shots);
        output.WriteLine("screenshots: " + shots);

        var path = DemoRegisters.Create();
        await using var app = WebView.Build([], DemoRegisters.Options(path), ["http://127.0.0.1:0"], DemoRegisters.Clock);
        await app.StartAsync();
        var root = app.Urls.First();
        await using var context = await chromium.Browser!.NewContextAsync(new BrowserNewContextOptions { ViewportSize = new ViewportSize { Width = 1280, Height = 900 } });
        var page = await context.NewPageAsync();
        page.SetDefaultTimeout(60_000);
        var external = new List<string>();
        page.Request += (_, r) =>
        {
            if (!r.Url.StartsWith(root, StringComparison.Ordinal) && !r.Url.StartsWith("data:", StringComparison.Ordinal)) external.Add(r.Url);
        };

        // The register.
        await page.GotoAsync(root + "/");
        await Shot(page, shots, "01-register");
        Assert.True(await page.Locator($"tr[data-code='{Code}']").IsVisibleAsync());

        // A component: its numbers arrive from the background run (the page polls and reloads).
        await page.ClickAsync($"a[href='/components/{Code}']");
        await page.WaitForSelectorAsync("#summary", new PageWaitForSelectorOptions { Timeout = Slow });
        await Shot(page, shots, "02-component");
        var dueBefore = DateOnly.Parse(await page.InnerTextAsync("#next-due"), System.Globalization.CultureInfo.InvariantCulture);

        // Log a no-indication finding through the form; the page shows the due date before and after.
        await page.ClickAsync("#log-finding");
        await Shot(page, shots, "03-log-form");
        await page.FillAsync("#f-inspection_date", "2025-06-01");
        await page.SelectOptionAsync("#f-kind", "no-indication");
        await page.SelectOptionAsync("#f-method", "UT-CMAP");
        await page.FillAsync("#f-location", "KP 4.2 joint 311");
        await page.ClickAsync("#finding-form button[type=submit]");
        await page.WaitForSelectorAsync("#after-due", new PageWaitForSelectorOptions { Timeout = Slow });
        await Shot(page, shots, "04-before-after");
        Assert.Equal(dueBefore.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture), (await page.InnerTextAsync("#before-due")).Trim());
        var dueAfter = DateOnly.Parse(await page.InnerTextAsync("#after-due"), System.Globalization.CultureInfo.InvariantCulture);
        output.WriteLine($"next inspection due: {dueBefore:yyyy-MM-dd} -> {dueAfter:yyyy-MM-dd}");
        Assert.True(dueAfter > dueBefore, $"the due date moves later after a no-indication finding ({dueBefore} -> {dueAfter})");
        var logged = DemoRegisters.AllRevisions(path, Code).Single(f => f.InspectionDate == new DateOnly(2025, 6, 1));
        var rows = await page.Locator("#findings tbody tr").CountAsync();

        // An invalid finding: the register's problems next to their fields, nothing written.
        await page.ClickAsync("#log-finding");
        await page.FillAsync("#f-inspection_date", "1999-03-01");
        await page.SelectOptionAsync("#f-kind", "sized-indication");
        await page.SelectOptionAsync("#f-method", "MFL-ILI");
        await page.FillAsync("#f-measured_size_mm", "30");
        await page.ClickAsync("#finding-form button[type=submit]");
        await page.WaitForSelectorAsync("#err-inspection_date");
        await Shot(page, shots, "05-refused");
        Assert.Contains("install date 2008-05-01", await page.InnerTextAsync("#err-inspection_date"), StringComparison.Ordinal);
        Assert.True(await page.Locator("#err-measured_size_mm").IsVisibleAsync());
        Assert.Equal("true", await page.GetAttributeAsync("#f-inspection_date", "aria-invalid"));
        Assert.DoesNotContain(DemoRegisters.AllRevisions(path, Code), f => f.InspectionDate == new DateOnly(1999, 3, 1));
        await page.GotoAsync(root + "/components/" + Code);
        Assert.Equal(rows, await page.Locator("#findings tbody tr").CountAsync());

        // Correct the logged finding with a reason: a new revision, the old one struck through.
        await page.ClickAsync($"tr[data-finding='{logged.FindingId}'] a");
        await page.WaitForSelectorAsync("#correct-form");
        await Shot(page, shots, "06-correct-form");
        await page.FillAsync("#f-inspection_date", "2025-06-02");
        await page.FillAsync("#f-reason", "date from the dig sheet");
        await page.ClickAsync("#correct-form button[type=submit]");
        await page.WaitForSelectorAsync($"tr[data-finding='{logged.FindingId}'][data-revision='2']");
        Assert.Equal(1, await page.Locator($"tr[data-finding='{logged.FindingId}'][data-revision='1'].superseded s").First.CountAsync());
        await page.WaitForSelectorAsync("#after-due", new PageWaitForSelectorOptions { Timeout = Slow });
        await Shot(page, shots, "07-corrected");
        Assert.Contains("date from the dig sheet", await page.InnerTextAsync($"tr[data-finding='{logged.FindingId}'][data-revision='2']"), StringComparison.Ordinal);

        await page.GotoAsync(root + "/import");
        await Shot(page, shots, "08-import");

        // The component's runs stored their results: the register page shows the latest due date without computing.
        await page.GotoAsync(root + "/components/" + Code);
        var dueNow = (await page.InnerTextAsync("#next-due")).Trim();
        await page.GotoAsync(root + "/?sort=next_due");
        await Shot(page, shots, "09-register-after");
        Assert.Contains(dueNow, await page.InnerTextAsync($"tr[data-code='{Code}']"), StringComparison.Ordinal);
        Assert.Empty(external);
        await app.StopAsync();
    }

    private async Task Shot(IPage page, string folder, string name)
    {
        var file = Path.Combine(folder, name + ".png");
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = file, FullPage = true });
        output.WriteLine("screenshot " + file);
    }
}
