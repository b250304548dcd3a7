using System.Diagnostics;
using System.Text.Json;
using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// register assess killed with SIGKILL (Process.Kill on Linux) at random moments, in child processes: the register
/// stays consistent after every kill, and a rerun completes the rest with the results of an uninterrupted run.
/// </summary>
public sealed class KilledRunTests
{
    // Enough components that the computing phase spans several of the writer's half-second commit windows even on a
    // fast machine (with 12, the whole first-order run could fit in one window and no kill fell between two commits).
    private const int Components = 24;
    private const int Kills = 50;
    private const int KillsPerRound = 10;
    private const string AsOf = "2025-06-30";
    private static readonly TimeSpan Timeout = TimeSpan.FromMinutes(3);

    private static readonly string[] Assess = ["register", "assess", "-r", "r.register", "--as-of", AsOf, "--route", "first-order", "--parallel", "2", "--json"];

    [Fact]
    [Trait("Category", "ChildProcess")]
    [Reference("SQLite atomic commit (sqlite.org/atomiccommit.html, WAL mode): a killed writer loses only its open transaction; design rule (issue 13): a killed run leaves the register consistent and a rerun completes the rest")]
    public void Killing_register_assess_at_random_moments_leaves_the_register_consistent_and_a_rerun_completes_it_as_an_uninterrupted_run()
    {
        var folder = Path.Combine(Path.GetTempPath(), "iu-kill-" + Guid.NewGuid().ToString("N")[..12]);
        Directory.CreateDirectory(folder);
        try
        {
            var pristine = Path.Combine(folder, "pristine.register");
            var invent = CliProcess.Run(folder, Timeout, "register", "invent", pristine, "--components", Components.ToString(System.Globalization.CultureInfo.InvariantCulture), "--recorded", "2025-01-01");
            Assert.True(invent.ExitCode == 0, invent.Output + invent.Error);

            // The uninterrupted run, timed to spread the kills over a run's length.
            var reference = Path.Combine(folder, "reference");
            Directory.CreateDirectory(reference);
            File.Copy(pristine, Path.Combine(reference, "r.register"));
            var clock = Stopwatch.StartNew();
            var whole = CliProcess.Run(reference, Timeout, Assess);
            var wall = clock.Elapsed.TotalMilliseconds;
            Assert.True(whole.ExitCode is 0 or 3, whole.Output + whole.Error);
            var compute = Math.Min(wall, 1000 * CliProcess.JsonOf(whole).GetProperty("elapsed_seconds").GetDouble());
            var startup = wall - compute;
            var expected = Comparable(Path.Combine(reference, "r.register"));
            Assert.Equal(Components, expected.Length);
            var evidence = Fingerprint(pristine);

            var random = new Random(20261203);
            int killed = 0, endedFirst = 0, rounds = 0, partial = 0;
            // The machine's speed changes under load: a run that ends before its kill shortens the later delays, a kill
            // lengthens them again, so the trials keep falling inside runs whatever the load.
            var scale = 1.0;
            // At least 50 kills; more (up to three times as many) until one has also fallen between two batch commits.
            while (killed < Kills || (partial == 0 && killed < 3 * Kills))
            {
                Assert.True(killed + endedFirst < 10 * Kills, $"only {killed} of {Kills} runs were killed while running ({endedFirst} ended before the kill)");

                // A round: a fresh copy, killed up to ten times (each run going further), then completed by a rerun.
                rounds++;
                var round = Path.Combine(folder, "round-" + rounds);
                Directory.CreateDirectory(round);
                var register = Path.Combine(round, "r.register");
                File.Copy(pristine, register);
                var stored = 0;
                for (var k = 0; k < KillsPerRound && (killed < Kills || (partial == 0 && killed < 3 * Kills)); k++)
                {
                    // A moment between the start and the expected end of what is left to compute.
                    using var run = CliProcess.Start(round, Assess);
                    _ = run.StandardOutput.ReadToEndAsync();
                    _ = run.StandardError.ReadToEndAsync();
                    // Half the trials fall anywhere in the run, half after the start-up, inside the computing phase.
                    var from = random.NextDouble() < 0.5 ? 0 : startup;
                    var delay = TimeSpan.FromMilliseconds(scale * (from + random.NextDouble() * (startup - from + compute * (Components - stored) / Components)));
                    if (run.WaitForExit(delay))
                    {
                        endedFirst++;
                        scale *= 0.6;
                        break; // Ended before the kill: the round is complete.
                    }

                    run.Kill(); // SIGKILL
                    run.WaitForExit();
                    killed++;
                    scale = Math.Min(1, scale * 1.1);
                    stored = AssertConsistent(register, evidence);
                    if (stored > 0 && stored < Components) partial++;
                }

                var rerun = CliProcess.Run(round, Timeout, Assess);
                Assert.True(rerun.ExitCode is 0 or 3, rerun.Output + rerun.Error);
                var doc = CliProcess.JsonOf(rerun);
                Assert.Equal(Components, doc.GetProperty("components").GetInt32());
                Assert.Equal(0, doc.GetProperty("failed").GetInt32());
                AssertConsistent(register, evidence);
                Assert.Equal(expected, Comparable(register));
            }

            // The kills fell between batches as well as before the first: some left a partly stored run behind.
            Assert.True(partial > 0, $"no kill left a partly stored run ({killed} kills, {endedFirst} runs ended first)");
        }
        finally
        {
            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
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

    /// <summary>The register passes its check, no stored result is stale or half-written, no finding changed; returns the stored count.</summary>
    private static int AssertConsistent(string register, string evidence)
    {
        using var store = RegisterStore.Open(register, RegisterOpenMode.OpenExisting);
        var check = store.Check();
        Assert.True(check.IsHealthy, string.Join("; ", [.. check.IntegrityCheck, .. check.ForeignKeyViolations, .. check.InvariantViolations]));
        Assert.Empty(StoredResults.Check(store).Stale);
        Assert.Equal(evidence, store.Fingerprint(DateTimeOffset.MaxValue));
        var rows = store.Results(withProfiles: true);
        foreach (var row in rows)
        {
            Assert.NotEqual(ResultStatus.Failed, row.Status);
            Assert.NotNull(row.AnnualPf);
            Assert.NotNull(row.Beta);
            Assert.NotNull(row.Route);
            Assert.NotNull(row.ProfilesJson);
            using var profiles = JsonDocument.Parse(row.ProfilesJson!); // whole, parseable JSON
        }

        return rows.Count;
    }

    private static string Fingerprint(string register)
    {
        using var store = RegisterStore.Open(register, RegisterOpenMode.OpenExisting);
        return store.Fingerprint(DateTimeOffset.MaxValue);
    }

    private static StoredResult[] Comparable(string register)
    {
        using var store = RegisterStore.Open(register, RegisterOpenMode.OpenExisting);
        return store.Results(withProfiles: true).Select(r => r with { ComputedUtc = default }).ToArray();
    }
}
