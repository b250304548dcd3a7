using System.Text.Json;
using InspectionUpdate.Application;
using InspectionUpdate.Reporting.Export;
using Spectre.Console;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>
/// Base of every command: runs <see cref="Run"/>, turns expected failures into one sentence and an exit code,
/// and writes JSON errors when --json is given.
/// </summary>
public abstract partial class CliCommand<TSettings> : Command<TSettings>
    where TSettings : CommonSettings
{
    /// <summary>Creates the command on a host.</summary>
    protected CliCommand(CliHost host) => Host = host;

    /// <summary>The host (console, clock, folder).</summary>
    protected CliHost Host { get; }

    /// <summary>The command's work; returns an exit code.</summary>
    protected abstract int Run(TSettings settings, CancellationToken cancellation);

    /// <inheritdoc />
    public sealed override int Execute(CommandContext context, TSettings settings, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(settings);
        try
        {
            return Run(settings, cancellationToken);
        }
        catch (CliException e)
        {
            return Fail(settings, e.ExitCode, e.Message, e, e.Problems);
        }
        catch (ApplicationFailureException e)
        {
            return Fail(settings, ExitCodes.Of(e.Kind), e.Message, e, e.Problems);
        }
        catch (Register.RegisterFileException e)
        {
            return Fail(settings, ExitCodes.RegisterError, e.Message, e);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return Fail(settings, ExitCodes.BadInput, e.Message, e);
        }
        catch (Exception e)
        {
            return Fail(settings, ExitCodes.InternalError, "Internal error: " + e.Message + " (run again with --verbose and report it).", e);
        }
    }

    /// <summary>Writes <paramref name="document"/> as the command's JSON output.</summary>
    protected void WriteJson(object document)
    {
        Host.RawOut.Write(JsonSerializer.Serialize(document, document.GetType(), ProfileExport.JsonOptions));
        Host.RawOut.Write('\n');
        Host.RawOut.Flush();
    }

    /// <summary>Writes one plain line (markup escaped).</summary>
    protected void Line(string text) => Host.Console.MarkupLine(Markup.Escape(text));

    /// <summary>Writes the caution line (results outputs).</summary>
    protected void Caution() => Host.Console.MarkupLine("[italic]" + Markup.Escape(Reporting.Cautions.Line) + "[/]");

    /// <summary>Writes a table.</summary>
    protected void Table(IReadOnlyList<string> headers, IEnumerable<IReadOnlyList<string>> rows, string? title = null)
    {
        var table = new Table().Border(TableBorder.Rounded);
        if (title is not null) table.Title(Markup.Escape(title));
        foreach (var h in headers) table.AddColumn(new TableColumn(Markup.Escape(h)));
        foreach (var r in rows) table.AddRow(r.Select(c => new Text(c)).ToArray<Spectre.Console.Rendering.IRenderable>());
        Host.Console.Write(table);
    }

    private int Fail(TSettings settings, int code, string message, Exception e, IReadOnlyList<string>? problems = null)
    {
        // .NET's "(Parameter 'x')" names an internal parameter, not the user's field: never shown.
        message = NetParameter().Replace(message, string.Empty);
        problems = (problems ?? []).Select(p => NetParameter().Replace(p, string.Empty)).ToArray();
        Host.Error.WriteLine("error: " + message);
        foreach (var p in problems) Host.Error.WriteLine("  " + p);
        if (settings.Verbose) Host.Error.WriteLine(e.ToString());
        if (settings.Json) WriteJson(new ErrorDocument(new ErrorDetail(code, ExitCodes.Name(code), message, problems)));
        return code;
    }

    [System.Text.RegularExpressions.GeneratedRegex(@" ?\(Parameter '[^']*'\)")]
    private static partial System.Text.RegularExpressions.Regex NetParameter();

    private sealed record ErrorDocument(ErrorDetail Error);

    private sealed record ErrorDetail(int ExitCode, string Kind, string Message, IReadOnlyList<string> Problems);
}
