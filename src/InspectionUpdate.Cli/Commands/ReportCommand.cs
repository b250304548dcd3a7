using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;
using InspectionUpdate.Time;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>report</c>.</summary>
public sealed class ReportSettings : ReportRunSettings
{
    /// <summary>The branch plans assume after a detection.</summary>
    [CommandOption("--after-detection <BRANCH>")]
    [Description(AfterDetectionOption.Help)]
    [DefaultValue("monitor")]
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>Only this component.</summary>
    [CommandArgument(0, "[COMPONENT]")]
    [Description("Only this component (default: every component).")]
    public string? Component { get; init; }

    /// <summary>Output folder.</summary>
    [CommandOption("-o|--out <DIR>")]
    [Description("Folder for the reports and exports (created if missing).")]
    [DefaultValue("reports")]
    public string Out { get; init; } = "reports";

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description(AssessSettings.AsOfHelp)]
    public string? AsOf { get; init; }

    /// <summary>Register date.</summary>
    [CommandOption("--known-on <DATE>")]
    [Description(AssessSettings.KnownOnHelp)]
    public string? KnownOn { get; init; }

    /// <summary>Target.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability for plans and ranking.")]
    [DefaultValue(1e-4)]
    public double TargetAnnualPf { get; init; } = 1e-4;

    /// <summary>Include schedules.</summary>
    [CommandOption("--schedule")]
    [Description("Also compute each component's life-cycle schedule (slower).")]
    public bool Schedule { get; init; }

    /// <summary>Updating route.</summary>
    [CommandOption("--route <ROUTE>")]
    [Description("Route: auto (sample set with first-order cross-check), first-order or simulation.")]
    [DefaultValue("auto")]
    public string Route { get; init; } = "auto";

}

/// <summary>
/// The options of a report run (report, register report): the inspection calendar's campaign window, and the document
/// control, each given field of which overrides the register's stored document control for this run only (the stored
/// record is not changed).
/// </summary>
public abstract class ReportRunSettings : SampledSettings
{
    /// <summary>Campaign window of the inspection calendar.</summary>
    [CommandOption("--campaign-window <WINDOW>")]
    [Description("How calendar.csv and calendar.ics group each site's due inspections in time: month (default), quarter, or a number of days (1 to 3660: windows counted from the day after the evidence date, e.g. 90).")]
    [DefaultValue("month")]
    public string CampaignWindow { get; init; } = "month";

    /// <summary>The campaign window of the options; bad input names the option and the value.</summary>
    internal Reporting.Export.CampaignWindow Campaign() => Reporting.Export.CampaignWindow.TryParse(CampaignWindow)
        ?? throw CliException.BadInput("--campaign-window", CampaignWindow, "must be month, quarter or a whole number of days from 1 to 3660.");

    /// <summary>Report title for this run.</summary>
    [CommandOption("--title <TEXT>")]
    [Description("Report title for this run (default: the register's document control, else the file name).")]
    public string? Title { get; init; }

    /// <summary>Owner for this run.</summary>
    [CommandOption("--owner <WHO>")]
    [Description("Owner (duty holder) for this run (overrides the register's document control).")]
    public string? Owner { get; init; }

    /// <summary>Author for this run.</summary>
    [CommandOption("--author <WHO>")]
    [Description("Author for this run.")]
    public string? Author { get; init; }

    /// <summary>Checker for this run.</summary>
    [CommandOption("--checker <WHO>")]
    [Description("Checker for this run.")]
    public string? Checker { get; init; }

    /// <summary>Approver for this run.</summary>
    [CommandOption("--approver <WHO>")]
    [Description("Approver for this run.")]
    public string? Approver { get; init; }

    /// <summary>Revision for this run.</summary>
    [CommandOption("--revision <REV>")]
    [Description("Revision number or letter for this run.")]
    public string? Revision { get; init; }

    /// <summary>Revision date for this run.</summary>
    [CommandOption("--revision-date <DATE>")]
    [Description("Date of the revision (yyyy-MM-dd) for this run.")]
    public string? RevisionDate { get; init; }

    /// <summary>Target source for this run.</summary>
    [CommandOption("--target-source <TEXT>")]
    [Description("Where the target comes from (the owner's justification), shown with the target.")]
    public string? TargetSource { get; init; }

