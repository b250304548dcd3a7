using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Planning;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>One component's run for a report: the engine's results, or why it could not be assessed.</summary>
public sealed record ComponentRun(string ComponentId, ComponentContext? Context, AssessmentRequest? Request, AssessmentOutcome? Outcome, PlanOutcome? Plan, string? Error)
{
    public bool AllConverged => (Outcome?.AllConverged ?? true) && (Plan?.AllConverged ?? true);
}

/// <summary>Settings of a report run.</summary>
public sealed record ReportRunOptions(DateOnly AsOf, AnnualTarget Target, bool Schedule, UpdatingRoute Route, double? HorizonYears)
{
    /// <summary>Accuracy and seed of the sampling route.</summary>
    public SamplingSettings Sampling { get; init; } = SamplingSettings.Default;

    /// <summary>The branch plans assume after a detection.</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>How the inspection calendar groups each site's due inspections in time (default: calendar months).</summary>
    public CampaignWindow Calendar { get; init; } = CampaignWindow.Month;

    /// <summary>The owner's consequence classes, one line each, for the register page.</summary>
    public IReadOnlyList<string> ConsequenceClasses { get; init; } = [];

    /// <summary>Document control shown on every page and export (the register's, with this run's overrides).</summary>
    public ReportDocumentControl DocumentControl { get; init; } = new();
}

/// <summary>Runs assess and plan over several components (in parallel) and writes the reports and exports.</summary>
public static class ReportRun
{
    /// <summary>Assesses and plans each component; a component that fails is recorded with its error, the others go on.</summary>
    public static IReadOnlyList<ComponentRun> Run(IReadOnlyList<Func<ComponentContext>> components, IReadOnlyList<string> ids, ReportRunOptions options, Action<double> progress, int? parallelism = null)
    {
        var runs = new ComponentRun[components.Count];
        var done = 0;
        Parallel.For(0, components.Count, new ParallelOptions { MaxDegreeOfParallelism = parallelism ?? Environment.ProcessorCount }, i =>
        {
            try
            {
                var context = components[i]();
                // The component's consequence class chooses its target where the class names a preset; else the run's.
                var target = context.Consequence?.Target ?? options.Target;
                var request = ComponentStudy.Request(context, options.AsOf, options.HorizonYears ?? context.ServiceLifeYears ?? 40, 1, options.Route) with { Sampling = options.Sampling.For(target), AfterDetection = options.AfterDetection };
                var outcome = ComponentAssessment.Assess(request, _ => { });
                var method = options.Schedule ? context.DefaultPlanMethod : null;
                PlanOutcome? plan = request.AsOfYears < request.HorizonYears ? ComponentAssessment.Plan(request, target, method, _ => { }) : null;
                runs[i] = new ComponentRun(context.Id, context, request, outcome, plan, null);
            }
            catch (ApplicationFailureException e)
            {
                runs[i] = new ComponentRun(ids[i], null, null, null, null, e.FullText);
            }
            catch (ArgumentException e)
            {
                runs[i] = new ComponentRun(ids[i], null, null, null, null, e.Message);
            }

            progress(Interlocked.Increment(ref done) / (double)components.Count);
        });
        return runs;
    }

