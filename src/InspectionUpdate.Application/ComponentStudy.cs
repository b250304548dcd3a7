using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>One component as the application studies it: identity, model, evidence and the records behind the evidence.</summary>
public sealed record ComponentContext
{
    public required string Id { get; init; }

    public required string Name { get; init; }

    public required string Site { get; init; }

    public required DateOnly InServiceDate { get; init; }

    public required IDegradationModel Model { get; init; }

    /// <summary>Model name and version, e.g. "corrosion (leak), version corrosion-1".</summary>
    public required string ModelDescription { get; init; }

    /// <summary>Service life of the model definition in years, when it states one: the default horizon.</summary>
    public double? ServiceLifeYears { get; init; }

    /// <summary>Where the model's inputs come from, e.g. "model file wil-01.model.json".</summary>
    public required string InputSource { get; init; }

    /// <summary>Evidence in the core's terms, in time order.</summary>
    public required IReadOnlyList<InspectionOutcome> Evidence { get; init; }

    /// <summary>Every revision of every finding, for the report.</summary>
    public IReadOnlyList<ReportFinding> Findings { get; init; } = [];

    /// <summary>Repairs, for the report.</summary>
    public IReadOnlyList<ReportRepair> Repairs { get; init; } = [];

    /// <summary>Methods known for this component (used ones first).</summary>
    public IReadOnlyList<InspectionMethod> Methods { get; init; } = [];

    /// <summary>Fingerprint of the register state (or of the input files).</summary>
    public required string Fingerprint { get; init; }

    /// <summary>Fingerprint of what this component's numbers rest on (<see cref="InspectionUpdate.Register.IRegister.ComponentFingerprint"/>; for files, of the files).</summary>
    public string ComponentFingerprint { get; init; } = string.Empty;

    /// <summary>Revision of the component's model definition in the register (1 for a model file).</summary>
    public int ModelRevision { get; init; } = 1;

    /// <summary>Code of the site that holds the component ("-" for a model file).</summary>
    public string SiteCode { get; init; } = "-";

    /// <summary>The register file or model file.</summary>
    public required string Source { get; init; }

    /// <summary>The date the register was read as recorded on (--known-on); null for model files.</summary>
    public DateOnly? KnownOn { get; init; }

    /// <summary>The owner's consequence class of the component (with its meaning, target and cost of failure), or null.</summary>
    public ComponentConsequence? Consequence { get; init; }

    /// <summary>The method of the latest finding with a method, else the first known method, else null.</summary>
    public InspectionMethod? DefaultPlanMethod =>
        Evidence.Reverse().Select(e => e switch
        {
            NoIndication n => n.Method,
            IndicationNotSized i => i.Method,
            SizedIndication s => s.Method,
            _ => null,
        }).FirstOrDefault(m => m is not null) ?? (Methods.Count > 0 ? Methods[0] : null);
}

/// <summary>The current state read off a profile at the evidence date.</summary>
/// <param name="TimeYears">Grid time used (first grid time at or after the evidence date).</param>
/// <param name="AnnualPf">ΔPf over the step ending there.</param>
/// <param name="CumulativePf">Pf(t).</param>
/// <param name="Beta">β(t), ±99 for Pf of 0 or 1.</param>
/// <param name="Route">Route key.</param>
/// <param name="Converged">Convergence flag.</param>
/// <param name="Cov">CoV when simulated.</param>
public sealed record CurrentState(double TimeYears, double AnnualPf, double CumulativePf, double Beta, string Route, bool Converged, double? Cov);

/// <summary>--json of <c>assess</c>.</summary>
public sealed record AssessDocument(string ComponentId, string Site, string Model, DateOnly InServiceDate, DateOnly AsOf, double AsOfYears,
    int EvidenceCount, bool AllConverged, CurrentState? Current, ProfileExportDocument Prior, ProfileExportDocument? Updated,
    IReadOnlyList<ReportPosteriorSummary> Posterior, string? PosteriorNote, string Fingerprint, string ToolVersion, string Caution)
{
    /// <summary>The date the register was read as recorded on (--known-on); null for model files.</summary>
    public DateOnly? KnownOn { get; init; }
}

