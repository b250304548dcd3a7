using InspectionUpdate.Inspection;
using InspectionUpdate.Register;
using InspectionUpdate.Updating;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

public class CorrectionTests
{
    private static NewMethod UtWithSizingSd(double sdMm) => new(TestRegister.Ut, "Phased-array UT (invented qualification)",
        new PodSpec(PodForms.LogLogistic, Math.Log(1.16), 1 / 0.9, null, LowerLimitMm: 0.2), new SizingError(SizingErrorKind.AdditiveNormal, 0.1, sdMm));

    [Fact]
    [Reference("Design rule (DESIGN.md §5): a correction is a new revision with who, when and why; reads as known on a date see the revision of then")]
    public void A_site_correction_keeps_the_earlier_name_and_is_audited()
    {
        using var r = new TestRegister();
        var before = r.Clock.UtcNow;
        r.Clock.Advance(TimeSpan.FromDays(1));
        var corrected = r.Store.CorrectSite("NORTH", "North tank farm and jetty (invented)", "engineer B", "name from the asset list").Require();

        Assert.Equal(2, corrected.Revision);
        Assert.Equal("North tank farm (invented)", Assert.Single(r.Store.Sites(before)).Name);
        Assert.Equal("North tank farm and jetty (invented)", Assert.Single(r.Store.Sites()).Name);
        var history = r.Store.SiteHistory("NORTH");
        Assert.Equal([1, 2], history.Select(s => s.Revision));
        Assert.Equal(("engineer B", "name from the asset list"), (history[1].Recorded.RecordedBy, history[1].Recorded.Reason));
        var audit = Assert.Single(r.Store.AuditTrail(entity: "site"), a => a.Action == "revise");
        Assert.Contains("name from the asset list", audit.DetailJson, StringComparison.Ordinal);
        Assert.True(r.Store.Check().IsHealthy, string.Join("; ", r.Store.Check().InvariantViolations));
    }

    [Fact]
    [Reference("Validation at the public boundary (STYLE.md): every problem listed, nothing written")]
    public void Bad_site_and_method_corrections_are_refused_and_write_nothing()
    {
        using var r = new TestRegister();
        var fingerprint = r.Store.Fingerprint(DateTimeOffset.MaxValue);

        var site = r.Store.CorrectSite("SOUTH", " ", "", "");
        Assert.Equal(["name", "reason", "recorded_by", "site_code"], site.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
        var same = r.Store.CorrectSite("NORTH", "North tank farm (invented)", "B", "no change");
        Assert.Equal("name", Assert.Single(same.Problems).Field);

        var method = r.Store.CorrectMethod(UtWithSizingSd(-1) with { Name = "EC-NONE" }, "B", "");
        Assert.Equal(["name", "reason", "sizing_sd_mm"], method.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
        var unchanged = r.Store.CorrectMethod(UtWithSizingSd(0.5), "B", "no change");
        Assert.Contains("nothing to correct", Assert.Single(unchanged.Problems).Message, StringComparison.Ordinal);

        Assert.Equal(fingerprint, r.Store.Fingerprint(DateTimeOffset.MaxValue));
        Assert.Equal(0, r.Count("site_revision"));
        Assert.Equal(0, r.Count("inspection_method_revision"));
    }

    [Fact]
    [Reference("Design rule (DESIGN.md §5): findings keep their meaning; an earlier result is reproduced as known on its date")]
    public void Evidence_reads_a_method_with_the_parameters_known_on_the_date_asked_for()
    {
        using var r = new TestRegister();
        r.Store.AddFinding(new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.5), "A", "IR-3").Require();
        var before = r.Clock.UtcNow;
        var fingerprintBefore = r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue);
        r.Clock.Advance(TimeSpan.FromDays(3));
        var corrected = r.Store.CorrectMethod(UtWithSizingSd(0.8), "engineer B", "sizing sd from the 2026 qualification").Require();

        Assert.Equal(2, corrected.Revision);
        Assert.Equal(0.5, Assert.IsType<SizedIndication>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, before))).Method.Sizing.StandardDeviation);
        Assert.Equal(0.8, Assert.IsType<SizedIndication>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, r.Clock.UtcNow))).Method.Sizing.StandardDeviation);
        Assert.Equal(0.5, r.Store.Methods(before).Single(m => m.Name == TestRegister.Ut).Sizing.StandardDeviation);
        Assert.Equal(0.8, r.Store.FindMethod(TestRegister.Ut)!.Sizing.StandardDeviation);
        Assert.Equal([0.5, 0.8], r.Store.MethodHistory(TestRegister.Ut).Select(m => m.Sizing.StandardDeviation));
        // What the component's numbers rest on changed, so stored results for it are recomputed; as known before, nothing changed.
        Assert.NotEqual(fingerprintBefore, r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue));
        Assert.Equal(fingerprintBefore, r.Store.ComponentFingerprint(r.ComponentId, before));
        Assert.True(r.Store.Check().IsHealthy, string.Join("; ", r.Store.Check().InvariantViolations));
    }

    [Theory]
    [InlineData("site_revision")]
    [InlineData("inspection_method_revision")]
    [Reference("Design rule (DESIGN.md §5): nothing is deleted or overwritten, enforced by triggers as well as by the API")]
    public void Corrections_cannot_be_updated_or_deleted_even_with_raw_sql(string table)
    {
        using var r = new TestRegister();
        r.Store.CorrectSite("NORTH", "North tank farm and jetty (invented)", "B", "asset list").Require();
        r.Store.CorrectMethod(UtWithSizingSd(0.8), "B", "qualification").Require();
        using var connection = new SqliteConnection($"Data Source={r.Path};Pooling=False");
        connection.Open();
        foreach (var sql in new[] { $"UPDATE {table} SET reason = 'x'", $"DELETE FROM {table}" })
        {
            using var command = connection.CreateCommand();
            command.CommandText = sql; // table names are test constants
            var e = Assert.Throws<SqliteException>(() => command.ExecuteNonQuery());
            Assert.Contains("append-only", e.Message, StringComparison.Ordinal);
        }

        Assert.Equal(1, r.Count(table));
    }
}
