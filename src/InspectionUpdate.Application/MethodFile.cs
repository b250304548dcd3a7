using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Inspection;
using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>The method file (format inspection-update/method/1, docs/formats.md).</summary>
public static class MethodFile
{
    /// <summary>The format name a method file states.</summary>
    public const string FormatName = "inspection-update/method/1";

    private static readonly string[] RootKeys = ["format", "description", "pod", "sizing"];
    private static readonly string[] PodKeys = ["form", "mu_ln_mm", "sigma_ln", "lambda_mm", "lower_limit_mm", "max_pod", "false_call_probability"];
    private static readonly string[] SizingKeys = ["kind", "bias", "sd"];

    /// <summary>
    /// Reads a method file; every problem is listed with its field and value: unknown or duplicate fields, wrong
    /// types, missing values (nothing is ignored or silently replaced).
    /// </summary>
    public static NewMethod Read(string path, string name)
    {
        if (!File.Exists(path)) throw ApplicationFailureException.BadInput("--file", path, "does not exist.");
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(File.ReadAllText(path));
        }
        catch (JsonException e)
        {
            throw ApplicationFailureException.BadInput("--file", path, string.Create(CultureInfo.InvariantCulture,
                $"is not valid JSON (line {e.LineNumber + 1}, byte {e.BytePositionInLine + 1}): {e.Message.Split(" Path:")[0].Split(" LineNumber:")[0]}"));
        }

        using (document)
        {
            var bounds = new List<DefinitionProblem>();
            JsonInputBounds.Check(document.RootElement, "$", bounds);
            var problems = bounds.Select(b => new ValidationProblem(b.Path.TrimStart('$', '.'), b.Value, b.Message)).ToList();
            if (problems.Count > 0) throw Registers.Problems("method file " + Path.GetFileName(path), problems);
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object) throw Registers.Problems("method file " + Path.GetFileName(path), [new("(file)", Render(root), "must be a JSON object")]);
            Keys(root, "", RootKeys, problems);
            var format = Text(root, "format", "", problems);
            if (format != FormatName) problems.Add(new("format", format, $"must be {FormatName}"));
            var description = Text(root, "description", "", problems);
            var pod = Section(root, "pod", PodKeys, problems);
            var sizing = Section(root, "sizing", SizingKeys, problems);
            var form = pod is { } p ? Text(p, "form", "pod.", problems) : null;
            if (form is null) problems.Add(new("pod.form", null, $"is required ({PodForms.LogLogistic}, {PodForms.CumulativeLognormal} or {PodForms.Exponential})"));
            var kindText = sizing is { } sz ? Text(sz, "kind", "sizing.", problems) : null;
            var kind = kindText switch
            {
                "additive-normal" => SizingErrorKind.AdditiveNormal,
                "multiplicative-lognormal" => SizingErrorKind.MultiplicativeLognormal,
                var k => Bad(problems, "sizing.kind", k, "must be additive-normal or multiplicative-lognormal"),
            };
            double? N(JsonElement? o, string key, string prefix) => o is { } e ? Number(e, key, prefix, problems) : null;
            var sd = N(sizing, "sd", "sizing.");
            if (sizing is { } s2 && !s2.TryGetProperty("sd", out _)) problems.Add(new("sizing.sd", null, "is required"));
            var spec = new PodSpec(form ?? string.Empty, N(pod, "mu_ln_mm", "pod."), N(pod, "sigma_ln", "pod."), N(pod, "lambda_mm", "pod."),
                N(pod, "lower_limit_mm", "pod.") ?? 0, N(pod, "max_pod", "pod.") ?? 1, N(pod, "false_call_probability", "pod.") ?? 0);
            var bias = N(sizing, "bias", "sizing.") ?? 0;
            if (problems.Count > 0) throw Registers.Problems("method file " + Path.GetFileName(path), problems);
            return new NewMethod(name, description ?? string.Empty, spec, new SizingError(kind, bias, sd!.Value));
        }
    }

    private static void Keys(JsonElement o, string prefix, string[] allowed, List<ValidationProblem> problems)
    {
        foreach (var p in o.EnumerateObject().Where(p => !allowed.Contains(p.Name)))
            problems.Add(new(prefix + p.Name, Render(p.Value), $"unknown field (allowed here: {string.Join(", ", allowed)})"));
    }

    private static JsonElement? Section(JsonElement root, string key, string[] allowed, List<ValidationProblem> problems)
    {
        if (!root.TryGetProperty(key, out var v))
        {
            problems.Add(new(key, null, "is required"));
            return null;
        }

        if (v.ValueKind != JsonValueKind.Object)
        {
            problems.Add(new(key, Render(v), "must be an object"));
            return null;
        }

        Keys(v, key + ".", allowed, problems);
        return v;
    }

    private static string? Text(JsonElement o, string key, string prefix, List<ValidationProblem> problems)
    {
        if (!o.TryGetProperty(key, out var v)) return null;
        if (v.ValueKind == JsonValueKind.String) return v.GetString();
        problems.Add(new(prefix + key, Render(v), "must be text"));
        return null;
    }

    private static double? Number(JsonElement o, string key, string prefix, List<ValidationProblem> problems)
    {
        if (!o.TryGetProperty(key, out var v) || v.ValueKind == JsonValueKind.Null) return null;
        if (v.ValueKind == JsonValueKind.Number && v.TryGetDouble(out var d) && double.IsFinite(d)) return d;
        problems.Add(new(prefix + key, Render(v), "must be a finite number"));
        return null;
    }

    private static string Render(JsonElement v)
    {
        var text = v.ValueKind == JsonValueKind.String ? v.GetString()! : v.GetRawText();
        return text.Length > 60 ? text[..57] + "..." : text;
    }

    private static SizingErrorKind Bad(List<ValidationProblem> problems, string field, string? value, string message)
    {
        problems.Add(new(field, value, message));
        return SizingErrorKind.AdditiveNormal;
    }
}
