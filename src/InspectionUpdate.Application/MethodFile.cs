using System.Text.Json;
using InspectionUpdate.Inspection;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting.Export;

namespace InspectionUpdate.Application;

/// <summary>The method file (format inspection-update/method/1, docs/formats.md).</summary>
public static class MethodFile
{
    /// <summary>The format name a method file states.</summary>
    public const string FormatName = "inspection-update/method/1";

    private sealed record FileDoc(string? Format, string? Description, PodDoc? Pod, SizingDoc? Sizing);

    private sealed record PodDoc(string? Form, double? MuLnMm, double? SigmaLn, double? LambdaMm, double? LowerLimitMm, double? MaxPod, double? FalseCallProbability);

    private sealed record SizingDoc(string? Kind, double? Bias, double? Sd);

    /// <summary>Reads a method file; every problem is listed with its field.</summary>
    public static NewMethod Read(string path, string name)
    {
        if (!File.Exists(path)) throw ApplicationFailureException.BadInput("--file", path, "does not exist.");
        FileDoc? doc;
        try
        {
            doc = JsonSerializer.Deserialize<FileDoc>(File.ReadAllText(path), ProfileExport.JsonOptions);
        }
        catch (JsonException e)
        {
            throw ApplicationFailureException.BadInput("--file", path, "is not a valid method file: " + e.Message);
        }

        var problems = new List<ValidationProblem>();
        if (doc?.Format != FormatName) problems.Add(new("format", doc?.Format, $"must be {FormatName}"));
        if (doc?.Pod?.Form is null) problems.Add(new("pod.form", null, $"is required ({PodForms.LogLogistic}, {PodForms.CumulativeLognormal} or {PodForms.Exponential})"));
        var kind = doc?.Sizing?.Kind switch
        {
            "additive-normal" => SizingErrorKind.AdditiveNormal,
            "multiplicative-lognormal" => SizingErrorKind.MultiplicativeLognormal,
            var k => Bad(problems, "sizing.kind", k, "must be additive-normal or multiplicative-lognormal"),
        };
        if (doc?.Sizing?.Sd is null) problems.Add(new("sizing.sd", null, "is required"));
        if (problems.Count > 0) throw Registers.Problems("method file " + Path.GetFileName(path), problems);
        var pod = doc!.Pod!;
        return new NewMethod(name, doc.Description ?? string.Empty,
            new PodSpec(pod.Form!, pod.MuLnMm, pod.SigmaLn, pod.LambdaMm, pod.LowerLimitMm ?? 0, pod.MaxPod ?? 1, pod.FalseCallProbability ?? 0),
            new SizingError(kind, doc.Sizing!.Bias ?? 0, doc.Sizing.Sd!.Value));
    }

    private static SizingErrorKind Bad(List<ValidationProblem> problems, string field, string? value, string message)
    {
        problems.Add(new(field, value, message));
        return SizingErrorKind.AdditiveNormal;
    }
}
