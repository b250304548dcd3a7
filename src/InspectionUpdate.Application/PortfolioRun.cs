using System.Collections.Concurrent;
using System.Diagnostics;
using System.Text.Json;
using InspectionUpdate.Planning;
using InspectionUpdate.Register;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reporting.Export;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>Settings of a whole-register run.</summary>
/// <param name="AsOf">Evidence date: the register as known at the end of that day; components in service by then.</param>
/// <param name="Target">Annual target for the plan.</param>
/// <param name="Route">Updating route.</param>
/// <param name="HorizonYears">Horizon in years since entry into service; null: the model's service life, else 40.</param>
public sealed record PortfolioOptions(DateOnly AsOf, AnnualTarget Target, UpdatingRoute Route = UpdatingRoute.Auto, double? HorizonYears = null)
{
    /// <summary>Recompute every component even when its stored key still matches.</summary>
    public bool Force { get; init; }

    /// <summary>Accuracy and seed of the sampling route (part of the result key).</summary>
    public SamplingSettings Sampling { get; init; } = SamplingSettings.Default;

    /// <summary>The branch plans assume after a detection (part of the options key: it changes numbers).</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>Only the components of this shard; null: all.</summary>
    public ShardSpec? Shard { get; init; }

    /// <summary>Components computed at once; null: one per processor.</summary>
    public int? Parallelism { get; init; }

    /// <summary>Results written per transaction.</summary>
    public int BatchSize { get; init; } = 64;

    /// <summary>Canonical text of the options that change numbers (<see cref="ResultKeys.Options"/>).</summary>
    public string OptionsKey => ResultKeys.Options(Route, Target, HorizonYears, Sampling, AfterDetection);
}

/// <summary>Progress of a run: components done (computed, reused or failed) out of the total.</summary>
public readonly record struct PortfolioProgress(int Done, int Total, int Computed, int Reused, int Failed);

/// <summary>One component that could not be assessed, and why.</summary>
public sealed record PortfolioFailure(string ComponentId, string Reason);

/// <summary>What a whole-register run did.</summary>
/// <param name="AsOf">Evidence date.</param>
/// <param name="OptionsKey">Options that change numbers.</param>
/// <param name="ToolVersion">Tool version and build in the keys.</param>
/// <param name="Shard">The shard run, or null.</param>
/// <param name="Components">Components of this run (in service by the evidence date, in this shard).</param>
/// <param name="Assessed">Computed, every number converged.</param>
/// <param name="NotConverged">Computed, some number did not converge (stored and flagged).</param>
/// <param name="Reused">Stored result whose key still matched: not recomputed.</param>
/// <param name="Failed">Could not be assessed (stored with the reason; retried on every run).</param>
/// <param name="NotInService">Recorded by the evidence date but entering service later: skipped.</param>
/// <param name="OtherShards">Components of other shards: skipped.</param>
/// <param name="Failures">Each failure with its reason.</param>
/// <param name="Elapsed">Wall time.</param>
public sealed record PortfolioSummary(DateOnly AsOf, string OptionsKey, string ToolVersion, string? Shard, int Components, int Assessed, int NotConverged,
    int Reused, int Failed, int NotInService, int OtherShards, IReadOnlyList<PortfolioFailure> Failures, TimeSpan Elapsed);

/// <summary>
/// Assesses and plans every component of a register as of a date and stores each component's result under its key.
/// Streams: components are loaded one at a time per worker, results go through a bounded queue to one writer that
/// commits them in batches, so memory stays bounded whatever the register size; a killed run keeps every committed
/// batch and a rerun computes only the rest. One component's failure never stops the run.
/// </summary>
public static class PortfolioRun
{
    /// <summary>Runs over <paramref name="store"/>, writing to <paramref name="sink"/> (the register itself, or a shard results file).</summary>
    /// <exception cref="ApplicationFailureException">The sink refused a write (register problem).</exception>
    public static PortfolioSummary Run(IRegister store, IResultSink sink, PortfolioOptions options, IProgress<PortfolioProgress>? progress = null, CancellationToken cancellation = default)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(sink);
        ArgumentNullException.ThrowIfNull(options);
        var clock = Stopwatch.StartNew();
        var snapshot = new RegisterSnapshot(store, options.AsOf);
        var optionsKey = options.OptionsKey;
        var tool = ToolInfo.ResultVersion;
        var index = store.ComponentIndex(snapshot.Known);
        var inShard = index.Where(c => options.Shard is not { } s || s.Contains(c.Code)).ToArray();
        var active = inShard.Where(c => c.InstallDate <= options.AsOf).ToArray();
        var stored = options.Force ? new Dictionary<long, (string Key, ResultStatus Status)>() : store.ResultKeys(options.AsOf, optionsKey);

