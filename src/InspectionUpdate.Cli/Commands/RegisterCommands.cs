using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using Spectre.Console;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>register create</c>.</summary>
public sealed class RegisterCreateSettings : CommonSettings
{
    /// <summary>File to create.</summary>
    [CommandArgument(0, "<FILE>")]
    [Description("The register to create: a SQLite file that must not exist, or a postgresql:// URI of an empty database.")]
    public string File { get; init; } = string.Empty;
}

/// <summary>Creates an empty register.</summary>
public sealed class RegisterCreateCommand(CliHost host) : CliCommand<RegisterCreateSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCreateSettings settings, CancellationToken cancellation)
    {
        var path = Host.Resolve(settings.File);
        using var store = RegisterAccess.Open(Host, path, RegisterOpenMode.CreateNew);
        var result = new RegisterCreated(store.Path, store.SchemaVersion);
        if (settings.Json) WriteJson(result);
        else Line($"Created register {store.Path} (schema {store.SchemaVersion}).");
        if (!settings.Json && store.Kind == RegisterStoreKind.PostgreSql)
        {
            var db = RegisterStore.PostgresDatabase(store.Path);
            Line($"Roles {db}_reader, {db}_recorder (findings, repairs) and {db}_modeller (models, methods) hold the grants; give them to logins with GRANT (docs/register.md).");
        }

        return ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>register copy</c>.</summary>
public sealed class RegisterCopySettings : CommonSettings
{
    /// <summary>Source.</summary>
    [CommandArgument(0, "<FROM>")]
    [Description("The register to copy: a SQLite file or a postgresql:// URI.")]
    public string From { get; init; } = string.Empty;

    /// <summary>Target.</summary>
    [CommandArgument(1, "<TO>")]
    [Description("The new register: a SQLite file that must not exist, or a postgresql:// URI of an empty database.")]
    public string To { get; init; } = string.Empty;
}

/// <summary>Copies a whole register between stores (SQLite and PostgreSQL).</summary>
public sealed class RegisterCopyCommand(CliHost host) : CliCommand<RegisterCopySettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCopySettings settings, CancellationToken cancellation)
    {
        RegisterCopyResult result;
        try
        {
            result = RegisterStore.Copy(Host.Resolve(settings.From), Host.Resolve(settings.To), new RegisterOptions(Host.Clock));
        }
        catch (System.Data.Common.DbException e)
        {
            throw new CliException(ExitCodes.RegisterError, $"register copy: {e.Message}; nothing was written.", e);
        }

        if (settings.Json)
        {
            WriteJson(result);
        }
        else
        {
            Line(string.Create(CultureInfo.InvariantCulture,
                $"Copied {result.From} to {result.To}: {result.RowsByTable.GetValueOrDefault("finding_revision")} finding revisions, {result.RowsByTable.GetValueOrDefault("repair_revision")} repair revisions, {result.RowsByTable.GetValueOrDefault("audit_log")} audit entries, {result.RowsByTable.GetValueOrDefault("component_result")} stored results."));
            Line($"Fingerprint of both: {result.Fingerprint}");
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>register create</c>.</summary>
public sealed record RegisterCreated(string Register, int SchemaVersion);

/// <summary>Settings of <c>register check</c>.</summary>
public sealed class RegisterCheckSettings : RegisterSettings
{
}

/// <summary>Checks a register.</summary>
public sealed class RegisterCheckCommand(CliHost host) : CliCommand<RegisterCheckSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterCheckSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var check = store.Check();
        var now = Host.Clock.GetUtcNow();
        var results = StoredResults.Check(store);
        var result = new RegisterChecked(store.Path, check.SchemaVersion, check.IsHealthy, check.IntegrityCheck, check.ForeignKeyViolations,
            check.InvariantViolations, check.InvalidModels, store.Fingerprint(now), store.Sites().Count, store.Components().Count, store.Methods().Count)
        {
            StoredResults = results.Stored,
            StaleResults = results.Stale,
        };
        if (settings.Json) WriteJson(result);
        else
        {
            Table(["check", "result"],
            [
                ["schema version", check.SchemaVersion.ToString(System.Globalization.CultureInfo.InvariantCulture)],
                store.Kind == RegisterStoreKind.PostgreSql
                    ? ["page integrity", "not checked by this program on PostgreSQL (use pg_amcheck)"]
                    : ["SQLite integrity", string.Join("; ", check.IntegrityCheck)],
                ["foreign keys", check.ForeignKeyViolations.Count == 0 ? "ok" : string.Join("; ", check.ForeignKeyViolations)],
                ["register invariants", check.InvariantViolations.Count == 0 ? "ok" : string.Join("; ", check.InvariantViolations)],
                ["component models", check.InvalidModels.Count == 0 ? "ok" : $"{check.InvalidModels.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)} do not pass (listed below)"],
                ["sites / components / methods", $"{result.Sites} / {result.Components} / {result.Methods}"],
                ["fingerprint", result.Fingerprint],
                ["stored results", results.Stored.ToString(CultureInfo.InvariantCulture) + (results.Stale.Count == 0 ? ", every key matches" : $", {results.Stale.Count.ToString(CultureInfo.InvariantCulture)} stale (recomputed by the next register assess)")],
            ]);
            foreach (var m in check.InvalidModels) Line("model does not pass: " + m);
            if (check.InvalidModels.Count > 0) Line("Components with these models cannot be assessed until their model is revised (component revise).");
            if (results.Stale.Count > 0)
            {
                Table(["component", "as of", "options", "stale because"], results.Stale.Select(r => (IReadOnlyList<string>)
                    [r.ComponentId, r.AsOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r.OptionsKey, r.Reason]), "Stale stored results");
            }
            Line(check.IsHealthy ? "The register is healthy." : "The register FAILED its check.");
        }

        return check.IsHealthy ? ExitCodes.Ok : ExitCodes.RegisterError;
    }
}