/// <summary>One planned inspection in --json.</summary>
public sealed record PlannedRow(int Number, DateOnly Date, double TimeYears, double IntervalYears, double AnnualBefore, double AnnualAfter, string Route, bool Converged);

/// <summary>--json of <c>plan</c>.</summary>
public sealed record PlanDocument(string ComponentId, DateOnly AsOf, double TargetAnnualPf, double TargetAnnualBeta, string TargetMeasure, string TargetSource,
    string NextStatus, DateOnly NextDate, double NextTimeYears, string NextMessage, double? RemainingLifeYears, bool RemainingLifeReached,
    string? ScheduleMethod, string? ScheduleStatus, IReadOnlyList<PlannedRow> Schedule, bool AllConverged, IReadOnlyList<string> Routes,
    double? MaxCov, IReadOnlyList<string> Assumptions, string Fingerprint, string ToolVersion, string Caution)
{
    /// <summary>The date the register was read as recorded on (--known-on); null for model files.</summary>
    public DateOnly? KnownOn { get; init; }

    /// <summary>The branch assumed after a detection: "monitor" or "repair".</summary>
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>The sentence stating the branch when a detection is open since the last repair, else null.</summary>
    public string? AfterDetectionNote { get; init; }
}

/// <summary>Builds outputs from engine results. Lookups and wording only.</summary>
public static class ComponentStudy
{
    public static AssessmentRequest Request(ComponentContext c, DateOnly asOf, double horizonYears, int stepsPerYear, UpdatingRoute route = UpdatingRoute.Auto) =>
        new(c.Id, c.Model, c.InServiceDate, asOf, c.Evidence.Where(e => e.TimeYears <= ServiceTime.YearsSince(c.InServiceDate, asOf) + 1e-9).ToArray(), horizonYears, stepsPerYear, route);

    public static CurrentState? Current(ReliabilityProfile profile, double asOfYears)
    {
        var p = HtmlReportWriter.PointAt(profile, asOfYears);
        return p is null ? null : new CurrentState(p.TimeYears, p.IntervalPf, p.CumulativePf, double.IsFinite(p.Beta) ? p.Beta : Math.Sign(p.Beta) * 99,
            ProfileExport.RouteKey(p.Route), p.Converged, p.CoefficientOfVariation);
    }

    public static AssessDocument AssessJson(ComponentContext c, AssessmentRequest r, AssessmentOutcome o) => new(
        c.Id, c.Site, c.ModelDescription, c.InServiceDate, r.AsOf, Math.Round(r.AsOfYears, 4), c.Evidence.Count, o.AllConverged,
        Current(o.Current, r.AsOfYears), ProfileExport.ToExport(o.Prior), o.Updated is null ? null : ProfileExport.ToExport(o.Updated),
        ReportMapping.Posterior(o.Posterior), o.PosteriorNote, c.Fingerprint, ToolInfo.Version, Cautions.Line)
    { KnownOn = c.KnownOn };

