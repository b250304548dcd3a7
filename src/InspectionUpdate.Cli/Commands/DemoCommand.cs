using System.ComponentModel;
using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Updating;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>demo</c>.</summary>
public sealed class DemoSettings : CommonSettings
{
    /// <summary>Output folder.</summary>
    [CommandOption("-o|--out <DIR>")]
    [Description("Folder for the demo register, reports and exports (an earlier demo there is replaced).")]
    [DefaultValue("demo-output")]
    public string Out { get; init; } = "demo-output";

    /// <summary>Sample data folder.</summary>
    [CommandOption("--sample-data <DIR>")]
    [Description("Folder of the demo scenario (default: the sample-data shipped with the tool).")]
    public string? SampleData { get; init; }

    /// <summary>Include schedules.</summary>
    [CommandOption("--schedule")]
    [Description("Also compute each component's life-cycle schedule (slower).")]
    public bool Schedule { get; init; }
}

/// <summary>
/// Builds the demo register from sample-data, assesses, plans and reports every component, and prints a summary.
/// Steps whose engine parts are not in this build are listed as not available, never faked.
/// </summary>
public sealed class DemoCommand(CliHost host) : CliCommand<DemoSettings>(host)
{
    /// <summary>File name of the demo register inside the output folder.</summary>
    public const string RegisterFile = "demo.register";

    /// <inheritdoc />
    protected override int Run(DemoSettings settings, CancellationToken cancellation)
    {
        var clock = Stopwatch.StartNew();
        var sampleData = settings.SampleData is null ? DemoScenario.LocateSampleData(Host.WorkingDirectory) : Host.Resolve(settings.SampleData);
        var scenario = DemoScenario.Load(Path.Combine(sampleData, "scenario.json"));
        var outDir = Host.Resolve(settings.Out);
        Directory.CreateDirectory(outDir);
        var registerPath = Path.Combine(outDir, RegisterFile);
        foreach (var f in new[] { registerPath, registerPath + "-wal", registerPath + "-shm" })
        {
            if (File.Exists(f)) File.Delete(f);
        }

        // The demo register records at the scenario's evidence date, so that "as known on" that date sees everything.
        var demoHost = Host.WithClock(new FixedClock(scenario.EvidenceDate));
        var steps = new List<DemoStep>();
        var findings = Build(demoHost, scenario, sampleData, registerPath, steps);

        var options = new ReportRunOptions(scenario.EvidenceDate, AnnualTarget.FromAnnualPf(scenario.TargetAnnualPf, AnnualMeasure.IntervalPf, scenario.TargetSource),
            settings.Schedule, UpdatingRoute.Auto, null);
        // Exit 0 once every step ran: numbers that did not converge are flagged in the summary and the reports.
        var (report, _) = ReportCommand.Produce(demoHost, registerPath, null, Path.Combine(outDir, "reports"), options, settings.Json, scenario.Title);
        steps.Add(new DemoStep("assess", "done", $"{report.Components.Count(r => r.Error is null)} of {report.Components.Count} components: prior and updated profiles"));
        steps.Add(new DemoStep("plan", "done", settings.Schedule ? "next inspection, remaining life and life-cycle schedule" : "next inspection and remaining life (add --schedule for life-cycle schedules)"));
        steps.Add(new DemoStep("report", "done", report.PortfolioReport));

        var result = new DemoResult(scenario.Title, outDir, registerPath, report.PortfolioReport, scenario.Sites.Count, scenario.Components.Count, scenario.Methods.Count,
            findings, steps, report.Components, Math.Round(clock.Elapsed.TotalSeconds, 2), Reporting.Cautions.Line);
        if (settings.Json)
        {
            WriteJson(result);
            return ExitCodes.Ok;
        }

        Line(scenario.Title);
        Line(scenario.Note);
        Table(["step", "status", "detail"], steps.Select(s => (IReadOnlyList<string>)[s.Step, s.Status, s.Detail]));
        new ReportCommand(Host).Summary(report);
        Line($"Register: {registerPath}");
        Line($"Report:   {report.PortfolioReport}");
        Line($"Done in {result.ElapsedSeconds.ToString("0.0", CultureInfo.InvariantCulture)} s. Try: inspection-update finding list -r {registerPath}");
        Caution();
        return ExitCodes.Ok;
    }

    private static int Build(CliHost host, DemoScenario scenario, string sampleData, string registerPath, List<DemoStep> steps)
    {
        using var store = RegisterAccess.Open(host, registerPath, RegisterOpenMode.CreateNew);
        var built = DemoRegister.Build(store, scenario, sampleData);
        steps.Add(new DemoStep("register", "done", $"{scenario.Sites.Count} sites, {scenario.Methods.Count} methods, {scenario.Components.Count} components"));
        steps.Add(new DemoStep("findings", "done",
            $"{built.Findings} findings imported, {built.Corrections} corrected by a new revision, {built.Repairs} repair(s) logged"));
        return built.Findings;
    }
}

/// <summary>One step of the demo and how it went.</summary>
/// <param name="Step">register, findings, assess, plan or report.</param>
/// <param name="Status">done or not available.</param>
/// <param name="Detail">One sentence.</param>
public sealed record DemoStep(string Step, string Status, string Detail);

/// <summary>The --json document of <c>demo</c>.</summary>
public sealed record DemoResult(string Title, string OutputFolder, string Register, string PortfolioReport, int Sites, int Components, int Methods,
    int Findings, IReadOnlyList<DemoStep> Steps, IReadOnlyList<ReportRow> Summary, double ElapsedSeconds, string Caution);
