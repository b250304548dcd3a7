using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Application;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Inspection;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting.Export;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>method add</c>.</summary>
public sealed class MethodAddSettings : RegisterSettings
{
    /// <summary>Method name.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Short name of the method, e.g. UT-AUTO.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Method file.</summary>
    [CommandOption("--file <FILE>")]
    [Description("Method file (JSON: PoD curve and sizing error, see docs/formats.md, \"Method file\").")]
    public string? File { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }
}

/// <summary>Adds a method.</summary>
public sealed class MethodAddCommand(CliHost host) : CliCommand<MethodAddSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodAddSettings settings, CancellationToken cancellation)
    {
        var method = MethodFile.Read(Host.Resolve(RegisterAccess.Text("--file", settings.File)), settings.Id);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var stored = RegisterAccess.Require(store.AddMethod(method, RegisterAccess.Actor(settings.By)), "method add");
        if (settings.Json) WriteJson(MethodRow.From(stored));
        else Line($"Added method {stored.Name}: {MethodRow.From(stored).PodText}.");
        return ExitCodes.Ok;
    }
}

/// <summary>Settings of <c>method correct</c>.</summary>
public sealed class MethodCorrectSettings : ChangeSettings
{
    /// <summary>Method name.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Name of the method to correct (the name is the method's identity: findings name it).")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Method file.</summary>
    [CommandOption("--file <FILE>")]
    [Description("The whole corrected method (JSON: PoD curve and sizing error, see docs/formats.md, \"Method file\"; required).")]
    public string? File { get; init; }
}

/// <summary>Corrects a method's PoD curve, sizing error or description: a new revision with who, when and why.</summary>
public sealed class MethodCorrectCommand(CliHost host) : CliCommand<MethodCorrectSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodCorrectSettings settings, CancellationToken cancellation)
    {
        var reason = RegisterAccess.Text("--reason", settings.Reason);
        var method = MethodFile.Read(Host.Resolve(RegisterAccess.Text("--file", settings.File)), settings.Id);
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
        var stored = RegisterAccess.Require(store.CorrectMethod(method, RegisterAccess.Actor(settings.By), reason), "method correct");
        if (settings.Json) WriteJson(MethodRow.From(store.MethodHistory(stored.Name)[^1]));
        else Line($"Corrected method {stored.Name} (revision {stored.Revision.ToString(CultureInfo.InvariantCulture)}): {MethodRow.From(stored).PodText}. "
            + "Findings with this method are read with these parameters from now on; earlier results are reproduced with --known-on.");
        return ExitCodes.Ok;
    }
}

