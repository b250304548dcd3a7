using System.Data.Common;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

public abstract class RevisionTests
{
    protected abstract RegisterStoreKind Kind { get; }
    private static NewFinding Sized(double sizeMm, string location = "6 o'clock") =>
        new(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: sizeMm, Location: location);

    public static TheoryData<string> AppendOnlyTables() => new()
    {
        "site", "component", "component_model_revision", "inspection_method", "finding", "finding_revision", "repair", "repair_revision", "audit_log", "import_batch",
    };

    [SkippableFact]
    [Reference("Independent computation in the test: each finding's history (FindingHistory) cut at the instant, for every finding of the component")]
    public void A_components_finding_revisions_are_each_findings_history_as_known_then()
    {
        using var r = new TestRegister(Kind);
        var instants = new List<DateTimeOffset> { r.Clock.UtcNow.AddHours(-1) };
        var first = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        r.Store.AddFinding(new(TestRegister.Component, new DateOnly(2018, 5, 4), FindingKind.NoIndication, TestRegister.Mpi), "inspector A", "report IR-0").Require();
        r.Store.AddFinding(new("P-101-W4", new DateOnly(2018, 5, 4), FindingKind.NoIndication, TestRegister.Mpi), "inspector A", "other weld").Require();
        instants.Add(r.Clock.UtcNow);
        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.ReviseFinding(first.FindingId, Sized(2.4), "engineer B", "re-read").Require();
        instants.Add(r.Clock.UtcNow);
        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.WithdrawFinding(first.FindingId, "engineer B", "wrong weld").Require();
        instants.Add(r.Clock.UtcNow);

        foreach (var at in instants)
        {
            var expected = r.Store.Findings(r.ComponentId, at, includeWithdrawn: true)
                .SelectMany(f => r.Store.FindingHistory(f.FindingId).Where(x => x.Recorded.RecordedUtc <= at))
                .OrderBy(x => x.FindingId).ThenBy(x => x.Revision).ToList();
            Assert.Equal(expected, r.Store.FindingRevisions(r.ComponentId, at));
        }

        Assert.Equal([1, 1], r.Store.FindingRevisions(r.ComponentId, instants[1]).Select(x => x.Revision));
        Assert.Equal([1, 2, 3, 1], r.Store.FindingRevisions(r.ComponentId, instants[3]).Select(x => x.Revision));
    }

    [SkippableTheory]
    [MemberData(nameof(AppendOnlyTables), MemberType = typeof(RevisionTests))]
    [Reference("Design rule (DESIGN.md §5): nothing is deleted or overwritten, enforced by triggers as well as by the API")]
    public void Rows_cannot_be_updated_or_deleted_even_with_raw_sql(string table)
    {
        using var r = new TestRegister(Kind);
        var finding = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        r.Store.AddRepair(new NewRepair(TestRegister.Component, new DateOnly(2021, 1, 1), "ground out", """{"inputs":{}}"""), "inspector A", "work order 5").Require();
        File.WriteAllText(r.Path + ".csv", $"component_code,inspection_date,kind,method\n{TestRegister.Component},2019-01-01,no-indication,{TestRegister.Mpi}\n");
        try
        {
            Assert.True(r.Store.ImportFindingsCsv(r.Path + ".csv", "inspector A", "campaign 2019").Succeeded);
        }
        finally
        {
            File.Delete(r.Path + ".csv");
        }

        var before = r.Count(table);
        var update = Assert.ThrowsAny<DbException>(() => r.Exec($"UPDATE {table} SET recorded_by = 'someone else'".Replace("recorded_by", table == "audit_log" ? "actor" : "recorded_by", StringComparison.Ordinal)));
        Assert.Contains("append-only", update.Message, StringComparison.Ordinal);
        var delete = Assert.ThrowsAny<DbException>(() => r.Exec($"DELETE FROM {table}"));
        Assert.Contains("append-only", delete.Message, StringComparison.Ordinal);
        Assert.Equal(before, r.Count(table));
        Assert.True(before > 0);
        Assert.Equal(2.0, r.Store.GetFinding(finding.FindingId)!.MeasuredSizeMm);
    }