        // Every key first, from one bulk read of the fingerprints: a component whose stored key still matches is
        // reused without reading anything else of it, and only the rest go to the workers.
        var stamps = store.ComponentFingerprints(snapshot.Known);
        var due = new List<(long Id, string Code, ComponentStamp? Stamp)>();
        var reused = 0;
        foreach (var c in active)
        {
            ComponentStamp? stamp = stamps.TryGetValue(c.Id, out var s) ? s : null;
            if (stamp is { ModelRevision: { } revision } && stored.TryGetValue(c.Id, out var old) && old.Status != ResultStatus.Failed
                && old.Key == ResultKeys.Compute(revision, stamp.Value.Fingerprint, options.AsOf, optionsKey, tool))
            {
                reused++;
            }
            else
            {
                due.Add((c.Id, c.Code, stamp));
            }
        }

        var consequences = due.Count == 0 ? new Dictionary<string, ComponentConsequence>() : OwnerRecords.Consequences(store, snapshot.Known);

        int assessed = 0, notConverged = 0, failed = 0, done = reused;
        if (reused > 0) progress?.Report(new PortfolioProgress(done, active.Length, 0, reused, 0));
        var failures = new ConcurrentBag<PortfolioFailure>();
        var downgraded = new List<ResultStatus>(); // computed results the store refused: counted as failed (writer thread only)
        using var queue = new BlockingCollection<StoredResult>(boundedCapacity: Math.Max(16, options.BatchSize * 4));
        using var stop = CancellationTokenSource.CreateLinkedTokenSource(cancellation);
        Exception? writeFailure = null;
        var writer = Task.Factory.StartNew(() =>
        {
            var batch = new List<StoredResult>(options.BatchSize);
            try
            {
                var since = Stopwatch.StartNew();
                while (!queue.IsCompleted)
                {
                    if (queue.TryTake(out var item, 200))
                    {
                        if (batch.Count == 0) since.Restart();
                        batch.Add(item);
                    }

                    // Commit a full batch, or what has waited half a second: few transactions, little lost to a kill.
                    if (batch.Count >= options.BatchSize || (batch.Count > 0 && since.ElapsedMilliseconds >= 500))
                    {
                        Save(sink, batch, failures, downgraded);
                        batch.Clear();
                    }
                }

                Save(sink, batch, failures, downgraded);
            }
            catch (Exception e) when (e is System.Data.Common.DbException or IOException or InvalidOperationException)
            {
                writeFailure = e;
                stop.Cancel();
            }
        }, TaskCreationOptions.LongRunning);

        void Report(int computed)
        {
            var d = Interlocked.Increment(ref done);
            progress?.Report(new PortfolioProgress(d, active.Length, computed, reused, Volatile.Read(ref failed)));
        }

