using InspectionUpdate.Application;

namespace InspectionUpdate.Tests.Application;

/// <summary>What-if runs from a model file and a findings CSV: refused rows say where such a run takes its names from.</summary>
public sealed class WhatIfFilesTests
{
    private const string Model = """
        {
          "schemaVersion": 1,
          "name": "Invented drum bottom, internal corrosion (leak)",
          "serviceLife_years": 30,
          "mechanism": { "type": "corrosion", "growthLaw": "linear", "failureMode": "leak", "leakFraction": 0.8 },
          "inputs": {
            "wallThickness_mm": { "family": "Normal", "mean": 8.0, "sd": 0.25 },
            "rate_mmPerYear": { "family": "Lognormal", "mean": 0.2, "cov": 0.5 }
          }
        }
        """;

    private const string Method = """
        {
          "format": "inspection-update/method/1",
          "description": "Invented test method",
          "pod": { "form": "log-logistic", "mu_ln_mm": -0.7, "sigma_ln": 0.3 },
          "sizing": { "kind": "additive-normal", "bias": 0.0, "sd": 0.3 }
        }
        """;

    [Fact]
    [Reference("docs/user-guide.md §2.10: without a register the component is named after the model file and the methods after the method files beside it")]
    public void A_row_naming_another_component_is_refused_with_the_names_a_what_if_run_knows()
    {
        var folder = Directory.CreateTempSubdirectory("iu-whatif-test-").FullName;
        try
        {
            File.WriteAllText(Path.Combine(folder, "drum.model.json"), Model);
            File.WriteAllText(Path.Combine(folder, "ut-scan.method.json"), Method);
            File.WriteAllText(Path.Combine(folder, "drum.findings.csv"),
                "component_code,inspection_date,kind,method,measured_size_mm,remaining_wall_mm,location,note\nD-4,2016-05-10,no-indication,UT-SCAN,,,bottom,\n");

            var e = Assert.Throws<ApplicationFailureException>(() => ComponentContexts.FromFiles(
                Path.Combine(folder, "drum.model.json"), Path.Combine(folder, "drum.findings.csv"), new DateOnly(2008, 3, 1), new DateOnly(2025, 6, 30)));

            Assert.Equal(FailureKind.BadInput, e.Kind);
            Assert.Contains("component_code 'D-4'", e.FullText, StringComparison.Ordinal);
            Assert.Contains("the component code is 'drum'", e.FullText, StringComparison.Ordinal);
            Assert.Contains("(here: UT-SCAN)", e.FullText, StringComparison.Ordinal);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }
}
