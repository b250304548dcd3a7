using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting;

namespace InspectionUpdate.Tests.Reporting;

/// <summary>
/// Report inputs for the tests. The profile curves are smooth made-up shapes for drawing, not results of any
/// reliability computation: the reports draw what they are given and compute nothing.
/// </summary>
internal static class SampleReports
{
    public static readonly DateOnly InService = new(2012, 6, 1);

    public static ReliabilityProfile Profile(string label, double scale, bool oneNotConverged = false, int years = 30)
    {
        var points = new List<ProfilePoint>();
        var previous = 0.0;
        for (var t = 1; t <= years; t++)
        {
            // Pf(t) = scale·t⁴ capped below 1: an increasing test curve.
            var pf = Math.Min(0.5, scale * Math.Pow(t, 4));
            points.Add(new ProfilePoint
            {
                TimeYears = t,
                Beta = -InspectionUpdate.Probability.StandardNormal.InverseCdf(pf),
                CumulativePf = pf,
                IntervalPf = pf - previous,
                Hazard = (pf - previous) / (1 - previous),
                Route = t == 25 ? ComputationRoute.SubsetSimulation : ComputationRoute.FirstOrder,
                Converged = !(oneNotConverged && t == 27),
                CoefficientOfVariation = t == 25 ? 0.08 : null,
                Evaluations = 40,
                Alpha = [0.8, -0.6],
            });
            previous = pf;
        }

        return new ReliabilityProfile { Label = label, VariableNames = ["rate_mmPerYear", "wall_mm"], Points = points };
    }

    public static ComponentReportData Component(bool withPlan = true) => new()
    {
        ComponentId = "CX-101",
        ComponentName = "Test spool",
        Site = "Test site",
        Model = "linear corrosion v1",
        InServiceDate = InService,
        Inputs =
        [
            new ReportInput("rate_mmPerYear", "lognormal, mean 0.2, CoV 0.3", "mm/year", "test value"),
            new ReportInput("wall_mm", "normal, mean 12, sd 0.3", "mm", "test value"),
        ],
        Findings =
        [
            new ReportFinding("F-1 r1", new DateOnly(2018, 5, 2), 5.92, "sized indication", "UT", 1.9, 1, "tester", null, true),
            new ReportFinding("F-1 r2", new DateOnly(2018, 5, 2), 5.92, "sized indication", "UT", 2.1, 2, "tester", "transcription error", false),
            new ReportFinding("F-2 r1", new DateOnly(2021, 5, 2), 8.92, "no indication", "MFL", null, 1, "tester", null, false),
        ],
        Repairs = [new ReportRepair(new DateOnly(2022, 1, 10), 9.61, "sleeve fitted")],
        Prior = Profile("prior", 2e-9),
        Updated = Profile("updated with 2 findings", 5e-10, oneNotConverged: true),
        Importance = new ReportImportance(20, ["rate_mmPerYear", "wall_mm"], [0.64, 0.36], "updated, 20 years"),
        PodCurves = [new ReportPodCurve("UT", [0, 1, 2, 3, 4, 5], [0, 0.3, 0.7, 0.9, 0.96, 0.99]), new ReportPodCurve("MFL", [0, 1, 2, 3, 4, 5], [0, 0.1, 0.4, 0.7, 0.85, 0.93])],
        Posteriors = [new ReportPosterior("rate_mmPerYear", Samples(0.2, 0.06, 500, 1), Samples(0.15, 0.03, 500, 2), "test samples")],
        PosteriorSummaries = [new ReportPosteriorSummary("rate_mmPerYear", 0.2, 0.06, 0.15, 0.03, 0.1, 0.2)],
        PosteriorRoute = "test route",
        Plan = withPlan
            ? new ReportPlan(1e-4, "test target", [new ReportPlannedInspection(14.2, new DateOnly(2026, 8, 12), "UT", "annual Pf reaches the target")], "next inspection due 2026-08-12", ["each planned inspection finds nothing"])
            : null,
        Assumptions = ["test assumption"],
        NotAvailable = ["test: posterior from simulation"],
        Provenance = new ReportProvenance("0.1.0-test", "sha256:abc123", "test.register", new DateTimeOffset(2025, 1, 1, 0, 0, 0, TimeSpan.Zero), new DateOnly(2024, 12, 31)),
    };

    public static PortfolioReportData Portfolio() => new()
    {
        Title = "Test register",
        TargetAnnualPf = 1e-4,
        Rows =
        [
            new PortfolioRow("CX-101", "Test spool", "Test site", 3e-5, "first order, converged", 4.2, new DateOnly(2026, 8, 12), "due 2026-08-12", "CX-101.html"),
            new PortfolioRow("CX-102", "Test weld", "Test site", 2e-4, "first order, converged", 0, new DateOnly(2025, 1, 1), "overdue", "CX-102.html"),
            new PortfolioRow("CX-103", "Not assessed", "Other site", null, "-", null, null, "no model", null),
        ],
        Assumptions = ["test assumption"],
        Provenance = new ReportProvenance("0.1.0-test", "sha256:abc123", "test.register", new DateTimeOffset(2025, 1, 1, 0, 0, 0, TimeSpan.Zero), new DateOnly(2024, 12, 31)),
    };

    // Deterministic pseudo-normal samples (sum of 12 uniforms) for the histogram test; seeded.
    private static double[] Samples(double mean, double sd, int n, int seed)
    {
        var rng = new Random(seed);
        return Enumerable.Range(0, n).Select(_ => mean + sd * (Enumerable.Range(0, 12).Sum(_ => rng.NextDouble()) - 6)).ToArray();
    }
}
