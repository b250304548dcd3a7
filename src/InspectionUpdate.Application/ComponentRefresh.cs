using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>One component assessed and planned for a front end, with the result stored in the register under its key.</summary>
/// <param name="Context">The component as studied (model, evidence, records).</param>
/// <param name="Request">The assessment request.</param>
/// <param name="Outcome">Prior and updated profiles.</param>
/// <param name="Plan">Next inspection, remaining life and (when asked) the schedule; null beyond the horizon.</param>
/// <param name="Stored">The row stored in the register (the overview reads it).</param>
public sealed record ComponentResult(ComponentContext Context, AssessmentRequest Request, AssessmentOutcome Outcome, PlanOutcome? Plan, StoredResult Stored)
{
    /// <summary>The key the result is filed under (<see cref="ResultKeys.Compute"/>).</summary>
    public string Key => Stored.ResultKey;

    /// <summary>True when every number of the profiles and the plan converged.</summary>
    public bool AllConverged => Outcome.AllConverged && (Plan?.AllConverged ?? true);
}

/// <summary>
/// Assesses and plans one component of the register as of a date and stores its result under its key, as a
/// whole-register run (<see cref="PortfolioRun"/>) would, so that the overview shows it at once.
/// </summary>
public static class ComponentRefresh
{
    /// <summary>The key a result of the component would be filed under now (changes with every finding, repair, model revision or option).</summary>
    public static string Key(IRegister store, string code, PortfolioOptions options)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(options);
        var snapshot = new RegisterSnapshot(store, options.AsOf);
        var component = Registers.Component(store, code, options.AsOf);
        return ResultKeys.Compute(component.Model.Revision, store.ComponentFingerprint(component.Id, snapshot.Known), options.AsOf, options.OptionsKey, ToolInfo.ResultVersion);
    }

    /// <summary>The stored result of the component for the options' date and options, or null when none is stored.</summary>
    public static StoredResult? Stored(IRegister store, string code, PortfolioOptions options)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(options);
        return store.Results(options.AsOf, options.OptionsKey).FirstOrDefault(r => r.ComponentCode == code);
    }

    /// <summary>Assesses and plans the component (with a schedule when <paramref name="schedule"/>) and stores the result.</summary>
    /// <exception cref="ApplicationFailureException">The component is unknown, not in service by the date, or its model or evidence is bad input.</exception>
    public static ComponentResult Run(IRegister store, string code, PortfolioOptions options, bool schedule, Action<double> progress)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(progress);
        var snapshot = new RegisterSnapshot(store, options.AsOf);
        var component = Registers.Component(store, code, options.AsOf);
        if (component.InstallDate > options.AsOf)
        {
            throw ApplicationFailureException.BadInput("component", code, $"enters service on {component.InstallDate:yyyy-MM-dd}, after the evidence date {options.AsOf:yyyy-MM-dd}.");
        }

        var fingerprint = store.ComponentFingerprint(component.Id, snapshot.Known);
        var tool = ToolInfo.ResultVersion;
        var key = ResultKeys.Compute(component.Model.Revision, fingerprint, options.AsOf, options.OptionsKey, tool);
        var site = snapshot.Sites.FirstOrDefault(s => s.Id == component.SiteId)?.Code ?? "?";
        var row = new StoredResult(component.Id, component.Code, site, options.AsOf, options.OptionsKey, component.Model.Revision, fingerprint, tool, key,
            ResultStatus.Failed, null, DateTimeOffset.UtcNow);
        var context = ComponentContexts.FromRegister(snapshot, component, fingerprint) with { Consequence = OwnerRecords.Consequences(store, snapshot.Known).GetValueOrDefault(component.Code) };
        var request = ComponentStudy.Request(context, options.AsOf, options.HorizonYears ?? context.ServiceLifeYears ?? 40, 1, options.Route) with { Sampling = options.Sampling.For(PortfolioRun.PlanTarget(context, options.Target)), AfterDetection = options.AfterDetection };
        var outcome = ComponentAssessment.Assess(request, p => progress(0.6 * p));
        var plan = request.AsOfYears < request.HorizonYears
            ? ComponentAssessment.Plan(request, PortfolioRun.PlanTarget(context, options.Target), schedule ? context.DefaultPlanMethod : null, p => progress(0.6 + 0.35 * p))
            : null;
        var stored = PortfolioRun.ToStored(context, request, outcome, plan, row);
        if (!store.IsReadOnly) store.Save([stored]);
        progress(1.0);
        return new ComponentResult(context, request, outcome, plan, stored);
    }
}
