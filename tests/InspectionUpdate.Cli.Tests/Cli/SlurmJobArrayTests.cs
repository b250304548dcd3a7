using System.Globalization;
using System.Text;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// A whole-register run on a real scheduler: a Slurm job array of four shards, each a child process of the built
/// command line, merged and compared with a single-process run. Needs a running Slurm on this machine
/// (.ci/start-slurm.sh starts a single-node one; .ci/run sets INSPECTION_UPDATE_SLURM); skips, saying why, only where
/// Slurm could not start.
/// </summary>
public sealed class SlurmJobArrayTests
{
    private const string SlurmVariable = "INSPECTION_UPDATE_SLURM";
    private const int Components = 200;
    private const int Shards = 4;
    private const string AsOf = "2025-06-30";

    private static readonly TimeSpan JobTimeout = TimeSpan.FromMinutes(8);
    private static readonly TimeSpan Short = TimeSpan.FromMinutes(1);

    [SkippableFact]
    [Reference("Design rule (issue 13): a sharded run merged equals the single-process run (same numbers, same keys), on an existing scheduler (Slurm job array, SLURM_ARRAY_TASK_ID)")]
    public void A_four_task_slurm_job_array_merged_equals_a_single_process_run()
    {
        SkipUnlessSlurmIsUp();
        var folder = Path.Combine(Path.GetTempPath(), "iu-slurm-" + Guid.NewGuid().ToString("N")[..12]);
        Directory.CreateDirectory(folder);
        try
        {
            var sharded = Path.Combine(folder, "sharded.register");
            var single = Path.Combine(folder, "single.register");
            var invent = CliProcess.Run(folder, Short, "register", "invent", sharded, "--components", Invariant(Components), "--recorded", "2025-01-01", "--json");
            Assert.True(invent.ExitCode == 0, invent.Output + invent.Error);
            File.Copy(sharded, single);

            // Four array tasks, one CPU each; each takes its shard index from SLURM_ARRAY_TASK_ID (--shard N alone)
            // and writes its default results file beside the register.
            var script = Path.Combine(folder, "assess.sbatch");
            File.WriteAllText(script, new StringBuilder()
                .Append("#!/bin/bash\nset -eu\n")
                .Append(CultureInfo.InvariantCulture, $"exec {Quote(CliProcess.Dotnet)} {Quote(CliProcess.Dll)} register assess -r {Quote(sharded)} --as-of {AsOf} --route first-order --shard {Shards} --parallel 1 --json\n")
                .ToString());
            var submit = CliProcess.RunProgram("sbatch", Short, "--parsable", "--job-name=iu-register-assess", $"--array=0-{Shards - 1}", "--ntasks=1", "--cpus-per-task=1",
                "--chdir=" + folder, "--output=" + Path.Combine(folder, "assess-%a.out"), "--error=" + Path.Combine(folder, "assess-%a.err"), script);
            Assert.True(submit.ExitCode == 0, "sbatch failed: " + submit.Output + submit.Error);
            var job = submit.Output.Trim().Split(';')[0];

            // The single-process run of the same register, while the array runs.
            var one = CliProcess.Run(folder, JobTimeout, "register", "assess", "-r", single, "--as-of", AsOf, "--route", "first-order", "--json");
            Assert.True(one.ExitCode is 0 or 3, one.Output + one.Error);
            var oneDoc = CliProcess.JsonOf(one);
            Assert.Equal(Components, oneDoc.GetProperty("components").GetInt32());
            Assert.Equal(0, oneDoc.GetProperty("failed").GetInt32());

            WaitForJob(job, folder);

            // Every task ended with the run's own exit codes (0, or 3 when some component did not converge: stored and flagged).
            var tasks = CliProcess.RunProgram("scontrol", Short, "show", "job", job, "-o");
            var exitCodes = tasks.Output.Split('\n', StringSplitOptions.RemoveEmptyEntries)
                .Select(line => line.Split(' ').First(f => f.StartsWith("ExitCode=", StringComparison.Ordinal))["ExitCode=".Length..])
                .ToArray();
            Assert.Equal(Shards, exitCodes.Length);
            Assert.All(exitCodes, c => Assert.True(c is "0:0" or "3:0", "array task exit " + c + "\n" + tasks.Output + Logs(folder)));

            var total = 0;
            var seen = new HashSet<string>();
            for (var k = 0; k < Shards; k++)
            {
                var log = File.ReadAllText(Path.Combine(folder, $"assess-{k}.out"));
                var doc = CliProcess.JsonOf(new CliRun(0, log, ""));
                Assert.True(seen.Add(doc.GetProperty("shard").GetString()!));
                Assert.Equal(0, doc.GetProperty("failed").GetInt32());
                total += doc.GetProperty("components").GetInt32();
            }

            Assert.Equal(Enumerable.Range(0, Shards).Select(k => $"{k}/{Shards}").ToHashSet(), seen);
            Assert.Equal(Components, total);

            var files = Enumerable.Range(0, Shards).Select(k => $"{sharded}.shard-{k}-of-{Shards}.results").ToArray();
            var merge = CliProcess.Run(folder, Short, ["register", "merge", .. files, "-r", sharded, "--json"]);
            Assert.True(merge.ExitCode == 0, merge.Output + merge.Error);
            Assert.Equal(Components, CliProcess.JsonOf(merge).GetProperty("accepted").GetInt32());

            var check = CliProcess.Run(folder, Short, "register", "check", "-r", sharded, "--json");
            Assert.Equal(0, check.ExitCode);
            Assert.Equal(0, CliProcess.JsonOf(check).GetProperty("stale_results").GetArrayLength());

            // Same numbers, same keys: every stored field but the time it was written.
            var expected = Comparable(single);
            var actual = Comparable(sharded);
            Assert.Equal(Components, expected.Length);
            Assert.Equal(expected, actual);
        }
        finally
        {
            try
            {
                Directory.Delete(folder, recursive: true);
            }
            catch (IOException)
            {
                // Left to the OS's temp cleaning.
            }
        }
    }

