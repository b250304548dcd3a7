using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Register;

/// <summary>
/// Parses the post-repair prior stored with a repair: the distributions of the inputs whose state the repair renews.
/// </summary>
/// <remarks>
/// Format: <c>{"inputs": {"a0_mm": {"family": "lognormal", "mean": 0.2, "sd": 0.1}, ...}}</c>: each input names a
/// family and its parameters, spelt as in model files as <see cref="RandomVariableFactory"/> accepts them (normal, lognormal, gumbel, weibull,
/// gamma, exponential, uniform, truncated-normal, beta, deterministic). Input names must match the names of the
/// component model's random inputs; the updating layer checks that against the model. Registers written before the
/// spelling was unified hold <c>"distribution"</c> in place of <c>"family"</c>: such stored rows are still read
/// (<see cref="ParseStored(string)"/>), but a new or corrected prior must say <c>"family"</c>.
/// </remarks>
public static class PostRepairPrior
{
    private const string Root = "post_repair_prior_json";

    /// <summary>Parses the prior; every problem (with its JSON path as the field) is added to <paramref name="problems"/>.</summary>
    /// <returns>The inputs by name (empty when there were problems).</returns>
    public static IReadOnlyDictionary<string, RandomVariable> Parse(string? json, List<ValidationProblem> problems) =>
        Parse(json, problems, acceptOldSpelling: false);

    /// <summary>
    /// Parses a prior as stored in the register, accepting the old key <c>"distribution"</c> for the family (rows
    /// written before the spelling was unified); throws listing every problem.
    /// </summary>
    /// <exception cref="RegisterValidationException">The prior is not valid.</exception>
    public static IReadOnlyDictionary<string, RandomVariable> ParseStored(string json)
    {
        var problems = new List<ValidationProblem>();
        var result = Parse(json, problems, acceptOldSpelling: true);
        return problems.Count > 0 ? throw new RegisterValidationException(problems) : result;
    }

    /// <summary>
    /// Parses a prior carried forward unchanged from a stored row (a correction of a repair's date or description):
    /// the old key <c>"distribution"</c> is accepted there, as on reading.
    /// </summary>
    internal static IReadOnlyDictionary<string, RandomVariable> ParseCarriedForward(string? json, List<ValidationProblem> problems) =>
        Parse(json, problems, acceptOldSpelling: true);

    private static Dictionary<string, RandomVariable> Parse(string? json, List<ValidationProblem> problems, bool acceptOldSpelling)
    {
        ArgumentNullException.ThrowIfNull(problems);
        var result = new Dictionary<string, RandomVariable>(StringComparer.Ordinal);
        var before = problems.Count;
        if (string.IsNullOrWhiteSpace(json))
        {
            problems.Add(new(Root, json, "the post-repair prior is required (use {\"inputs\": {}} when the repair renews nothing)"));
            return result;
        }

        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(json);
        }
        catch (JsonException e)
        {
            problems.Add(new(Root, json.Length > 60 ? json[..57] + "..." : json, "not valid JSON: " + e.Message));
            return result;
        }

        using (document)
        {
            if (document.RootElement.ValueKind != JsonValueKind.Object
                || !document.RootElement.TryGetProperty("inputs", out var inputs) || inputs.ValueKind != JsonValueKind.Object)
            {
                problems.Add(new(Root, null, "expected an object with an \"inputs\" object"));
                return result;
            }

            foreach (var input in inputs.EnumerateObject())
            {
                var path = $"{Root}.inputs.{input.Name}";
                if (input.Value.ValueKind != JsonValueKind.Object)
                {
                    problems.Add(new(path, input.Value.ToString(), "each input must be an object with \"family\" and its parameters"));
                    continue;
                }

                var variable = ParseVariable(input.Name, input.Value, path, problems, acceptOldSpelling);
                if (variable is not null)
                {
                    result[input.Name] = variable;
                }
            }
        }

        return problems.Count > before ? new Dictionary<string, RandomVariable>() : result;
    }

    /// <summary>Parses the prior or throws listing every problem.</summary>
    /// <exception cref="RegisterValidationException">The prior is not valid.</exception>
    public static IReadOnlyDictionary<string, RandomVariable> Parse(string json)
    {
        var problems = new List<ValidationProblem>();
        var result = Parse(json, problems);
        return problems.Count > 0 ? throw new RegisterValidationException(problems) : result;
    }

    private static RandomVariable? ParseVariable(string name, JsonElement e, string path, List<ValidationProblem> problems, bool acceptOldSpelling)
    {
        string? family = null;
        var familyKey = "family";
        var parameters = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        var ok = true;
        foreach (var p in e.EnumerateObject())
        {
            if (p.NameEquals("family") || (acceptOldSpelling && p.NameEquals("distribution")))
            {
                familyKey = p.Name;
                family = p.Value.ValueKind == JsonValueKind.String ? p.Value.GetString() : null;
                if (family is null)
                {
                    problems.Add(new($"{path}.{p.Name}", p.Value.ToString(), "the family must be a text, one of " + string.Join(", ", RandomVariableFactory.Families)));
                    ok = false;
                }
            }
            else if (p.NameEquals("distribution"))
            {
                problems.Add(new($"{path}.distribution", p.Value.ToString(),
                    "the key is \"family\" (as in model files), not \"distribution\": write {\"family\": \"" + p.Value.ToString() + "\", ...}"));
                ok = false;
            }
            else if (p.NameEquals("note") && p.Value.ValueKind == JsonValueKind.String)
            {
                // free text, as in model files: where the numbers come from
            }
            else if (p.Value.ValueKind == JsonValueKind.Number)
            {
                parameters[p.Name] = p.Value.GetDouble();
            }
            else
            {
                problems.Add(new($"{path}.{p.Name}", p.Value.ToString(), "must be a number"));
                ok = false;
            }
        }

        if (!ok)
        {
            return null;
        }

        if (string.IsNullOrWhiteSpace(family))
        {
            problems.Add(new($"{path}.family", family, "the family is required, one of " + string.Join(", ", RandomVariableFactory.Families)));
            return null;
        }

        if (!ok)
        {
            return null;
        }

        try
        {
            return RandomVariableFactory.Create(name, family, parameters);
        }
        catch (DistributionParameterException ex)
        {
            var field = ex.ParamName switch
            {
                "family" => $"{path}.{familyKey}",
                "parameters" or null => path,
                { } other => $"{path}.{other}",
            };
            var value = ex.ParamName == "family" ? family : double.IsNaN(ex.Value) ? null : ex.Value.ToString("R", CultureInfo.InvariantCulture);
            problems.Add(new(field, value, ex.Message));
            return null;
        }
    }
}
