using System.Globalization;
using System.Text.Json;
using System.Text.Json.Serialization;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Reporting.Export;

/// <summary>
/// Machine-readable exports of profiles and plans. Field names are stable and documented in docs/formats.md:
/// snake_case, units in the names, probabilities as plain numbers, dates as ISO 8601.
/// </summary>
public static class ProfileExport
{
    /// <summary>Header of the profile CSV, in column order.</summary>
    public static IReadOnlyList<string> CsvColumns { get; } =
    [
        "component_id", "profile", "time_years", "beta", "cumulative_pf", "annual_pf", "hazard", "route", "converged",
        "cov", "evaluations", "note",
    ];

    /// <summary>Options used for every JSON output of the tool (exports and the CLI's --json).</summary>
    public static JsonSerializerOptions JsonOptions { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower), new UtcTimeConverter() },
    };

    /// <summary>Writes the profiles of a component as CSV, one row per time step (invariant culture, RFC 4180 quoting).</summary>
    public static void WriteCsv(TextWriter writer, string componentId, IEnumerable<ReliabilityProfile> profiles)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(profiles);
        writer.Write(string.Join(',', CsvColumns));
        writer.Write('\n');
        foreach (var profile in profiles)
        {
            foreach (var p in profile.Points)
            {
                string[] cells =
                [
                    componentId, profile.Label, R(p.TimeYears), R(p.Beta), R(p.CumulativePf), R(p.IntervalPf), R(p.Hazard),
                    RouteKey(p.Route), p.Converged ? "true" : "false", p.CoefficientOfVariation is { } c ? R(c) : string.Empty,
                    p.Evaluations.ToString(CultureInfo.InvariantCulture), p.Note ?? string.Empty,
                ];
                writer.Write(string.Join(',', cells.Select(Quote)));
                writer.Write('\n');
            }
        }
    }

    /// <summary>Writes the plan's schedule as CSV.</summary>
    public static void WritePlanCsv(TextWriter writer, string componentId, ReportPlan plan)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(plan);
        writer.Write("component_id,sequence,date,time_years,method,basis,target_annual_pf,after_detection\n");
        for (var i = 0; i < plan.Schedule.Count; i++)
        {
            var s = plan.Schedule[i];
            string[] cells =
            [
                componentId, (i + 1).ToString(CultureInfo.InvariantCulture), s.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                R(s.TimeYears), s.Method, s.Basis, R(plan.TargetAnnualPf), plan.AfterDetection,
            ];
            writer.Write(string.Join(',', cells.Select(Quote)));
            writer.Write('\n');
        }
    }

    /// <summary>Header of the register CSV of a report run, in column order.</summary>
    public static IReadOnlyList<string> RegisterCsvColumns { get; } =
    [
        "component_id", "component_name", "site", "current_annual_pf", "current_year_ending", "route", "years_to_target", "next_due", "all_converged", "flags", "status", "after_detection",
    ];

    /// <summary>Writes the register rows of a report run as CSV (one row per component, marks as <c>;</c>-separated keys).</summary>
    public static void WriteRegisterCsv(TextWriter writer, IEnumerable<PortfolioRow> rows)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(rows);
        writer.Write(string.Join(',', RegisterCsvColumns));
        writer.Write('\n');
        foreach (var r in rows)
        {
            string[] cells =
            [
                r.ComponentId, r.ComponentName, r.Site, r.CurrentAnnualPf is { } p ? R(p) : string.Empty,
                r.CurrentYearEnding?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? string.Empty, r.Route,
                r.YearsToTarget is { } y ? R(y) : string.Empty, r.NextDue?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) ?? string.Empty,
                r.AllConverged ? "true" : "false", ReportMarks.CsvCell(r.FlagSet), r.Status, r.AfterDetection,
            ];
            writer.Write(string.Join(',', cells.Select(Quote)));
            writer.Write('\n');
        }
    }

    /// <summary>The JSON document of a component: profiles and plan (see docs/formats.md, "component export").</summary>
    public static string ComponentJson(ComponentReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var doc = new ComponentExport(
            "inspection-update/component-export/1",
            data.ComponentId, data.ComponentName, data.Site, data.Model, data.InServiceDate,
            data.Provenance.AssessedAsOf, data.Provenance.ToolVersion, data.Provenance.RegisterFingerprint,
            data.Prior is null ? null : ToExport(data.Prior),
            data.Updated is null ? null : ToExport(data.Updated),
            data.Plan is null ? null : new PlanExport(data.Plan.TargetAnnualPf, data.Plan.TargetSource, data.Plan.Status,
                data.Plan.Schedule.Select(s => new PlannedExport(s.Date, s.TimeYears, s.Method, s.Basis)).ToArray(), data.Plan.Notes)
            {
                AfterDetection = data.Plan.AfterDetection,
                AfterDetectionNote = data.Plan.BranchNote,
            },
            data.NotAvailable, Cautions.Line)
        {
            Flags = ReportMarks.Keys(data.Flags),
            DocumentControl = data.DocumentControl,
        };
        return JsonSerializer.Serialize(doc, JsonOptions);
    }

    /// <summary>A profile in the export's field names.</summary>
    public static ProfileExportDocument ToExport(ReliabilityProfile profile)
    {
        ArgumentNullException.ThrowIfNull(profile);
        return new ProfileExportDocument(profile.Label, profile.AllConverged, profile.VariableNames,
            profile.Points.Select(p => new PointExport(p.TimeYears, Finite(p.Beta), p.CumulativePf, p.IntervalPf, p.Hazard,
                RouteKey(p.Route), p.Converged, p.CoefficientOfVariation, p.Evaluations, p.Alpha, p.Note)
            {
                AnnualPfCov = p.IntervalCoefficientOfVariation,
                UpperBound = p.UpperBound,
            }).ToArray());
    }

    /// <summary>Stable key of a route in exports: first_order, second_order, monte_carlo, importance_sampling, subset_simulation, exact.</summary>
    public static string RouteKey(ComputationRoute route) => JsonNamingPolicy.SnakeCaseLower.ConvertName(route.ToString());

    // ±∞ β (Pf 0 or 1) is written as ±99 so that strict JSON parsers accept the document; the Pf fields carry the exact value.
    private static double Finite(double v) => double.IsFinite(v) ? v : Math.Sign(v) * 99.0;

    private static string R(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    private static string Quote(string s) =>
        s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;

    private sealed record ComponentExport(string Format, string ComponentId, string ComponentName, string Site, string Model,
        DateOnly InServiceDate, DateOnly AssessedAsOf, string ToolVersion, string RegisterFingerprint, ProfileExportDocument? Prior,
        ProfileExportDocument? Updated, PlanExport? Plan, IReadOnlyList<string> NotAvailable, string Caution)
    {
        public IReadOnlyList<string> Flags { get; init; } = [];

        public ReportDocumentControl? DocumentControl { get; init; }
    }

    private sealed record PlanExport(double TargetAnnualPf, string TargetSource, string Status, IReadOnlyList<PlannedExport> Schedule, IReadOnlyList<string> Notes)
    {
        public string AfterDetection { get; init; } = "monitor";

        public string? AfterDetectionNote { get; init; }
    }

    private sealed record PlannedExport(DateOnly Date, double TimeYears, string Method, string Basis);
}

