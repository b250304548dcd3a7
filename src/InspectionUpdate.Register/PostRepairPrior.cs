using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Register;

/// <summary>
/// Parses the post-repair prior stored with a repair: the distributions of the inputs whose state the repair renews.
/// </summary>
/// <remarks>
/// Format: <c>{"inputs": {"a0_mm": {"distribution": "lognormal", "mean": 0.2, "sd": 0.1}, ...}}</c>. Distributions:
/// "normal" (mean, sd), "lognormal" (mean and sd, or mean and cov, or lambda and zeta of ln X). Input names must match
/// the names of the component model's random inputs; the updating layer checks that against the model.
/// </remarks>
public static class PostRepairPrior
{
    private const string Root = "post_repair_prior_json";

    /// <summary>Parses the prior; every problem (with its JSON path as the field) is added to <paramref name="problems"/>.</summary>
    /// <returns>The inputs by name (empty when there were problems).</returns>
    public static IReadOnlyDictionary<string, RandomVariable> Parse(string? json, List<ValidationProblem> problems)
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
                    problems.Add(new(path, input.Value.ToString(), "each input must be an object with \"distribution\" and its parameters"));
                    continue;
                }

                var variable = ParseVariable(input.Name, input.Value, path, problems);
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

    private static RandomVariable? ParseVariable(string name, JsonElement e, string path, List<ValidationProblem> problems)
    {
        var distribution = e.TryGetProperty("distribution", out var d) && d.ValueKind == JsonValueKind.String ? d.GetString() : null;
        double? Number(string key)
        {
            if (!e.TryGetProperty(key, out var v))
            {
                return null;
            }

            if (v.ValueKind != JsonValueKind.Number)
            {
                problems.Add(new($"{path}.{key}", v.ToString(), "must be a number"));
                return null;
            }

            return v.GetDouble();
        }

        try
        {
            switch (distribution?.ToLowerInvariant())
            {
                case "normal":
                    {
                        var (mean, sd) = (Number("mean"), Number("sd"));
                        if (mean is null || sd is null)
                        {
                            problems.Add(new(path, e.ToString(), "a normal input needs \"mean\" and \"sd\""));
                            return null;
                        }

                        return new NormalVariable(name, mean.Value, sd.Value);
                    }

                case "lognormal":
                    {
                        var (mean, sd, cov, lambda, zeta) = (Number("mean"), Number("sd"), Number("cov"), Number("lambda"), Number("zeta"));
                        if (mean is { } m && sd is { } s)
                        {
                            return LognormalVariable.FromMeanStd(name, m, s);
                        }

                        if (mean is { } m2 && cov is { } v)
                        {
                            return LognormalVariable.FromMeanCov(name, m2, v);
                        }

                        if (lambda is { } l && zeta is { } z)
                        {
                            return LognormalVariable.FromLogParameters(name, l, z);
                        }

                        problems.Add(new(path, e.ToString(), "a lognormal input needs \"mean\" and \"sd\", \"mean\" and \"cov\", or \"lambda\" and \"zeta\""));
                        return null;
                    }

                default:
                    problems.Add(new($"{path}.distribution", distribution, "unknown distribution; expected \"normal\" or \"lognormal\""));
                    return null;
            }
        }
        catch (DistributionParameterException ex)
        {
            problems.Add(new($"{path}.{ex.ParamName}", ex.Value.ToString("R", CultureInfo.InvariantCulture), ex.Message));
            return null;
        }
    }
}