/// <summary>A method in --json output (<c>revision</c> 1 as first recorded; <c>reason</c> empty except on corrections).</summary>
public sealed record MethodRow(long Id, string Name, string Description, string PodForm, double? PodMuLnMm, double? PodSigmaLn, double? PodLambdaMm,
    double PodLowerLimitMm, double PodMax, double FalseCallProbability, double? A90Mm, string SizingKind, double SizingBias, double SizingSd)
{
    /// <summary>Revision of the parameters (1: as first recorded).</summary>
    public int Revision { get; init; } = 1;

    /// <summary>When this revision was recorded.</summary>
    public DateTimeOffset RecordedUtc { get; init; }

    /// <summary>Who recorded it.</summary>
    public string RecordedBy { get; init; } = string.Empty;

    /// <summary>Why the revision was recorded (corrections only).</summary>
    public string Reason { get; init; } = string.Empty;

    /// <summary>The PoD curve in words.</summary>
    public string PodText => PodForm + (A90Mm is { } a ? $", a90 = {a.ToString("0.###", CultureInfo.InvariantCulture)} mm" : string.Empty);

    internal static MethodRow From(StoredMethod m)
    {
        double? a90;
        try
        {
            a90 = m.Pod.ToCurve().SizeAtPod(0.9);
        }
        catch (ArgumentException)
        {
            a90 = null;
        }

        return new(m.Id, m.Name, m.Description, m.Pod.Form, m.Pod.MuLnMm, m.Pod.SigmaLn, m.Pod.LambdaMm, m.Pod.LowerLimitMm, m.Pod.MaxPod, m.Pod.FalseCallProbability,
            a90 is { } v && double.IsFinite(v) ? v : null,
            m.Sizing.Kind == SizingErrorKind.AdditiveNormal ? "additive-normal" : "multiplicative-lognormal", m.Sizing.Bias, m.Sizing.StandardDeviation)
        {
            Revision = m.Revision,
            RecordedUtc = m.Recorded.RecordedUtc,
            RecordedBy = m.Recorded.RecordedBy,
            Reason = m.Recorded.Reason,
        };
    }
}

/// <summary>Settings of <c>method fit</c>.</summary>
public sealed class MethodFitSettings : RegisterSettings
{
    /// <summary>Method name.</summary>
    [CommandArgument(0, "<ID>")]
    [Description("Name of the method to create.")]
    public string Id { get; init; } = string.Empty;

    /// <summary>Qualification data.</summary>
    [CommandOption("--data <FILE>")]
    [Description("Qualification data (CSV with header): size_mm,detected (1/0) for hit-miss; size_mm,response for signal-response.")]
    public string? Data { get; init; }

    /// <summary>Kind of data.</summary>
    [CommandOption("--kind <KIND>")]
    [Description("hit-miss or signal-response.")]
    [DefaultValue("hit-miss")]
    public string Kind { get; init; } = "hit-miss";

    /// <summary>Link of the hit/miss fit.</summary>
    [CommandOption("--link <LINK>")]
    [Description("hit-miss link: logit (log-logistic curve) or probit (cumulative lognormal curve).")]
    [DefaultValue("logit")]
    public string Link { get; init; } = "logit";

    /// <summary>Decision threshold.</summary>
    [CommandOption("--threshold <VALUE>")]
    [Description("Decision threshold of the signal response (signal-response only).")]
    public double? Threshold { get; init; }

    /// <summary>Sizing error sd.</summary>
    [CommandOption("--sizing-sd-mm <MM>")]
    [Description("Standard deviation of the additive normal sizing error, mm.")]
    public double? SizingSdMm { get; init; }

    /// <summary>Sizing bias.</summary>
    [CommandOption("--sizing-bias-mm <MM>")]
    [Description("Mean of the additive sizing error, mm (default 0).")]
    [DefaultValue(0.0)]
    public double SizingBiasMm { get; init; }

    /// <summary>Only fit, do not store.</summary>
    [CommandOption("--dry-run")]
    [Description("Fit and print, but do not add the method to the register.")]
    public bool DryRun { get; init; }

    /// <summary>Who records it.</summary>
    [CommandOption("--by <WHO>")]
    [Description("Who records it (default: the user name).")]
    public string? By { get; init; }
}

/// <summary>Fits a method from qualification data.</summary>
public sealed class MethodFitCommand(CliHost host) : CliCommand<MethodFitSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodFitSettings settings, CancellationToken cancellation)
    {
        var path = Host.Resolve(RegisterAccess.Text("--data", settings.Data));
        if (!File.Exists(path)) throw CliException.BadInput("--data", path, "does not exist.");
        if (settings.SizingSdMm is not { } sd || !(sd > 0)) throw CliException.BadInput("--sizing-sd-mm", settings.SizingSdMm, "must be given and > 0 mm.");
        var rows = ReadColumns(path, settings.Kind == "signal-response" ? "response" : "detected");
        PodEstimate estimate;
        string diagnostic;
        bool converged;
        switch (settings.Kind)
        {
            case "hit-miss":
                var link = settings.Link switch
                {
                    "logit" => PodLink.Logit,
                    "probit" => PodLink.Probit,
                    _ => throw CliException.BadInput("--link", settings.Link, "must be logit or probit."),
                };
                var hits = rows.Select((r, i) => r.Value switch
                {
                    1 => true,
                    0 => false,
                    _ => throw CliException.BadInput($"detected (line {i + 2})", r.Value, "must be 1 or 0."),
                }).ToArray();
                var fit = Engine(() => PodFitting.FitHitMiss(rows.Select(r => r.SizeMm).ToArray(), hits, link));
                (converged, diagnostic) = (fit.Converged, fit.Diagnostic);
                estimate = fit.Estimate ?? throw new CliException(ExitCodes.NotConverged, "The hit/miss fit did not converge: " + fit.Diagnostic);
                break;
            case "signal-response":
                if (settings.Threshold is not { } threshold) throw new CliException("--threshold is missing: signal-response needs the decision threshold.");
                var sfit = Engine(() => PodFitting.FitSignalResponse(rows.Select(r => r.SizeMm).ToArray(), rows.Select(r => r.Value).ToArray(), new SignalLimits(threshold)));
                (converged, diagnostic) = (sfit.Converged, sfit.Diagnostic);
                estimate = sfit.Estimate ?? throw new CliException(ExitCodes.NotConverged, "The signal-response fit did not converge: " + sfit.Diagnostic);
                break;
            default:
                throw CliException.BadInput("--kind", settings.Kind, "must be hit-miss or signal-response.");
        }

        var method = new NewMethod(settings.Id, $"fitted from {Path.GetFileName(path)} ({settings.Kind}, {rows.Count.ToString(CultureInfo.InvariantCulture)} trials)",
            PodSpec.From(estimate.ToCurve()), new SizingError(SizingErrorKind.AdditiveNormal, settings.SizingBiasMm, sd));
        long? id = null;
        if (!settings.DryRun)
        {
            using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host));
            id = RegisterAccess.Require(store.AddMethod(method, RegisterAccess.Actor(settings.By)), "method fit").Id;
        }

        var result = new MethodFitted(settings.Id, id, settings.Kind, rows.Count, method.Pod.Form, estimate.MuLnMm, estimate.SigmaLn, estimate.A90Mm, estimate.A90At95Mm, converged, diagnostic);
        if (settings.Json) WriteJson(result);
        else
        {
            Table(["quantity", "value"],
            [
                ["method", settings.Id + (settings.DryRun ? " (dry run, not stored)" : string.Empty)],
                ["data", $"{rows.Count} trials, {settings.Kind}"],
                ["PoD form", method.Pod.Form],
                ["μ of ln a (ln mm)", estimate.MuLnMm.ToString("0.####", CultureInfo.InvariantCulture)],
                ["σ of ln a", estimate.SigmaLn.ToString("0.####", CultureInfo.InvariantCulture)],
                ["a90 (mm)", estimate.A90Mm.ToString("0.###", CultureInfo.InvariantCulture)],
                ["a90/95 (mm)", estimate.A90At95Mm.ToString("0.###", CultureInfo.InvariantCulture)],
                ["fit", diagnostic],
            ]);
        }

        return ExitCodes.Ok;
    }

    private static T Engine<T>(Func<T> fit)
    {
        try
        {
            return fit();
        }
        catch (ArgumentException e)
        {
            throw new CliException("The qualification data cannot be fitted: " + e.Message, e);
        }
    }

    private static List<(double SizeMm, double Value)> ReadColumns(string path, string valueColumn)
    {
        var lines = File.ReadAllLines(path).Where(l => !string.IsNullOrWhiteSpace(l)).ToArray();
        if (lines.Length < 2) throw CliException.BadInput("--data", path, "has no data rows.");
        var header = lines[0].Split(',').Select(h => h.Trim()).ToList();
        var si = header.IndexOf("size_mm");
        var vi = header.IndexOf(valueColumn);
        if (si < 0 || vi < 0) throw CliException.BadInput("header", lines[0], $"of {Path.GetFileName(path)} must have the columns size_mm and {valueColumn}.");
        var rows = new List<(double, double)>();
        for (var i = 1; i < lines.Length; i++)
        {
            var cells = lines[i].Split(',');
            if (cells.Length <= Math.Max(si, vi)
                || !double.TryParse(cells[si], NumberStyles.Float, CultureInfo.InvariantCulture, out var size)
                || !double.TryParse(cells[vi], NumberStyles.Float, CultureInfo.InvariantCulture, out var value))
            {
                throw CliException.BadInput($"line {i + 1}", lines[i], $"of {Path.GetFileName(path)} does not hold two numbers size_mm and {valueColumn}.");
            }

            rows.Add((size, value));
        }

        return rows;
    }
}

