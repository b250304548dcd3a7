using System.Runtime.CompilerServices;
using InspectionUpdate.Degradation;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Reliability;
using InspectionUpdate.Time;
using InspectionUpdate.TimeVariant;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Application;

/// <summary>What to assess: one component's model and its evidence, with the dates that place it in time.</summary>
/// <param name="ComponentId">Component identifier.</param>
/// <param name="Model">The degradation model (time in years since entry into service).</param>
/// <param name="InServiceDate">Date of entry into service (time zero).</param>
/// <param name="AsOf">Evidence date: findings after it are left out by the caller.</param>
/// <param name="Evidence">Findings and repairs up to <paramref name="AsOf"/>, in time order.</param>
/// <param name="HorizonYears">Profile horizon and end of service life, years since entry into service.</param>
/// <param name="StepsPerYear">Grid steps per year (1 gives annual failure probabilities).</param>
/// <param name="Route">Route: automatic (one weighted sample set per component, first order below its resolution and as a cross-check), first order only, or the sample set only.</param>
public sealed record AssessmentRequest(string ComponentId, IDegradationModel Model, DateOnly InServiceDate, DateOnly AsOf,
    IReadOnlyList<InspectionOutcome> Evidence, double HorizonYears, int StepsPerYear, UpdatingRoute Route = UpdatingRoute.Auto)
{
    /// <summary>Accuracy and seed of the sampling route (auto and simulation); numbers are reproducible from them.</summary>
    public SamplingSettings Sampling { get; init; } = SamplingSettings.Default;

    /// <summary>The branch the plan assumes after a detection not yet followed by a repair (an option that changes numbers).</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>
    /// False to skip the posterior summaries and draws of the inputs (a whole-register run stores profiles and plans
    /// only; the summaries sort every input's samples). Default true.
    /// </summary>
    public bool PosteriorSummaries { get; init; } = true;

    /// <summary>Years from entry into service to the evidence date.</summary>
    public double AsOfYears => ServiceTime.YearsSince(InServiceDate, AsOf);
}

/// <summary>The profiles of one assessment and what they rest on.</summary>
/// <param name="Prior">Profile without inspection evidence.</param>
/// <param name="Updated">Profile given the evidence; null when there is none.</param>
/// <param name="Posterior">Posterior summary of the inputs; null without evidence or when the sampler failed (see <paramref name="PosteriorNote"/>).</param>
/// <param name="PosteriorNote">Why the posterior is missing, or null.</param>
public sealed record AssessmentOutcome(ReliabilityProfile Prior, ReliabilityProfile? Updated, PosteriorSummary? Posterior, string? PosteriorNote)
{
    /// <summary>Prior and posterior draws of the inputs for histograms; empty without evidence.</summary>
    public IReadOnlyList<InputSamples> Samples { get; init; } = [];

    /// <summary>The profile that describes the component now: updated when there is evidence, else the prior.</summary>
    public ReliabilityProfile Current => Updated ?? Prior;

    /// <summary>True when every number of both profiles converged.</summary>
    public bool AllConverged => Prior.AllConverged && (Updated?.AllConverged ?? true);
}

/// <summary>The plan of one component.</summary>
/// <param name="Next">Latest date of the next inspection.</param>
/// <param name="Schedule">Life-cycle schedule with the planned method (each planned inspection assumed to find nothing).</param>
/// <param name="RemainingLife">Remaining life without further inspection.</param>
public sealed record PlanOutcome(NextInspection Next, InspectionSchedule? Schedule, RemainingLife RemainingLife)
{
    /// <summary>The branch assumed after a detection (the run's option; it changes numbers only when a detection is open).</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>The sentence stating the branch, or null when no detection is open since the last repair.</summary>
    public string? BranchStatement { get; init; }

    /// <summary>True when every estimate behind the plan converged.</summary>
    public bool AllConverged => Next.Computation.AllConverged && (Schedule?.Computation.AllConverged ?? true) && RemainingLife.Computation.AllConverged;
}

/// <summary>
/// Runs the engine for the front ends: the prior profile by time-stepped FORM, the updated profile and posterior by the
/// updater, and the plan by the planner. It only orchestrates; every number comes from the core.
/// </summary>
public static class ComponentAssessment
{
    private static readonly ReliabilityUpdater FirstOrderUpdater = new(UpdatingOptions.Default with { Route = UpdatingRoute.FirstOrder });

    // One sample-set updater per model instance (one component's study): assess, plan and report share its sets.
    private static readonly ConditionalWeakTable<IDegradationModel, SampleSetUpdater> SampleSets = [];

    /// <summary>
    /// The updater of a request: first order for the first-order route; otherwise the sample-set route (the automatic
    /// route with first order below the sampling resolution and as a cross-check, the simulation route without it).
    /// </summary>
    public static IReliabilityUpdater Updater(AssessmentRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (request.Route == UpdatingRoute.FirstOrder) return FirstOrderUpdater;
        var options = request.Sampling.ToOptions(request.Route == UpdatingRoute.Auto, request.HorizonYears);
        lock (SampleSets)
        {
            if (SampleSets.TryGetValue(request.Model, out var known) && known.Options == options) return known;
            var updater = new SampleSetUpdater(options);
            SampleSets.AddOrUpdate(request.Model, updater);
            return updater;
        }
    }