/// <summary>A profile as exported: see docs/formats.md.</summary>
/// <param name="Label">Profile label.</param>
/// <param name="AllConverged">True when every step converged.</param>
/// <param name="VariableNames">Names matching each point's alpha.</param>
/// <param name="Points">Steps.</param>
public sealed record ProfileExportDocument(string Label, bool AllConverged, IReadOnlyList<string> VariableNames, IReadOnlyList<PointExport> Points);

/// <summary>One exported step.</summary>
/// <param name="TimeYears">Years since entry into service.</param>
/// <param name="Beta">β = −Φ⁻¹(Pf), ±99 for Pf of 0 or 1.</param>
/// <param name="CumulativePf">Pf(t).</param>
/// <param name="AnnualPf">ΔPf over the step.</param>
/// <param name="Hazard">ΔPf / (1 − Pf(t_prev)).</param>
/// <param name="Route">Route key.</param>
/// <param name="Converged">Convergence flag.</param>
/// <param name="Cov">Coefficient of variation when simulated.</param>
/// <param name="Evaluations">Limit-state evaluations.</param>
/// <param name="Alpha">Direction cosines (first order).</param>
/// <param name="Note">Note.</param>
public sealed record PointExport(double TimeYears, double Beta, double CumulativePf, double AnnualPf, double Hazard, string Route,
    bool Converged, double? Cov, int Evaluations, IReadOnlyList<double>? Alpha, string? Note)
{
    /// <summary>CoV of the annual Pf where the sample set estimated it directly (not as a difference); null otherwise.</summary>
    public double? AnnualPfCov { get; init; }

    /// <summary>Set where the cumulative Pf is only bounded from above (with three standard errors); null otherwise.</summary>
    public double? UpperBound { get; init; }
}
