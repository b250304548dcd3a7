using System.Globalization;
using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>Opens the register and turns its failures into the CLI's exit codes and sentences.</summary>
internal static class RegisterAccess
{
    /// <summary>Opens a register; a missing, foreign or newer file is a register error.</summary>
    public static RegisterStore Open(CliHost host, string path, RegisterOpenMode mode = RegisterOpenMode.OpenExisting)
    {
        try
        {
            return RegisterStore.Open(path, mode, new RegisterOptions(host.Clock));
        }
        catch (RegisterFileException e)
        {
            throw CliException.Register(e.Message, e);
        }
        catch (SqliteException e)
        {
            throw CliException.Register($"The register '{path}' cannot be used: {e.Message}", e);
        }
    }

    /// <summary>The written record, or bad input listing every problem.</summary>
    public static T Require<T>(WriteResult<T> result, string what)
        where T : class
    {
        ArgumentNullException.ThrowIfNull(result);
        if (result.Succeeded) return result.Value!;
        throw Problems(what, result.Problems);
    }

    /// <summary>Bad input with one line per problem; the first problem is the headline.</summary>
    public static CliException Problems(string what, IReadOnlyList<ValidationProblem> problems)
    {
        var lines = problems.Select(Sentence).ToArray();
        var head = lines.Length == 1 ? $"{what} refused: {lines[0]}" : $"{what} refused with {lines.Length.ToString(CultureInfo.InvariantCulture)} problems; nothing was written.";
        return new CliException(ExitCodes.BadInput, head, lines.Length == 1 ? [] : lines);
    }

    /// <summary>One problem as a sentence naming the field and the value.</summary>
    public static string Sentence(ValidationProblem p) =>
        (p.LineNumber is { } line ? $"line {line.ToString(CultureInfo.InvariantCulture)}: " : string.Empty)
        + $"{p.Field} '{p.Value ?? "(missing)"}': {p.Message.TrimEnd('.')}.";

    /// <summary>Recorded instant of "as known on" a date: the end of that day (UTC).</summary>
    public static DateTimeOffset AsKnownOn(DateOnly date) => RegisterStore.EndOfDay(date);

    /// <summary>A component by code, or bad input naming the code.</summary>
    public static Component Component(RegisterStore store, string code) =>
        store.FindComponent(code) ?? throw CliException.BadInput("component", code, "is not in the register.");

    /// <summary>
    /// A component by code as known on <paramref name="asOf"/> (the --known-on date). A component recorded after that
    /// date is bad input naming the component, the as-of date and the recording date; an unknown code names the code.
    /// </summary>
    public static Component Component(RegisterStore store, string code, DateOnly asOf)
    {
        ArgumentNullException.ThrowIfNull(store);
        if (store.FindComponent(code, AsKnownOn(asOf)) is { } known) return known;
        if (store.FindComponent(code) is not { } later) throw CliException.BadInput("component", code, "is not in the register.");
        var recorded = DateOnly.FromDateTime(later.Recorded.RecordedUtc.UtcDateTime);
        var asOfText = asOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        var recordedText = recorded.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        throw CliException.BadInput("--known-on", asOfText,
            $"is before component '{code}' was recorded in the register on {recordedText}: the register as known on {asOfText} does not hold it. Give --known-on {recordedText} or later.");
    }

    /// <summary>Parses an ISO 8601 date option, or bad input naming the option.</summary>
    public static DateOnly Date(string option, string? value)
    {
        if (value is null) throw new CliException($"{option} is missing: give a date as yyyy-MM-dd.");
        return DateOnly.TryParseExact(value, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var d)
            ? d
            : throw CliException.BadInput(option, value, "is not an ISO 8601 date (yyyy-MM-dd).");
    }

    /// <summary>A required text option.</summary>
    public static string Text(string option, string? value) =>
        string.IsNullOrWhiteSpace(value) ? throw new CliException($"{option} is missing.") : value;

    /// <summary>Who records: the option, else the user name of the process.</summary>
    public static string Actor(string? by) => string.IsNullOrWhiteSpace(by) ? Environment.UserName : by;
}
