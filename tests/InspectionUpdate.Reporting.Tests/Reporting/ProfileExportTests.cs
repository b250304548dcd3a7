using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Reporting.Export;

namespace InspectionUpdate.Tests.Reporting;

public sealed class ProfileExportTests
{
    [Fact]
    public void Csv_has_the_documented_header_and_one_row_per_step_with_exact_values()
    {
        var data = SampleReports.Component();
        using var w = new StringWriter();
        ProfileExport.WriteCsv(w, data.ComponentId, [data.Prior!, data.Updated!]);
        var lines = w.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(string.Join(',', ProfileExport.CsvColumns), lines[0]);
        Assert.Equal(1 + data.Prior!.Points.Count + data.Updated!.Points.Count, lines.Length);
        var first = lines[1].Split(',');
        // Round-trip ("R") formatting: the parsed value equals the profile's double exactly.
        Assert.Equal(data.Prior.Points[0].CumulativePf, double.Parse(first[4], CultureInfo.InvariantCulture));
        Assert.Equal("first_order", first[7]);
        Assert.Contains(lines, l => l.Contains(",subset_simulation,", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains(",false,", StringComparison.Ordinal));
    }

    [Fact]
    public void Plan_csv_lists_the_schedule()
    {
        var data = SampleReports.Component();
        using var w = new StringWriter();
        ProfileExport.WritePlanCsv(w, data.ComponentId, data.Plan!);
        var lines = w.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(2, lines.Length);
        Assert.StartsWith("CX-101,1,2026-08-12,", lines[1], StringComparison.Ordinal);
    }

    [Fact]
    public void Json_export_uses_the_documented_field_names()
    {
        using var doc = JsonDocument.Parse(ProfileExport.ComponentJson(SampleReports.Component()));
        var root = doc.RootElement;
        Assert.Equal("inspection-update/component-export/1", root.GetProperty("format").GetString());
        Assert.Equal("CX-101", root.GetProperty("component_id").GetString());
        Assert.Equal("sha256:abc123", root.GetProperty("register_fingerprint").GetString());
        var point = root.GetProperty("updated").GetProperty("points")[26];
        Assert.False(point.GetProperty("converged").GetBoolean());
        Assert.Equal("first_order", point.GetProperty("route").GetString());
        Assert.True(point.TryGetProperty("annual_pf", out _));
        Assert.Equal(1e-4, root.GetProperty("plan").GetProperty("target_annual_pf").GetDouble());
        Assert.Contains("judgement", root.GetProperty("caution").GetString(), StringComparison.Ordinal);
    }
}