    [SkippableFact]
    [Reference("Design rule: a correction is a new revision superseding the old one, with who, when and why; the old revision stays readable")]
    public void A_correction_is_a_new_revision_and_the_old_one_stays_readable()
    {
        using var r = new TestRegister(Kind);
        var first = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        var t1 = r.Clock.UtcNow;
        r.Clock.Advance(TimeSpan.FromDays(3));
        var second = r.Store.ReviseFinding(first.FindingId, Sized(2.6), "engineer B", "sizing re-read from the raw data").Require();

        Assert.Equal(2, second.Revision);
        Assert.Equal(r.By("engineer B"), second.Recorded.RecordedBy);
        Assert.Equal("sizing re-read from the raw data", second.Recorded.Reason);
        Assert.Equal(r.Clock.UtcNow, second.Recorded.RecordedUtc);
        var history = r.Store.FindingHistory(first.FindingId);
        Assert.Equal([2.0, 2.6], history.Select(h => h.MeasuredSizeMm!.Value));
        Assert.Equal(2.6, Assert.Single(r.Store.Findings(r.ComponentId)).MeasuredSizeMm);
        Assert.Equal(2, r.Count("finding_revision"));
        Assert.Equal(1, r.Count("finding"));

        // As known before the correction: revision 1.
        Assert.Equal(2.0, r.Store.GetFinding(first.FindingId, t1)!.MeasuredSizeMm);
        Assert.Equal(1, Assert.Single(r.Store.Findings(r.ComponentId, t1)).Revision);
        // As known before the finding was logged: nothing.
        Assert.Empty(r.Store.Findings(r.ComponentId, t1.AddTicks(-1)));
    }

    [SkippableFact]
    [Reference("Design rule: a finding entered in error is withdrawn by a revision, never deleted")]
    public void A_withdrawn_finding_leaves_current_reads_but_stays_in_history_and_earlier_as_of_reads()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        var before = r.Clock.UtcNow;
        r.Clock.Advance(TimeSpan.FromHours(1));
        var withdrawn = r.Store.WithdrawFinding(f.FindingId, "engineer B", "logged on the wrong weld").Require();
        Assert.True(withdrawn.Withdrawn);
        Assert.Empty(r.Store.Findings(r.ComponentId));
        Assert.Empty(r.Store.EvidenceFor(r.ComponentId, r.Clock.UtcNow));
        Assert.Single(r.Store.Findings(r.ComponentId, before));
        Assert.Single(r.Store.Findings(r.ComponentId, includeWithdrawn: true));
        Assert.Equal(2, r.Store.FindingHistory(f.FindingId).Count);
        Assert.False(r.Store.WithdrawFinding(f.FindingId, "engineer B", "again").Succeeded);
    }

    [SkippableFact]
    [Reference("Schema trigger finding_revision_chain: a revision supersedes the latest revision of its finding")]
    public void A_revision_that_skips_the_latest_one_is_refused_by_the_schema()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        r.Store.ReviseFinding(f.FindingId, Sized(2.2), "B", "fix").Require();
        var e = Assert.ThrowsAny<DbException>(() => r.Exec(
            $"INSERT INTO finding_revision (finding_id, revision, supersedes_revision_id, inspection_date, kind, method_id, measured_size_mm, recorded_utc, recorded_by, reason) " +
            $"VALUES ({f.FindingId}, 3, {f.RevisionId}, '2020-05-04', 'sized-indication', 1, 9.0, '2026-03-02T00:00:00.0000000Z', 'x', 'fork')"));
        Assert.Contains("supersede", e.Message, StringComparison.Ordinal);
    }

    [SkippableFact]
    [Reference("Design rule: any assessment can be reproduced from the register as of a date; the fingerprint identifies that state")]
    public void The_fingerprint_as_of_a_date_ignores_later_writes()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        var asOf = r.Clock.UtcNow;
        var fingerprint = r.Store.Fingerprint(asOf);
        Assert.Matches("^[0-9a-f]{64}$", fingerprint);

        r.Clock.Advance(TimeSpan.FromDays(1));
        r.Store.ReviseFinding(f.FindingId, Sized(3.0), "engineer B", "re-read").Require();
        r.Store.AddFinding(Sized(1.0, "12 o'clock"), "inspector A", "report IR-2").Require();
        r.Store.ReviseModel(TestRegister.Component, TestRegister.ModelJson.Replace("\"mean\":0.1", "\"mean\":0.2", StringComparison.Ordinal), "corrosion-2", "engineer B", "new rate data").Require();

        Assert.Equal(fingerprint, r.Store.Fingerprint(asOf));
        Assert.NotEqual(fingerprint, r.Store.Fingerprint(r.Clock.UtcNow));
        Assert.Equal("corrosion-1", r.Store.GetComponent(r.ComponentId, asOf)!.Model.ModelVersion);
        Assert.Equal("corrosion-2", r.Store.GetComponent(r.ComponentId)!.Model.ModelVersion);
        Assert.Equal(2, r.Store.ModelHistory(r.ComponentId).Count);
    }

    [SkippableFact]
    [Reference("Design rule: an audit trail records who did what and why")]
    public void The_audit_trail_records_creation_revision_and_withdrawal_with_actor_and_reason()
    {
        using var r = new TestRegister(Kind);
        var since = r.Clock.UtcNow;
        var f = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        r.Clock.Advance(TimeSpan.FromMinutes(5));
        r.Store.ReviseFinding(f.FindingId, Sized(2.1), "engineer B", "typo").Require();
        r.Clock.Advance(TimeSpan.FromMinutes(5));
        r.Store.WithdrawFinding(f.FindingId, "engineer C", "duplicate of an older report").Require();

        var trail = r.Store.AuditTrail(since, "finding");
        Assert.Equal(["create", "revise", "withdraw"], trail.Select(a => a.Action));
        Assert.Equal([r.By("inspector A"), r.By("engineer B"), r.By("engineer C")], trail.Select(a => a.Actor));
        Assert.Contains("typo", trail[1].DetailJson, StringComparison.Ordinal);
        Assert.All(trail, a => Assert.Equal(f.FindingId, a.EntityId));
    }

    [SkippableFact]
    [Reference("Design rule: revisions are recorded in order even when a writer's clock is behind")]
    public void A_revision_from_a_clock_that_is_behind_is_recorded_no_earlier_than_the_one_it_supersedes()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(Sized(2.0), "inspector A", "report IR-1").Require();
        r.Clock.Advance(TimeSpan.FromHours(-2));
        var second = r.Store.ReviseFinding(f.FindingId, Sized(2.4), "engineer B", "re-read").Require();
        Assert.Equal(f.Recorded.RecordedUtc, second.Recorded.RecordedUtc);
        Assert.Equal(2, r.Store.GetFinding(f.FindingId, f.Recorded.RecordedUtc)!.Revision);
    }
}