    /// <summary>Prior and updated profiles on a grid from the first step to the horizon.</summary>
    public static AssessmentOutcome Assess(AssessmentRequest request, Action<double> progress)
    {
        ArgumentNullException.ThrowIfNull(request);
        var grid = TimeGrid.Yearly(request.HorizonYears, request.StepsPerYear);
        var updater = Updater(request);
        if (updater is SampleSetUpdater sampled)
        {
            var priorSampled = sampled.Profile(request.Model, [], grid.TimesYears, "prior");
            progress(request.Evidence.Count == 0 ? 1.0 : 0.4);
            if (request.Evidence.Count == 0) return new AssessmentOutcome(priorSampled, null, null, "no findings: the prior stands");
            var updatedSampled = sampled.Profile(request.Model, request.Evidence, grid.TimesYears, UpdatedLabel(request));
            progress(0.9);
            if (!request.PosteriorSummaries) return new AssessmentOutcome(priorSampled, updatedSampled, null, PosteriorNotRequested);
            var summary = sampled.Posterior(request.Model, request.Evidence);
            var draws = sampled.PosteriorSamples(request.Model, request.Evidence);
            progress(1.0);
            return new AssessmentOutcome(priorSampled, updatedSampled, summary, null) { Samples = draws };
        }

        var prior = FirstOrderPrior(request, grid);
        progress(request.Evidence.Count == 0 ? 1.0 : 0.4);
        if (request.Evidence.Count == 0) return new AssessmentOutcome(prior, null, null, "no findings: the prior stands");

        var session = FirstOrderUpdater.Prepare(request.Model, request.Evidence);
        var updated = session.Profile(UpdatingCase.SingleComponentId, grid.TimesYears, UpdatedLabel(request));
        progress(0.8);
        if (!request.PosteriorSummaries) return new AssessmentOutcome(prior, updated, null, PosteriorNotRequested);
        PosteriorSummary? posterior = null;
        IReadOnlyList<InputSamples> samples = [];
        string? note = null;
        try
        {
            posterior = session.Posterior();
            samples = session.PosteriorSamples();
        }
        catch (InvalidOperationException e)
        {
            note = "posterior not computed: " + e.Message;
        }

        progress(1.0);
        return new AssessmentOutcome(prior, updated, posterior, note) { Samples = samples };
    }

    /// <summary>
    /// The profile that describes the component now, alone: the updated profile where there are findings (no prior set
    /// is built for it: a whole-register run stores the current state, and a component's report still shows both),
    /// else the prior. The same numbers as <see cref="Assess"/>'s current profile: each set has its own stream.
    /// </summary>
    public static ReliabilityProfile CurrentProfile(AssessmentRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        var grid = TimeGrid.Yearly(request.HorizonYears, request.StepsPerYear);
        if (Updater(request) is SampleSetUpdater sampled)
        {
            return request.Evidence.Count == 0
                ? sampled.Profile(request.Model, [], grid.TimesYears, "prior")
                : sampled.Profile(request.Model, request.Evidence, grid.TimesYears, UpdatedLabel(request));
        }

        if (request.Evidence.Count == 0)
        {
            return FirstOrderPrior(request, grid);
        }

        return FirstOrderUpdater.Prepare(request.Model, request.Evidence).Profile(UpdatingCase.SingleComponentId, grid.TimesYears, UpdatedLabel(request));
    }

    /// <summary>The prior profile of the first-order route (importance sampling where first order cannot stand).</summary>
    private static ReliabilityProfile FirstOrderPrior(AssessmentRequest request, TimeGrid grid) =>
        TimeVariantReliability.Profile(request.Model, grid, ProfileOptions.Default with { Label = "prior", Fallback = new ImportanceSamplingFallback() });

    private const string PosteriorNotRequested = "posterior summaries not requested in this run";

    private static string UpdatedLabel(AssessmentRequest request) => $"updated with {request.Evidence.Count} record(s) to {request.AsOf:yyyy-MM-dd}";

    /// <summary>Next inspection, schedule and remaining life against <paramref name="target"/>.</summary>
    public static PlanOutcome Plan(AssessmentRequest request, AnnualTarget target, InspectionMethod? method, Action<double> progress)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(target);
        // Every year where the annual Pf could reach the target is resolved: the request's decision floor is lowered to
        // a tenth of the target where it lies higher (the front ends set it so before assessing, and then share the set).
        request = request with { Sampling = request.Sampling.For(target) };
        var planner = new InspectionPlanner(Updater(request));
        // The repair branch's post-repair prior: the latest logged repair's (the owner's own record of what a repair
        // leaves), else the renewed inputs restart from their original prior.
        var lastRepair = request.Evidence.OfType<Repair>().LastOrDefault();
        var planning = new PlanningRequest
        {
            Model = request.Model,
            Evidence = request.Evidence,
            InServiceDate = request.InServiceDate,
            Target = target,
            EndOfServiceYears = request.HorizonYears,
            StartTimeYears = Math.Clamp(request.AsOfYears, 0, request.HorizonYears),
            AfterDetection = request.AfterDetection,
            AssumedRepairInputs = request.AfterDetection == AfterDetection.Repair && lastRepair is not null
                ? lastRepair.PostRepairInputs.Where(kv => request.Model.RenewedOnRepair.Contains(kv.Key)).ToDictionary()
                : new Dictionary<string, Probability.RandomVariable>(),
            AssumedRepairSource = lastRepair is null ? null : $"of the latest logged repair ({lastRepair.Reference})",
        };
        var next = planner.NextInspection(planning);
        progress(0.3);
        var life = planner.RemainingLife(planning);
        progress(0.5);
        var schedule = method is null ? null : planner.Schedule(planning, method);
        progress(1.0);
        return new PlanOutcome(next, schedule, life)
        {
            AfterDetection = request.AfterDetection,
            BranchStatement = DetectionBranch.Statement(planning, ServiceTime.DateAt(request.InServiceDate, planning.EffectiveStartYears)),
        };
    }
}
