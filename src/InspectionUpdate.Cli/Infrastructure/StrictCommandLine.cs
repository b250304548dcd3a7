using System.Reflection;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>
/// The sentences of strict parsing: an unknown option or an extra argument names the word and the nearest known
/// option (or command) of the command that was being read, so that a misspelt option never runs with a default.
/// </summary>
internal sealed class StrictCommandLine
{
    private readonly Dictionary<string, Type> _commands = new(StringComparer.Ordinal);
    private readonly HashSet<string> _branches = new(StringComparer.Ordinal);

    /// <summary>Records a command at <paramref name="path"/> ("site list", "assess").</summary>
    public void Command<TCommand>(string path) => _commands[path] = typeof(TCommand);

    /// <summary>Records a branch (a noun with verbs).</summary>
    public void Branch(string noun) => _branches.Add(noun);

    /// <summary>The command path given on the command line, or null when none matched.</summary>
    public string? PathOf(IReadOnlyList<string> args)
    {
        if (args.Count == 0) return null;
        if (_branches.Contains(args[0]))
            return args.Count > 1 && _commands.ContainsKey(args[0] + " " + args[1]) ? args[0] + " " + args[1] : null;
        return _commands.ContainsKey(args[0]) ? args[0] : null;
    }

    /// <summary>Every option of the command at <paramref name="path"/>, with dashes ("--as-of", "-r").</summary>
    public IReadOnlyList<string> OptionsOf(string path)
    {
        if (!_commands.TryGetValue(path, out var command)) return [];
        var settings = SettingsType(command);
        if (settings is null) return [];
        var names = new List<string> { "--help", "-h" };
        foreach (var p in settings.GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            if (p.GetCustomAttribute<CommandOptionAttribute>() is not { } o) continue;
            names.AddRange(o.LongNames.Select(n => "--" + n));
            names.AddRange(o.ShortNames.Select(n => "-" + n));
        }

        return names;
    }

    /// <summary>The one-sentence error for a parse failure, naming the word and the nearest known one.</summary>
    public string Sentence(string message, IReadOnlyList<string> args)
    {
        var path = PathOf(args);
        if (Quoted(message, "Unknown option '") is { } option)
        {
            var given = args.FirstOrDefault(a => a.TrimStart('-') == option && a.StartsWith('-')) ?? (option.Length == 1 ? "-" + option : "--" + option);
            var where = path is null ? string.Empty : $" of '{path}'";
            var known = path is null ? [] : OptionsOf(path);
            // A one-letter option is too short to guess from; a long one is compared with the long names.
            var nearest = given.Length <= 2 ? null : Nearest(given, known.Where(k => k.StartsWith("--", StringComparison.Ordinal)));
            return $"Unknown option '{given}'{where}." + (nearest is null ? string.Empty : $" Did you mean '{nearest}'?") + Help(path);
        }

        if (Quoted(message, "Unknown command '") is { } word)
        {
            if (path is not null)
                return $"Unexpected argument '{word}' for '{path}': it takes no more arguments (quote a value with spaces)." + Help(path);
            var candidates = args.Count > 0 && _branches.Contains(args[0])
                ? _commands.Keys.Where(k => k.StartsWith(args[0] + " ", StringComparison.Ordinal)).Select(k => k[(args[0].Length + 1)..])
                : _commands.Keys.Select(k => k.Split(' ')[0]).Distinct();
            var nearest = Nearest(word, candidates);
            return $"Unknown command '{word}'." + (nearest is null ? string.Empty : $" Did you mean '{nearest}'?") + " See inspection-update --help.";
        }

        if (Quoted(message, "Could not match '") is { } extra)
            return $"Unexpected argument '{extra}'" + (path is null ? string.Empty : $" for '{path}'") + ": it takes no more arguments (quote a value with spaces)." + Help(path);

        return message;
    }

    private static string Help(string? path) => path is null ? string.Empty : $" See inspection-update {path} --help.";

    private static string? Quoted(string message, string prefix)
    {
        if (!message.StartsWith(prefix, StringComparison.Ordinal)) return null;
        var end = message.IndexOf('\'', prefix.Length);
        return end < 0 ? null : message[prefix.Length..end];
    }

    private static Type? SettingsType(Type command)
    {
        for (var t = command; t is not null; t = t.BaseType)
            if (t.IsGenericType && t.GetGenericTypeDefinition() == typeof(Command<>)) return t.GetGenericArguments()[0];
        return null;
    }

    /// <summary>The candidate nearest to <paramref name="word"/> in edit distance, when near enough to be a slip.</summary>
    internal static string? Nearest(string word, IEnumerable<string> candidates)
    {
        string? best = null;
        var bestDistance = int.MaxValue;
        foreach (var c in candidates)
        {
            var d = Distance(word, c);
            if (d < bestDistance) (best, bestDistance) = (c, d);
        }

        // A slip: at most a third of the word's letters changed (and at least two allowed for short words).
        var allowed = Math.Max(2, word.TrimStart('-').Length / 3);
        return best is not null && bestDistance <= allowed ? best : null;
    }

    /// <summary>Optimal string alignment distance (Levenshtein with adjacent transpositions).</summary>
    internal static int Distance(string a, string b)
    {
        var d = new int[a.Length + 1, b.Length + 1];
        for (var i = 0; i <= a.Length; i++) d[i, 0] = i;
        for (var j = 0; j <= b.Length; j++) d[0, j] = j;
        for (var i = 1; i <= a.Length; i++)
        {
            for (var j = 1; j <= b.Length; j++)
            {
                var cost = a[i - 1] == b[j - 1] ? 0 : 1;
                d[i, j] = Math.Min(Math.Min(d[i - 1, j] + 1, d[i, j - 1] + 1), d[i - 1, j - 1] + cost);
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1]) d[i, j] = Math.Min(d[i, j], d[i - 2, j - 2] + 1);
            }
        }

        return d[a.Length, b.Length];
    }
}
