using System.Globalization;
using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>The command line's side of register access: the host's clock, option parsing, who records.</summary>
internal static class RegisterAccess
{
    /// <summary>Opens a register on the host's clock; a missing, foreign or newer file is a register error.</summary>
    public static IRegister Open(CliHost host, string path, RegisterOpenMode mode = RegisterOpenMode.OpenExisting) =>
        Registers.Open(path, mode, host.Clock);

    /// <summary>The written record, or bad input listing every problem.</summary>
    public static T Require<T>(WriteResult<T> result, string what)
        where T : class => Registers.Require(result, what);

    /// <summary>Bad input with one line per problem; the first problem is the headline.</summary>
    public static ApplicationFailureException Problems(string what, IReadOnlyList<ValidationProblem> problems) => Registers.Problems(what, problems);

    /// <summary>Recorded instant of "as known on" a date: the end of that day (UTC).</summary>
    public static DateTimeOffset AsKnownOn(DateOnly date) => Registers.AsKnownOn(date);

    /// <summary>A component by code, or bad input naming the code.</summary>
    public static Component Component(IRegister store, string code) => Registers.Component(store, code);

    /// <summary>
    /// A component by code as known on <paramref name="knownOn"/> (the --known-on date); a component recorded after that
    /// date is bad input naming --known-on (see <see cref="Registers.Component(IRegister, string, DateOnly, string)"/>).
    /// </summary>
    public static Component Component(IRegister store, string code, DateOnly knownOn) => Registers.Component(store, code, knownOn, "--known-on");

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
