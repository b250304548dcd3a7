using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

public class MigrationTests
{
    private static object? Pragma(string path, string pragma)
    {
        using var connection = new SqliteConnection($"Data Source={path};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA " + pragma;
        return command.ExecuteScalar();
    }

    [Fact]
    [Reference("Design rule (DESIGN.md §5): versioned schema migrated forward, PRAGMA user_version, WAL mode")]
    public void A_missing_file_is_created_at_the_current_schema()
    {
        var path = TestRegister.TempPath();
        try
        {
            using (var store = RegisterStore.Open(path))
            {
                Assert.Equal(RegisterStore.CurrentSchemaVersion, store.SchemaVersion);
                Assert.True(store.Check().IsHealthy, string.Join("; ", store.Check().InvariantViolations));
                Assert.Equal(Enumerable.Range(1, RegisterStore.CurrentSchemaVersion).Select(v => (long)v),
                    store.AuditTrail(entity: "schema").Select(a => a.EntityId));
            }

            Assert.Equal((long)RegisterStore.CurrentSchemaVersion, Pragma(path, "user_version"));
            Assert.Equal("wal", Pragma(path, "journal_mode"));
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Design rule: a migration keeps existing rows; version 2 adds import batches to findings written under version 1")]
    public void Migrating_a_version_1_file_keeps_its_findings()
    {
        var path = TestRegister.TempPath();
        try
        {
            using (var v1 = RegisterStore.Open(path, RegisterOpenMode.CreateNew, null, targetVersion: 1))
            {
                Assert.Equal(1L, Pragma(path, "user_version"));
            }

            // Rows as a version-1 program wrote them (no import_batch_id column yet).
            using (var connection = new SqliteConnection($"Data Source={path};Pooling=False;Foreign Keys=True"))
            {
                connection.Open();
                using var command = connection.CreateCommand();
                command.CommandText = """
                    INSERT INTO site (code, name, recorded_utc, recorded_by) VALUES ('S', 'Site', '2024-01-01T00:00:00.0000000Z', 'v1');
                    INSERT INTO component (site_id, code, install_date, wall_thickness_mm, recorded_utc, recorded_by) VALUES (1, 'C', '2015-01-01', 10.0, '2024-01-01T00:00:00.0000000Z', 'v1');
                    INSERT INTO component_model_revision (component_id, revision, definition_json, model_version, recorded_utc, recorded_by, reason) VALUES (1, 1, '{}', 'm1', '2024-01-01T00:00:00.0000000Z', 'v1', 'initial');
                    INSERT INTO inspection_method (name, pod_form, pod_lambda_mm, sizing_kind, sizing_bias_mm, sizing_sd_mm, recorded_utc, recorded_by) VALUES ('M', 'exponential', 1.0, 'additive-normal', 0.0, 0.3, '2024-01-01T00:00:00.0000000Z', 'v1');
                    INSERT INTO finding (component_id, recorded_utc, recorded_by) VALUES (1, '2024-01-02T00:00:00.0000000Z', 'v1');
                    INSERT INTO finding_revision (finding_id, revision, inspection_date, kind, method_id, measured_size_mm, recorded_utc, recorded_by, reason) VALUES (1, 1, '2023-06-01', 'sized-indication', 1, 2.5, '2024-01-02T00:00:00.0000000Z', 'v1', 'report 7');
                    """;
                command.ExecuteNonQuery();
            }

            using var current = RegisterStore.Open(path, RegisterOpenMode.OpenExisting);
            Assert.Equal(RegisterStore.CurrentSchemaVersion, (int)(long)Pragma(path, "user_version")!);
            var finding = Assert.Single(current.Findings(current.FindComponent("C")!.Id));
            Assert.Equal(2.5, finding.MeasuredSizeMm);
            Assert.Null(finding.ImportBatchId);
            Assert.True(current.Check().IsHealthy);
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("docs/register.md: version 3 adds component_result, version 4 adds component_status and model_check")]
    public void Version_3_holds_stored_results_and_version_4_adds_the_model_checks_and_statuses()
    {
        var path = TestRegister.TempPath();
        try
        {
            Assert.True(RegisterStore.CurrentSchemaVersion >= 4);
            using (RegisterStore.Open(path, RegisterOpenMode.CreateNew, null, targetVersion: 3))
            {
            }

            string[] Tables()
            {
                using var connection = new SqliteConnection($"Data Source={path};Pooling=False");
                connection.Open();
                using var command = connection.CreateCommand();
                command.CommandText = "SELECT name FROM sqlite_schema WHERE type = 'table' AND name IN ('component_result', 'model_check', 'component_status') ORDER BY name";
                using var reader = command.ExecuteReader();
                var names = new List<string>();
                while (reader.Read()) names.Add(reader.GetString(0));
                return names.ToArray();
            }

            Assert.Equal(["component_result"], Tables());
            using (RegisterStore.Open(path, RegisterOpenMode.OpenExisting))
            {
            }

            Assert.Equal((long)RegisterStore.CurrentSchemaVersion, Pragma(path, "user_version"));
            Assert.Equal(["component_result", "component_status", "model_check"], Tables());
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Design rule: a program never writes into a schema newer than it knows")]
    public void A_file_with_a_newer_schema_is_refused()
    {
        var path = TestRegister.TempPath();
        try
        {
            using (RegisterStore.Open(path))
            {
            }

            Pragma(path, "user_version = 99");
            var e = Assert.Throws<RegisterFileException>(() => RegisterStore.Open(path));
            Assert.Contains("99", e.Message, StringComparison.Ordinal);
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("Open modes documented on RegisterOpenMode")]
    public void Open_modes_refuse_a_missing_or_an_existing_file_as_asked()
    {
        var path = TestRegister.TempPath();
        try
        {
            Assert.Throws<RegisterFileException>(() => RegisterStore.Open(path, RegisterOpenMode.OpenExisting));
            Assert.False(File.Exists(path));
            using (RegisterStore.Open(path, RegisterOpenMode.CreateNew))
            {
            }

            Assert.Throws<RegisterFileException>(() => RegisterStore.Open(path, RegisterOpenMode.CreateNew));
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }

    [Fact]
    [Reference("SQLite file format: a file without the SQLite header is not a database")]
    public void A_file_that_is_not_sqlite_is_refused_with_its_name()
    {
        var path = TestRegister.TempPath();
        try
        {
            File.WriteAllText(path, "component_code,inspection_date\nthis is a CSV, not a register\n");
            var e = Assert.Throws<RegisterFileException>(() => RegisterStore.Open(path));
            Assert.Contains(path, e.Message, StringComparison.Ordinal);
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }
}

public class ModelCheckMigrationTests
{
    [Theory]
    [Reference("Design rule: a model stored before the register checked models is marked by the migration (version 4) and listed by the check")]
    [InlineData(2)]
    [InlineData(3)]
    public void Migrating_marks_stored_models_that_no_longer_pass_and_the_check_lists_them(int version)
    {
        var path = TestRegister.TempPath();
        try
        {
            using (RegisterStore.Open(path, RegisterOpenMode.CreateNew, null, targetVersion: version))
            {
            }

            // Rows as an earlier program wrote them: it checked only that the model was JSON.
            using (var connection = new SqliteConnection($"Data Source={path};Pooling=False;Foreign Keys=True"))
            {
                connection.Open();
                using var command = connection.CreateCommand();
                command.CommandText = """
                    INSERT INTO site (code, name, recorded_utc, recorded_by) VALUES ('S', 'Site', '2024-01-01T00:00:00.0000000Z', 'v2');
                    INSERT INTO component (site_id, code, install_date, recorded_utc, recorded_by) VALUES (1, 'GOOD', '2015-01-01', '2024-01-01T00:00:00.0000000Z', 'v2');
                    INSERT INTO component (site_id, code, install_date, recorded_utc, recorded_by) VALUES (1, 'BAD', '2015-01-01', '2024-01-01T00:00:00.0000000Z', 'v2');
                    INSERT INTO component_model_revision (component_id, revision, definition_json, model_version, recorded_utc, recorded_by, reason) VALUES (1, 1, $good, 'm1', '2024-01-01T00:00:00.0000000Z', 'v2', 'initial');
                    INSERT INTO component_model_revision (component_id, revision, definition_json, model_version, recorded_utc, recorded_by, reason) VALUES (2, 1, $bad, 'm1', '2024-01-01T00:00:00.0000000Z', 'v2', 'initial');
                    """;
                command.Parameters.AddWithValue("$good", TestRegister.ModelJson);
                command.Parameters.AddWithValue("$bad", TestRegister.ModelJson.Replace("serviceLife_years", "serviceLife_year", StringComparison.Ordinal));
                command.ExecuteNonQuery();
            }

            using var store = RegisterStore.Open(path, RegisterOpenMode.OpenExisting);
            using (var connection = new SqliteConnection($"Data Source={path};Pooling=False"))
            {
                connection.Open();
                using var command = connection.CreateCommand();
                command.CommandText = "SELECT c.code, m.passes FROM model_check m JOIN component_model_revision r USING (model_revision_id) JOIN component c USING (component_id) ORDER BY c.code";
                using var reader = command.ExecuteReader();
                var rows = new List<(string, long)>();
                while (reader.Read()) rows.Add((reader.GetString(0), reader.GetInt64(1)));
                Assert.Equal([("BAD", 0L), ("GOOD", 1L)], rows);
            }

            var check = store.Check();
            Assert.True(check.IsHealthy, string.Join("; ", check.InvariantViolations));
            var line = Assert.Single(check.InvalidModels);
            Assert.Contains("component BAD", line, StringComparison.Ordinal);
            Assert.Contains("serviceLife_year", line, StringComparison.Ordinal);
            Assert.Contains("marked", line, StringComparison.Ordinal);
        }
        finally
        {
            TestRegister.Delete(path);
        }
    }
}
