using System.Collections.Concurrent;
using System.Diagnostics;
using System.Globalization;
using System.Text;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>Settings of a register report from stored results; the first four select the stored results (as <c>register assess</c> stored them).</summary>
/// <param name="AsOf">Evidence date of the stored results.</param>
/// <param name="Target">Annual target of the run.</param>
/// <param name="Route">Updating route of the run.</param>
/// <param name="HorizonYears">Horizon of the run (null: the model's service life).</param>
public sealed record RegisterReportOptions(DateOnly AsOf, AnnualTarget Target, UpdatingRoute Route = UpdatingRoute.Auto, double? HorizonYears = null)
{
    /// <summary>Rows shown at the top of each list (the CSV has every row).</summary>
    public int Top { get; init; } = 100;

    /// <summary>Components to write their own pages for.</summary>
    public IReadOnlyList<string> PagesFor { get; init; } = [];

    /// <summary>Write pages for every component of this site.</summary>
    public string? PagesForSite { get; init; }

    /// <summary>Write pages for every component whose stored annual Pf is above this.</summary>
    public double? PagesAboveAnnualPf { get; init; }

    /// <summary>Accuracy and seed of the sampling route the results were stored with.</summary>
    public SamplingSettings Sampling { get; init; } = SamplingSettings.Default;

    /// <summary>The branch plans assume after a detection (part of the options key: it changes numbers).</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>How the inspection calendar groups each site's due inspections in time (default: calendar months).</summary>
    public CampaignWindow Calendar { get; init; } = CampaignWindow.Month;

    /// <summary>Document control of this run: each field set overrides the register's for this run only (the stored record is not changed).</summary>
    public ReportDocumentControl DocumentControl { get; init; } = new();

    /// <summary>Canonical options key (<see cref="ResultKeys.Options"/>).</summary>
    public string OptionsKey => ResultKeys.Options(Route, Target, HorizonYears, Sampling, AfterDetection);
}

/// <summary>What a register report wrote.</summary>
/// <param name="Index">index.html.</param>
/// <param name="Csv">The CSV of every stored result.</param>
/// <param name="Results">Stored results in the report.</param>
/// <param name="Missing">Components in service without a stored result for these options.</param>
/// <param name="Stale">Stored results whose key no longer matches the register.</param>
/// <param name="Pages">Component pages written (file names).</param>
/// <param name="Elapsed">Wall time.</param>
public sealed record RegisterReportSummary(string Index, string Csv, int Results, IReadOnlyList<string> Missing, IReadOnlyList<string> Stale, IReadOnlyList<string> Pages, TimeSpan Elapsed);

/// <summary>
/// The register report from stored results (<c>register assess</c>): it computes no reliability number for the
/// register page, so that it stays quick and readable at 10,000 components. Component pages are written only on
/// request (a list, a site, components above an annual Pf), recomputed with the same options, in parallel.
/// </summary>
public static class RegisterReport
{
    /// <summary>File name of the CSV with every stored result.</summary>
    public const string CsvName = "register-results.csv";

    /// <summary>File name of the JSON export: document control, options, and every stored result with its consequence and risk.</summary>
    public const string JsonName = "register-results.json";

    /// <summary>Writes index.html and the CSV into <paramref name="folder"/>, and the requested component pages.</summary>
    /// <exception cref="ApplicationFailureException">A requested component or site has no stored result, or no result is stored for these options.</exception>
    public static RegisterReportSummary Write(IRegister store, string folder, string title, RegisterReportOptions options)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(options);
        var clock = Stopwatch.StartNew();
        var snapshot = new RegisterSnapshot(store, options.AsOf);
        // The register's document control, this run's fields over it (for this run only); the target carries the owner's source.
        var document = OwnerRecords.DocumentControl(store).With(options.DocumentControl);
        var target = document.TargetSource is { } source ? AnnualTarget.FromAnnualPf(options.Target.AnnualPf, options.Target.Measure, source) : options.Target;
        title = document.Title ?? title;
        var results = store.Results(options.AsOf, options.OptionsKey);
        if (results.Count == 0)
        {
            var stored = store.Results().Select(r => $"{r.AsOf:yyyy-MM-dd} {r.OptionsKey}").Distinct().Take(5).ToArray();
            throw ApplicationFailureException.BadInput("--as-of", options.AsOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                $"has no stored results with options '{options.OptionsKey}'; run register assess with the same date and options first" +
                (stored.Length == 0 ? " (the register holds no stored results)." : ". Stored: " + string.Join("; ", stored) + "."));
        }

