using System.Globalization;
using System.Text.Json;

namespace InspectionUpdate.Degradation.Definition;

/// <summary>
/// Checks a definition's JSON before it is read: every key once per object, text made of whole characters (no lone
/// UTF-16 surrogate), numbers within the range of a double, and sizes within bounds, so that no input makes the
/// reader crash or run for minutes. Each problem names its path. Used for model files and the CLI's other JSON files.
/// </summary>
public static class JsonInputBounds
{
    /// <summary>The most inputs a model may have.</summary>
    public const int MaximumInputs = 200;

    /// <summary>The longest text accepted, in characters.</summary>
    public const int MaximumTextLength = 10_000;

    /// <summary>The most members of one object or elements of one array.</summary>
    public const int MaximumMembers = 5_000;

    /// <summary>Adds a problem for everything out of bounds under <paramref name="e"/> (at most 50 problems).</summary>
    public static void Check(JsonElement e, string path, List<DefinitionProblem> problems)
    {
        if (problems.Count >= 50) return;
        switch (e.ValueKind)
        {
            case JsonValueKind.Object:
                {
                    var count = 0;
                    var seen = new HashSet<string>(StringComparer.Ordinal);
                    foreach (var p in e.EnumerateObject())
                    {
                        if (++count > MaximumMembers)
                        {
                            problems.Add(new(path, null, string.Create(CultureInfo.InvariantCulture, $"more than {MaximumMembers} fields in one object")));
                            return;
                        }

                        string name;
                        try
                        {
                            name = p.Name;
                        }
                        catch (InvalidOperationException)
                        {
                            problems.Add(new(path, null, "a field name holds a lone UTF-16 surrogate (\\uD800–\\uDFFF without its pair), which is not a character"));
                            continue;
                        }

                        var at = $"{path}.{Short(name)}";
                        if (!seen.Add(name))
                        {
                            problems.Add(new(at, null, "duplicate key: the field is given more than once in the same object; give each field once"));
                            continue;
                        }

                        if (name.Length > 200) problems.Add(new(path, Short(name), "a field name longer than 200 characters"));
                        Check(p.Value, at, problems);
                    }

                    if (path == "$.inputs" && count > MaximumInputs)
                    {
                        problems.Add(new(path, count.ToString(CultureInfo.InvariantCulture), string.Create(CultureInfo.InvariantCulture, $"too many inputs: at most {MaximumInputs}")));
                    }

                    break;
                }

            case JsonValueKind.Array:
                {
                    var i = 0;
                    foreach (var item in e.EnumerateArray())
                    {
                        if (i >= MaximumMembers)
                        {
                            problems.Add(new(path, null, string.Create(CultureInfo.InvariantCulture, $"more than {MaximumMembers} elements in one array")));
                            return;
                        }

                        Check(item, string.Create(CultureInfo.InvariantCulture, $"{path}[{i++}]"), problems);
                    }

                    break;
                }

            case JsonValueKind.String:
                try
                {
                    var text = e.GetString()!;
                    if (text.Length > MaximumTextLength)
                    {
                        problems.Add(new(path, Short(text), string.Create(CultureInfo.InvariantCulture, $"text of {text.Length} characters; at most {MaximumTextLength}")));
                    }
                }
                catch (InvalidOperationException)
                {
                    problems.Add(new(path, null, "the text holds a lone UTF-16 surrogate (\\uD800–\\uDFFF without its pair), which is not a character"));
                }

                break;
            case JsonValueKind.Number:
                if (!e.TryGetDouble(out var d) || !double.IsFinite(d))
                {
                    problems.Add(new(path, Short(e.GetRawText()), "the number is beyond the range of a double (about ±1.8e308)"));
                }

                break;
        }
    }

    private static string Short(string s) => s.Length <= 60 ? s : s[..57] + "...";
}