    /// <summary>Skips with the reason when Slurm is not running here; a running Slurm found by sinfo counts even without the variable.</summary>
    private static void SkipUnlessSlurmIsUp()
    {
        var state = Environment.GetEnvironmentVariable(SlurmVariable);
        if (state == "up") return;
        Skip.If(state is not null, $"Slurm could not start on this machine ({SlurmVariable}={state}).");
        CliRun? sinfo = null;
        try
        {
            sinfo = CliProcess.RunProgram("sinfo", TimeSpan.FromSeconds(20), "-h", "-o", "%t");
        }
        catch (System.ComponentModel.Win32Exception)
        {
            // sinfo is not installed.
        }

        Skip.If(sinfo is null || sinfo.ExitCode != 0 || !sinfo.Output.Split('\n').Any(s => s.Trim() is "idle" or "mix" or "alloc"),
            $"No Slurm running here ({SlurmVariable} is not set and sinfo {(sinfo is null ? "is not installed" : "shows no idle node: " + (sinfo.Output + sinfo.Error).Trim())}); .ci/start-slurm.sh starts a single-node Slurm as root, and .ci/run calls it.");
    }

    private static void WaitForJob(string job, string folder)
    {
        var deadline = DateTime.UtcNow + JobTimeout;
        while (true)
        {
            var queued = CliProcess.RunProgram("squeue", Short, "-h", "-j", job, "-o", "%i %T");
            Assert.True(queued.ExitCode == 0 || queued.Error.Contains("Invalid job id", StringComparison.Ordinal), "squeue failed: " + queued.Error);
            if (queued.Output.Trim().Length == 0) return;
            if (DateTime.UtcNow > deadline)
            {
                CliProcess.RunProgram("scancel", Short, job);
                Assert.Fail($"job array {job} still queued or running after {JobTimeout.TotalMinutes} min:\n{queued.Output}{Logs(folder)}");
            }

            Thread.Sleep(1000);
        }
    }

    private static StoredResult[] Comparable(string register)
    {
        using var store = RegisterStore.Open(register, RegisterOpenMode.OpenExisting);
        return store.Results(withProfiles: true).Select(r => r with { ComputedUtc = default }).ToArray();
    }

    private static string Logs(string folder) => string.Concat(Directory.GetFiles(folder, "assess-*.*").Order(StringComparer.Ordinal)
        .Select(f => $"\n--- {Path.GetFileName(f)}\n{File.ReadAllText(f)}"));

    private static string Quote(string s) => "'" + s.Replace("'", "'\\''", StringComparison.Ordinal) + "'";

    private static string Invariant(int v) => v.ToString(CultureInfo.InvariantCulture);
}
