using System.Diagnostics;
using System.Text;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

public class MultiProcessTests
{
    private static Process StartChild(params string[] args)
    {
        var dll = Path.Combine(AppContext.BaseDirectory, "InspectionUpdate.Register.ChildProcess.dll");
        Assert.True(File.Exists(dll), $"child process not built next to the tests: {dll}");
        var info = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        info.ArgumentList.Add(dll);
        foreach (var a in args)
        {
            info.ArgumentList.Add(a);
        }

        return Process.Start(info)!;
    }

    private static async Task<string> Finish(Process p, TimeSpan timeout)
    {
        var output = p.StandardOutput.ReadToEndAsync();
        var error = p.StandardError.ReadToEndAsync();
        await p.WaitForExitAsync().WaitAsync(timeout);
        return await output + await error;
    }

    [Fact]
    [Reference("SQLite WAL with BEGIN IMMEDIATE and a busy timeout serializes writers across processes (sqlite.org/wal.html, lockingv3.html)")]
    public async Task Two_processes_writing_at_once_lose_nothing()
    {
        using var r = new TestRegister();
        const int perProcess = 100;
        using var a = StartChild("add-findings", r.Path, TestRegister.Component, TestRegister.Ut, perProcess.ToString(System.Globalization.CultureInfo.InvariantCulture), "alpha", "beta");
        using var b = StartChild("add-findings", r.Path, TestRegister.Component, TestRegister.Ut, perProcess.ToString(System.Globalization.CultureInfo.InvariantCulture), "beta", "alpha");
        Assert.Equal("ready", await a.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2)));
        Assert.Equal("ready", await b.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2)));
        File.WriteAllText(r.Path + ".go", "");
        // The parent writes too, to the sister component, while both children run.
        for (var i = 0; i < 50; i++)
        {
            r.Store.AddFinding(new NewFinding("P-101-W4", new DateOnly(2020, 1, 1).AddDays(i), FindingKind.InService, null), "parent", "concurrent writer test").Require();
        }

        var outA = await Finish(a, TimeSpan.FromMinutes(2));
        var outB = await Finish(b, TimeSpan.FromMinutes(2));
        Assert.True(a.ExitCode == 0, outA);
        Assert.True(b.ExitCode == 0, outB);

        var findings = r.Store.Findings(r.ComponentId);
        Assert.Equal(perProcess, findings.Count(f => f.Location.StartsWith("alpha-", StringComparison.Ordinal)));
        Assert.Equal(perProcess, findings.Count(f => f.Location.StartsWith("beta-", StringComparison.Ordinal)));
        Assert.Equal(2 * perProcess + 50, r.Count("finding"));
        Assert.Equal(2 * perProcess + 50, r.Count("finding_revision"));
        Assert.True(r.Store.Check().IsHealthy);

        // The test is only worth something if the writers overlapped: the children keep in step every ten findings, so
        // the owner changes at least once per round (ten rounds); two runs in sequence would give 2.
        var order = r.Store.Findings(r.ComponentId).OrderBy(f => f.FindingId).Select(f => f.Location[0]).ToList();
        var switches = order.Zip(order.Skip(1)).Count(p => p.First != p.Second);
        Assert.True(switches >= 9, $"the two writers did not overlap (owner changed {switches} times)");
    }

    [Fact]
    [Reference("SQLite atomic commit: a transaction not committed when its process dies is rolled back on the next open (sqlite.org/atomiccommit.html)")]
    public async Task A_process_killed_in_the_middle_of_an_import_leaves_the_register_as_it_was()
    {
        using var r = new TestRegister();
        r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2012, 1, 1), FindingKind.NoIndication, TestRegister.Mpi), "A", "before the import").Require();
        var fingerprint = r.Store.Fingerprint(DateTimeOffset.MaxValue);
        var csv = r.Path + ".csv";
        var text = new StringBuilder("component_code,inspection_date,kind,method,location\n");
        for (var i = 0; i < 400; i++)
        {
            text.Append(FormattableString.Invariant($"{TestRegister.Component},{new DateOnly(2013, 1, 1).AddDays(i):yyyy-MM-dd},no-indication,{TestRegister.Ut},spot {i}\n"));
        }

        File.WriteAllText(csv, text.ToString());
        try
        {
            using var child = StartChild("import-and-hang", r.Path, csv, "200");
            var line = await child.StandardOutput.ReadLineAsync().WaitAsync(TimeSpan.FromMinutes(2));
            Assert.Equal("hanging", line);
            child.Kill(entireProcessTree: true);
            await child.WaitForExitAsync().WaitAsync(TimeSpan.FromSeconds(30));

            // Reopen as a fresh process would: nothing of the batch, integrity intact, the lock released.
            TestRegister.Delete(csv);
            using var reopened = RegisterStore.Open(r.Path, RegisterOpenMode.OpenExisting);
            Assert.Equal(1, r.Count("finding"));
            Assert.Equal(0, r.Count("import_batch"));
            Assert.Equal(fingerprint, reopened.Fingerprint(DateTimeOffset.MaxValue));
            var check = reopened.Check();
            Assert.True(check.IsHealthy, string.Join("; ", check.IntegrityCheck.Concat(check.ForeignKeyViolations).Concat(check.InvariantViolations)));
            File.WriteAllText(csv, text.ToString());
            var retry = reopened.ImportFindingsCsv(csv, "A", "retry after the crash");
            Assert.True(retry.Succeeded, string.Join("; ", retry.Problems));
            Assert.Equal(401, r.Count("finding"));
        }
        finally
        {
            File.Delete(csv);
        }
    }
}
