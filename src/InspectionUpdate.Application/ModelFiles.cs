using System.Text.Json;

namespace InspectionUpdate.Application;

/// <summary>Reads model files.</summary>
public static class ModelFiles
{
    /// <summary>The file's text, checked to be JSON.</summary>
    public static string Read(string path)
    {
        if (!File.Exists(path)) throw ApplicationFailureException.BadInput("--model", path, "does not exist.");
        var text = File.ReadAllText(path);
        try
        {
            using var _ = JsonDocument.Parse(text);
        }
        catch (JsonException e)
        {
            throw ApplicationFailureException.BadInput("--model", path, "is not valid JSON: " + e.Message);
        }

        return text;
    }

    /// <summary>
    /// The model version recorded when none is given. The model file schema (docs/schema/component-model.schema.json)
    /// has no version field: the version is the user's label of the definition, kept by the register.
    /// </summary>
    public const string DefaultVersion = "1";
}