/// <summary>--json of <c>register check</c>.</summary>
public sealed record RegisterChecked(string Register, int SchemaVersion, bool Healthy, IReadOnlyList<string> IntegrityCheck,
    IReadOnlyList<string> ForeignKeyViolations, IReadOnlyList<string> InvariantViolations, IReadOnlyList<string> InvalidModels, string Fingerprint, int Sites, int Components, int Methods)
{
    /// <summary>Stored results of whole-register runs.</summary>
    public int StoredResults { get; init; }

    /// <summary>Stored results whose keys no longer match the register (results, not evidence: they do not make the register unhealthy).</summary>
    public IReadOnlyList<StaleResult> StaleResults { get; init; } = [];
}

/// <summary>Settings of <c>register assess</c>.</summary>
public sealed class RegisterAssessSettings : SampledSettings
{
    /// <summary>The branch plans assume after a detection.</summary>
    [CommandOption("--after-detection <BRANCH>")]
    [Description(AfterDetectionOption.Help)]
    [DefaultValue("monitor")]
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description(AssessSettings.AsOfHelp)]
    public string? AsOf { get; init; }

    /// <summary>Target.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability for the plans.")]
    [DefaultValue(1e-4)]
    public double TargetAnnualPf { get; init; } = 1e-4;

    /// <summary>Updating route.</summary>
    [CommandOption("--route <ROUTE>")]
    [Description("Updating route: auto, first-order or simulation.")]
    [DefaultValue("auto")]
    public string Route { get; init; } = "auto";

    /// <summary>Recompute all.</summary>
    [CommandOption("--force")]
    [Description("Recompute every component, even those whose stored result still matches its key.")]
    public bool Force { get; init; }

    /// <summary>Shard.</summary>
    [CommandOption("--shard <K/N>")]
    [Description("Only shard K of N (K from 0 to N − 1, by a stable hash of the component code). Give N alone to take K from SLURM_ARRAY_TASK_ID or JOB_COMPLETION_INDEX. The results go to a shard results file (see --results), not into the register.")]
    public string? Shard { get; init; }

    /// <summary>Shard results file.</summary>
    [CommandOption("--results <FILE>")]
    [Description("Shard results file to write (default with --shard: REGISTER.shard-K-of-N.results beside the register). Fold it in with register merge.")]
    public string? Results { get; init; }

    /// <summary>Parallelism.</summary>
    [CommandOption("--parallel <N>")]
    [Description("Components computed at once (default: one per processor).")]
    public int? Parallel { get; init; }
}