public abstract class ComponentStatusTests
{
    protected abstract RegisterStoreKind Kind { get; }
    [SkippableFact]
    [Reference("Design rule: a retired component leaves runs from its retirement on and stays readable as known on earlier dates")]
    public void A_retired_component_is_in_service_as_known_before_and_retired_after()
    {
        using var r = new TestRegister(Kind);
        var before = r.Clock.UtcNow;
        r.Clock.Advance(TimeSpan.FromDays(1));
        r.Store.SetRetired(TestRegister.Component, retired: true, "engineer B", "spool replaced").Require();
        Assert.Contains(r.Store.ComponentsInService(before), c => c.Code == TestRegister.Component);
        Assert.DoesNotContain(r.Store.ComponentsInService(r.Clock.UtcNow), c => c.Code == TestRegister.Component);
        Assert.NotNull(r.Store.FindComponent(TestRegister.Component));
        r.Clock.Advance(TimeSpan.FromDays(1));
        r.Store.SetRetired(TestRegister.Component, retired: false, "engineer B", "retired in error").Require();
        Assert.Contains(r.Store.ComponentsInService(), c => c.Code == TestRegister.Component);
        var history = r.Store.StatusHistory(r.ComponentId);
        Assert.Equal(["retired", "in-service"], history.Select(h => h.Status));
        Assert.Equal(["spool replaced", "retired in error"], history.Select(h => h.Recorded.Reason));
        Assert.ThrowsAny<DbException>(() => r.Exec("DELETE FROM component_status"));
        Assert.True(r.Store.Check().IsHealthy);
    }
}

/// <summary><see cref="RevisionTests"/> on a SQLite file.</summary>
public sealed class RevisionTestsOnSqlite : RevisionTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="RevisionTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class RevisionTestsOnPostgres : RevisionTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}

/// <summary><see cref="ComponentStatusTests"/> on a SQLite file.</summary>
public sealed class ComponentStatusTestsOnSqlite : ComponentStatusTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="ComponentStatusTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class ComponentStatusTestsOnPostgres : ComponentStatusTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}
