using System.Globalization;
using System.Text;
using InspectionUpdate.Inspection;
using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>
/// Builds a register of invented components for benchmarks and trials: buried pipeline sections with external
/// corrosion (linear wall loss after a random coating life, burst capacity), each with its own model inputs and 2–6
/// findings of mixed kinds. Every name and number is invented; no real asset is meant. Deterministic for a seed.
/// </summary>
public static class InventedPortfolio
{
    /// <summary>Components per invented site.</summary>
    public const int ComponentsPerSite = 250;

    /// <summary>Adds <paramref name="count"/> invented components (codes INV-00001 …) with their findings to an empty register.</summary>
    /// <param name="store">An empty register (its clock dates the records: put it before the evidence date of the runs).</param>
    /// <param name="count">Number of components (≥ 1).</param>
    /// <param name="seed">Seed of the invention.</param>
    /// <param name="latestFinding">No finding after this date.</param>
    public static void Create(IRegister store, int count, int seed, DateOnly latestFinding)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        const string actor = "invented-portfolio";
        Registers.Require(store.AddMethod(new NewMethod("INV-MFL", "Invented in-line magnetic-flux-leakage tool (illustrative)",
            new PodSpec(PodForms.LogLogistic, 0.4, 0.35, null), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.8)), actor), "invented method");
        Registers.Require(store.AddMethod(new NewMethod("INV-UT", "Invented ultrasonic wall mapping (illustrative)",
            new PodSpec(PodForms.LogLogistic, -0.7, 0.3, null), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3)), actor), "invented method");
        var random = new Random(seed);
        var csv = new StringBuilder();
        for (var i = 0; i < count; i++)
        {
            var siteCode = "INV-S" + (i / ComponentsPerSite + 1).ToString("000", CultureInfo.InvariantCulture);
            if (i % ComponentsPerSite == 0) Registers.Require(store.AddSite(new NewSite(siteCode, "Invented pipeline system " + siteCode[4..]), actor), "invented site");
            var code = "INV-" + (i + 1).ToString("00000", CultureInfo.InvariantCulture);
            var rate = 0.08 + 0.25 * random.NextDouble();
            var initiation = 4 + 8 * random.NextDouble();
            var pressure = 12 + 6 * random.NextDouble();
            var installed = new DateOnly(1995, 1, 1).AddDays(random.Next(0, 20 * 365));
            Registers.Require(store.AddComponent(new NewComponent(siteCode, code, "Invented buried section " + code[4..], installed, 12.7, Model(rate, initiation, pressure), "invented-1"), actor), "invented component");

            var findings = 2 + random.Next(0, 5);
            var first = installed.AddYears(3);
            var span = latestFinding.DayNumber - first.DayNumber;
            if (span < findings * 30) continue;
            var days = Enumerable.Range(0, findings).Select(_ => random.Next(0, span)).Distinct().Order().ToArray();
            foreach (var (day, k) in days.Select((d, k) => (d, k)))
            {
                var date = first.AddDays(day);
                var years = (date.DayNumber - installed.DayNumber) / 365.25;
                var depth = Math.Min(0.6 * 12.7, Math.Max(0.3, rate * (years - initiation)) * (0.7 + 0.6 * random.NextDouble()));
                // Early records find nothing or confirm service; later ones size what corrosion there is.
                var late = k >= days.Length / 2 && years > initiation + 2;
                var kind = late ? random.Next(3) : random.Next(2) + 3;
                var d = date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
                csv.Append(kind switch
                {
                    0 => $"{code},{d},sized-indication,INV-MFL,{F(depth)},,joint {k + 1},invented",
                    1 => $"{code},{d},wall-thickness,INV-UT,,{F(12.7 - depth)},joint {k + 1},invented",
                    2 => $"{code},{d},indication-not-sized,INV-MFL,,,joint {k + 1},invented",
                    3 => $"{code},{d},no-indication,INV-MFL,,,joint {k + 1},invented",
                    _ => $"{code},{d},in-service,,,,joint {k + 1},invented",
                }).Append('\n');
            }

            if ((i + 1) % 500 == 0 || i == count - 1) Flush(store, csv, actor);
        }

        Flush(store, csv, actor);
    }

    private static void Flush(IRegister store, StringBuilder csv, string actor)
    {
        if (csv.Length == 0) return;
        var text = "component_code,inspection_date,kind,method,measured_size_mm,remaining_wall_mm,location,note\n" + csv;
        csv.Clear();
        var result = store.ImportFindingsCsv(new StringReader(text), "invented-findings.csv", actor, "invented portfolio");
        if (!result.Succeeded) throw Registers.Problems("invented findings", result.Problems);
    }

    private static string F(double v) => v.ToString("0.00", CultureInfo.InvariantCulture);

    private static string Model(double rate, double initiation, double pressure) => string.Create(CultureInfo.InvariantCulture, $$"""
        {
          "schemaVersion": 1,
          "name": "Invented buried line, external corrosion (burst)",
          "description": "Invented for benchmarks: linear wall loss after a random coating life; burst capacity. Not data of any real asset.",
          "serviceLife_years": 40,
          "mechanism": { "type": "corrosion", "growthLaw": "linear", "failureMode": "burstDnvRpF101", "lengthGrows": true, "capacityFactor": 1.0 },
          "inputs": {
            "wallThickness_mm": { "family": "Normal", "mean": 12.7, "sd": 0.25 },
            "diameter_mm": 323.9,
            "initiationTime_years": { "family": "Lognormal", "mean": {{initiation:0.00}}, "cov": 0.3 },
            "rate_mmPerYear": { "family": "Lognormal", "mean": {{rate:0.000}}, "cov": 0.5 },
            "defectLength_mm": { "family": "Lognormal", "mean": 60, "cov": 0.4 },
            "lengthRate_mmPerYear": { "family": "Lognormal", "mean": 3, "cov": 0.5 },
            "tensileStrength_MPa": { "family": "Lognormal", "mean": 560, "cov": 0.04 },
            "modelFactor": { "family": "Lognormal", "mean": 1.0, "cov": 0.1 },
            "pressure_MPa": { "family": "Normal", "mean": {{pressure:0.00}}, "sd": 0.9 }
          }
        }
        """);
}