/// <summary>Assesses and plans every component in service, storing the results in the register (or a shard results file).</summary>
public sealed class RegisterAssessCommand(CliHost host) : CliCommand<RegisterAssessSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterAssessSettings settings, CancellationToken cancellation)
    {
        if (!(settings.TargetAnnualPf > 0 && settings.TargetAnnualPf < 1)) throw CliException.BadInput("--target-annual-pf", settings.TargetAnnualPf, "must be a probability strictly between 0 and 1.");
        if (settings.Parallel is { } p && p < 1) throw CliException.BadInput("--parallel", p, "must be at least 1.");
        if (settings.Results is not null && settings.Shard is null) throw CliException.BadInput("--results", settings.Results, "needs --shard: without it the results go into the register.");
        var asOf = settings.AsOf is null ? Host.Today() : RegisterAccess.Date("--as-of", settings.AsOf);
        var shard = settings.Shard is null ? (ShardSpec?)null : ShardSpec.Parse(settings.Shard, Environment.GetEnvironmentVariable);
        var options = new PortfolioOptions(asOf, AnnualTarget.FromAnnualPf(settings.TargetAnnualPf, AnnualMeasure.IntervalPf), Study.Route(settings.Route))
        {
            Force = settings.Force,
            Shard = shard,
            Parallelism = settings.Parallel,
            Sampling = settings.Sampling(),
            AfterDetection = AfterDetectionOption.Parse(settings.AfterDetection),
        };
        var registerPath = settings.RegisterPath(Host);
        // A shard only reads the register (its results go to their own file): a read-only register can be sharded.
        using var store = RegisterAccess.Open(Host, registerPath, shard is null ? RegisterOpenMode.OpenExisting : RegisterOpenMode.OpenExistingToRead);
        string? resultsPath = null;
        PortfolioSummary summary;
        if (shard is { } s)
        {
            resultsPath = Host.Resolve(settings.Results ?? string.Create(CultureInfo.InvariantCulture, $"{store.Path}.shard-{s.Index}-of-{s.Count}.results"));
            using var file = ShardResultsFile.Create(resultsPath, new ShardHeader(store.Path, asOf, options.OptionsKey, ToolInfo.ResultVersion, s.Index, s.Count, Host.Clock.GetUtcNow()));
            summary = Run(store, file, options, settings.Json, cancellation);
        }
        else
        {
            summary = Run(store, store, options, settings.Json, cancellation);
        }

        var doc = new RegisterAssessed(store.Path, resultsPath, summary.AsOf, summary.OptionsKey, summary.ToolVersion, summary.Shard, summary.Components, summary.Assessed,
            summary.NotConverged, summary.Reused, summary.Failed, summary.NotInService, summary.OtherShards, summary.Failures,
            Math.Round(summary.Elapsed.TotalSeconds, 2), Reporting.Cautions.Line);
        if (settings.Json) WriteJson(doc);
        else
        {
            Table(["components", "assessed", "not converged", "reused", "failed", "not yet in service", "other shards", "seconds"],
            [[
                I(doc.Components), I(doc.Assessed), I(doc.NotConverged), I(doc.Reused), I(doc.Failed), I(doc.NotInService), I(doc.OtherShards),
                doc.ElapsedSeconds.ToString("0.0", CultureInfo.InvariantCulture),
            ]], $"Evidence up to {asOf:yyyy-MM-dd}, register as recorded on that date; {doc.OptionsKey}");
            if (doc.Failures.Count > 0) Table(["component", "reason"], doc.Failures.Select(f => (IReadOnlyList<string>)[f.ComponentId, f.Reason]), "Not assessed");
            Line(resultsPath is null ? $"Results stored in {store.Path}." : $"Results written to {resultsPath}; fold them in with: register merge {resultsPath} -r {store.Path}");
            Caution();
        }

        return doc.Failed > 0 ? ExitCodes.BadInput : doc.NotConverged > 0 ? ExitCodes.NotConverged : ExitCodes.Ok;
    }

    private PortfolioSummary Run(IRegister store, IResultSink sink, PortfolioOptions options, bool quiet, CancellationToken cancellation)
    {
        if (quiet || !Host.ShowProgress) return PortfolioRun.Run(store, sink, options, null, cancellation);
        PortfolioSummary summary = null!;
        Host.Console.Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new RemainingTimeColumn(), new ElapsedTimeColumn())
            .Start(ctx =>
            {
                var task = ctx.AddTask("Assessing", maxValue: 1.0);
                var clock = System.Diagnostics.Stopwatch.StartNew();
                var progress = new InlineProgress<PortfolioProgress>(p =>
                {
                    var rate = p.Done / Math.Max(clock.Elapsed.TotalSeconds, 1e-3);
                    task.Description = Markup.Escape(string.Create(CultureInfo.InvariantCulture, $"{p.Done}/{p.Total} components ({p.Reused} reused, {p.Failed} failed), {rate:0.0}/s"));
                    task.MaxValue = Math.Max(1, p.Total);
                    task.Value = p.Done;
                });
                summary = PortfolioRun.Run(store, sink, options, progress, cancellation);
            });
        return summary;
    }

    private static string I(int v) => v.ToString(CultureInfo.InvariantCulture);

    /// <summary>Reports on the calling thread (Progress&lt;T&gt; would post to the thread pool and reorder).</summary>
    private sealed class InlineProgress<T>(Action<T> report) : IProgress<T>
    {
        private readonly Lock _gate = new();

        public void Report(T value)
        {
            lock (_gate) report(value);
        }
    }
}

