using System.Diagnostics;
using System.Globalization;
using System.Text;
using InspectionUpdate.Register;
using Npgsql;

namespace InspectionUpdate.Tests.Register;

/// <summary>
/// What only a shared PostgreSQL register has: several processes writing at once, processes killed inside a
/// transaction, database roles, and copies between the two stores. Skips, saying why, without a server.
/// </summary>
public class PostgresTests
{
    private static Process StartChild(string signal, params string[] args)
    {
        var dll = Path.Combine(AppContext.BaseDirectory, "InspectionUpdate.Register.ChildProcess.dll");
        Assert.True(File.Exists(dll), $"child process not built next to the tests: {dll}");
        var info = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        info.Environment["IU_TEST_SIGNAL"] = signal;
        info.ArgumentList.Add(dll);
        foreach (var a in args) info.ArgumentList.Add(a);
        return Process.Start(info)!;
    }

    private static async Task<string> Finish(Process p, TimeSpan timeout)
    {
        var output = p.StandardOutput.ReadToEndAsync();
        var error = p.StandardError.ReadToEndAsync();
        await p.WaitForExitAsync().WaitAsync(timeout);
        return await output + await error;
    }

    [SkippableFact]
    [Reference("PostgreSQL: transactions serialized by pg_advisory_xact_lock (postgresql.org/docs/15/explicit-locking.html §13.3.5); every committed write is kept")]
    public async Task Two_processes_logging_500_findings_each_lose_nothing_and_duplicate_nothing()
    {
        using var r = new TestRegister(RegisterStoreKind.PostgreSql);
        const int perProcess = 500;
        var n = perProcess.ToString(CultureInfo.InvariantCulture);
        using var a = StartChild(r.Path, "add-findings", r.Location, TestRegister.Component, TestRegister.Ut, n, "alpha", "beta");
        using var b = StartChild(r.Path, "add-findings", r.Location, TestRegister.Component, TestRegister.Ut, n, "beta", "alpha");
        try
        {
            Assert.Equal("ready", await a.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2)));
            Assert.Equal("ready", await b.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2)));
            File.WriteAllText(r.Path + ".go", "");
            var outA = await Finish(a, TimeSpan.FromMinutes(5));
            var outB = await Finish(b, TimeSpan.FromMinutes(5));
            Assert.True(a.ExitCode == 0, outA);
            Assert.True(b.ExitCode == 0, outB);
        }
        finally
        {
            foreach (var f in Directory.GetFiles(Path.GetDirectoryName(r.Path)!, Path.GetFileName(r.Path) + ".*")) File.Delete(f);
        }

        var findings = r.Store.Findings(r.ComponentId);
        foreach (var tag in new[] { "alpha", "beta" })
        {
            var locations = findings.Where(f => f.Location.StartsWith(tag + "-", StringComparison.Ordinal)).Select(f => f.Location).ToList();
            Assert.Equal(perProcess, locations.Count);
            Assert.Equal(perProcess, locations.Distinct(StringComparer.Ordinal).Count());
        }

        Assert.Equal(2 * perProcess, r.Count("finding"));
        Assert.Equal(2 * perProcess, r.Count("finding_revision"));
        Assert.Equal(2 * perProcess, r.Count("audit_log WHERE entity = 'finding'"));
        // Ids are the largest id + 1, as on SQLite: 1..n with no gap and no repeat.
        Assert.Equal(Enumerable.Range(1, 2 * perProcess).Select(i => (long)i), findings.Select(f => f.FindingId).Order());
        Assert.True(r.Store.Check().IsHealthy);

        // Only worth something if the writers overlapped: they keep in step every ten findings (50 rounds).
        var order = findings.OrderBy(f => f.FindingId).Select(f => f.Location[0]).ToList();
        var switches = order.Zip(order.Skip(1)).Count(p => p.First != p.Second);
        Assert.True(switches >= 49, $"the two writers did not overlap (owner changed {switches} times)");
    }

    [SkippableFact]
    [Trait("Category", "Statistical")]
    [Reference("PostgreSQL: a transaction whose client dies is rolled back and its locks released (postgresql.org/docs/15/tutorial-transactions.html: all-or-nothing)")]
    public async Task Imports_killed_with_sigkill_in_50_trials_leave_the_register_consistent_and_all_or_nothing()
    {
        using var r = new TestRegister(RegisterStoreKind.PostgreSql);
        r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2012, 1, 1), FindingKind.NoIndication, TestRegister.Mpi), "A", "before the imports").Require();
        var fingerprint = r.Store.Fingerprint(DateTimeOffset.MaxValue);
        var audit = r.Count("audit_log");
        var csv = r.Path + ".csv";
        var text = new StringBuilder("component_code,inspection_date,kind,method,location\n");
        const int rows = 300;
        for (var i = 0; i < rows; i++)
        {
            text.Append(FormattableString.Invariant($"{TestRegister.Component},{new DateOnly(2013, 1, 1).AddDays(i):yyyy-MM-dd},no-indication,{TestRegister.Ut},spot {i}\n"));
        }

        File.WriteAllText(csv, text.ToString());
        var random = new Random(17);
        const int trials = 50;
        try
        {
            for (var trial = 0; trial < trials; trial++)
            {
                // The kill lands inside the import's transaction at a different row each time (first row to last).
                var hangAt = trial == 0 ? 1 : trial == 1 ? rows : random.Next(1, rows + 1);
                using var child = StartChild(r.Path, "import-and-hang", r.Location, csv, hangAt.ToString(CultureInfo.InvariantCulture));
                var line = await child.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2));
                if (line != "hanging")
                {
                    await child.WaitForExitAsync().WaitAsync(TimeSpan.FromMinutes(1));
                    Assert.Fail($"trial {trial}: the child said '{line}' ({await child.StandardError.ReadToEndAsync()})");
                }

                child.Kill(entireProcessTree: true); // SIGKILL on Linux
                await child.WaitForExitAsync().WaitAsync(TimeSpan.FromSeconds(30));

                Assert.Equal(1, r.Count("finding"));
                Assert.Equal(0, r.Count("import_batch"));
                Assert.Equal(audit, r.Count("audit_log"));
                Assert.Equal(fingerprint, r.Store.Fingerprint(DateTimeOffset.MaxValue));
            }

            var check = r.Store.Check();
            Assert.True(check.IsHealthy, string.Join("; ", check.IntegrityCheck.Concat(check.ForeignKeyViolations).Concat(check.InvariantViolations)));
            // The killed sessions released the write lock: an import goes through, whole.
            var retry = r.Store.ImportFindingsCsv(csv, "A", "retry after the kills");
            Assert.True(retry.Succeeded, string.Join("; ", retry.Problems));
            Assert.Equal(rows + 1, r.Count("finding"));
            Assert.Equal(1, r.Count("import_batch"));
        }
        finally
        {
            File.Delete(csv);
        }
    }

    /// <summary>A login of the test server holding one of the register's roles; dropped with the database.</summary>
    private static string Login(TestRegister r, string role)
    {
        var login = $"{r.Database}_{role}_login";
        r.Exec($"CREATE ROLE {login} LOGIN; GRANT {r.Database}_{role} TO {login}");
        return login;
    }

    private static string As(TestRegister r, string login) => r.Location.Replace(PostgresServer.User + "@", login + "@", StringComparison.Ordinal);

    [SkippableFact]
    [Reference("PostgreSQL privileges: INSERT without the privilege fails with insufficient_privilege, SQLSTATE 42501 (postgresql.org/docs/15/ddl-priv.html)")]
    public void A_reader_cannot_write_and_nothing_is_written_a_recorder_logs_findings_but_not_methods()
    {
        using var r = new TestRegister(RegisterStoreKind.PostgreSql);
        var reader = Login(r, "reader");
        var recorder = Login(r, "recorder");
        var modeller = Login(r, "modeller");
        var before = (r.Count("finding"), r.Count("finding_revision"), r.Count("audit_log"));
        var finding = new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.NoIndication, TestRegister.Ut);
        try
        {
            using (var asReader = RegisterStore.OpenPostgres(As(r, reader), RegisterOpenMode.OpenExisting))
            {
                Assert.Equal(2, asReader.Components().Count);
                var e = Assert.Throws<RegisterFileException>(() => asReader.AddFinding(finding, "someone", "reader tries"));
                Assert.Contains($"user '{reader}' may not write", e.Message, StringComparison.Ordinal);
                Assert.Contains("nothing was written", e.Message, StringComparison.Ordinal);
                Assert.Throws<RegisterFileException>(() => asReader.ImportFindingsCsv(new StringReader($"component_code,inspection_date,kind,method\n{TestRegister.Component},2020-05-05,no-indication,{TestRegister.Ut}\n"), "x.csv", "someone", "reader tries"));
                Assert.Equal(before, (r.Count("finding"), r.Count("finding_revision"), r.Count("audit_log")));
            }

            using (var asRecorder = RegisterStore.OpenPostgres(As(r, recorder), RegisterOpenMode.OpenExisting))
            {
                var stored = asRecorder.AddFinding(finding, "free text is not used", "recorder logs").Require();
                Assert.Equal(recorder, stored.Recorded.RecordedBy);
                Assert.Equal(recorder, asRecorder.AuditTrail(entity: "finding").Single().Actor);
                Assert.Throws<RegisterFileException>(() => asRecorder.ReviseModel(TestRegister.Component, TestRegister.ModelJson, "corrosion-2", "x", "recorder tries"));
            }

            using (var asModeller = RegisterStore.OpenPostgres(As(r, modeller), RegisterOpenMode.OpenExisting))
            {
                Assert.Equal(2, asModeller.ReviseModel(TestRegister.Component, TestRegister.ModelJson, "corrosion-2", "x", "new model version").Require().Revision);
                Assert.Throws<RegisterFileException>(() => asModeller.AddFinding(finding with { InspectionDate = new DateOnly(2020, 6, 1) }, "x", "modeller tries"));
            }

            // No role may edit evidence or forge audit rows directly.
            using var raw = new NpgsqlConnection(new NpgsqlConnectionStringBuilder(PostgresServer.ConnectionString(r.Database!)) { Username = recorder, Pooling = false }.ConnectionString);
            raw.Open();
            using var forge = new NpgsqlCommand("INSERT INTO audit_log (audit_id, at_utc, actor, action, entity, entity_id, detail) VALUES (999, '2026-01-01T00:00:00.0000000Z', 'x', 'create', 'finding', 1, '{}')", raw);
            Assert.Equal(PostgresErrorCodes.InsufficientPrivilege, Assert.Throws<PostgresException>(() => forge.ExecuteNonQuery()).SqlState);
        }
        finally
        {
            NpgsqlConnection.ClearAllPools();
            r.Exec($"DROP ROLE {reader}, {recorder}, {modeller}");
        }
    }

    [SkippableFact]
    [Reference("PostgreSQL deadlock detection: after deadlock_timeout (1 s) the waiter that checks aborts with SQLSTATE 40P01 (postgresql.org/docs/15/explicit-locking.html §13.3.4)")]
    public async Task A_write_aborted_by_a_deadlock_is_retried_and_written_once()
    {
        using var r = new TestRegister(RegisterStoreKind.PostgreSql);
        await using var raw = new NpgsqlConnection(new NpgsqlConnectionStringBuilder(PostgresServer.ConnectionString(r.Database!)) { Pooling = false }.ConnectionString);
        await raw.OpenAsync();
        await using var transaction = await raw.BeginTransactionAsync();
        await using (var share = new NpgsqlCommand("LOCK TABLE finding IN SHARE MODE", raw, transaction))
        {
            await share.ExecuteNonQueryAsync();
        }

        // The register's write takes its advisory lock, then waits for the table; the other session then waits for the
        // advisory lock: a deadlock. The register's write waited first, so its check fires first and it is the victim.
        var write = Task.Run(() => r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.NoIndication, TestRegister.Ut), "A", "deadlock test"));
        await Task.Delay(TimeSpan.FromMilliseconds(400));
        await using (var take = new NpgsqlCommand("SELECT pg_advisory_xact_lock(1230328391)", raw, transaction))
        {
            await take.ExecuteNonQueryAsync(); // 0x49555247, the register's write lock
        }

        await transaction.CommitAsync();
        var stored = (await write.WaitAsync(TimeSpan.FromMinutes(1))).Require();
        Assert.Equal(1, stored.Revision);
        Assert.Equal(1, r.Count("finding"));
        Assert.Equal(1, r.Count("finding_revision"));
    }

    [SkippableFact]
    [Reference("Design rule (issue 17): a correction of a revision another user has superseded is refused, not applied over it")]
    public void A_correction_of_a_revision_another_user_superseded_is_refused_with_nothing_written()
    {
        using var r = new TestRegister(RegisterStoreKind.PostgreSql);
        using var other = RegisterStore.OpenPostgres(r.Location, RegisterOpenMode.OpenExisting, new RegisterOptions(r.Clock));
        var f = r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.0), "A", "IR-1").Require();
        var seen = r.Store.GetFinding(f.FindingId)!;
        r.Clock.Advance(TimeSpan.FromMinutes(1));
        other.ReviseFinding(f.FindingId, new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.4), "B", "resized", seen.Revision).Require();
        var stale = r.Store.ReviseFinding(f.FindingId, new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 1.8), "A", "my correction", seen.Revision);
        Assert.False(stale.Succeeded);
        var problem = Assert.Single(stale.Problems);
        Assert.Equal("revision", problem.Field);
        Assert.Contains("was superseded by revision 2", problem.Message, StringComparison.Ordinal);
        Assert.Equal(2, r.Count("finding_revision"));
        Assert.Equal(2.4, r.Store.GetFinding(f.FindingId)!.MeasuredSizeMm);
    }

    [SkippableFact]
    [Reference("Design rule (issue 17): register copy keeps every revision, the audit trail and stored results; SHA-256 fingerprints equal")]
    public void Copy_sqlite_to_postgres_and_back_keeps_the_fingerprint_revisions_audit_trail_and_results()
    {
        using var source = new TestRegister(RegisterStoreKind.Sqlite);
        var f = source.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.0, Note: "tab\there, quote ' and ü"), "inspector A", "IR-1").Require();
        source.Clock.Advance(TimeSpan.FromDays(1));
        source.Store.ReviseFinding(f.FindingId, new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.2), "engineer B", "resized").Require();
        source.Store.AddRepair(new NewRepair(TestRegister.Component, new DateOnly(2021, 1, 1), "ground out", """{"inputs":{}}"""), "inspector A", "work order 5").Require();
        source.Store.Save([new StoredResult(source.ComponentId, TestRegister.Component, "NORTH", new DateOnly(2026, 1, 1), "opts", 1, new string('a', 64), "test", new string('b', 64), ResultStatus.Assessed, null, source.Clock.UtcNow) { AnnualPf = 1.25e-5, Converged = true, ProfilesJson = "{}" }]);
        var fingerprint = source.Store.Fingerprint(DateTimeOffset.MaxValue);
        var asOfDay = source.Store.Fingerprint(f.Recorded.RecordedUtc);

        PostgresServer.RequireServer();
        var database = PostgresServer.CreateDatabase();
        var back = TestRegister.TempPath();
        try
        {
            var there = RegisterStore.Copy(source.Path, PostgresServer.Uri(database));
            Assert.Equal(fingerprint, there.Fingerprint);
            var home = RegisterStore.Copy(PostgresServer.Uri(database), back);
            Assert.Equal(fingerprint, home.Fingerprint);
            using var pg = RegisterStore.OpenPostgres(PostgresServer.Uri(database), RegisterOpenMode.OpenExisting);
            using var copy = RegisterStore.Open(back, RegisterOpenMode.OpenExisting);
            foreach (IRegister store in new IRegister[] { pg, copy })
            {
                Assert.Equal(fingerprint, store.Fingerprint(DateTimeOffset.MaxValue));
                Assert.Equal(asOfDay, store.Fingerprint(f.Recorded.RecordedUtc));
                Assert.Equal(source.Store.AuditTrail(), store.AuditTrail());
                Assert.Equal(source.Store.FindingHistory(f.FindingId), store.FindingHistory(f.FindingId));
                Assert.Equal(source.Store.Results(withProfiles: true), store.Results(withProfiles: true));
                Assert.True(store.Check().IsHealthy);
            }

            // The copy into PostgreSQL keeps who recorded each row, and the register keeps working after it.
            Assert.Equal("engineer B", pg.FindingHistory(f.FindingId)[1].Recorded.RecordedBy);
            Assert.Equal(3, pg.ReviseFinding(f.FindingId, new NewFinding(TestRegister.Component, new DateOnly(2020, 5, 4), FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 2.3), "x", "after copy", 2).Require().Revision);
        }
        finally
        {
            TestRegister.Delete(back);
            PostgresServer.DropDatabase(database);
        }
    }
}
