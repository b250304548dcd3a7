using InspectionUpdate.Application;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Application;

/// <summary>Whole-register runs: stored results, incremental reruns, shards and merge, stale keys.</summary>
public sealed class PortfolioRunTests
{
    private const int Components = 4;

    /// <summary>Stored results without the time they were written (the only field that may differ between equal runs).</summary>
    private static StoredResult[] Comparable(RegisterStore store) =>
        store.Results(withProfiles: true).Select(r => r with { ComputedUtc = default }).ToArray();

    [Fact]
    [Reference("Design rule (issue 13): a whole-register result equals what assess computes for the component on its own, on the sampled route too, where the run builds no prior set")]
    public void A_sampled_run_stores_the_current_profile_alone_with_the_numbers_of_a_full_assessment()
    {
        using var r = new PortfolioRegister(1);
        var options = PortfolioRegister.Options with { Route = InspectionUpdate.Updating.UpdatingRoute.Auto };
        PortfolioRun.Run(r.Store, r.Store, options);

        var row = Assert.Single(r.Store.Results(withProfiles: true));
        var known = Registers.AsKnownOn(PortfolioRegister.AsOf);
        var context = ComponentContexts.FromRegister(r.Store, r.Store.GetComponent(row.ComponentId, known)!, PortfolioRegister.AsOf);
        var request = ComponentStudy.Request(context, options.AsOf, context.ServiceLifeYears ?? 40, 1, options.Route) with
        {
            Sampling = options.Sampling.For(options.Target),
        };
        Assert.NotEmpty(request.Evidence);
        var outcome = ComponentAssessment.Assess(request, _ => { });
        var current = ComponentStudy.Current(outcome.Current, request.AsOfYears)!;
        Assert.Equal(current.AnnualPf, row.AnnualPf);
        Assert.Equal(current.CumulativePf, row.CumulativePf);
        Assert.Equal(current.Cov, row.Cov);

        // The stored profiles: the updated one, every point equal to the full assessment's; no prior (none was computed).
        using var profiles = System.Text.Json.JsonDocument.Parse(row.ProfilesJson!);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, profiles.RootElement.GetProperty("prior").ValueKind);
        var points = profiles.RootElement.GetProperty("updated").GetProperty("points");
        Assert.Equal(outcome.Updated!.Points.Count, points.GetArrayLength());
        var last = points[points.GetArrayLength() - 1];
        Assert.Equal(outcome.Updated.Points[^1].CumulativePf, last.GetProperty("cumulative_pf").GetDouble());
    }

    [Fact]
    [Reference("Design rule (issue 13): stored results are results, not evidence; each equals what assess computes for the component on its own")]
    public void A_run_stores_one_result_per_component_equal_to_the_single_component_route_and_changes_no_finding()
    {
        using var r = new PortfolioRegister(Components);
        var known = Registers.AsKnownOn(PortfolioRegister.AsOf);
        var fingerprint = r.Store.Fingerprint(DateTimeOffset.MaxValue);
        var findings = r.Store.Components().Sum(c => r.Store.Findings(c.Id, includeWithdrawn: true).Count);

        var summary = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);

        Assert.Equal(Components, summary.Components);
        Assert.Equal(Components, summary.Assessed + summary.NotConverged + summary.Failed);
        Assert.Equal(0, summary.Failed);
        var stored = r.Store.Results(withProfiles: true);
        Assert.Equal(Components, stored.Count);
        Assert.Equal(fingerprint, r.Store.Fingerprint(DateTimeOffset.MaxValue));
        Assert.Equal(findings, r.Store.Components().Sum(c => r.Store.Findings(c.Id, includeWithdrawn: true).Count));

        // The same component through the single-component route (context, assess, plan) gives the stored numbers.
        var row = stored[0];
        var context = ComponentContexts.FromRegister(r.Store, r.Store.GetComponent(row.ComponentId, known)!, PortfolioRegister.AsOf);
        var options = PortfolioRegister.Options;
        var request = ComponentStudy.Request(context, options.AsOf, context.ServiceLifeYears ?? 40, 1, options.Route);
        var outcome = ComponentAssessment.Assess(request, _ => { });
        var plan = ComponentAssessment.Plan(request, options.Target, null, _ => { });
        var current = ComponentStudy.Current(outcome.Current, request.AsOfYears)!;
        Assert.Equal(current.AnnualPf, row.AnnualPf);
        Assert.Equal(current.CumulativePf, row.CumulativePf);
        Assert.Equal(current.Beta, row.Beta);
        Assert.Equal(plan.Next.Date, row.NextDue);
        Assert.Equal(context.ComponentFingerprint, row.ComponentFingerprint);
        Assert.Equal(ResultKeys.Compute(row.ModelRevision, row.ComponentFingerprint, row.AsOf, options.OptionsKey, ToolInfo.ResultVersion), row.ResultKey);
        Assert.NotNull(row.ProfilesJson);
        Assert.Empty(StoredResults.Check(r.Store).Stale);
    }

    [Fact]
    [Reference("JCSS Probabilistic Model Code Part 1 (2001), §7, Table 1 (the preset's annual target); design rule (issue 15): the consequence class chooses the target; issue 13: a result's key covers what its numbers depend on")]
    public void A_whole_register_run_plans_a_component_against_its_class_preset_and_a_class_change_recomputes_it()
    {
        const int Few = 2;
        using var r = new PortfolioRegister(Few);
        var code = r.Store.Components().OrderBy(c => c.Code, StringComparer.Ordinal).First().Code;
        var preset = TargetPresetKeys.Resolve("jcss-normal-large");
        Assert.NotEqual(PortfolioRegister.Options.Target.AnnualPf, preset.AnnualPf);
        r.Store.SetConsequenceClass(4, "large consequences (test)", "jcss-normal-large", "test", "class target");
        r.Store.SetComponentConsequence(code, 4, null, "test", "class target");

        PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);

        // The stored due date is the one planned against the class's preset, not the run's target.
        var known = Registers.AsKnownOn(PortfolioRegister.AsOf);
        var component = r.Store.Components().Single(c => c.Code == code);
        var context = ComponentContexts.FromRegister(r.Store, r.Store.GetComponent(component.Id, known)!, PortfolioRegister.AsOf);
        var options = PortfolioRegister.Options;
        var request = ComponentStudy.Request(context, options.AsOf, context.ServiceLifeYears ?? 40, 1, options.Route);
        var byClass = ComponentAssessment.Plan(request, preset, null, _ => { });
        var byRun = ComponentAssessment.Plan(request, options.Target, null, _ => { });
        Assert.NotEqual(byRun.Next.Date, byClass.Next.Date);
        Assert.Equal(byClass.Next.Date, r.Store.Results().Single(x => x.ComponentCode == code).NextDue);

        // Moving the component to another class changes its key: the rerun recomputes it and reuses the other.
        r.Store.SetComponentConsequence(code, 2, null, "test", "class changed");
        var again = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        Assert.Equal(Few - 1, again.Reused);
        Assert.Equal(byRun.Next.Date, r.Store.Results().Single(x => x.ComponentCode == code).NextDue);
    }

    [Fact]
    [Reference("Design rule (issue 13): a rerun recomputes only components whose key changed; --force recomputes all")]
    public void A_rerun_recomputes_only_the_component_whose_findings_changed_and_force_recomputes_all()
    {
        const int Few = 3;
        using var r = new PortfolioRegister(Few);
        PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        var again = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        Assert.Equal(Few, again.Reused);
        Assert.Equal(0, again.Assessed + again.NotConverged + again.Failed);

        var changed = r.Store.Components()[1];
        r.Store.AddFinding(new NewFinding(changed.Code, new DateOnly(2024, 11, 2), FindingKind.NoIndication, "INV-UT", Location: "dig 1"), "tester", "new dig").Require();
        var check = StoredResults.Check(r.Store);
        Assert.Equal(Few, check.Stored);
        Assert.Equal(changed.Code, Assert.Single(check.Stale).ComponentId);
        // The bulk check (one read of the index and fingerprints) gives every row the reason the row-by-row check gives.
        var rows = r.Store.Results();
        Assert.Equal(rows.Select(x => StoredResults.WhyStale(r.Store, x)).ToArray(), StoredResults.WhyStale(r.Store, rows));
        Assert.Single(StoredResults.WhyStale(r.Store, rows), why => why is not null);

        var rerun = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        Assert.Equal(Few - 1, rerun.Reused);
        Assert.Equal(1, rerun.Assessed + rerun.NotConverged);
        Assert.Empty(StoredResults.Check(r.Store).Stale);

        var forced = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options with { Force = true });
        Assert.Equal(0, forced.Reused);
        Assert.Equal(Few, forced.Assessed + forced.NotConverged);
    }

    [Fact]
    [Reference("Design rule (issue 13): progress counts every component of the run once, reused ones included, ending at the total")]
    public void A_reruns_progress_counts_reused_components_and_ends_at_the_total()
    {
        const int Few = 3;
        using var r = new PortfolioRegister(Few);
        PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        var changed = r.Store.Components()[2];
        r.Store.AddFinding(new NewFinding(changed.Code, new DateOnly(2024, 11, 2), FindingKind.NoIndication, "INV-UT", Location: "dig 2"), "tester", "new dig").Require();
        var reports = new List<PortfolioProgress>();
        var rerun = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options, new SyncProgress(reports.Add));

        Assert.Equal(Few - 1, rerun.Reused);
        Assert.Equal(new PortfolioProgress(Few, Few, rerun.Assessed + rerun.NotConverged, Few - 1, 0), reports[^1]);
        Assert.All(reports, p => Assert.Equal(Few - 1, p.Reused));
        // One component is computed, so the workers report once, after the reused ones.
        Assert.Equal([Few - 1, Few], reports.Select(p => p.Done));
    }

    /// <summary>Reports on the calling thread, one at a time (workers report concurrently).</summary>
    private sealed class SyncProgress(Action<PortfolioProgress> report) : IProgress<PortfolioProgress>
    {
        private readonly Lock _gate = new();

        public void Report(PortfolioProgress value)
        {
            lock (_gate) report(value);
        }
    }

    [Fact]
    [Reference("Design rule (issue 13): a sharded run merged equals the single-process run (same numbers, same keys)")]
    public void Four_shards_merged_equal_the_single_process_run()
    {
        using var single = new PortfolioRegister(Components);
        using var sharded = single.Copy();
        PortfolioRun.Run(single.Store, single.Store, PortfolioRegister.Options);

        var files = Enumerable.Range(0, 4).Select(k => PortfolioRegister.TempPath("shard-" + k)).ToArray();
        try
        {
            var total = 0;
            for (var k = 0; k < 4; k++)
            {
                var options = PortfolioRegister.Options with { Shard = new ShardSpec(k, 4) };
                using var file = ShardResultsFile.Create(files[k], new ShardHeader(sharded.Path, options.AsOf, options.OptionsKey, ToolInfo.ResultVersion, k, 4, DateTimeOffset.UtcNow));
                total += PortfolioRun.Run(sharded.Store, file, options).Components;
            }

            Assert.Equal(Components, total);
            var merged = StoredResults.Merge(sharded.Store, files);
            Assert.Empty(merged.Refused);
            Assert.Equal(Components, merged.Accepted);
            Assert.Equal(Comparable(single.Store), Comparable(sharded.Store));
        }
        finally
        {
            foreach (var f in files) PortfolioRegister.Delete(f);
        }
    }

    [Fact]
    [Reference("Design rule (issue 13): the merge refuses results whose keys no longer match the register")]
    public void The_merge_refuses_a_result_whose_component_changed_after_the_shard_ran()
    {
        using var r = new PortfolioRegister(3);
        var file = PortfolioRegister.TempPath("shard");
        try
        {
            var options = PortfolioRegister.Options with { Shard = new ShardSpec(0, 1) };
            using (var shard = ShardResultsFile.Create(file, new ShardHeader(r.Path, options.AsOf, options.OptionsKey, ToolInfo.ResultVersion, 0, 1, DateTimeOffset.UtcNow)))
            {
                PortfolioRun.Run(r.Store, shard, options);
            }

            var changed = r.Store.Components()[0];
            r.Store.AddFinding(new NewFinding(changed.Code, new DateOnly(2024, 11, 2), FindingKind.InService, null, Location: "patrol"), "tester", "line walk").Require();
            var merged = StoredResults.Merge(r.Store, [file]);
            Assert.Equal(2, merged.Accepted);
            var refused = Assert.Single(merged.Refused);
            Assert.Equal(changed.Code, refused.ComponentId);
            Assert.Contains("findings", refused.Reason, StringComparison.Ordinal);
            Assert.DoesNotContain(r.Store.Results(), x => x.ComponentCode == changed.Code);
        }
        finally
        {
            PortfolioRegister.Delete(file);
        }
    }

    [Fact]
    [Reference("Design rule (issue 13): one component's failure never stops the run; the summary gives the reason")]
    public void A_component_whose_model_cannot_be_built_fails_alone_with_its_reason()
    {
        using var r = new PortfolioRegister(2);
        // The register refuses such a model since schema 4; one stored by an earlier program stays readable (marked by
        // the migration), so it is written here as that program wrote it: rows inserted directly.
        using (var connection = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={r.Path};Pooling=False;Foreign Keys=True"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = """
                INSERT INTO component (site_id, code, description, install_date, wall_thickness_mm, recorded_utc, recorded_by)
                  VALUES ((SELECT site_id FROM site WHERE code = 'INV-S001'), 'INV-BROKEN', 'model of an unknown kind', '2010-01-01', 12.7, '2025-01-01T00:00:00.0000000Z', 'earlier program');
                INSERT INTO component_model_revision (component_id, revision, definition_json, model_version, recorded_utc, recorded_by, reason)
                  VALUES ((SELECT component_id FROM component WHERE code = 'INV-BROKEN'), 1, '{"schemaVersion":1,"name":"x","mechanism":{"type":"no-such-mechanism"}}', 'bad-1', '2025-01-01T00:00:00.0000000Z', 'earlier program', 'initial');
                """;
            command.ExecuteNonQuery();
        }

        var summary = PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options);
        Assert.Equal(3, summary.Components);
        Assert.Equal(1, summary.Failed);
        var failure = Assert.Single(summary.Failures);
        Assert.Equal("INV-BROKEN", failure.ComponentId);
        Assert.Contains("mechanism", failure.Reason, StringComparison.Ordinal);
        Assert.Equal(2, summary.Assessed + summary.NotConverged);
        var stored = r.Store.Results().Single(x => x.ComponentCode == "INV-BROKEN");
        Assert.Equal(ResultStatus.Failed, stored.Status);
        Assert.Equal(failure.Reason, stored.Error);
        // Failed components are retried on every run.
        Assert.Equal(1, PortfolioRun.Run(r.Store, r.Store, PortfolioRegister.Options).Failed);
    }
}