/// <summary>--json of <c>register assess</c>.</summary>
public sealed record RegisterAssessed(string Register, string? ResultsFile, DateOnly AsOf, string OptionsKey, string ToolVersion, string? Shard, int Components,
    int Assessed, int NotConverged, int Reused, int Failed, int NotInService, int OtherShards, IReadOnlyList<PortfolioFailure> Failures, double ElapsedSeconds, string Caution);

/// <summary>Settings of <c>register merge</c>.</summary>
public sealed class RegisterMergeSettings : RegisterSettings
{
    /// <summary>Shard results files.</summary>
    [CommandArgument(0, "<FILES>")]
    [Description("Shard results files written by register assess --shard.")]
    public string[] Files { get; init; } = [];
}

/// <summary>Folds shard results files into the register, refusing results whose keys no longer match.</summary>
public sealed class RegisterMergeCommand(CliHost host) : CliCommand<RegisterMergeSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterMergeSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExisting);
        var merged = StoredResults.Merge(store, settings.Files.Select(Host.Resolve).ToArray());
        if (settings.Json) WriteJson(merged);
        else
        {
            Line(string.Create(CultureInfo.InvariantCulture, $"Merged {merged.Accepted} result(s) from {merged.Files.Count} file(s) into {store.Path}."));
            if (merged.Refused.Count > 0)
            {
                Table(["component", "as of", "file", "refused because"], merged.Refused.Select(r => (IReadOnlyList<string>)
                    [r.ComponentId, r.AsOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), Path.GetFileName(r.Source), r.Reason]), "Refused (keys no longer match the register; rerun register assess)");
            }
        }

        return merged.Refused.Count > 0 ? ExitCodes.BadInput : ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>register invent</c>.</summary>
public sealed class RegisterInventSettings : CommonSettings
{
    /// <summary>File to create.</summary>
    [CommandArgument(0, "<FILE>")]
    [Description("The register to create: a SQLite file that must not exist, or a postgresql:// URI of an empty database.")]
    public string File { get; init; } = string.Empty;

    /// <summary>Component count.</summary>
    [CommandOption("--components <N>")]
    [Description("Number of invented components.")]
    [DefaultValue(1000)]
    public int Components { get; init; } = 1000;

    /// <summary>Seed.</summary>
    [CommandOption("--seed <S>")]
    [Description("Seed of the invention (same seed, same register content).")]
    [DefaultValue(1)]
    public int Seed { get; init; } = 1;

    /// <summary>Recording date.</summary>
    [CommandOption("--recorded <DATE>")]
    [Description("Date the invented records are recorded on (runs as of this date or later see them); findings end half a year before.")]
    [DefaultValue("2025-01-01")]
    public string Recorded { get; init; } = "2025-01-01";
}

