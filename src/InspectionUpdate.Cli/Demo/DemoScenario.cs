using System.Text.Json;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Reporting.Export;

namespace InspectionUpdate.Cli.Demo;

/// <summary>The demo scenario file sample-data/scenario.json (format inspection-update/demo-scenario/1).</summary>
internal sealed record DemoScenario(
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
            throw new CliException($"Demo scenario '{path}' is not valid: {e.Message}", e);
        }

        if (s is null || s.Format != FormatName)
        {
            throw CliException.BadInput("format", s?.Format, $"of '{path}' is not {FormatName}.");
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

        throw new CliException("sample-data/scenario.json was found neither beside the executable nor above the working folder: give --sample-data DIR.");
    }
}

internal sealed record DemoSite(string Id, string Name, string Location);

internal sealed record DemoMethod(string Id, string File);

internal sealed record DemoComponent(string Id, string Site, string Name, string Model, DateOnly InService, double? WallMm);

internal sealed record DemoCorrection(string Component, DateOnly InspectionDate, string Method, double MeasuredSizeMm, string By, string Reason);

internal sealed record DemoRepair(string Component, DateOnly Date, string Description, string By);
