using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Reporting.Plots;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Shared steps of assess and plan: find the component (register or files) and run the engine.</summary>
internal static class Study
{
    /// <summary>The component named by the settings, as known on the evidence date.</summary>
    public static ComponentContext Context(CliHost host, AssessSettings s, DateOnly asOf)
    {
        if (s.Model is not null)
        {
            var modelPath = host.Resolve(s.Model);
            var findings = s.Findings is not null ? host.Resolve(s.Findings) : Beside(modelPath);
            if (findings is not null && !File.Exists(findings)) throw CliException.BadInput("--findings", findings, "does not exist.");
            var inService = s.InService is null ? (findings is null ? asOf : throw new CliException("--in-service is missing: findings are dated, so the date of entry into service is needed."))
                : RegisterAccess.Date("--in-service", s.InService);
            return ComponentContexts.FromFiles(modelPath, findings, inService, asOf);
        }

        using var store = RegisterAccess.Open(host, s.RegisterPath(host), RegisterOpenMode.OpenExistingToRead);
        var knownOn = s.KnownOnDate(host);
        return ComponentContexts.FromRegister(store, RegisterAccess.Component(store, s.Component!, knownOn), asOf, knownOn);
    }

    /// <summary>&lt;model&gt;.findings.csv beside a model file (x.model.json → x.findings.csv), when it exists.</summary>
    public static string? Beside(string modelPath)
    {
        var name = Path.GetFileName(modelPath);
        var stem = name.EndsWith(".model.json", StringComparison.OrdinalIgnoreCase) ? name[..^".model.json".Length] : Path.GetFileNameWithoutExtension(name);
        var candidate = Path.Combine(Path.GetDirectoryName(modelPath)!, stem + ".findings.csv");
        return File.Exists(candidate) ? candidate : null;
    }

    public static UpdatingRoute Route(string route) => route switch
    {
        "auto" => UpdatingRoute.Auto,
        "first-order" => UpdatingRoute.FirstOrder,
        "simulation" => UpdatingRoute.Simulation,
        _ => throw CliException.BadInput("--route", route, "must be auto, first-order or simulation."),
    };

    public static string P(double p) => ReportCharts.Probability(p);
}

/// <summary>Assesses a component: prior and updated profiles.</summary>
public sealed class AssessCommand(CliHost host) : CliCommand<AssessSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(AssessSettings settings, CancellationToken cancellation)
    {
        var asOf = settings.AsOfDate(Host);
        var context = Study.Context(Host, settings, asOf);
        var request = ComponentStudy.Request(context, asOf, settings.Horizon(context.ServiceLifeYears), settings.StepsPerYear, Study.Route(settings.Route)) with { Sampling = settings.Sampling().For(context.Consequence?.Target) };
        var outcome = ProgressRunner.Run(Host, settings.Json, $"Assessing {context.Id}", p => ComponentAssessment.Assess(request, p));
        var doc = ComponentStudy.AssessJson(context, request, outcome);
        if (settings.Json)
        {
            WriteJson(doc);
        }
        else
        {
            Line($"{context.Id} — {context.Name} ({context.Site}); {context.ModelDescription}");
            Line($"In service {context.InServiceDate:yyyy-MM-dd}; evidence to {asOf:yyyy-MM-dd} ({request.AsOfYears.ToString("0.00", CultureInfo.InvariantCulture)} years): {request.Evidence.Count.ToString(CultureInfo.InvariantCulture)} record(s)"
                + (settings.Model is null ? $"; register as known on {settings.KnownOnDate(Host):yyyy-MM-dd}." : "."));
            var prior = outcome.Prior.Points;
            var updated = outcome.Updated?.Points;
            var step = Math.Max(1, prior.Count / 20);
            Table(["time (years)", "date", "Pf prior", "ΔPf prior", "Pf updated", "ΔPf updated", "β updated", "route", "converged"],
                prior.Select((p, i) => (p, u: updated?[i], i)).Where(x => x.i % step == step - 1 || x.i == prior.Count - 1).Select(x => (IReadOnlyList<string>)
                [
                    x.p.TimeYears.ToString("0.##", CultureInfo.InvariantCulture), ServiceTime.DateAt(context.InServiceDate, x.p.TimeYears).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                    Study.P(x.p.CumulativePf), Study.P(x.p.IntervalPf),
                    x.u is null ? "-" : Study.P(x.u.CumulativePf), x.u is null ? "-" : Study.P(x.u.IntervalPf),
                    (x.u ?? x.p).Beta.ToString("0.00", CultureInfo.InvariantCulture), ProfileExport.RouteKey((x.u ?? x.p).Route),
                    (x.u ?? x.p).Converged && x.p.Converged ? "yes" : "NO",
                ]));
            if (doc.Current is { } c)
            {
                Line($"Grid year ending {ServiceTime.DateAt(context.InServiceDate, c.TimeYears):yyyy-MM-dd} ({c.TimeYears.ToString("0.##", CultureInfo.InvariantCulture)} years, the first grid time at or after the as-of date): annual Pf {Study.P(c.AnnualPf)}, cumulative Pf {Study.P(c.CumulativePf)}, β {(Math.Abs(c.Beta) >= 99 ? (c.Beta > 0 ? "∞ (Pf 0)" : "−∞ (Pf 1)") : c.Beta.ToString("0.00", CultureInfo.InvariantCulture))} ({c.Route}{(c.Converged ? ", converged" : ", NOT converged")}{(c.Cov is { } v ? ", CoV " + v.ToString("0.000", CultureInfo.InvariantCulture) : string.Empty)}).");
            }

            if (!outcome.AllConverged) Line("Some steps did not converge: their numbers are best estimates only (exit code 3).");
            Caution();
        }

        return outcome.AllConverged ? ExitCodes.Ok : ExitCodes.NotConverged;
    }
}

