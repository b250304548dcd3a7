using InspectionUpdate.Application;
using InspectionUpdate.Register;
using Spectre.Console;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>
/// Everything a command may touch outside its arguments: the output console, the error writer, the clock and the
/// working folder. Tests build one over string writers and run commands in process.
/// </summary>
public sealed class CliHost
{
    /// <summary>Creates a host.</summary>
    /// <param name="console">Where tables and text go.</param>
    /// <param name="rawOut">The same output as a plain writer, for JSON (never wrapped or styled).</param>
    /// <param name="error">Where error sentences go.</param>
    /// <param name="showProgress">False when output is redirected: no progress bars then.</param>
    /// <param name="today">Today's date (the default evidence date).</param>
    /// <param name="workingDirectory">Folder that relative paths are resolved against.</param>
    /// <param name="clock">Clock of recorded times in the register; the system clock when null.</param>
    public CliHost(IAnsiConsole console, TextWriter rawOut, TextWriter error, bool showProgress, Func<DateOnly> today, string workingDirectory, TimeProvider? clock = null)
    {
        Clock = clock ?? TimeProvider.System;
        Console = console;
        RawOut = rawOut;
        Error = error;
        ShowProgress = showProgress;
        Today = today;
        WorkingDirectory = workingDirectory;
    }

    /// <summary>The styled console.</summary>
    public IAnsiConsole Console { get; }

    /// <summary>Plain writer to the same output, for JSON.</summary>
    public TextWriter RawOut { get; }

    /// <summary>Error writer (standard error).</summary>
    public TextWriter Error { get; }

    /// <summary>Whether progress bars may be drawn.</summary>
    public bool ShowProgress { get; }

    /// <summary>Today's date.</summary>
    public Func<DateOnly> Today { get; }

    /// <summary>Clock of the times the register records.</summary>
    public TimeProvider Clock { get; }

    /// <summary>Working folder.</summary>
    public string WorkingDirectory { get; }

    /// <summary>The host of the real process: colours and progress only on a terminal.</summary>
    public static CliHost FromProcess()
    {
        var redirected = System.Console.IsOutputRedirected;
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(System.Console.Out),
            Ansi = redirected ? AnsiSupport.No : AnsiSupport.Detect,
            ColorSystem = redirected ? ColorSystemSupport.NoColors : ColorSystemSupport.Detect,
            Interactive = redirected ? InteractionSupport.No : InteractionSupport.Detect,
        });
        // Redirected output has no terminal width: wide enough that tables written to files do not wrap.
        if (redirected) console.Profile.Width = 160;
        return new CliHost(console, System.Console.Out, System.Console.Error, !redirected,
            () => DateOnly.FromDateTime(DateTime.Today), Environment.CurrentDirectory);
    }

    /// <summary>A host writing to <paramref name="output"/> and <paramref name="error"/> with no colour, no progress, a fixed date.</summary>
    public static CliHost ForWriters(TextWriter output, TextWriter error, DateOnly today, string workingDirectory)
    {
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(output),
            Ansi = AnsiSupport.No,
            ColorSystem = ColorSystemSupport.NoColors,
            Interactive = InteractionSupport.No,
        });
        console.Profile.Width = 160;
        return new CliHost(console, output, error, false, () => today, workingDirectory, new FixedClock(today));
    }

    /// <summary>The same host with another register clock (the demo and what-if registers record at their evidence date).</summary>
    public CliHost WithClock(TimeProvider clock) => new(Console, RawOut, Error, ShowProgress, Today, WorkingDirectory, clock);

    /// <summary>An absolute path for a user-given one.</summary>
    /// <remarks>
    /// A PostgreSQL register URI (postgresql://, postgres://) is returned as it is; one with a password is refused:
    /// a command-line argument shows in ps (use PGPASSWORD, ~/.pgpass, or the URI in INSPECTION_UPDATE_REGISTER).
    /// </remarks>
    public string Resolve(string path)
    {
        if (!RegisterLocation.IsPostgres(path)) return Path.GetFullPath(path, WorkingDirectory);
        if (RegisterStore.UriHasPassword(path))
        {
            throw new CliException("A register URI on the command line must not carry a password (ps shows the command line to every user): use PGPASSWORD, ~/.pgpass, or put the URI in INSPECTION_UPDATE_REGISTER.");
        }

        return path;
    }
}