    public static PlanDocument PlanJson(ComponentContext c, AssessmentRequest r, PlanOutcome p)
    {
        var computation = ComputationSummary.Combine(new[] { p.Next.Computation, p.RemainingLife.Computation }.Concat(p.Schedule is null ? [] : [p.Schedule.Computation]));
        return new PlanDocument(c.Id, r.AsOf, p.Next.Target.AnnualPf, p.Next.Target.AnnualBeta, AnnualTarget.MeasureName(p.Next.Target.Measure), p.Next.Target.Source,
            Key(p.Next.Status.ToString()), p.Next.Date, p.Next.TimeYears, p.Next.Message,
            p.RemainingLife.UntilAnnualTarget.RemainingYears, p.RemainingLife.UntilAnnualTarget.Reached,
            p.Schedule?.MethodName, p.Schedule is null ? null : Key(p.Schedule.Status.ToString()),
            p.Schedule?.Inspections.Select(i => new PlannedRow(i.Number, i.Date, i.TimeYears, i.IntervalYears, i.Before.Value, i.After.Value,
                ProfileExport.RouteKey(i.Before.Route), i.Before.Converged && i.After.Converged)).ToArray() ?? [],
            p.AllConverged, computation.Routes.Select(ProfileExport.RouteKey).ToArray(), computation.MaxCoefficientOfVariation,
            p.Next.Assumptions.Concat(p.Schedule?.Assumptions ?? []).Distinct().ToArray(), c.Fingerprint, ToolInfo.Version, Cautions.Line)
        {
            KnownOn = c.KnownOn,
            AfterDetection = DetectionBranch.Key(p.AfterDetection),
            AfterDetectionNote = p.BranchStatement,
        };
    }

    public static ComponentReportData Report(ComponentContext c, AssessmentRequest r, AssessmentOutcome o, PlanOutcome? plan, IReadOnlyList<string> notAvailable,
        IReadOnlyList<string>? notRequested = null)
    {
        // The design point of the next due date (or of the evidence date when nothing is planned), never the horizon's.
        var importanceTime = plan is not null && plan.Next.TimeYears >= r.AsOfYears ? plan.Next.TimeYears : r.AsOfYears;
        var inputNames = c.Model.Inputs.Variables.Select(v => v.Name).ToArray();
        var importance = ReportMapping.Importance(o.Current, importanceTime, o.Updated is null ? "prior" : "updated", inputNames, c.InServiceDate)
            ?? (o.Updated is null ? null : ReportMapping.Importance(o.Prior, importanceTime, "prior", inputNames, c.InServiceDate));
        var maxSize = c.Model.MaximumSizeMm is { } m && double.IsFinite(m) ? m : 10;
        var assumptions = new List<string>
        {
            $"Time zero is the entry into service on {c.InServiceDate:yyyy-MM-dd}; one year is {ServiceTime.DaysPerYear.ToString(CultureInfo.InvariantCulture)} days.",
            $"Evidence up to {r.AsOf:yyyy-MM-dd}: {c.Evidence.Count.ToString(CultureInfo.InvariantCulture)} record(s) (latest revision of each finding and repair"
                + (c.KnownOn is { } known ? $" as recorded on {known:yyyy-MM-dd}" : string.Empty) + "; withdrawn ones left out).",
            "The annual failure probability is ΔPf(t) = Pf(t) − Pf(t − 1) on a yearly grid; after a repair it counts from the repair.",
            $"The limit state and its inputs are those of the model ({c.ModelDescription}); their distributions are as stated under Inputs.",
        };
        if (c.Model.AnnualMaximumInput is { } annual) assumptions.Add($"{annual} is an annual maximum renewed independently each year; Pf(t) is the series system of the yearly events.");
        if (c.Model.RenewedOnRepair.Count > 0) assumptions.Add("A repair renews " + string.Join(", ", c.Model.RenewedOnRepair) + "; the other inputs keep what earlier findings taught about them.");
        if (o.PosteriorNote is not null) assumptions.Add(o.PosteriorNote);
        return new ComponentReportData
        {
            ComponentId = c.Id,
            ComponentName = c.Name,
            Site = c.Site,
            Model = c.ModelDescription,
            InServiceDate = c.InServiceDate,
            Inputs = ReportMapping.Inputs(c.Model.Inputs, c.InputSource),
            Findings = c.Findings,
            Repairs = c.Repairs,
            Prior = o.Prior,
            Updated = o.Updated,
            Importance = importance,
            PodCurves = PodMethods(c, plan).Select(mt => ReportMapping.Pod(mt, maxSize)).ToArray(),
            PosteriorSummaries = ReportMapping.Posterior(o.Posterior),
            Posteriors = o.Samples.Select(s => new ReportPosterior(s.Name, s.Prior, s.Posterior,
                o.Posterior is null ? "importance sampling" : string.Create(CultureInfo.InvariantCulture, $"importance sampling, ESS {o.Posterior.EffectiveSampleSize:F0}"))).ToArray(),
            PosteriorRoute = ReportMapping.PosteriorRoute(o.Posterior),
            Plan = plan is null ? null : BranchStated(ReportMapping.Plan(plan, notRequested), plan),
            Assumptions = assumptions,
            NotAvailable = notAvailable,
            NotRequested = notRequested ?? [],
            Provenance = new ReportProvenance(ToolInfo.Version, c.Fingerprint, c.Source, DateTimeOffset.UtcNow, r.AsOf) { RegisterKnownOn = c.KnownOn },
            Flags = Flags(r, o, plan),
        };
    }

