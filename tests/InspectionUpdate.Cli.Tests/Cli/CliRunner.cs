using System.Text.Json;
using InspectionUpdate.Cli;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>Runs inspection-update in process with captured output, a fixed date and a temporary working folder.</summary>
internal sealed class CliRunner : IDisposable
{
    public static readonly DateOnly Today = new(2025, 6, 30);

    public CliRunner()
    {
        Folder = Path.Combine(Path.GetTempPath(), "iu-cli-" + Guid.NewGuid().ToString("N")[..12]);
        Directory.CreateDirectory(Folder);
    }

    public string Folder { get; }

    public string PathOf(string name) => Path.Combine(Folder, name);

    public CliRun Run(params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var code = CliApp.Run(args, CliHost.ForWriters(output, error, Today, Folder));
        return new CliRun(code, output.ToString(), error.ToString());
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Folder, recursive: true);
        }
        catch (IOException)
        {
            // A file still open by SQLite's pool on some platforms: the temp folder is cleaned by the OS later.
        }
    }
}

internal sealed record CliRun(int ExitCode, string Output, string Error)
{
    public JsonElement Json()
    {
        using var doc = JsonDocument.Parse(Output);
        return doc.RootElement.Clone();
    }
}
