using InspectionUpdate.Application;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Application;

/// <summary>
/// A component of an invented 10,000-component register (INV-05039 of `register invent`) on which first order's
/// updated Pf at 9 years was not a number (the conditioning's multinormal integral underflowed), and the first-order
/// route stopped with "Probability must lie in [0, 1]. Actual value was NaN" instead of giving a profile. The register's
/// two wall-thickness readings (11.71 and 10.75 mm of a 12.7 mm wall) are given here as the depths they stand for.
/// </summary>
public sealed class FirstOrderNaNTests : IDisposable
{
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "iu-fo-nan-" + Guid.NewGuid().ToString("N")[..12]);

    public FirstOrderNaNTests()
    {
        Directory.CreateDirectory(_folder);
        File.WriteAllText(Path.Combine(_folder, "pipe.model.json"), """
            {
              "schemaVersion": 1,
              "name": "Invented buried line, external corrosion (burst)",
              "serviceLife_years": 40,
              "mechanism": { "type": "corrosion", "growthLaw": "linear", "failureMode": "burstDnvRpF101", "lengthGrows": true, "capacityFactor": 1.0 },
              "inputs": {
                "wallThickness_mm": { "family": "Normal", "mean": 12.7, "sd": 0.25 },
                "diameter_mm": 323.9,
                "initiationTime_years": { "family": "Lognormal", "mean": 9.06, "cov": 0.3 },
                "rate_mmPerYear": { "family": "Lognormal", "mean": 0.180, "cov": 0.5 },
                "defectLength_mm": { "family": "Lognormal", "mean": 60, "cov": 0.4 },
                "lengthRate_mmPerYear": { "family": "Lognormal", "mean": 3, "cov": 0.5 },
                "tensileStrength_MPa": { "family": "Lognormal", "mean": 560, "cov": 0.04 },
                "modelFactor": { "family": "Lognormal", "mean": 1.0, "cov": 0.1 },
                "pressure_MPa": { "family": "Normal", "mean": 18.00, "sd": 0.9 }
              }
            }
            """);
        File.WriteAllText(Path.Combine(_folder, "inv-mfl.method.json"), """
            { "format": "inspection-update/method/1", "description": "Invented in-line tool (illustrative)",
              "pod": { "form": "log-logistic", "mu_ln_mm": 0.4, "sigma_ln": 0.35 }, "sizing": { "kind": "additive-normal", "bias": 0.0, "sd": 0.8 } }
            """);
        File.WriteAllText(Path.Combine(_folder, "inv-ut.method.json"), """
            { "format": "inspection-update/method/1", "description": "Invented wall mapping (illustrative)",
              "pod": { "form": "log-logistic", "mu_ln_mm": -0.7, "sigma_ln": 0.3 }, "sizing": { "kind": "additive-normal", "bias": 0.0, "sd": 0.3 } }
            """);
        File.WriteAllText(Path.Combine(_folder, "findings.csv"), """
            component_code,inspection_date,kind,method,measured_size_mm,remaining_wall_mm,location,note
            pipe,2008-06-25,in-service,,,,joint 1,invented
            pipe,2013-01-08,in-service,,,,joint 2,invented
            pipe,2013-04-01,in-service,,,,joint 3,invented
            pipe,2016-07-24,sized-indication,INV-MFL,0.54,,joint 4,invented
            pipe,2020-02-12,sized-indication,INV-UT,0.99,,joint 5,invented
            pipe,2023-01-10,sized-indication,INV-UT,1.95,,joint 6,invented
            """);
    }

    [Fact]
    [Reference("Probability axioms: every reported Pf lies in [0, 1] and never falls with time within a renewal period (Pf(t) is a distribution function of the failure time); design rule of the engine issue: no NaN is reported")]
    public void The_first_order_route_reports_a_profile_with_every_Pf_a_probability_where_first_order_gives_no_number()
    {
        var context = ComponentContexts.FromFiles(Path.Combine(_folder, "pipe.model.json"), Path.Combine(_folder, "findings.csv"), new DateOnly(2004, 2, 18), new DateOnly(2026, 12, 3));
        var request = ComponentStudy.Request(context, new DateOnly(2026, 12, 3), 40, 1, UpdatingRoute.FirstOrder) with { PosteriorSummaries = false };

        var outcome = ComponentAssessment.Assess(request, _ => { });

        Assert.NotNull(outcome.Updated);
        foreach (var profile in new[] { outcome.Prior, outcome.Updated! })
        {
            var previous = 0.0;
            foreach (var p in profile.Points)
            {
                Assert.True(p.CumulativePf is >= 0 and <= 1, $"{profile.Label} t = {p.TimeYears}: Pf {p.CumulativePf}");
                Assert.True(p.CumulativePf >= previous - 1e-12, $"{profile.Label} t = {p.TimeYears}: Pf fell from {previous} to {p.CumulativePf}");
                previous = p.CumulativePf;
            }
        }

        // The step first order could not evaluate says so and is simulated instead.
        Assert.Contains(outcome.Updated!.Points, p => p.Route == ComputationRoute.ImportanceSampling && (p.Note ?? "").Contains("first order gave no probability", StringComparison.Ordinal));
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_folder, recursive: true);
        }
        catch (IOException)
        {
        }
    }
}
