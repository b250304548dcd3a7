using Spectre.Console;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>Runs long work with a progress bar on a terminal and silently when output is redirected or JSON.</summary>
internal static class ProgressRunner
{
    /// <summary>Runs <paramref name="work"/>; it reports progress as a fraction in [0, 1] through its argument.</summary>
    public static T Run<T>(CliHost host, bool quiet, string description, Func<Action<double>, T> work)
    {
        if (quiet || !host.ShowProgress) return work(_ => { });
        T result = default!;
        host.Console.Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new ElapsedTimeColumn())
            .Start(ctx =>
            {
                var task = ctx.AddTask(Markup.Escape(description), maxValue: 1.0);
                result = work(f => task.Value = Math.Clamp(f, 0, 1));
                task.Value = 1.0;
            });
        return result;
    }
}
