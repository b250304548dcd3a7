using System.Globalization;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Reporting.Plots;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>Maps engine results to what the reports and the --json outputs show. No numerics: lookups and wording only.</summary>
public static class ReportMapping
{
    /// <summary>Inputs of a model in words, with the unit taken from the name's suffix (e.g. rate_mmPerYear → mm/year).</summary>
    public static IReadOnlyList<ReportInput> Inputs(StochasticModel inputs, string source) =>
        inputs.Variables.Select(v => new ReportInput(v.Name, Describe(v), UnitOf(v.Name), source)).ToArray();

    /// <summary>A distribution in words.</summary>
    public static string Describe(RandomVariable v) =>
        v.IsDeterministic
            ? "fixed " + G(v.Mean)
            : $"{v.Family}, mean {G(v.Mean)}, sd {G(v.StandardDeviation)}" + (double.IsFinite(v.CoefficientOfVariation) ? $" (CoV {v.CoefficientOfVariation.ToString("0.###", CultureInfo.InvariantCulture)})" : string.Empty);

    /// <summary>The unit encoded in an input name's suffix, "-" when none.</summary>
    public static string UnitOf(string name)
    {
        var at = name.LastIndexOf('_');
        if (at < 0 || at == name.Length - 1) return "-";
        var suffix = name[(at + 1)..];
        return suffix switch
        {
            "mmPerYear" => "mm/year",
            "years" or "year" => "years",
            "perYear" => "1/year",
            "cyclesPerYear" => "cycles/year",
            _ => suffix.Replace("Per", "/", StringComparison.Ordinal),
        };
    }

    /// <summary>
    /// Importance factors α² of the model's own inputs (with their units) at the design point of the profile point
    /// nearest <paramref name="timeYears"/> that has a usable one: finite β and some weight on the model's inputs.
    /// Auxiliary variables of the inspection events (detectable size, sizing error) are summed into one bar.
    /// </summary>
    /// <param name="profile">The profile.</param>
    /// <param name="timeYears">The time wanted (the next due date, or the evidence date).</param>
    /// <param name="which">"prior" or "updated".</param>
    /// <param name="inputs">The model's input names (the rest are inspection-event variables).</param>
    /// <param name="inService">Entry into service, to name the date of the design point.</param>
    public static ReportImportance? Importance(ReliabilityProfile profile, double timeYears, string which, IReadOnlyList<string> inputs, DateOnly inService)
    {
        ArgumentNullException.ThrowIfNull(profile);
        ArgumentNullException.ThrowIfNull(inputs);
        var own = inputs.ToHashSet(StringComparer.Ordinal);
        var index = profile.VariableNames.Select((n, i) => (n, i)).Where(x => own.Contains(x.n)).Select(x => x.i).ToArray();
        var point = profile.Points
            .Where(p => p.Alpha is { } a && a.Count == profile.VariableNames.Count && double.IsFinite(p.Beta) && index.Sum(i => a[i] * a[i]) > 1e-6)
            .OrderBy(p => Math.Abs(p.TimeYears - timeYears)).FirstOrDefault();
        if (point?.Alpha is null) return null;
        var names = new List<string>();
        var values = new List<double>();
        foreach (var i in index)
        {
            var unit = UnitOf(profile.VariableNames[i]);
            names.Add(profile.VariableNames[i] + (unit == "-" ? string.Empty : " (" + unit + ")"));
            values.Add(point.Alpha[i] * point.Alpha[i]);
        }

        var others = Enumerable.Range(0, profile.VariableNames.Count).Where(i => !own.Contains(profile.VariableNames[i])).Sum(i => point.Alpha[i] * point.Alpha[i]);
        if (others > 0)
        {
            names.Add("inspection outcomes (detectable size, sizing error)");
            values.Add(others);
        }

        var date = Time.ServiceTime.DateAt(inService, point.TimeYears);
        var label = $"{which}, design point at {point.TimeYears.ToString("0.#", CultureInfo.InvariantCulture)} years ({date:yyyy-MM-dd})";
        return new ReportImportance(point.TimeYears, names, values.Select(v => Math.Clamp(v, 0, 1)).ToArray(), label);
    }

    /// <summary>A method's PoD curve sampled on 0…<paramref name="maxSizeMm"/>.</summary>
    public static ReportPodCurve Pod(InspectionMethod method, double maxSizeMm)
    {
        const int n = 121;
        var sizes = Enumerable.Range(0, n).Select(i => maxSizeMm * i / (n - 1)).ToArray();
        return new ReportPodCurve(method.Name, sizes, sizes.Select(method.Detection.Evaluate).ToArray());
    }

    /// <summary>The posterior summaries as report rows.</summary>
    public static IReadOnlyList<ReportPosteriorSummary> Posterior(PosteriorSummary? posterior) =>
        posterior is null ? [] : posterior.Inputs.Select(i => new ReportPosteriorSummary(i.Name, i.PriorMean, i.PriorStandardDeviation, i.Mean, i.StandardDeviation, i.Quantile05, i.Quantile95)).ToArray();

    /// <summary>How the posterior was obtained, in words.</summary>
    public static string? PosteriorRoute(PosteriorSummary? posterior) => posterior is null ? null
        : $"{HtmlReportWriter.RouteName(posterior.Route)}, {posterior.Samples.ToString(CultureInfo.InvariantCulture)} samples, effective sample size {posterior.EffectiveSampleSize.ToString("0", CultureInfo.InvariantCulture)}"
          + (posterior.Converged ? ", converged" : ", NOT converged") + (posterior.Note is null ? string.Empty : "; " + posterior.Note);

    /// <summary>The plan as the report states it.</summary>
    /// <remarks>Without a schedule, the next inspection assumes no method (its date is when the annual Pf reaches the target with no further inspection): its method is empty.</remarks>
    public static ReportPlan Plan(PlanOutcome plan, IReadOnlyList<string>? notRequested = null)
    {
        var schedule = plan.Schedule?.Inspections.Select(p => new ReportPlannedInspection(p.TimeYears, p.Date, plan.Schedule.MethodName,
            $"annual {AnnualTarget.MeasureName(plan.Next.Target.Measure)} reaches the target ({ReportCharts.Probability(p.Before.Value)})")).ToArray()
            ?? [new ReportPlannedInspection(plan.Next.TimeYears, plan.Next.Date, string.Empty, plan.Next.Message)];
        if (plan.Next.Status == NextInspectionStatus.NotReachedBeforeEndOfService && plan.Schedule is null) schedule = [];
        var notes = plan.Next.Assumptions.Concat(plan.Schedule?.Assumptions ?? []).Distinct().ToList();
        notes.Add(plan.RemainingLife.Message);
        if (plan.Schedule is not null) notes.Add(plan.Schedule.Message);
        notes.AddRange(notRequested ?? []);
        if (!plan.AllConverged) notes.Add("Some estimates behind this plan did not converge: treat its dates as provisional.");
        // The status never lets a schedule that misses the target pass as keeping it.
        var status = plan.Schedule is { } sch && (!sch.Verification.WithinTarget || sch.Status != ScheduleStatus.Complete)
            ? plan.Next.Message + " " + sch.Message
            : plan.Next.Message;
        return new ReportPlan(plan.Next.Target.AnnualPf, plan.Next.Target.Describe(), schedule, status, notes);
    }

    private static string G(double v) => v.ToString("G4", CultureInfo.InvariantCulture);
}
