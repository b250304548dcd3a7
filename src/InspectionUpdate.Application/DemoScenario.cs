using System.Text.Json;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting.Export;

namespace InspectionUpdate.Application;

/// <summary>The demo scenario file sample-data/scenario.json (format inspection-update/demo-scenario/1).</summary>
public sealed record DemoScenario(
    string Format,
    string Title,
    string Note,
    DateOnly EvidenceDate,
    double TargetAnnualPf,
    string TargetSource,
    IReadOnlyList<DemoSite> Sites,
    IReadOnlyList<DemoMethod> Methods,
    IReadOnlyList<DemoComponent> Components,
    string Findings,
    IReadOnlyList<DemoCorrection> Corrections,
    IReadOnlyList<DemoRepair> Repairs)
{
    /// <summary>The format name the file must state.</summary>
    public const string FormatName = "inspection-update/demo-scenario/1";

    /// <summary>Reads and checks the scenario file.</summary>
    public static DemoScenario Load(string path)
    {
        DemoScenario? s;
        try
        {
            s = JsonSerializer.Deserialize<DemoScenario>(File.ReadAllText(path), ProfileExport.JsonOptions);
        }
        catch (JsonException e)
        {
            throw new ApplicationFailureException(FailureKind.BadInput, $"Demo scenario '{path}' is not valid: {e.Message}", e);
        }

        if (s is null || s.Format != FormatName)
        {
            throw ApplicationFailureException.BadInput("format", s?.Format, $"of '{path}' is not {FormatName}.");
        }

        return s;
    }

    /// <summary>
    /// Finds the sample-data folder: beside the executable (copied at build), else the nearest sample-data folder
    /// above the working folder.
    /// </summary>
    public static string LocateSampleData(string workingDirectory)
    {
        var beside = Path.Combine(AppContext.BaseDirectory, "sample-data");
        if (File.Exists(Path.Combine(beside, "scenario.json"))) return beside;
        for (var dir = new DirectoryInfo(workingDirectory); dir is not null; dir = dir.Parent)
        {
            var candidate = Path.Combine(dir.FullName, "sample-data");
            if (File.Exists(Path.Combine(candidate, "scenario.json"))) return candidate;
        }

        throw new ApplicationFailureException(FailureKind.BadInput, "sample-data/scenario.json was found neither beside the executable nor above the working folder: give --sample-data DIR.");
    }
}

public sealed record DemoSite(string Id, string Name, string Location);

public sealed record DemoMethod(string Id, string File);

public sealed record DemoComponent(string Id, string Site, string Name, string Model, DateOnly InService, double? WallMm);

public sealed record DemoCorrection(string Component, DateOnly InspectionDate, string Method, double MeasuredSizeMm, string By, string Reason);

public sealed record DemoRepair(string Component, DateOnly Date, string Description, string By);

/// <summary>What <see cref="DemoRegister.Build"/> wrote.</summary>
/// <param name="Findings">Findings imported.</param>
/// <param name="Corrections">Findings corrected by a new revision.</param>
/// <param name="Repairs">Repairs logged.</param>
public sealed record DemoRegisterSummary(int Findings, int Corrections, int Repairs);

/// <summary>Fills an empty register with the invented demo scenario of sample-data (the demo command and the web view's tests use it).</summary>
public static class DemoRegister
{
    /// <summary>Who records the demo's rows.</summary>
    public const string By = "demo.integrity";

    /// <summary>Adds the scenario's sites, methods, components, findings, corrections and repairs to <paramref name="store"/>.</summary>
    /// <exception cref="ApplicationFailureException">A row of the scenario is refused (every problem listed).</exception>
    public static DemoRegisterSummary Build(IRegister store, DemoScenario scenario, string sampleData)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(scenario);
        foreach (var s in scenario.Sites) Registers.Require(store.AddSite(new NewSite(s.Id, s.Name), By), "demo site " + s.Id);
        foreach (var m in scenario.Methods) Registers.Require(store.AddMethod(MethodFile.Read(Path.Combine(sampleData, m.File), m.Id), By), "demo method " + m.Id);
        foreach (var c in scenario.Components)
        {
            var json = ModelFiles.Read(Path.Combine(sampleData, c.Model));
            Registers.Require(store.AddComponent(new NewComponent(c.Site, c.Id, c.Name, c.InService, c.WallMm, json, ModelFiles.DefaultVersion), By), "demo component " + c.Id);
        }

        // Invented document control, so that the demo's pages show what an owner signs.
        Registers.Require(store.SetDocumentControl(new DocumentControlChange(scenario.Title, "Sandwick and Hollin integrity owner (invented)", "demo.integrity (invented author)",
            "demo.checker (invented checker)", "demo.approver (invented approver)", "1", scenario.EvidenceDate, scenario.TargetSource), By, "demo issue"), "demo document control");
        // Invented consequence scale and classes (no preset: the scenario's target applies to every class).
        string[] meanings =
        [
            "no release; repair at the next planned stop (invented)", "small release contained on site (invented)", "release needing a shutdown of the line or platform (invented)",
            "release reaching open water or the public (invented)", "release with risk to life (invented)",
        ];
        for (var k = 1; k <= 5; k++) Registers.Require(store.SetConsequenceClass(k, meanings[k - 1], null, By, "demo consequence scale"), "demo consequence class");
        foreach (var (code, cls, cost) in new[] { ("HR1-J112", 3, (double?)4.0e6), ("HR1-J118", 4, 9.0e6), ("IL3-KP42", 2, null), ("IL3-KP38", 3, 1.5e6) })
        {
            Registers.Require(store.SetComponentConsequence(code, cls, cost, By, "demo consequence survey"), "demo component consequence");
        }

        var import = store.ImportFindingsCsv(Path.Combine(sampleData, scenario.Findings), By, "demo import");
        if (!import.Succeeded) throw Registers.Problems("demo findings import", import.Problems);
        foreach (var fix in scenario.Corrections)
        {
            var component = Registers.Component(store, fix.Component);
            var current = store.Findings(component.Id).FirstOrDefault(f => f.InspectionDate == fix.InspectionDate && f.MethodName == fix.Method)
                ?? throw ApplicationFailureException.BadInput("correction", $"{fix.Component} {fix.InspectionDate:yyyy-MM-dd} {fix.Method}", "matches no imported finding.");
            Registers.Require(store.ReviseFinding(current.FindingId, new NewFinding(current.ComponentCode, current.InspectionDate, current.Kind, current.MethodName,
                fix.MeasuredSizeMm, current.RemainingWallMm, current.Location, current.Note), fix.By, fix.Reason), "demo correction");
        }

        foreach (var r in scenario.Repairs)
        {
            Registers.Require(store.AddRepair(new NewRepair(r.Component, r.Date, r.Description, Registers.OriginalPostRepairPrior), r.By, "demo repair"), "demo repair");
        }

        return new DemoRegisterSummary(import.Findings.Count, scenario.Corrections.Count, scenario.Repairs.Count);
    }
}