    /// <summary>Writes index.html, one HTML, profile CSV, plan CSV and JSON per component, and register.json.</summary>
    /// <returns>The path of index.html.</returns>
    public static string Write(string folder, string title, IReadOnlyList<ComponentRun> runs, ReportRunOptions options, string fingerprint, string source,
        IReadOnlyList<string> notAvailable, DateOnly? knownOn = null)
    {
        Directory.CreateDirectory(folder);
        // Components write to their own files: both cores render their plots at once, the rows keep the runs' order.
        var written = new PortfolioRow[runs.Count];
        Parallel.For(0, runs.Count, i => written[i] = WriteComponent(folder, runs[i], options, notAvailable));
        var rows = written.ToList();

        title = options.DocumentControl.Title ?? title;
        PortfolioReportData portfolio = new()
        {
            Title = title,
            DocumentControl = options.DocumentControl with { Title = title },
            Rows = rows,
            TargetAnnualPf = options.Target.AnnualPf,
            Assumptions =
            [
                $"Target: {options.Target.Describe()}.",
                $"Evidence up to {options.AsOf:yyyy-MM-dd}" + (knownOn is { } known ? $", register as recorded on {known:yyyy-MM-dd}" : string.Empty) + "; the current annual Pf is the updated ΔPf of the year ending at the first grid time at or after that date.",
                "Years to target: from the evidence date until the updated annual Pf reaches the target without further inspection (the remaining life against the target).",
                "Each component is assessed on its own; shared parameters across components are not pooled in this report.",
                AfterDetectionAssumption(options.AfterDetection),
                "Updating route: " + (options.Route switch
                {
                    UpdatingRoute.FirstOrder => "first order only (linearized events); numbers the updater flags as unreliable are noted per step — check them with --route auto",
                    UpdatingRoute.Simulation => "simulation only (one weighted sample set per component; numbers it cannot resolve are flagged, not replaced)",
                    _ => "automatic: one weighted sample set per component (every Pf, annual Pf and due date with its standard error); first order below the sampling resolution and as a cross-check of every step",
                }) + ".",
            ],
            NotAvailable = notAvailable,
            ConsequenceClasses = options.ConsequenceClasses,
            Provenance = new ReportProvenance(ToolInfo.Version, fingerprint, source, DateTimeOffset.UtcNow, options.AsOf) { RegisterKnownOn = knownOn },
        };
        var calendar = CalendarEntries(runs);
        using (var w = new StreamWriter(Path.Combine(folder, InspectionCalendar.CsvName)))
        {
            InspectionCalendar.WriteCsv(w, calendar, options.AsOf, options.Calendar);
        }

        File.WriteAllText(Path.Combine(folder, InspectionCalendar.IcsName), InspectionCalendar.Ics(calendar, options.AsOf, title + " — due inspections", options.Calendar));
        portfolio = portfolio with { Downloads = [CsvName, InspectionCalendar.CsvName, InspectionCalendar.IcsName, "register.json"] };
        var index = Path.Combine(folder, "index.html");
        File.WriteAllText(index, HtmlReportWriter.Portfolio(portfolio));
        using (var w = new StreamWriter(Path.Combine(folder, CsvName)))
        {
            ProfileExport.WriteRegisterCsv(w, rows);
        }

        File.WriteAllText(Path.Combine(folder, "register.json"), JsonSerializer.Serialize(new RegisterExport("inspection-update/register-export/1", title, options.AsOf,
            ToolInfo.Version, fingerprint, options.Target.AnnualPf, options.DocumentControl with { Title = title }, rows.Select(r => r with { YearsToTarget = r.YearsToTarget is { } y && double.IsFinite(y) ? y : r.YearsToTarget is null ? null : 1e9 }).ToArray())
        {
            AfterDetection = DetectionBranch.Key(options.AfterDetection),
        }, ProfileExport.JsonOptions));
        return index;
    }

