using InspectionUpdate.Inspection;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

/// <summary>The per-component fingerprint that keys stored results.</summary>
public abstract class ComponentFingerprintTests
{
    protected abstract RegisterStoreKind Kind { get; }
    private const string Sister = "P-101-W4";

    private static NewFinding Sized(string component, double sizeMm) =>
        new(component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: sizeMm);

    [SkippableFact]
    [Reference("Design rule: stored results are keyed by what they depend on (the component's own findings, repairs and model), so a rerun recomputes only what changed")]
    public void Changes_with_the_components_own_findings_and_model_but_not_with_another_components()
    {
        using var r = new TestRegister(Kind);
        var sisterId = r.Store.FindComponent(Sister)!.Id;
        var own0 = r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue);
        var sister0 = r.Store.ComponentFingerprint(sisterId, DateTimeOffset.MaxValue);
        Assert.Matches("^[0-9a-f]{64}$", own0);
        Assert.NotEqual(own0, sister0);

        r.Clock.Advance(TimeSpan.FromHours(1));
        var f = r.Store.AddFinding(Sized(TestRegister.Component, 2.0), "inspector A", "report IR-1").Require();
        var own1 = r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue);
        Assert.NotEqual(own0, own1);
        Assert.Equal(sister0, r.Store.ComponentFingerprint(sisterId, DateTimeOffset.MaxValue));

        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.ReviseFinding(f.FindingId, Sized(TestRegister.Component, 2.2), "engineer B", "re-read").Require();
        var own2 = r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue);
        Assert.NotEqual(own1, own2);

        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.ReviseModel(TestRegister.Component, TestRegister.ModelJson.Replace("\"mean\":0.1", "\"mean\":0.2", StringComparison.Ordinal), "corrosion-2", "engineer B", "new rate data").Require();
        Assert.NotEqual(own2, r.Store.ComponentFingerprint(r.ComponentId, DateTimeOffset.MaxValue));
        Assert.Equal(sister0, r.Store.ComponentFingerprint(sisterId, DateTimeOffset.MaxValue));
    }

    [SkippableFact]
    [Reference("Design rule: any assessment can be reproduced from the register as of a date")]
    public void As_of_a_date_it_ignores_later_writes()
    {
        using var r = new TestRegister(Kind);
        var before = r.Clock.UtcNow;
        var fingerprint = r.Store.ComponentFingerprint(r.ComponentId, before);
        r.Clock.Advance(TimeSpan.FromDays(1));
        r.Store.AddFinding(Sized(TestRegister.Component, 2.0), "inspector A", "report IR-1").Require();
        Assert.Equal(fingerprint, r.Store.ComponentFingerprint(r.ComponentId, before));
    }

    [SkippableFact]
    [Reference("Independent computation in the test: the per-component fingerprint (one query per table for one component) and the model revision read with the component")]
    public void The_bulk_read_gives_every_component_what_one_read_per_component_gives()
    {
        using var r = new TestRegister(Kind);
        var s = r.Store;
        var instants = new List<DateTimeOffset> { r.Clock.UtcNow };
        void Step()
        {
            r.Clock.Advance(TimeSpan.FromHours(1));
            instants.Add(r.Clock.UtcNow);
        }

        // A history touching every table the fingerprint reads, on both seeded components and one added later.
        var f1 = s.AddFinding(new(TestRegister.Component, new DateOnly(2014, 6, 1), FindingKind.NoIndication, TestRegister.Mpi, Note: "tab\tand\nline"), "A", "IR-1").Require();
        s.AddFinding(new(Sister, new DateOnly(2016, 6, 1), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 1.5), "A", "IR-2").Require();
        s.AddFinding(new(TestRegister.Component, new DateOnly(2017, 6, 1), FindingKind.InService, null), "A", "walk-down").Require();
        Step();
        s.ReviseFinding(f1.FindingId, new(TestRegister.Component, new DateOnly(2014, 6, 1), FindingKind.NoIndication, TestRegister.Ut), "B", "method re-read").Require();
        s.AddRepair(new(Sister, new DateOnly(2023, 6, 1), "weld overlay", """{"inputs":{"d0_mm":{"family":"lognormal","mean":0.2,"sd":0.1}}}"""), "B", "WO-77").Require();
        Step();
        s.CorrectMethod(new NewMethod(TestRegister.Ut, "Phased-array UT (invented qualification)",
            new PodSpec(PodForms.LogLogistic, Math.Log(1.16), 1 / 0.9, null, LowerLimitMm: 0.2), new SizingError(SizingErrorKind.AdditiveNormal, 0.1, 0.8)), "B", "new qualification").Require();
        s.SetConsequenceClass(3, "a leak reaches the plant drains (invented meaning)", "jcss-normal-moderate", "owner", "owner's scale").Require();
        s.SetComponentConsequence(TestRegister.Component, 3, 1.0e6, "owner", "survey").Require();
        Step();
        s.WithdrawFinding(f1.FindingId, "B", "wrong weld").Require();
        s.ReviseModel(Sister, TestRegister.ModelJson.Replace("\"mean\":0.1", "\"mean\":0.2", StringComparison.Ordinal), "corrosion-2", "B", "new rate data").Require();
        s.SetConsequenceClass(3, "a leak reaches open water (invented meaning)", "jcss-normal-large", "owner", "revised scale").Require();
        s.AddComponent(new NewComponent("NORTH", "P-101-W5", "Weld 5 of line 101", TestRegister.InstallDate, null, TestRegister.ModelJson, "corrosion-1"), "tester").Require();
        Step();
        instants.Add(DateTimeOffset.MaxValue);

        foreach (var at in instants)
        {
            var bulk = s.ComponentFingerprints(at);
            var expected = s.Components(at);
            Assert.Equal(expected.Select(c => c.Id).Order(), bulk.Keys.Order());
            foreach (var c in expected)
            {
                Assert.Equal(s.ComponentFingerprint(c.Id, at), bulk[c.Id].Fingerprint);
                Assert.Equal(c.Model.Revision, bulk[c.Id].ModelRevision);
            }
        }

        // Writes at each of the first four instants changed both seeded components' fingerprints (the comparison is not vacuous).
        foreach (var id in new[] { r.ComponentId, s.FindComponent(Sister)!.Id })
        {
            Assert.Equal(4, instants.Take(4).Select(at => s.ComponentFingerprints(at)[id].Fingerprint).Distinct().Count());
        }
    }
}

/// <summary><see cref="ComponentFingerprintTests"/> on a SQLite file.</summary>
public sealed class ComponentFingerprintTestsOnSqlite : ComponentFingerprintTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="ComponentFingerprintTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class ComponentFingerprintTestsOnPostgres : ComponentFingerprintTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}