        try
        {
            Parallel.ForEach(System.Collections.Concurrent.Partitioner.Create(due, System.Collections.Concurrent.EnumerablePartitionerOptions.NoBuffering),
                new ParallelOptions { MaxDegreeOfParallelism = options.Parallelism ?? Environment.ProcessorCount, CancellationToken = stop.Token },
                entry =>
                {
                    var result = One(snapshot, entry.Id, entry.Code, entry.Stamp?.Fingerprint, options, optionsKey, tool, consequences);
                    _ = result.Status switch
                    {
                        ResultStatus.Assessed => Interlocked.Increment(ref assessed),
                        ResultStatus.NotConverged => Interlocked.Increment(ref notConverged),
                        _ => Interlocked.Increment(ref failed),
                    };
                    if (result.Status == ResultStatus.Failed) failures.Add(new PortfolioFailure(entry.Code, result.Error!));
                    queue.Add(result, stop.Token);
                    Report(Volatile.Read(ref assessed) + Volatile.Read(ref notConverged));
                });
        }
        catch (OperationCanceledException) when (writeFailure is not null)
        {
            // The writer failed: reported below.
        }
        finally
        {
            queue.CompleteAdding();
            writer.Wait(CancellationToken.None);
        }

        if (writeFailure is not null)
        {
            throw ApplicationFailureException.Register("Writing results failed (every batch committed before stays; rerun to complete): " + writeFailure.Message, writeFailure);
        }