    /// <summary>
    /// Writes one component's HTML page, JSON, profile CSV and plan CSV into <paramref name="folder"/> (which must
    /// exist) and returns its row of the register page; a component that could not be assessed gets a row saying why
    /// and no files. Components write to their own files, so several may be written at once.
    /// </summary>
    public static PortfolioRow WriteComponent(string folder, ComponentRun run, ReportRunOptions options, IReadOnlyList<string> notAvailable)
    {
        ArgumentNullException.ThrowIfNull(run);
        ArgumentNullException.ThrowIfNull(options);
        var safe = Safe(run.ComponentId);
        if (run.Context is null || run.Request is null || run.Outcome is null)
        {
            return new PortfolioRow(run.ComponentId, "-", "-", null, "-", null, null, "not assessed: " + run.Error, null) { AfterDetection = DetectionBranch.Key(options.AfterDetection) };
        }

        IReadOnlyList<string> notRequested = options.Schedule || run.Plan is null ? [] : [ScheduleNotRequested];
        var data = ComponentStudy.Report(run.Context, run.Request, run.Outcome, run.Plan, notAvailable, notRequested) with { DocumentControl = options.DocumentControl };
        File.WriteAllText(Path.Combine(folder, safe + ".html"), HtmlReportWriter.Component(data));
        File.WriteAllText(Path.Combine(folder, safe + ".json"), ProfileExport.ComponentJson(data));
        using (var w = new StreamWriter(Path.Combine(folder, safe + ".profile.csv")))
        {
            ProfileExport.WriteCsv(w, run.ComponentId, new[] { run.Outcome.Prior, run.Outcome.Updated }.Where(p => p is not null)!);
        }

        if (data.Plan is not null)
        {
            using var w = new StreamWriter(Path.Combine(folder, safe + ".plan.csv"));
            ProfileExport.WritePlanCsv(w, run.ComponentId, data.Plan);
        }

        return ComponentStudy.Row(run.Context, run.Request, run.Outcome, run.Plan, safe + ".html") with
        {
            ConsequenceClass = run.Context.Consequence?.Class,
            CostOfFailure = run.Context.Consequence?.CostOfFailure,
            TargetAnnualPf = run.Plan?.Next.Target.AnnualPf ?? (run.Context.Consequence?.Target ?? options.Target).AnnualPf,
            AfterDetection = DetectionBranch.Key(options.AfterDetection),
        };
    }

    /// <summary>Every due inspection of the runs' plans (the next inspection, and the schedule where one was computed) for the calendar.</summary>
    public static IReadOnlyList<CalendarEntry> CalendarEntries(IEnumerable<ComponentRun> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);
        var entries = new List<CalendarEntry>();
        foreach (var run in runs)
        {
            if (run.Context is null || run.Plan is null) continue;
            var plan = ReportMapping.Plan(run.Plan);
            entries.AddRange(plan.Schedule.Select((s, i) => new CalendarEntry(run.Context.Id, run.Context.Name, run.Context.SiteCode, i + 1, s.Date, s.Method, s.Basis)));
        }

        return entries;
    }

    /// <summary>What a report without --schedule says of the life-cycle schedule: not requested, and how to request it.</summary>
    public const string ScheduleNotRequested =
        "Life-cycle schedule: not requested in this run; the plan shows the next inspection only. Request it with report --schedule (every component) or plan COMPONENT (this one).";

    /// <summary>File name of the register CSV of a report run (one row per component, with its marks).</summary>
    public const string CsvName = "register.csv";

    /// <summary>A component code as a file name.</summary>
    public static string Safe(string id) => string.Concat(id.Select(c => char.IsLetterOrDigit(c) || c is '-' or '_' or '.' ? c : '_'));

    private sealed record RegisterExport(string Format, string Title, DateOnly AssessedAsOf, string ToolVersion, string RegisterFingerprint, double TargetAnnualPf,
        ReportDocumentControl DocumentControl, IReadOnlyList<PortfolioRow> Components)
    {
        public string AfterDetection { get; init; } = "monitor";
    }

    /// <summary>The register pages' sentence on the branch plans assume after a detection.</summary>
    public static string AfterDetectionAssumption(AfterDetection branch) => branch == AfterDetection.Repair
        ? "After a detection not yet followed by a logged repair, plans assume repair on detection (--after-detection repair): the defect is repaired at the evidence date and the component restarts from its post-repair prior (the latest logged repair's, else the renewed inputs' original prior)."
        : "After a detection not yet followed by a logged repair, plans assume the known defect stays in service and is monitored (--after-detection monitor): no repair is assumed.";
}
