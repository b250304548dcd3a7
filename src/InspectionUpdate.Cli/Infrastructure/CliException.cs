namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>
/// An expected failure of a command: printed as one sentence (no stack trace unless --verbose) and mapped to an
/// exit code of <see cref="ExitCodes"/>.
/// </summary>
public sealed class CliException : Exception
{
    /// <summary>Creates the exception.</summary>
    public CliException(int exitCode, string message, Exception? inner = null)
        : base(message, inner) => ExitCode = exitCode;

    /// <summary>Creates the exception with every problem found (each one sentence naming its field and value).</summary>
    public CliException(int exitCode, string message, IReadOnlyList<string> problems)
        : base(message)
    {
        ExitCode = exitCode;
        Problems = problems;
    }

    /// <summary>Creates a bad-input exception.</summary>
    public CliException()
        : this(ExitCodes.BadInput, "Bad input.")
    {
    }

    /// <summary>Creates a bad-input exception.</summary>
    public CliException(string message)
        : this(ExitCodes.BadInput, message)
    {
    }

    /// <summary>Creates a bad-input exception.</summary>
    public CliException(string message, Exception inner)
        : this(ExitCodes.BadInput, message, inner)
    {
    }

    /// <summary>The exit code the process ends with.</summary>
    public int ExitCode { get; }

    /// <summary>Every problem found, when there were several (printed one per line).</summary>
    public IReadOnlyList<string> Problems { get; } = [];

    /// <summary>Bad input naming the field and the value.</summary>
    public static CliException BadInput(string field, object? value, string why) =>
        new(ExitCodes.BadInput, $"{field} '{value}' {why}");

    /// <summary>The command needs something this build does not have.</summary>
    public static CliException NotAvailable(string what) =>
        new(ExitCodes.NotAvailable, $"Not available yet in this build: {what}");

    /// <summary>A register failure.</summary>
    public static CliException Register(string message, Exception? inner = null) => new(ExitCodes.RegisterError, message, inner);
}
