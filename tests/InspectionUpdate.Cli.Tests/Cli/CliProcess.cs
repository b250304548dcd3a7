using System.Diagnostics;
using System.Text.Json;

namespace InspectionUpdate.Tests.Cli;

/// <summary>Runs the built inspection-update as a child process (<c>dotnet inspection-update.dll …</c>).</summary>
internal static class CliProcess
{
    /// <summary>The built command line beside the tests (a referenced executable is copied with its runtime configuration).</summary>
    public static string Dll
    {
        get
        {
            var dll = Path.Combine(AppContext.BaseDirectory, "inspection-update.dll");
            if (!File.Exists(dll) || !File.Exists(Path.ChangeExtension(dll, ".runtimeconfig.json")))
            {
                throw new FileNotFoundException("The built command line (inspection-update.dll with its .runtimeconfig.json) is not beside the tests.", dll);
            }

            return dll;
        }
    }

    /// <summary>The dotnet host running the tests (DOTNET_HOST_PATH, set by the dotnet CLI), else dotnet on the PATH.</summary>
    public static string Dotnet => Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } host && File.Exists(host) ? host : "dotnet";

    /// <summary>Starts <c>dotnet inspection-update.dll ARGS</c> in <paramref name="folder"/> with output redirected.</summary>
    public static Process Start(string folder, params string[] args)
    {
        var info = new ProcessStartInfo(Dotnet)
        {
            WorkingDirectory = folder,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        info.ArgumentList.Add(Dll);
        foreach (var a in args) info.ArgumentList.Add(a);
        info.Environment["DOTNET_CLI_TELEMETRY_OPTOUT"] = "1";
        return Process.Start(info) ?? throw new InvalidOperationException("could not start " + Dotnet);
    }

    /// <summary>Runs to the end (killed after <paramref name="timeout"/>).</summary>
    public static CliRun Run(string folder, TimeSpan timeout, params string[] args)
    {
        using var p = Start(folder, args);
        var output = p.StandardOutput.ReadToEndAsync();
        var error = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(timeout))
        {
            p.Kill(entireProcessTree: true);
            throw new TimeoutException($"inspection-update {string.Join(' ', args)} did not end within {timeout.TotalSeconds} s");
        }

        p.WaitForExit();
        return new CliRun(p.ExitCode, output.Result, error.Result);
    }

    /// <summary>Runs a program (not the command line) to the end and returns its exit code and output.</summary>
    public static CliRun RunProgram(string program, TimeSpan timeout, params string[] args)
    {
        var info = new ProcessStartInfo(program) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in args) info.ArgumentList.Add(a);
        using var p = Process.Start(info) ?? throw new InvalidOperationException("could not start " + program);
        var output = p.StandardOutput.ReadToEndAsync();
        var error = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(timeout))
        {
            p.Kill(entireProcessTree: true);
            throw new TimeoutException($"{program} {string.Join(' ', args)} did not end within {timeout.TotalSeconds} s");
        }

        p.WaitForExit();
        return new CliRun(p.ExitCode, output.Result, error.Result);
    }

    /// <summary>The JSON document of a run, or a failure naming its output.</summary>
    public static JsonElement JsonOf(CliRun run)
    {
        try
        {
            return run.Json();
        }
        catch (JsonException e)
        {
            throw new InvalidOperationException($"not JSON (exit {run.ExitCode}): {run.Output}\n{run.Error}", e);
        }
    }
}
