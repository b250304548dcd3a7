using System.Globalization;
using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>Opens the register and turns its failures into <see cref="ApplicationFailureException"/>s naming the field and the value.</summary>
public static class Registers
{
    /// <summary>The post-repair prior that renews nothing beyond the model's own renewed inputs (which restart with their original prior).</summary>
    public const string OriginalPostRepairPrior = "{\"inputs\": {}}";

    /// <summary>
    /// Opens a register; a missing, foreign or newer file is a register failure. The store follows the location: a
    /// <c>postgresql://</c> (or <c>postgres://</c>) URI opens the PostgreSQL store, anything else the SQLite file.
    /// </summary>
    public static IRegister Open(string path, RegisterOpenMode mode, TimeProvider clock)
    {
        try
        {
            return RegisterLocation.Open(path, mode, new RegisterOptions(clock));
        }
        catch (RegisterFileException e)
        {
            throw ApplicationFailureException.Register(e.Message, e);
        }
        catch (System.Data.Common.DbException e)
        {
            throw ApplicationFailureException.Register($"The register '{path}' cannot be used: {e.Message}", e);
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
    public static ApplicationFailureException Problems(string what, IReadOnlyList<ValidationProblem> problems)
    {
        ArgumentNullException.ThrowIfNull(problems);
        var lines = problems.Select(Sentence).ToArray();
        var head = lines.Length == 1 ? $"{what} refused: {lines[0]}" : $"{what} refused with {lines.Length.ToString(CultureInfo.InvariantCulture)} problems; nothing was written.";
        return new ApplicationFailureException(FailureKind.BadInput, head, lines.Length == 1 ? [] : lines);
    }

    /// <summary>One problem as a sentence naming the field and the value.</summary>
    public static string Sentence(ValidationProblem p)
    {
        ArgumentNullException.ThrowIfNull(p);
        return (p.LineNumber is { } line ? $"line {line.ToString(CultureInfo.InvariantCulture)}: " : string.Empty)
            + $"{p.Field} '{p.Value ?? "(missing)"}': {p.Message.TrimEnd('.')}.";
    }

    /// <summary>Recorded instant of "as known on" a date: the end of that day (UTC).</summary>
    public static DateTimeOffset AsKnownOn(DateOnly date) => RegisterStore.EndOfDay(date);

    /// <summary>A component by code, or bad input naming the code.</summary>
    public static Component Component(IRegister store, string code)
    {
        ArgumentNullException.ThrowIfNull(store);
        return store.FindComponent(code) ?? throw ApplicationFailureException.BadInput("component", code, "is not in the register.");
    }

    /// <summary>
    /// A component by code as known on <paramref name="asOf"/> (the date of <paramref name="option"/>). A component
    /// recorded after that date is bad input naming the option, the component, the date and the recording date; an
    /// unknown code names the code.
    /// </summary>
    public static Component Component(IRegister store, string code, DateOnly asOf, string option = "--as-of")
    {
        ArgumentNullException.ThrowIfNull(store);
        if (store.FindComponent(code, AsKnownOn(asOf)) is { } known) return known;
        if (store.FindComponent(code) is not { } later) throw ApplicationFailureException.BadInput("component", code, "is not in the register.");
        var recorded = DateOnly.FromDateTime(later.Recorded.RecordedUtc.UtcDateTime);
        var asOfText = asOf.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        var recordedText = recorded.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        throw ApplicationFailureException.BadInput(option, asOfText,
            $"is before component '{code}' was recorded in the register on {recordedText}: the register as known on {asOfText} does not hold it. Give {option} {recordedText} or later.");
    }
}
