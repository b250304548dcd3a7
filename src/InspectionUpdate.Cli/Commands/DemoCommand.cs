using System.ComponentModel;
using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Cli.Demo;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>demo</c>.</summary>
public sealed class DemoSettings : CommonSettings
{
    /// <summary>Output folder.</summary>
    [CommandOption("-o|--out <DIR>")]
    [Description("Folder for the demo register, reports and exports (replaced if it holds an earlier demo).")]
    [DefaultValue("demo-output")]
    public string Out { get; init; } = "demo-output";

    /// <summary>Sample data folder.</summary>
    [CommandOption("--sample-data <DIR>")]
    [Description("Folder of the demo scenario (default: the sample-data shipped with the tool).")]
    public string? SampleData { get; init; }
}

/// <summary>
/// Builds the demo register from sample-data, assesses, plans and reports every component, and prints a summary.
/// Steps whose engine parts are not in this build are listed as not available, never faked.
/// </summary>
public sealed class DemoCommand(CliHost host) : CliCommand<DemoSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(DemoSettings settings, CancellationToken cancellation)
    {
        var clock = Stopwatch.StartNew();
        var sampleData = settings.SampleData is null ? DemoScenario.LocateSampleData(Host.WorkingDirectory) : Host.Resolve(settings.SampleData);
        var scenario = DemoScenario.Load(Path.Combine(sampleData, "scenario.json"));
        var outDir = Host.Resolve(settings.Out);
        Directory.CreateDirectory(outDir);

        var steps = new List<DemoStep>
        {
            new("register", "not available", "the register (issue 5) has not landed"),
            new("assess", "not available", "component models (issue 4) and the updater (issue 5) have not landed"),
            new("plan", "not available", "the planner (issue 6) has not landed"),
            new("report", "not available", "needs assessed components"),
        };

        var result = new DemoResult(scenario.Title, outDir, null, null, scenario.Sites.Count, scenario.Components.Count, scenario.Methods.Count,
            steps, [], Math.Round(clock.Elapsed.TotalSeconds, 2), Reporting.Cautions.Line);
        if (settings.Json)
        {
            WriteJson(result);
            return ExitCodes.Ok;
        }

        Line(scenario.Title);
        Line(scenario.Note);
        Table(["site", "name", "components"], scenario.Sites.Select(s => (IReadOnlyList<string>)
            [s.Id, s.Name, scenario.Components.Count(c => c.Site == s.Id).ToString(CultureInfo.InvariantCulture)]));
        Table(["step", "status", "detail"], steps.Select(s => (IReadOnlyList<string>)[s.Step, s.Status, s.Detail]));
        Line($"Output folder: {outDir} ({result.ElapsedSeconds.ToString("0.0", CultureInfo.InvariantCulture)} s)");
        Caution();
        return ExitCodes.Ok;
    }
}

/// <summary>One step of the demo and how it went.</summary>
/// <param name="Step">register, assess, plan or report.</param>
/// <param name="Status">done, not available, failed.</param>
/// <param name="Detail">One sentence.</param>
public sealed record DemoStep(string Step, string Status, string Detail);

/// <summary>One component of the demo summary.</summary>
public sealed record DemoComponentSummary(string ComponentId, string Site, double? AnnualPfNow, string Route, DateOnly? NextInspection, string? Report);

/// <summary>The --json document of <c>demo</c>.</summary>
public sealed record DemoResult(string Title, string OutputFolder, string? Register, string? PortfolioReport, int Sites, int Components, int Methods,
    IReadOnlyList<DemoStep> Steps, IReadOnlyList<DemoComponentSummary> Summary, double ElapsedSeconds, string Caution);
