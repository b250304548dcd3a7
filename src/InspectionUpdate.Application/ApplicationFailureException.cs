namespace InspectionUpdate.Application;

/// <summary>What kind of expected failure an application operation met; front ends map it to their own codes.</summary>
public enum FailureKind
{
    /// <summary>Bad input: a missing or malformed file, an unknown component, a field out of range.</summary>
    BadInput,

    /// <summary>The register could not be opened, is of an unknown schema, failed its check, or refused a write.</summary>
    Register,

    /// <summary>The work ran, but a number it must report did not converge.</summary>
    NotConverged,

    /// <summary>The operation needs a part of the engine that this build does not have.</summary>
    NotAvailable,
}

/// <summary>
/// An expected failure of an application operation: one sentence naming the field and the value, the kind of
/// failure, and every problem found when there were several. Front ends print it without a stack trace.
/// </summary>
public sealed class ApplicationFailureException : Exception
{
    /// <summary>Creates the exception.</summary>
    public ApplicationFailureException(FailureKind kind, string message, Exception? inner = null)
        : base(message, inner) => Kind = kind;

    /// <summary>Creates the exception with every problem found (each one sentence naming its field and value).</summary>
    public ApplicationFailureException(FailureKind kind, string message, IReadOnlyList<string> problems)
        : base(message)
    {
        Kind = kind;
        Problems = problems;
    }

    /// <summary>Creates a bad-input exception.</summary>
    public ApplicationFailureException()
        : this(FailureKind.BadInput, "Bad input.")
    {
    }

    /// <summary>Creates a bad-input exception.</summary>
    public ApplicationFailureException(string message)
        : this(FailureKind.BadInput, message)
    {
    }

    /// <summary>Creates a bad-input exception.</summary>
    public ApplicationFailureException(string message, Exception inner)
        : this(FailureKind.BadInput, message, inner)
    {
    }

    /// <summary>The kind of failure.</summary>
    public FailureKind Kind { get; }

    /// <summary>Every problem found, when there were several.</summary>
    public IReadOnlyList<string> Problems { get; } = [];

    /// <summary>The message followed by every problem, on one line.</summary>
    public string FullText => Message + (Problems.Count > 0 ? " " + string.Join(" ", Problems) : string.Empty);

    /// <summary>Bad input naming the field and the value.</summary>
    public static ApplicationFailureException BadInput(string field, object? value, string why) =>
        new(FailureKind.BadInput, $"{field} '{value}' {why}");

    /// <summary>A register failure.</summary>
    public static ApplicationFailureException Register(string message, Exception? inner = null) => new(FailureKind.Register, message, inner);
}