/// <summary>--json of <c>method fit</c>.</summary>
public sealed record MethodFitted(string Name, long? Id, string Kind, int Trials, string PodForm, double PodMuLnMm, double PodSigmaLn, double A90Mm, double A90At95Mm, bool Converged, string Diagnostic);

/// <summary>Settings of <c>method list</c>.</summary>
public sealed class MethodListSettings : RegisterSettings
{
    /// <summary>Show every revision.</summary>
    [CommandOption("--all-revisions")]
    [Description("Also show each method's earlier parameters (every correction with who, when and why).")]
    public bool AllRevisions { get; init; }
}

/// <summary>Lists methods.</summary>
public sealed class MethodListCommand(CliHost host) : CliCommand<MethodListSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(MethodListSettings settings, CancellationToken cancellation)
    {
        using var store = RegisterAccess.Open(Host, settings.RegisterPath(Host), RegisterOpenMode.OpenExistingToRead);
        var methods = store.Methods();
        var rows = (settings.AllRevisions ? methods.SelectMany(m => store.MethodHistory(m.Name)) : methods).Select(MethodRow.From).ToArray();
        if (settings.Json) WriteJson(new MethodList(rows));
        else
        {
            Table(["method", "rev", "PoD", "sizing error", "description", "reason"], rows.Select(r => (IReadOnlyList<string>)
                [r.Name, r.Revision.ToString(CultureInfo.InvariantCulture), r.PodText, $"{r.SizingKind}, bias {r.SizingBias.ToString(CultureInfo.InvariantCulture)}, sd {r.SizingSd.ToString(CultureInfo.InvariantCulture)}",
                 r.Description, r.Reason.Length == 0 ? "-" : r.Reason]));
        }

        return ExitCodes.Ok;
    }
}

/// <summary>--json of <c>method list</c>.</summary>
public sealed record MethodList(IReadOnlyList<MethodRow> Methods);