    /// <summary>
    /// The component's marks: not converged (any profile step or planning estimate), overdue (the next inspection's
    /// latest date on or before the evidence date), above target (the annual Pf now at or above the plan's target).
    /// The register page, the component page and every export take them from here.
    /// </summary>
    public static ReportMark Flags(AssessmentRequest r, AssessmentOutcome o, PlanOutcome? plan)
    {
        ArgumentNullException.ThrowIfNull(r);
        ArgumentNullException.ThrowIfNull(o);
        var current = Current(o.Current, r.AsOfYears);
        return ReportMarks.Of(o.AllConverged && (plan?.AllConverged ?? true), current?.AnnualPf, plan?.Next.Date, plan?.Next.Target.AnnualPf, r.AsOf);
    }

    /// <summary>
    /// A plan after a detection or a sizing (with no repair since) states the branch it assumes, first among its notes:
    /// the known defect left in service and monitored, or repaired on detection (the planner's statement).
    /// </summary>
    public static ReportPlan BranchStated(ReportPlan plan, PlanOutcome outcome)
    {
        ArgumentNullException.ThrowIfNull(plan);
        ArgumentNullException.ThrowIfNull(outcome);
        var stated = plan with { AfterDetection = DetectionBranch.Key(outcome.AfterDetection) };
        if (outcome.BranchStatement is not { } note) return stated;
        return stated with { BranchNote = note, Notes = [note, .. plan.Notes.Where(n => n != note)] };
    }

    /// <summary>The methods whose PoD the report draws: those of the component's current findings, then the schedule's method.</summary>
    public static IReadOnlyList<InspectionMethod> PodMethods(ComponentContext c, PlanOutcome? plan)
    {
        var names = c.Findings.Where(f => !f.Superseded).Select(f => f.Method)
            .Concat(plan?.Schedule is { } s ? [s.MethodName] : [])
            .ToHashSet(StringComparer.Ordinal);
        return c.Methods.Where(m => names.Contains(m.Name)).ToArray();
    }

    public static PortfolioRow Row(ComponentContext c, AssessmentRequest r, AssessmentOutcome o, PlanOutcome? plan, string? reportFile)
    {
        var current = Current(o.Current, r.AsOfYears);
        // The route of the number only: whether the component converged is its not-converged mark, one rule for every page.
        var route = current is null ? "-" : HtmlReportWriter.RouteAndCov(HtmlReportWriter.PointAt(o.Current, r.AsOfYears)!);
        double? years = plan is null ? null
            : plan.RemainingLife.UntilAnnualTarget.Reached ? plan.RemainingLife.UntilAnnualTarget.RemainingYears : double.PositiveInfinity;
        return new PortfolioRow(c.Id, c.Name, c.Site, current?.AnnualPf, route, years, plan?.Next.Date, plan?.Next.Message ?? "not planned", reportFile)
        {
            CurrentYearEnding = current is null ? null : ServiceTime.DateAt(c.InServiceDate, current.TimeYears),
            FlagSet = Flags(r, o, plan),
        };
    }

    private static string Key(string pascal) => System.Text.Json.JsonNamingPolicy.SnakeCaseLower.ConvertName(pascal);
}
