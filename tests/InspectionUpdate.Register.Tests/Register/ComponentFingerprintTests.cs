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