/// <summary>Creates a register of invented components for benchmarks and trials.</summary>
public sealed class RegisterInventCommand(CliHost host) : CliCommand<RegisterInventSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterInventSettings settings, CancellationToken cancellation)
    {
        if (settings.Components < 1) throw CliException.BadInput("--components", settings.Components, "must be at least 1.");
        var recorded = RegisterAccess.Date("--recorded", settings.Recorded);
        using var store = RegisterAccess.Open(Host.WithClock(new FixedClock(recorded)), Host.Resolve(settings.File), RegisterOpenMode.CreateNew);
        InventedPortfolio.Create(store, settings.Components, settings.Seed, recorded.AddMonths(-6));
        var doc = new RegisterInvented(store.Path, settings.Components, settings.Seed, recorded, "Invented data for benchmarks and trials: no real asset is meant.");
        if (settings.Json) WriteJson(doc);
        else Line(string.Create(CultureInfo.InvariantCulture, $"Created {store.Path} with {settings.Components} invented components (seed {settings.Seed}, recorded {recorded:yyyy-MM-dd}). {doc.Note}"));
        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>register invent</c>.</summary>
public sealed record RegisterInvented(string Register, int Components, int Seed, DateOnly Recorded, string Note);

/// <summary>Settings of <c>register report</c>.</summary>
public sealed class RegisterReportSettings : ReportRunSettings
{
    /// <summary>The branch plans assume after a detection.</summary>
    [CommandOption("--after-detection <BRANCH>")]
    [Description(AfterDetectionOption.Help)]
    [DefaultValue("monitor")]
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description("Evidence date of the stored results to report (as given to register assess). " + AssessSettings.AsOfHelp)]
    public string? AsOf { get; init; }

    /// <summary>Target.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability the results were stored with.")]
    [DefaultValue(1e-4)]
    public double TargetAnnualPf { get; init; } = 1e-4;

    /// <summary>Updating route.</summary>
    [CommandOption("--route <ROUTE>")]
    [Description("Updating route the results were stored with: auto, first-order or simulation.")]
    [DefaultValue("auto")]
    public string Route { get; init; } = "auto";

    /// <summary>Output folder.</summary>
    [CommandOption("-o|--out <DIR>")]
    [Description("Folder for index.html, register-results.csv and any component pages (created if missing).")]
    [DefaultValue("reports")]
    public string Out { get; init; } = "reports";

    /// <summary>Top rows.</summary>
    [CommandOption("--top <N>")]
    [Description("Rows shown at the top of the ranking and due-date tables (the CSV has every row).")]
    [DefaultValue(100)]
    public int Top { get; init; } = 100;

    /// <summary>Pages for these components.</summary>
    [CommandOption("--components <CODES>")]
    [Description("Also write the own pages of these components (comma-separated codes); recomputed with the same options.")]
    public string? Components { get; init; }

    /// <summary>Pages for a site.</summary>
    [CommandOption("--site <SITE>")]
    [Description("Also write the own pages of every component of this site.")]
    public string? Site { get; init; }

    /// <summary>Pages above a threshold.</summary>
    [CommandOption("--above <P>")]
    [Description("Also write the own pages of every component whose stored annual Pf is above P.")]
    public double? Above { get; init; }
}

/// <summary>Writes the register report from stored results.</summary>
public sealed class RegisterReportCommand(CliHost host) : CliCommand<RegisterReportSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(RegisterReportSettings settings, CancellationToken cancellation)
    {
        if (!(settings.TargetAnnualPf > 0 && settings.TargetAnnualPf < 1)) throw CliException.BadInput("--target-annual-pf", settings.TargetAnnualPf, "must be a probability strictly between 0 and 1.");
        if (settings.Top < 1) throw CliException.BadInput("--top", settings.Top, "must be at least 1.");
        if (settings.Above is { } a && !(a >= 0 && a < 1)) throw CliException.BadInput("--above", a, "must be a probability in [0, 1).");
        var asOf = settings.AsOf is null ? Host.Today() : RegisterAccess.Date("--as-of", settings.AsOf);
        var codes = settings.Components is null ? [] : settings.Components.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        var options = new RegisterReportOptions(asOf, AnnualTarget.FromAnnualPf(settings.TargetAnnualPf, AnnualMeasure.IntervalPf), Study.Route(settings.Route))
        {
            Top = settings.Top,
            PagesFor = codes,
            PagesForSite = settings.Site,
            PagesAboveAnnualPf = settings.Above,
            DocumentControl = settings.DocumentControl(),
            Calendar = settings.Campaign(),
            Sampling = settings.Sampling(),
            AfterDetection = AfterDetectionOption.Parse(settings.AfterDetection),
        };
        var registerPath = settings.RegisterPath(Host);
        using var store = RegisterAccess.Open(Host, registerPath, RegisterOpenMode.OpenExistingToRead);
        var summary = RegisterReport.Write(store, Host.Resolve(settings.Out), Path.GetFileNameWithoutExtension(registerPath), options);
        var doc = new RegisterReported(summary.Index, summary.Csv, asOf, options.OptionsKey, summary.Results, summary.Missing.Count, summary.Stale.Count, summary.Pages,
            Math.Round(summary.Elapsed.TotalSeconds, 2), Reporting.Cautions.Line);
        if (settings.Json) WriteJson(doc);
        else
        {
            Line(string.Create(CultureInfo.InvariantCulture,
                $"Register report of {doc.Results} stored result(s) ({doc.Stale} stale, {doc.Missing} component(s) in service without one), {doc.Pages.Count} component page(s): {doc.Report}"));
            Caution();
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>register report</c>.</summary>
public sealed record RegisterReported(string Report, string Csv, DateOnly AsOf, string OptionsKey, int Results, int Missing, int Stale, IReadOnlyList<string> Pages,
    double ElapsedSeconds, string Caution);