        var byCode = results.ToDictionary(r => r.ComponentCode, StringComparer.Ordinal);
        foreach (var code in options.PagesFor)
        {
            if (!byCode.ContainsKey(code)) throw ApplicationFailureException.BadInput("--components", code, "has no stored result for this date and these options.");
        }

        if (options.PagesForSite is { } site && !results.Any(r => r.SiteCode == site))
        {
            throw ApplicationFailureException.BadInput("--site", site, "has no component with a stored result for this date and these options.");
        }

        var inService = store.ComponentIndex(snapshot.Known).Where(c => c.InstallDate <= options.AsOf).Select(c => c.Code);
        var missing = inService.Where(c => !byCode.ContainsKey(c)).ToArray();

        // Each stored key checked against the register now (one bulk read of the component index and fingerprints).
        var reasons = StoredResults.WhyStale(store, results);
        var staleCodes = results.Where((_, i) => reasons[i] is not null).Select(r => r.ComponentCode).Order(StringComparer.Ordinal).ToArray();

        Directory.CreateDirectory(folder);
        var pages = WritePages(snapshot, folder, options, results, document, target);
        // Consequence and risk: each component's class (as known on the evidence date), its class's target, else the run's
        // (the target its stored plan was made against).
        var consequences = OwnerRecords.Consequences(store, snapshot.Known);
        var rows = results.Select(r => new RegisterResultRow(r.ComponentCode, r.SiteCode, StatusText(r.Status), r.AnnualPf, r.AnnualPfYearEnding, r.Beta, r.Route,
            r.NextDue, r.YearsToTarget, r.TargetReached, r.Error)
        {
            ReportFile = pages.TryGetValue(r.ComponentCode, out var f) ? f : null,
            Flags = r.Status == ResultStatus.Failed ? ReportMark.None
                : ReportMarks.Of(r.Status == ResultStatus.Assessed, r.AnnualPf, r.NextDue, (consequences.GetValueOrDefault(r.ComponentCode)?.Target ?? options.Target).AnnualPf, options.AsOf),
        }).ToArray();

        var risk = rows.Where(r => r.Status != "failed").Select(r => RiskRow(r, consequences.GetValueOrDefault(r.ComponentId), options.Target)).ToArray();
        var csv = Path.Combine(folder, CsvName);
        WriteCsv(csv, rows, staleCodes.ToHashSet(StringComparer.Ordinal), DetectionBranch.Key(options.AfterDetection), risk.ToDictionary(r => r.ComponentId, StringComparer.Ordinal));
        // The calendar of the stored results: each component's next due inspection (stored results keep no schedule).
        var calendar = results.Where(r => r.NextDue is not null)
            .Select(r => new CalendarEntry(r.ComponentCode, r.ComponentCode, r.SiteCode, 1, r.NextDue!.Value, string.Empty,
                "the annual ΔPf reaches the target then without further inspection (stored result)")).ToArray();
        using (var w = new StreamWriter(Path.Combine(folder, InspectionCalendar.CsvName)))
        {
            InspectionCalendar.WriteCsv(w, calendar, options.AsOf, options.Calendar);
        }

