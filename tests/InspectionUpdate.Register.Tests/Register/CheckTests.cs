using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

public class CheckTests
{
    [Fact]
    [Reference("SQLite PRAGMA integrity_check returns the single row 'ok' for a sound file (sqlite.org/pragma.html)")]
    public void A_sound_register_passes_every_check()
    {
        using var r = new TestRegister();
        r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2012, 1, 1), FindingKind.NoIndication, TestRegister.Mpi), "A", "IR").Require();
        var check = r.Store.Check();
        Assert.True(check.IsHealthy);
        Assert.Equal(["ok"], check.IntegrityCheck);
        Assert.Equal(RegisterStore.CurrentSchemaVersion, check.SchemaVersion);
    }

    [Fact]
    [Reference("SQLite PRAGMA foreign_key_check lists rows whose parent is missing (sqlite.org/pragma.html)")]
    public void Rows_written_behind_the_registers_back_are_reported()
    {
        using var r = new TestRegister();
        using (var connection = new SqliteConnection($"Data Source={r.Path};Pooling=False;Foreign Keys=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            // A finding pointing at a component that does not exist, and with no revision at all.
            command.CommandText = "INSERT INTO finding (component_id, recorded_utc, recorded_by) VALUES (999, '2026-03-01T08:00:00.0000000Z', 'intruder')";
            command.ExecuteNonQuery();
        }

        var check = r.Store.Check();
        Assert.False(check.IsHealthy);
        Assert.Contains(check.ForeignKeyViolations, v => v.StartsWith("finding row", StringComparison.Ordinal));
        Assert.Contains(check.InvariantViolations, v => v.Contains("revisions in finding_revision", StringComparison.Ordinal));
    }

    [Fact]
    [Reference("Schema check: the append-only triggers are part of the schema; a missing one is reported")]
    public void A_dropped_append_only_trigger_is_reported()
    {
        using var r = new TestRegister();
        using (var connection = new SqliteConnection($"Data Source={r.Path};Pooling=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = "DROP TRIGGER finding_revision_no_delete";
            command.ExecuteNonQuery();
        }

        Assert.Contains("append-only trigger finding_revision_no_delete is missing", r.Store.Check().InvariantViolations);
    }
}
