using System.Collections.Concurrent;
using System.Threading.Channels;
using InspectionUpdate.Application;

namespace InspectionUpdate.Web;

/// <summary>State of a background run.</summary>
public enum JobState
{
    /// <summary>Waiting for the worker.</summary>
    Queued,

    /// <summary>Running; <see cref="Job.Progress"/> says how far.</summary>
    Running,

    /// <summary>Finished.</summary>
    Done,

    /// <summary>Stopped with an error (<see cref="Job.Error"/>).</summary>
    Failed,
}

/// <summary>One background run: a component's assessment and plan, or a whole-register run.</summary>
public sealed class Job
{
    private double _progress;

    internal Job(string id, string subject, string? key, Action<Job, CancellationToken> work)
    {
        Id = id;
        Subject = subject;
        Key = key;
        Work = work;
    }

    /// <summary>Identifier (random, URL-safe).</summary>
    public string Id { get; }

    /// <summary>Component code, or <see cref="BackgroundRuns.RegisterSubject"/>.</summary>
    public string Subject { get; }

    /// <summary>The result key the run was asked for (component runs), or null.</summary>
    public string? Key { get; }

    /// <summary>State.</summary>
    public JobState State { get; internal set; }

    /// <summary>Fraction done, 0 to 1.</summary>
    public double Progress => Volatile.Read(ref _progress);

    /// <summary>What went wrong, or null.</summary>
    public string? Error { get; internal set; }

    /// <summary>A line about the run's outcome (e.g. the summary of a whole-register run), or null.</summary>
    public string? Note { get; internal set; }

    internal Action<Job, CancellationToken> Work { get; }

    internal void Report(double fraction) => Volatile.Write(ref _progress, Math.Clamp(fraction, 0, 1));
}

/// <summary>
/// Runs assessments in the background, one at a time, so that no page waits on the engine: a page asks for a run,
/// shows its progress and reloads when it is done (a small polling script). A component's run for a key already
/// queued or running is not queued twice.
/// </summary>
public sealed class BackgroundRuns(RegisterHolder register, ResultCache cache, ILogger<BackgroundRuns> log) : BackgroundService
{
    /// <summary>Subject of whole-register runs.</summary>
    public const string RegisterSubject = "(register)";

    private readonly Channel<Job> _channel = Channel.CreateUnbounded<Job>(new UnboundedChannelOptions { SingleReader = true });
    private readonly ConcurrentDictionary<string, Job> _jobs = new(StringComparer.Ordinal);
    private readonly object _gate = new();

    /// <summary>A job by id, or null.</summary>
    public Job? Find(string id) => _jobs.GetValueOrDefault(id);

    /// <summary>The queued or running job of a subject, or null.</summary>
    public Job? Active(string subject) => _jobs.Values.FirstOrDefault(j => j.Subject == subject && j.State is JobState.Queued or JobState.Running);

    /// <summary>The last failed job of a component for <paramref name="key"/>, or null.</summary>
    public Job? Failed(string subject, string key) => _jobs.Values.Where(j => j.Subject == subject && j.Key == key && j.State == JobState.Failed).LastOrDefault();

    /// <summary>Queues the assessment and plan of a component for the key it has now (unless one is queued or running).</summary>
    public Job Component(string code, string key)
    {
        lock (_gate)
        {
            if (_jobs.Values.FirstOrDefault(j => j.Subject == code && j.Key == key && j.State is JobState.Queued or JobState.Running) is { } known) return known;
            return Add(code, key, (job, _) =>
            {
                var options = register.Run;
                var result = ComponentRefresh.Run(register.Store, code, options, register.Options.Schedule, job.Report);
                cache.Put(new CachedResult(result, options.Target.AnnualPf));
            });
        }
    }

    /// <summary>Queues a whole-register run (every component whose stored result no longer matches its key).</summary>
    public Job WholeRegister()
    {
        lock (_gate)
        {
            if (Active(RegisterSubject) is { } known) return known;
            return Add(RegisterSubject, null, (job, cancel) =>
            {
                var summary = PortfolioRun.Run(register.Store, register.Store, register.Run, new SyncProgress(job), cancel);
                job.Note = $"{summary.Components} component(s): {summary.Assessed} assessed, {summary.NotConverged} not converged, {summary.Reused} unchanged, {summary.Failed} failed.";
            });
        }
    }

    private Job Add(string subject, string? key, Action<Job, CancellationToken> work)
    {
        var job = new Job(Guid.NewGuid().ToString("N")[..16], subject, key, work);
        _jobs[job.Id] = job;
        _channel.Writer.TryWrite(job);
        return job;
    }

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        await foreach (var job in _channel.Reader.ReadAllAsync(stoppingToken))
        {
            job.State = JobState.Running;
            try
            {
                // The engine is synchronous and CPU-bound: run it off the request threads.
                // On shutdown the view stops waiting at once; an engine run still going ends with the process.
                await Task.Run(() => job.Work(job, stoppingToken), stoppingToken).WaitAsync(stoppingToken);
                job.Report(1);
                job.State = JobState.Done;
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
            {
                job.Error = "stopped with the web view";
                job.State = JobState.Failed;
                return;
            }
            catch (ApplicationFailureException e)
            {
                job.Error = e.FullText;
                job.State = JobState.Failed;
            }
            catch (Exception e) when (e is not OperationCanceledException)
            {
                // A bug in one run must not stop the view (a background service that throws stops the host): the run
                // is marked failed with the message, and the page shows it.
                log.LogError(e, "Run of {Subject} failed", job.Subject);
                job.Error = e.Message;
                job.State = JobState.Failed;
            }
        }
    }

    /// <summary>Progress reported on the calling thread (Progress&lt;T&gt; would post to the thread pool, out of order).</summary>
    private sealed class SyncProgress(Job job) : IProgress<PortfolioProgress>
    {
        public void Report(PortfolioProgress value) => job.Report(value.Total == 0 ? 1 : value.Done / (double)value.Total);
    }
}
