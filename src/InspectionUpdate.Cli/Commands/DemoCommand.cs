using System.ComponentModel;
using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Demo;
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
        const string by = "demo.integrity";
        foreach (var s in scenario.Sites) RegisterAccess.Require(store.AddSite(new NewSite(s.Id, s.Name), by), "demo site " + s.Id);
        foreach (var m in scenario.Methods) RegisterAccess.Require(store.AddMethod(MethodFile.Read(Path.Combine(sampleData, m.File), m.Id), by), "demo method " + m.Id);
        foreach (var c in scenario.Components)
        {
            var json = ModelFiles.Read(Path.Combine(sampleData, c.Model));
            RegisterAccess.Require(store.AddComponent(new NewComponent(c.Site, c.Id, c.Name, c.InService, c.WallMm, json, ModelFiles.DefaultVersion), by), "demo component " + c.Id);
        }

        // Invented document control, so that the demo's pages show what an owner signs.
        RegisterAccess.Require(store.SetDocumentControl(new DocumentControlChange(scenario.Title, "Sandwick and Hollin integrity owner (invented)", "demo.integrity (invented author)",
            "demo.checker (invented checker)", "demo.approver (invented approver)", "1", scenario.EvidenceDate, scenario.TargetSource), by, "demo issue"), "demo document control");
        // Invented consequence scale and classes (no preset: the scenario's target applies to every class).
        string[] meanings =
        [
            "no release; repair at the next planned stop (invented)", "small release contained on site (invented)", "release needing a shutdown of the line or platform (invented)",
            "release reaching open water or the public (invented)", "release with risk to life (invented)",
        ];
        for (var k = 1; k <= 5; k++) RegisterAccess.Require(store.SetConsequenceClass(k, meanings[k - 1], null, by, "demo consequence scale"), "demo consequence class");
        foreach (var (code, cls, cost) in new[] { ("HR1-J112", 3, (double?)4.0e6), ("HR1-J118", 4, 9.0e6), ("IL3-KP42", 2, null), ("IL3-KP38", 3, 1.5e6) })
        {
            RegisterAccess.Require(store.SetComponentConsequence(code, cls, cost, by, "demo consequence survey"), "demo component consequence");
        }

        steps.Add(new DemoStep("register", "done", $"{scenario.Sites.Count} sites, {scenario.Methods.Count} methods, {scenario.Components.Count} components"));
        var import = store.ImportFindingsCsv(Path.Combine(sampleData, scenario.Findings), by, "demo import");
        if (!import.Succeeded) throw RegisterAccess.Problems("demo findings import", import.Problems);
        foreach (var fix in scenario.Corrections)
        {
            var component = RegisterAccess.Component(store, fix.Component);
            var current = store.Findings(component.Id).FirstOrDefault(f => f.InspectionDate == fix.InspectionDate && f.MethodName == fix.Method)
                ?? throw CliException.BadInput("correction", $"{fix.Component} {fix.InspectionDate:yyyy-MM-dd} {fix.Method}", "matches no imported finding.");
            RegisterAccess.Require(store.ReviseFinding(current.FindingId, new NewFinding(current.ComponentCode, current.InspectionDate, current.Kind, current.MethodName,
                fix.MeasuredSizeMm, current.RemainingWallMm, current.Location, current.Note), fix.By, fix.Reason), "demo correction");
        }

        foreach (var r in scenario.Repairs)
        {
            RegisterAccess.Require(store.AddRepair(new NewRepair(r.Component, r.Date, r.Description, RepairLogCommand.OriginalPrior), r.By, "demo repair"), "demo repair");
        }

        steps.Add(new DemoStep("findings", "done",
            $"{import.Findings.Count} findings imported, {scenario.Corrections.Count} corrected by a new revision, {scenario.Repairs.Count} repair(s) logged"));
        return import.Findings.Count;
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