/// <summary>Plans the next inspection of a component.</summary>
public sealed class PlanCommand(CliHost host) : CliCommand<PlanSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(PlanSettings settings, CancellationToken cancellation)
    {
        var asOf = settings.AsOfDate(Host);
        var context = Study.Context(Host, settings, asOf);
        var target = settings.TargetBeta is { } b
            ? AnnualTarget.FromAnnualBeta(b, AnnualMeasure.IntervalPf)
            : AnnualTarget.FromAnnualPf(settings.TargetAnnualPf ?? 1e-4, AnnualMeasure.IntervalPf, settings.TargetAnnualPf is null ? "default 1e-4 per year (give --target-annual-pf)" : "user value");
        var method = settings.Method is null ? context.DefaultPlanMethod
            : context.Methods.FirstOrDefault(m => m.Name == settings.Method) ?? throw CliException.BadInput("--method", settings.Method, "is not a known method.");
        if (method is null && !settings.NoSchedule) throw new CliException("No inspection method is known for the schedule: give --method, add a method, or use --no-schedule.");
        var request = ComponentStudy.Request(context, asOf, settings.Horizon(context.ServiceLifeYears), settings.StepsPerYear, Study.Route(settings.Route)) with { Sampling = settings.Sampling().For(target), AfterDetection = AfterDetectionOption.Parse(settings.AfterDetection) };
        var plan = ProgressRunner.Run(Host, settings.Json, $"Planning {context.Id}", p => ComponentAssessment.Plan(request, target, settings.NoSchedule ? null : method, p));
        var doc = ComponentStudy.PlanJson(context, request, plan);
        if (settings.Json)
        {
            WriteJson(doc);
        }
        else
        {
            Line($"{context.Id} — {context.Name}; target {target.Describe()}");
            Line($"Evidence to {asOf:yyyy-MM-dd}" + (context.KnownOn is { } known ? $"; register as known on {known:yyyy-MM-dd}." : "."));
            if (plan.BranchStatement is { } branch) Line(branch);
            Line(plan.Next.Message);
            Line(plan.RemainingLife.Message);
            if (plan.Schedule is { } s)
            {
                Table(["#", "date", "time (years)", "interval (years)", "annual Pf before", "annual Pf after", "route"],
                    doc.Schedule.Select(r => (IReadOnlyList<string>)
                    [
                        r.Number.ToString(CultureInfo.InvariantCulture), r.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r.TimeYears.ToString("0.00", CultureInfo.InvariantCulture),
                        r.IntervalYears.ToString("0.00", CultureInfo.InvariantCulture), Study.P(r.AnnualBefore), Study.P(r.AnnualAfter), r.Route + (r.Converged ? string.Empty : " (NOT converged)"),
                    ]), $"Schedule with {s.MethodName}: each planned inspection assumed to find nothing");
                Line(s.Message);
            }

            foreach (var a in doc.Assumptions) Line("Assumption: " + a);
            if (!plan.AllConverged) Line("Some estimates behind this plan did not converge: treat its dates as provisional (exit code 3).");
            Caution();
        }

        return plan.AllConverged ? ExitCodes.Ok : ExitCodes.NotConverged;
    }
}