        File.WriteAllText(Path.Combine(folder, InspectionCalendar.IcsName), InspectionCalendar.Ics(calendar, options.AsOf, title + " — due inspections", options.Calendar));
        var data = new RegisterResultsReportData
        {
            Title = title,
            DocumentControl = document with { Title = title },
            Rows = rows,
            TargetAnnualPf = options.Target.AnnualPf,
            OptionsKey = options.OptionsKey,
            Top = options.Top,
            Missing = missing,
            Stale = staleCodes,
            CsvFile = CsvName,
            RiskRows = risk,
            ConsequenceClasses = OwnerRecords.ClassLegend(store),
            Assumptions =
            [
                $"Target: {target.Describe()}.",
                $"Evidence as known on {options.AsOf:yyyy-MM-dd}; the current annual Pf is the updated ΔPf of the year ending at the first grid time at or after that date.",
                "Numbers are the stored results of register assess, each filed under a key (model revision, the component's findings and repairs, options, tool build); this page computes none. A stale result is shown and marked.",
                "Years to target: from the evidence date until the updated annual Pf reaches the target without further inspection.",
                "Each component is assessed on its own; shared parameters across components are not pooled.",
                ReportRun.AfterDetectionAssumption(options.AfterDetection),
                "Component pages (only where requested) are computed afresh with the same options from the register as known on the evidence date.",
            ],
            Provenance = new ReportProvenance(ToolInfo.Version, snapshot.Fingerprint, store.Path, DateTimeOffset.UtcNow, options.AsOf) { RegisterKnownOn = snapshot.KnownOn },
        };
        var index = Path.Combine(folder, "index.html");
        File.WriteAllText(index, HtmlReportWriter.RegisterResults(data));
        File.WriteAllText(Path.Combine(folder, JsonName), System.Text.Json.JsonSerializer.Serialize(new RegisterResultsExport("inspection-update/register-results-export/1", title,
            options.AsOf, ToolInfo.Version, snapshot.Fingerprint, options.OptionsKey, DetectionBranch.Key(options.AfterDetection), options.Target.AnnualPf, target.Source,
            data.DocumentControl, data.ConsequenceClasses, RankedRisk(risk).Select(r => new RiskExport(r.ComponentId, r.Site, r.CurrentAnnualPf, r.ConsequenceClass, r.TargetAnnualPf,
                r.RatioToTarget, r.CostOfFailure, r.ExpectedAnnualCost, r.NextDue, r.Flags)).ToArray(), Cautions.Line), ProfileExport.JsonOptions));
        return new RegisterReportSummary(index, csv, rows.Length, missing, staleCodes, pages.Values.Order(StringComparer.Ordinal).ToArray(), clock.Elapsed);
    }

    /// <summary>A stored result as a row of the risk section (class, its target else the run's, cost of failure).</summary>
    private static PortfolioRow RiskRow(RegisterResultRow r, ComponentConsequence? consequence, AnnualTarget runTarget) =>
        new(r.ComponentId, r.ComponentId, r.Site, r.AnnualPf, r.Route ?? "-", r.YearsToTarget, r.NextDue, r.Status, r.ReportFile)
        {
            FlagSet = r.Flags,
            ConsequenceClass = consequence?.Class,
            CostOfFailure = consequence?.CostOfFailure,
            TargetAnnualPf = (consequence?.Target ?? runTarget).AnnualPf,
        };

    /// <summary>The risk table's order: annual Pf over the class's target, then expected annual cost, then code (the same rule as the report page).</summary>
    public static IReadOnlyList<PortfolioRow> RankedRisk(IEnumerable<PortfolioRow> rows) =>
        rows.Where(r => r.ConsequenceClass is not null).OrderByDescending(r => r.RatioToTarget ?? -1).ThenByDescending(r => r.ExpectedAnnualCost ?? -1)
            .ThenBy(r => r.ComponentId, StringComparer.Ordinal).ToArray();

    private sealed record RegisterResultsExport(string Format, string Title, DateOnly AssessedAsOf, string ToolVersion, string RegisterFingerprint, string OptionsKey,
        string AfterDetection, double TargetAnnualPf, string TargetSource, ReportDocumentControl DocumentControl, IReadOnlyList<string> ConsequenceClasses,
        IReadOnlyList<RiskExport> Risk, string Caution);

    private sealed record RiskExport(string ComponentId, string Site, double? AnnualPf, int? ConsequenceClass, double? TargetAnnualPf, double? RatioToTarget,
        double? CostOfFailure, double? ExpectedAnnualCost, DateOnly? NextDue, IReadOnlyList<string> Flags);

    /// <summary>The requested component pages, computed and written in parallel; file name by component code.</summary>
    private static Dictionary<string, string> WritePages(RegisterSnapshot snapshot, string folder, RegisterReportOptions options, IReadOnlyList<StoredResult> results,
        ReportDocumentControl document, AnnualTarget target)
    {
        var wanted = options.PagesFor.ToHashSet(StringComparer.Ordinal);
        var selected = results.Where(r => wanted.Contains(r.ComponentCode)
            || (options.PagesForSite is { } s && r.SiteCode == s)
            || (options.PagesAboveAnnualPf is { } p && r.AnnualPf > p)).ToArray();
        var pages = new ConcurrentDictionary<string, string>(StringComparer.Ordinal);
        if (selected.Length == 0) return new Dictionary<string, string>(pages);
        var runOptions = new ReportRunOptions(options.AsOf, target, false, options.Route, options.HorizonYears)
        {
            Sampling = options.Sampling,
            AfterDetection = options.AfterDetection,
            DocumentControl = document,
        };
        var consequences = OwnerRecords.Consequences(snapshot.Store, snapshot.Known);
        Parallel.ForEach(selected, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, r =>
        {
            var component = snapshot.Store.GetComponent(r.ComponentId, snapshot.Known);
            if (component is null) return;
            var run = ReportRun.Run([() => ComponentContexts.FromRegister(snapshot, component) with { Consequence = consequences.GetValueOrDefault(r.ComponentCode) }],
                [r.ComponentCode], runOptions, _ => { }, parallelism: 1)[0];
            var row = ReportRun.WriteComponent(folder, run, runOptions, []);
            if (row.ReportFile is not null) pages[r.ComponentCode] = row.ReportFile;
        });
        return new Dictionary<string, string>(pages);
    }

    private static string StatusText(ResultStatus s) => s switch
    {
        ResultStatus.Assessed => "assessed",
        ResultStatus.NotConverged => "not-converged",
        _ => "failed",
    };

    /// <summary>Every stored result, most urgent first (annual Pf descending; failed last), RFC 4180 quoting.</summary>
    private static void WriteCsv(string path, IReadOnlyList<RegisterResultRow> rows, HashSet<string> stale, string afterDetection, Dictionary<string, PortfolioRow> risk)
    {
        static string Q(string? s) => s is null ? string.Empty : s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;
        static string N(double? v) => v is { } x ? x.ToString("R", CultureInfo.InvariantCulture) : string.Empty;
        static string D(DateOnly? d) => d?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? string.Empty;
        using var w = new StreamWriter(path, false, new UTF8Encoding(false));
        w.Write("rank,component_code,site_code,status,annual_pf,annual_pf_year_ending,beta,route,years_to_target,target_reached,next_due,stale,flags,error,after_detection,consequence_class,cost_of_failure,class_target_annual_pf,ratio_to_target,expected_annual_cost\n");
        var rank = 0;
        foreach (var r in rows.OrderByDescending(r => r.AnnualPf ?? -1).ThenBy(r => r.ComponentId, StringComparer.Ordinal))
        {
            rank++;
            w.Write(string.Join(',', rank.ToString(CultureInfo.InvariantCulture), Q(r.ComponentId), Q(r.Site), r.Status, N(r.AnnualPf), D(r.YearEnding), N(r.Beta), Q(r.Route),
                N(r.YearsToTarget), r.TargetReached is { } b ? (b ? "true" : "false") : string.Empty, D(r.NextDue), stale.Contains(r.ComponentId) ? "true" : "false", ReportMarks.CsvCell(r.Flags), Q(r.Error), afterDetection,
                risk.TryGetValue(r.ComponentId, out var k) && k.ConsequenceClass is { } c ? c.ToString(CultureInfo.InvariantCulture) : string.Empty,
                N(k?.CostOfFailure), k?.ConsequenceClass is null ? string.Empty : N(k.TargetAnnualPf), k?.ConsequenceClass is null ? string.Empty : N(k.RatioToTarget), N(k?.ExpectedAnnualCost)));
            w.Write('\n');
        }
    }
}
