using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Register;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Register;

public abstract class EvidenceTests
{
    protected abstract RegisterStoreKind Kind { get; }
    [SkippableFact]
    [Reference("DESIGN.md §3 inspection events; ServiceTime: years = days since install / 365.2425")]
    public void Evidence_maps_each_kind_of_finding_to_the_core_outcome_with_service_time()
    {
        using var r = new TestRegister(Kind);
        var s = r.Store;
        var none = s.AddFinding(new(TestRegister.Component, new DateOnly(2014, 6, 1), FindingKind.NoIndication, TestRegister.Mpi), "A", "IR-1").Require();
        s.AddFinding(new(TestRegister.Component, new DateOnly(2016, 6, 1), FindingKind.IndicationNotSized, TestRegister.Mpi), "A", "IR-2").Require();
        s.AddFinding(new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.5), "A", "IR-3").Require();
        s.AddFinding(new(TestRegister.Component, new DateOnly(2020, 6, 1), FindingKind.WallThickness, TestRegister.Ut, RemainingWallMm: 10.2), "A", "IR-4").Require();
        s.AddFinding(new(TestRegister.Component, new DateOnly(2022, 6, 1), FindingKind.InService, null), "A", "walk-down").Require();
        s.AddRepair(new(TestRegister.Component, new DateOnly(2023, 6, 1), "weld overlay",
            """{"inputs":{"d0_mm":{"family":"lognormal","mean":0.2,"sd":0.1}}}"""), "B", "WO-77").Require();

        var evidence = s.EvidenceFor(r.ComponentId, r.Clock.UtcNow);

        Assert.Collection(evidence,
            e => Assert.Equal(TestRegister.Mpi, Assert.IsType<NoIndication>(e).Method.Name),
            e => Assert.IsType<IndicationNotSized>(e),
            e => Assert.Equal(2.5, Assert.IsType<SizedIndication>(e).MeasuredSizeMm),
            e => Assert.Equal(TestRegister.WallMm - 10.2, Assert.IsType<SizedIndication>(e).MeasuredSizeMm, 1e-12),
            e => Assert.IsType<SurvivedInService>(e),
            e =>
            {
                var repair = Assert.IsType<Repair>(e);
                var d0 = Assert.IsType<LognormalVariable>(repair.PostRepairInputs["d0_mm"]);
                Assert.Equal(0.2, d0.Mean, 1e-12);
            });
        Assert.Equal((new DateOnly(2014, 6, 1).DayNumber - TestRegister.InstallDate.DayNumber) / 365.2425, evidence[0].TimeYears, 1e-12);
        Assert.Equal(ServiceTime.YearsSince(TestRegister.InstallDate, new DateOnly(2023, 6, 1)), evidence[5].TimeYears, 1e-12);
        Assert.Equal($"finding {none.FindingId} rev 1", evidence[0].Reference);
    }

    [SkippableFact]
    [Reference("Round trip: the stored PoD and sizing parameters rebuild the same curve (closed form evaluated both ways)")]
    public void Methods_are_rebuilt_with_their_pod_curve_and_sizing_error()
    {
        using var r = new TestRegister(Kind);
        r.Store.AddFinding(new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.5), "A", "IR-3").Require();
        var method = Assert.IsType<SizedIndication>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, r.Clock.UtcNow))).Method;
        var expected = LogLogisticPod.FromMedianAndShape(1.16, 0.9, lowerLimitMm: 0.2);
        foreach (var a in new[] { 0.1, 0.2, 0.5, 1.16, 3.0 })
        {
            Assert.Equal(expected.Evaluate(a), method.Detection.Evaluate(a), 1e-14);
        }

        Assert.Equal(new SizingError(SizingErrorKind.AdditiveNormal, 0.1, 0.5), method.Sizing);
        var mpi = r.Store.FindMethod(TestRegister.Mpi)!.ToInspectionMethod();
        Assert.Equal(0.95 * (1 - Math.Exp(-1.0)), mpi.Detection.Evaluate(0.95), 1e-14);
    }

    [SkippableFact]
    [Reference("Design rule: reads as known on a date ignore revisions recorded after it")]
    public void Evidence_as_of_a_date_uses_the_revision_known_then()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.5), "A", "IR-3").Require();
        var onFirstDay = DateOnly.FromDateTime(r.Clock.UtcNow.UtcDateTime);
        r.Clock.Advance(TimeSpan.FromDays(2));
        r.Store.ReviseFinding(f.FindingId, new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 3.5), "B", "re-read").Require();

        var then = Assert.IsType<SizedIndication>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, onFirstDay)));
        var now = Assert.IsType<SizedIndication>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, r.Clock.UtcNow)));
        Assert.Equal(2.5, then.MeasuredSizeMm);
        Assert.Equal($"finding {f.FindingId} rev 1", then.Reference);
        Assert.Equal(3.5, now.MeasuredSizeMm);
        Assert.Equal($"finding {f.FindingId} rev 2", now.Reference);
        Assert.Throws<ArgumentException>("componentId", () => r.Store.EvidenceFor(r.ComponentId, new DateOnly(2020, 1, 1)));
    }

    [SkippableFact]
    [Reference("Issue 5: sister components sharing an uncertain parameter; the group is the components with the same parameter_group")]
    public void Group_evidence_collects_the_findings_of_sister_components()
    {
        using var r = new TestRegister(Kind);
        r.Store.AddFinding(new(TestRegister.Component, new DateOnly(2018, 6, 1), FindingKind.WallThickness, TestRegister.Ut, RemainingWallMm: 11.0), "A", "IR-5").Require();
        r.Store.AddFinding(new("P-101-W4", new DateOnly(2019, 6, 1), FindingKind.WallThickness, TestRegister.Ut, RemainingWallMm: 10.5), "A", "IR-6").Require();
        var group = r.Store.EvidenceForGroup("line-101-water", r.Clock.UtcNow);
        Assert.Equal(2, group.Count);
        Assert.All(group.Values, e => Assert.IsType<SizedIndication>(Assert.Single(e)));
        Assert.Equal(["P-101-W3", "P-101-W4"], r.Store.ComponentsInGroup("line-101-water").Select(c => c.Code));
    }
}

/// <summary><see cref="EvidenceTests"/> on a SQLite file.</summary>
public sealed class EvidenceTestsOnSqlite : EvidenceTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="EvidenceTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class EvidenceTestsOnPostgres : EvidenceTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}
