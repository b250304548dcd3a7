using System.Net;
using System.Text.RegularExpressions;
using InspectionUpdate.Application;
using InspectionUpdate.Register;
using InspectionUpdate.Updating;
using InspectionUpdate.Web;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;

namespace InspectionUpdate.Tests.Web;

/// <summary>
/// Registers built from the invented demo scenario of sample-data (the same code path as the demo command), one per
/// test in its own folder, and the view's options for them: evidence date and target of the scenario, first-order
/// route so that a component is computed in seconds.
/// </summary>
internal static partial class DemoRegisters
{
    public static string SampleData => Path.Combine(AppContext.BaseDirectory, "sample-data");

    public static DemoScenario Scenario { get; } = DemoScenario.Load(Path.Combine(SampleData, "scenario.json"));

    public static DateOnly EvidenceDate => Scenario.EvidenceDate;

    /// <summary>A clock standing on the scenario's evidence date (records are made then; findings after it are "in the future").</summary>
    public static TimeProvider Clock { get; } = new FixedClock(Scenario.EvidenceDate);

    /// <summary>A new demo register in a new temporary folder; <paramref name="extra"/> adds rows after the scenario.</summary>
    public static string Create(Action<IRegister>? extra = null)
    {
        var folder = Path.Combine(Path.GetTempPath(), "iu-web-tests", Guid.NewGuid().ToString("N")[..12]);
        Directory.CreateDirectory(folder);
        var path = Path.Combine(folder, "demo.register");
        using var store = Registers.Open(path, RegisterOpenMode.CreateNew, Clock);
        DemoRegister.Build(store, Scenario, SampleData);
        extra?.Invoke(store);
        return path;
    }

    public static WebViewOptions Options(string path) => new(path)
    {
        AsOf = EvidenceDate,
        TargetAnnualPf = Scenario.TargetAnnualPf,
        Route = UpdatingRoute.FirstOrder,
        Parallelism = 1,
    };

    /// <summary>Reads the register directly (not through the view) to check what was or was not written.</summary>
    public static IReadOnlyList<FindingRevision> AllRevisions(string path, string code)
    {
        using var store = Registers.Open(path, RegisterOpenMode.OpenExistingToRead, Clock);
        var component = Registers.Component(store, code);
        return store.Findings(component.Id, includeWithdrawn: true).SelectMany(f => store.FindingHistory(f.FindingId)).ToArray();
    }

    public static string Token(string html) => TokenPattern().Match(html) is { Success: true } m ? WebUtility.HtmlDecode(m.Groups[1].Value) : throw new InvalidOperationException("no anti-forgery token in the page");

    [GeneratedRegex("name=\"__iu_token\" value=\"([^\"]+)\"")]
    private static partial Regex TokenPattern();
}

/// <summary>The web view in process (TestServer) over one register, on the scenario's clock.</summary>
internal sealed class WebViewFactory(WebViewOptions options) : WebApplicationFactory<Program>
{
    public WebViewOptions Options => options;

    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("WebView:Register", options.RegisterPath);
        builder.ConfigureServices(s =>
        {
            s.AddSingleton(options);
            s.AddSingleton(DemoRegisters.Clock);
        });
    }

    public HttpClient Client() => CreateClient(new WebApplicationFactoryClientOptions { AllowAutoRedirect = false, HandleCookies = true });
}