        assessed -= downgraded.Count(d => d == ResultStatus.Assessed);
        notConverged -= downgraded.Count(d => d == ResultStatus.NotConverged);
        failed += downgraded.Count;
        return new PortfolioSummary(options.AsOf, optionsKey, tool, options.Shard?.ToString(), active.Length, assessed, notConverged, reused, failed,
            inShard.Length - active.Length, index.Count - inShard.Length, failures.OrderBy(f => f.ComponentId, StringComparer.Ordinal).ToArray(), clock.Elapsed);
    }

    /// <summary>
    /// Saves a batch; when the store refuses it (a value its constraints reject), saves row by row and stores a
    /// refused row as failed with the reason, so that one component never stops the run.
    /// </summary>
    private static void Save(IResultSink sink, List<StoredResult> batch, ConcurrentBag<PortfolioFailure> failures, List<ResultStatus> downgraded)
    {
        try
        {
            sink.Save(batch);
        }
        catch (System.Data.Common.DbException) when (batch.Count > 1 || batch[0].Status != ResultStatus.Failed)
        {
            foreach (var row in batch)
            {
                try
                {
                    sink.Save([row]);
                }
                catch (System.Data.Common.DbException e) when (row.Status != ResultStatus.Failed)
                {
                    var reason = "result could not be stored: " + e.Message;
                    failures.Add(new PortfolioFailure(row.ComponentCode, reason));
                    downgraded.Add(row.Status);
                    sink.Save([new StoredResult(row.ComponentId, row.ComponentCode, row.SiteCode, row.AsOf, row.OptionsKey, row.ModelRevision, row.ComponentFingerprint,
                        row.ToolVersion, row.ResultKey, ResultStatus.Failed, reason, row.ComputedUtc)]);
                }
            }
        }
    }

    /// <summary>One component whose key changed (or that failed before): its new result (failed with the reason on error).</summary>
    /// <param name="fingerprint">The component's fingerprint from the run's bulk read; read here when null.</param>
    private static StoredResult One(RegisterSnapshot snapshot, long id, string code, string? fingerprint, PortfolioOptions options, string optionsKey, string tool,
        IReadOnlyDictionary<string, ComponentConsequence> consequences)
    {
        var store = snapshot.Store;
        var component = store.GetComponent(id, snapshot.Known)!;
        fingerprint ??= store.ComponentFingerprint(id, snapshot.Known);
        var key = ResultKeys.Compute(component.Model.Revision, fingerprint, options.AsOf, optionsKey, tool);
        var site = snapshot.Sites.FirstOrDefault(s => s.Id == component.SiteId)?.Code ?? "?";
        var row = new StoredResult(id, code, site, options.AsOf, optionsKey, component.Model.Revision, fingerprint, tool, key, ResultStatus.Failed, null, DateTimeOffset.UtcNow);
        try
        {
            // A stored result does not carry the register's fingerprint: the whole register is not hashed for it.
            var context = ComponentContexts.FromRegister(snapshot, component, fingerprint, registerFingerprint: false) with { Consequence = consequences.GetValueOrDefault(code) };
            return Compute(context, options, row);
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            // One component's failure never stops the run: its reason is stored and summarized.
            var reason = e is ApplicationFailureException a ? a.FullText
                : e is ArgumentException or InvalidOperationException or ArithmeticException ? e.Message
                : e.GetType().Name + ": " + e.Message;
            return row with { Error = reason };
        }
    }

    /// <summary>Assess and plan as <c>report</c> does (yearly grid, no schedule), and the numbers a register report needs.</summary>
    internal static StoredResult Compute(ComponentContext context, PortfolioOptions options, StoredResult row)
    {
        var request = ComponentStudy.Request(context, options.AsOf, options.HorizonYears ?? context.ServiceLifeYears ?? 40, 1, options.Route) with
        {
            Sampling = options.Sampling.For(PlanTarget(context, options.Target)),
            AfterDetection = options.AfterDetection,
            PosteriorSummaries = false,
        };
        // The current profile only: the prior of a component with findings is not part of a whole-register result.
        var current = ComponentAssessment.CurrentProfile(request);
        PlanOutcome? plan = request.AsOfYears < request.HorizonYears ? ComponentAssessment.Plan(request, PlanTarget(context, options.Target), null, _ => { }) : null;
        return ToStored(context, request, request.Evidence.Count == 0 ? current : null, request.Evidence.Count == 0 ? null : current, plan, row);
    }

    /// <summary>The target a component is planned against: its consequence class's where the class names one, else the run's.</summary>
    public static AnnualTarget PlanTarget(ComponentContext context, AnnualTarget runTarget)
    {
        ArgumentNullException.ThrowIfNull(context);
        return context.Consequence?.Target ?? runTarget;
    }

    /// <summary>The stored result of an assessment and plan: the numbers a register overview or report needs.</summary>
    internal static StoredResult ToStored(ComponentContext context, AssessmentRequest request, AssessmentOutcome outcome, PlanOutcome? plan, StoredResult row) =>
        ToStored(context, request, outcome.Prior, outcome.Updated, plan, row);

    /// <summary>The stored result from the profiles computed (the prior may be absent where the updated one is there).</summary>
    private static StoredResult ToStored(ComponentContext context, AssessmentRequest request, ReliabilityProfile? prior, ReliabilityProfile? updated, PlanOutcome? plan, StoredResult row)
    {
        var current = ComponentStudy.Current((updated ?? prior)!, request.AsOfYears);
        var converged = (prior?.AllConverged ?? true) && (updated?.AllConverged ?? true) && (plan?.AllConverged ?? true);
        var profiles = JsonSerializer.Serialize(new StoredProfiles(prior is null ? null : ProfileExport.ToExport(prior), updated is null ? null : ProfileExport.ToExport(updated)), ProfileExport.JsonOptions);
        var target = plan?.RemainingLife.UntilAnnualTarget;
        return row with
        {
            Status = converged ? ResultStatus.Assessed : ResultStatus.NotConverged,
            Error = null,
            AnnualPf = current?.AnnualPf,
            AnnualPfYearEnding = current is null ? null : ServiceTime.DateAt(context.InServiceDate, current.TimeYears),
            CumulativePf = current?.CumulativePf,
            Beta = current?.Beta,
            Route = current?.Route,
            Converged = converged,
            Cov = current?.Cov,
            NextDue = plan?.Next.Date,
            NextStatus = plan is null ? null : JsonNamingPolicy.SnakeCaseLower.ConvertName(plan.Next.Status.ToString()),
            YearsToTarget = target is { Reached: true } ? target.RemainingYears : null,
            TargetReached = target?.Reached,
            RemainingLifeYears = plan?.RemainingLife.UntilCumulativeLimit is { Reached: true } life ? life.RemainingYears : null,
            ProfilesJson = profiles,
        };
    }

    /// <summary>The profiles a result stores: a whole-register run stores the current one (updated where there are findings, else the prior); a single component's refresh stores both.</summary>
    private sealed record StoredProfiles(ProfileExportDocument? Prior, ProfileExportDocument? Updated);
}
