using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Cli.Verification;

/// <summary>
/// Verification of the main job, updating and planning, on the worked case of docs/references.md: ln a(t) = X₁ + X₂t,
/// X₁ ~ N(ln 0.5, 0.5), X₂ ~ N(0.10, 0.02), failure at a = 20 mm; probability of detection Φ((ln a − ln 2)/0.5);
/// sizing error ln ε ~ N(0, 0.25). Every event surface is a hyperplane in standard normal space, so the expected
/// values are exact (derived there by bivariate normal and Gaussian conditioning) and first order must reproduce
/// them; the simulation route must lie within three of its standard errors.
/// </summary>
/// <remarks>The model is written in the component-model file format, so the check also runs the definition parser.</remarks>
internal static class UpdatingVerificationCases
{
    private const string Source = "docs/references.md worked updating case [derived, exact]";

    private static readonly string ModelJson = """
        {
          "schemaVersion": 1,
          "name": "worked updating case: log-linear crack growth",
          "serviceLife_years": 40,
          "mechanism": {
            "type": "expression",
            "limitState": "20 - exp(lnInitialDepth + rate_perYear * t)",
            "size": "exp(lnInitialDepth + rate_perYear * t)",
            "sizeQuantity": "depth_mm"
          },
          "inputs": {
            "lnInitialDepth": { "family": "Normal", "mean": -0.6931471805599453, "sd": 0.5 },
            "rate_perYear": { "family": "Normal", "mean": 0.10, "sd": 0.02 }
          }
        }
        """;

    /// <summary>The rows: prior, no detection, sized finding (both routes) and the first year above the target.</summary>
    public static IReadOnlyList<VerificationTableRow> Run()
    {
        var parsed = ComponentModelDefinition.Parse(ModelJson);
        if (parsed.Definition is null)
        {
            throw new InvalidOperationException("The built-in verification model does not parse: " + string.Join("; ", parsed.Problems));
        }

        var model = parsed.Definition.Build();
        var method = new InspectionMethod("probit-2mm", new CumulativeLognormalPod(Math.Log(2), 0.5),
            new SizingError(SizingErrorKind.MultiplicativeLognormal, 0, 0.25));
        IReadOnlyList<InspectionOutcome> none = [new NoIndication(10, "verify: no indication at 10 y", method)];
        IReadOnlyList<InspectionOutcome> sized = [new SizedIndication(10, "verify: 3.2 mm at 10 y", method, 3.2)];
        var firstOrder = new ReliabilityUpdater(UpdatingOptions.Default with { Route = UpdatingRoute.FirstOrder });
        var simulation = new ReliabilityUpdater(UpdatingOptions.Default with { Route = UpdatingRoute.Simulation });
        const string name = "worked case ln a = X1 + X2·t";
        var rows = new List<VerificationTableRow>
        {
            FirstOrderRow(name + ", prior", "Pf(20 y)", 4.174915e-3, firstOrder.Estimate(model, [], 20), 1e-4),
        };

        var noneFo = firstOrder.Estimate(model, none, 20);
        rows.Add(FirstOrderRow(name + ", no indication at 10 y", "P(no indication)", 0.700445, noneFo, 1e-4, noneFo.EvidenceProbability));
        rows.Add(FirstOrderRow(name + ", no indication at 10 y", "Pf(20 y) updated", 1.071037e-4, noneFo, 2e-3));
        rows.Add(SimulationRow(name + ", no indication at 10 y", "Pf(20 y) updated", 1.071037e-4, simulation.Estimate(model, none, 20)));
        rows.Add(FirstOrderRow(name + ", 3.2 mm sized at 10 y", "Pf(20 y) updated", 2.628171e-3, firstOrder.Estimate(model, sized, 20), 2e-3));
        rows.Add(SimulationRow(name + ", 3.2 mm sized at 10 y", "Pf(20 y) updated", 2.628171e-3, simulation.Estimate(model, sized, 20)));

        // The sample-set route (the automatic route's numbers): one weighted set per set of findings, read at 20 y.
        var sampleSet = new SampleSetUpdater(SampleSetOptions.Default with { FirstOrderBelowResolution = false, HorizonYears = 40 });
        rows.Add(SimulationRow(name + ", prior", "Pf(20 y)", 4.174915e-3, sampleSet.Estimate(model, [], 20), "sample-set route"));
        rows.Add(SimulationRow(name + ", no indication at 10 y", "Pf(20 y) updated", 1.071037e-4, sampleSet.Estimate(model, none, 20), "sample-set route"));
        rows.Add(SimulationRow(name + ", 3.2 mm sized at 10 y", "Pf(20 y) updated", 2.628171e-3, sampleSet.Estimate(model, sized, 20), "sample-set route"));
        rows.Add(DueYearRow(name, model, none, sampleSet, "planner (sample-set route)"));

        // Planning: the annual ΔPf first exceeds 1e-4 in year 21 after the no indication (16 without it); the planner's
        // continuous-time crossing must fall inside that year.
        rows.Add(DueYearRow(name, model, none, firstOrder, "planner (first order)"));
        return rows;
    }

    private static VerificationTableRow DueYearRow(string name, IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, IReliabilityUpdater updater, string route)
    {
        var next = new InspectionPlanner(updater).NextInspection(new PlanningRequest
        {
            Model = model,
            Evidence = evidence,
            InServiceDate = new DateOnly(2000, 1, 1),
            Target = AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf, "verification"),
            EndOfServiceYears = 40,
        });
        return new VerificationTableRow(name + ", no indication at 10 y", Source, "year in which annual ΔPf first exceeds 1e-4",
            21, Math.Ceiling(next.TimeYears), 0, route,
            "crossing at " + next.TimeYears.ToString("0.000", CultureInfo.InvariantCulture) + " y" + (next.Computation.AllConverged ? "" : "; not converged"));
    }

    private static VerificationTableRow FirstOrderRow(string name, string quantity, double expected, UpdatedEstimate e, double tolerance, double? obtained = null) =>
        new(name, Source, quantity, expected, e.Converged && e.Route == ComputationRoute.FirstOrder ? obtained ?? e.CumulativePf : double.NaN, tolerance,
            "first-order updating", e.Converged ? null : "not converged: " + e.Note);

    private static VerificationTableRow SimulationRow(string name, string quantity, double expected, UpdatedEstimate e, string route = "importance-sampling updating")
    {
        var cov = e.CoefficientOfVariation ?? double.NaN;
        return new(name, Source, quantity, expected, e.Converged ? e.CumulativePf : double.NaN, 3 * cov, route,
            "CoV " + cov.ToString("0.000", CultureInfo.InvariantCulture));
    }
}