    /// <summary>The document-control overrides of this run.</summary>
    internal ReportDocumentControl DocumentControl() => new(Title, Owner, Author, Checker, Approver, Revision,
        RevisionDate is null ? null : RegisterAccess.Date("--revision-date", RevisionDate), TargetSource);
}

/// <summary>Writes reports.</summary>
public sealed class ReportCommand(CliHost host) : CliCommand<ReportSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(ReportSettings settings, CancellationToken cancellation)
    {
        if (!(settings.TargetAnnualPf > 0 && settings.TargetAnnualPf < 1)) throw CliException.BadInput("--target-annual-pf", settings.TargetAnnualPf, "must be a probability strictly between 0 and 1.");
        var asOf = settings.AsOf is null ? Host.Today() : RegisterAccess.Date("--as-of", settings.AsOf);
        var registerPath = settings.RegisterPath(Host);
        var options = new ReportRunOptions(asOf, AnnualTarget.FromAnnualPf(settings.TargetAnnualPf, AnnualMeasure.IntervalPf), settings.Schedule, Study.Route(settings.Route), null)
        {
            Sampling = settings.Sampling(),
            AfterDetection = AfterDetectionOption.Parse(settings.AfterDetection),
            DocumentControl = settings.DocumentControl(),
            Calendar = settings.Campaign(),
        };
        var knownOn = settings.KnownOn is null ? Host.Today() : RegisterAccess.Date("--known-on", settings.KnownOn);
        var result = Produce(Host, registerPath, settings.Component, Host.Resolve(settings.Out), options, settings.Json, Path.GetFileNameWithoutExtension(registerPath), knownOn);
        if (settings.Json) WriteJson(result.Document);
        else
        {
            Summary(result.Document);
            Line($"Evidence up to {result.Document.AsOf:yyyy-MM-dd}; register as known on {result.Document.KnownOn:yyyy-MM-dd}; fingerprint {result.Document.Fingerprint[..12]}….");
            Line($"Report: {result.Document.PortfolioReport}");
            Caution();
        }

        return result.ExitCode;
    }

    /// <summary>Runs the report over a register; shared with demo.</summary>
    internal static (ReportDocument Document, int ExitCode) Produce(CliHost host, string registerPath, string? only, string folder, ReportRunOptions options, bool quiet, string title, DateOnly? knownOn = null)
    {
        // Evidence up to options.AsOf; the register as recorded on knownOn (the demo passes none: the same date).
        var registerDate = knownOn ?? options.AsOf;
        using var store = RegisterAccess.Open(host, registerPath, RegisterOpenMode.OpenExistingToRead);
        var snapshot = new RegisterSnapshot(store, options.AsOf, registerDate);
        // The register's document control, this run's fields over it; the target carries the owner's source.
        var document = OwnerRecords.DocumentControl(store).With(options.DocumentControl);
        options = options with
        {
            DocumentControl = document,
            Target = document.TargetSource is { } source ? AnnualTarget.FromAnnualPf(options.Target.AnnualPf, options.Target.Measure, source) : options.Target,
        };
        // Retired components leave reports (as known on the date); naming one still reports it.
        var components = only is null ? store.ComponentsInService(snapshot.Known) : [RegisterAccess.Component(store, only, registerDate)];
        var fingerprint = snapshot.Fingerprint;
        var consequences = OwnerRecords.Consequences(store, snapshot.Known);
        options = options with { ConsequenceClasses = OwnerRecords.ClassLegend(store) };
        var factories = components.Select(c => (Func<ComponentContext>)(() => ComponentContexts.FromRegister(snapshot, c) with { Consequence = consequences.GetValueOrDefault(c.Code) })).ToArray();
        var runs = ProgressRunner.Run(host, quiet, $"Assessing {components.Count} component(s)", p => ReportRun.Run(factories, components.Select(c => c.Code).ToArray(), options, p));
        var index = ReportRun.Write(folder, title, runs, options, fingerprint, store.Path, [], registerDate);
        var rows = runs.Select(r => Row(r, folder)).ToArray();
        var code = runs.Any(r => r.Error is not null) ? ExitCodes.BadInput : runs.All(r => r.AllConverged) ? ExitCodes.Ok : ExitCodes.NotConverged;
        return (new ReportDocument(folder, index, fingerprint, options.AsOf, options.Target.AnnualPf, rows, Reporting.Cautions.Line) { KnownOn = registerDate }, code);
    }

    /// <summary>One component's row: the annual Pf is the ΔPf of the grid year ending at the first grid time at or after the as-of date.</summary>
    private static ReportRow Row(ComponentRun r, string folder)
    {
        var now = r.Outcome is null || r.Request is null ? null : ComponentStudy.Current(r.Outcome.Current, r.Request.AsOfYears);
        var ending = now is null || r.Context is null ? (DateOnly?)null : ServiceTime.DateAt(r.Context.InServiceDate, now.TimeYears);
        return new ReportRow(r.ComponentId, now?.AnnualPf, ending, r.Plan?.Next.Date, r.Plan?.RemainingLife.UntilAnnualTarget.RemainingYears, r.AllConverged, r.Error,
            r.Context is null ? null : Path.Combine(folder, ReportRun.Safe(r.ComponentId) + ".html"))
        {
            ConvergenceNote = ConvergenceNote(r),
            Flags = r.Request is null || r.Outcome is null ? [] : ReportMarks.Keys(ComponentStudy.Flags(r.Request, r.Outcome, r.Plan)),
        };
    }

    /// <summary>Where a component's numbers did not converge, so that a reader can judge how much it matters.</summary>
    private static string? ConvergenceNote(ComponentRun r)
    {
        if (r.AllConverged || r.Outcome is null) return null;
        var failed = new[] { r.Outcome.Prior, r.Outcome.Updated }.Where(p => p is not null).SelectMany(p => p!.Points).Where(p => !p.Converged).ToArray();
        var parts = new List<string>();
        if (failed.Length > 0)
        {
            var largest = failed.Max(p => p.CumulativePf);
            parts.Add(string.Create(CultureInfo.InvariantCulture,
                $"{failed.Length} profile step(s) not converged (at {string.Join(", ", failed.Select(p => p.TimeYears.ToString("0.##", CultureInfo.InvariantCulture)).Distinct())} y; largest cumulative Pf there {Study.P(largest)})"));
        }

        if (r.Plan is { AllConverged: false }) parts.Add("some planning estimates not converged");
        return parts.Count == 0 ? null : string.Join("; ", parts);
    }

    internal void Summary(ReportDocument doc) =>
        Table(["component", "annual Pf (grid year ending)", "next inspection", "years to target", "converged", "note"], doc.Components.Select(r => (IReadOnlyList<string>)
        [
            r.ComponentId, r.AnnualPfNow is { } p ? Study.P(p) + (r.AnnualPfYearEnding is { } end ? end.ToString(" (yyyy-MM-dd)", CultureInfo.InvariantCulture) : string.Empty) : "-", r.NextInspection?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? "-",
            r.YearsToTarget is { } y ? y.ToString("0.0", CultureInfo.InvariantCulture) : "-", r.AllConverged ? "yes" : "NO", r.Error ?? r.ConvergenceNote ?? string.Empty,
        ]));
}

/// <summary>One component in the --json of <c>report</c> and <c>demo</c>.</summary>
/// <param name="ComponentId">Component identifier.</param>
/// <param name="AnnualPfNow">Updated ΔPf of the grid year ending at the first grid time at or after the as-of date.</param>
/// <param name="AnnualPfYearEnding">End date of that grid year.</param>
/// <param name="NextInspection">Latest date of the next inspection.</param>
/// <param name="YearsToTarget">Years until the annual Pf reaches the target.</param>
/// <param name="AllConverged">True when every number converged.</param>
/// <param name="Error">Why the component was not assessed, or null.</param>
/// <param name="Report">The component report file, or null.</param>
public sealed record ReportRow(string ComponentId, double? AnnualPfNow, DateOnly? AnnualPfYearEnding, DateOnly? NextInspection, double? YearsToTarget, bool AllConverged, string? Error, string? Report)
{
    /// <summary>Where the numbers did not converge (steps, their times and the largest cumulative Pf there), or null.</summary>
    public string? ConvergenceNote { get; init; }

    /// <summary>The component's marks (not_converged, overdue, above_target), as on its pages and in register.json.</summary>
    public IReadOnlyList<string> Flags { get; init; } = [];
}

/// <summary>--json of <c>report</c>.</summary>
public sealed record ReportDocument(string OutputFolder, string PortfolioReport, string Fingerprint, DateOnly AsOf, double TargetAnnualPf, IReadOnlyList<ReportRow> Components, string Caution)
{
    /// <summary>The date the register was read as recorded on (--known-on).</summary>
    public DateOnly KnownOn { get; init; }
}
