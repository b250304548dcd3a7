using System.ComponentModel;
using System.Globalization;
using System.Net;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using InspectionUpdate.Web;
using Microsoft.Extensions.Hosting;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>serve</c>.</summary>
public sealed class ServeSettings : SampledSettings
{
    /// <summary>The branch plans assume after a detection.</summary>
    [CommandOption("--after-detection <BRANCH>")]
    [Description(AfterDetectionOption.Help)]
    [DefaultValue("monitor")]
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>Address to listen on.</summary>
    [CommandOption("--listen <ADDRESS>")]
    [Description("IP address to listen on (default 127.0.0.1: this machine only). Any other address lets others on the network read and write the register, and is printed as a warning.")]
    public string? Listen { get; init; }

    /// <summary>Port.</summary>
    [CommandOption("--port <PORT>")]
    [Description("TCP port (default 5080; 0 picks a free one).")]
    [DefaultValue(5080)]
    public int Port { get; init; } = 5080;

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description("Evidence date of every number shown (ISO 8601; default: today, as the clock turns).")]
    public string? AsOf { get; init; }

    /// <summary>Target.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability of the plans and the above-target flag.")]
    [DefaultValue(1e-4)]
    public double TargetAnnualPf { get; init; } = 1e-4;

    /// <summary>Route.</summary>
    [CommandOption("--route <ROUTE>")]
    [Description("Updating route: auto, first-order or simulation.")]
    [DefaultValue("auto")]
    public string Route { get; init; } = "auto";

    /// <summary>Schedules.</summary>
    [CommandOption("--schedule")]
    [Description("Also compute each component's life-cycle schedule with its latest method on the component page (slower).")]
    public bool Schedule { get; init; }
}

/// <summary>Serves the local web view of a register until Ctrl+C.</summary>
public sealed class ServeCommand(CliHost host) : CliCommand<ServeSettings>(host)
{
    /// <summary>The default address: the loopback interface only.</summary>
    public const string DefaultAddress = "127.0.0.1";

    /// <summary>The URL to listen on, and whether it reaches beyond this machine; bad input names --listen or --port.</summary>
    public static (string Url, bool Exposed) Address(string? listen, int port)
    {
        if (port is < 0 or > 65535) throw CliException.BadInput("--port", port, "must be a TCP port from 0 to 65535.");
        var text = string.IsNullOrWhiteSpace(listen) ? DefaultAddress : listen.Trim();
        if (!IPAddress.TryParse(text, out var ip)) throw CliException.BadInput("--listen", text, "is not an IP address (e.g. 127.0.0.1, ::1 or 0.0.0.0).");
        var host = ip.AddressFamily == System.Net.Sockets.AddressFamily.InterNetworkV6 ? "[" + ip + "]" : ip.ToString();
        return (string.Create(CultureInfo.InvariantCulture, $"http://{host}:{port}"), !IPAddress.IsLoopback(ip));
    }

    /// <inheritdoc />
    protected override int Run(ServeSettings settings, CancellationToken cancellation)
    {
        if (!(settings.TargetAnnualPf > 0 && settings.TargetAnnualPf < 0.5)) throw CliException.BadInput("--target-annual-pf", settings.TargetAnnualPf, "must be a probability strictly between 0 and 0.5.");
        var (url, exposed) = Address(settings.Listen, settings.Port);
        var asOf = settings.AsOf is null ? (DateOnly?)null : RegisterAccess.Date("--as-of", settings.AsOf);
        var path = settings.RegisterPath(Host);
        // Refuse a missing, foreign or newer file before listening.
        using (RegisterAccess.Open(Host, path, RegisterOpenMode.OpenExisting))
        {
        }

        var options = new WebViewOptions(path)
        {
            AsOf = asOf,
            TargetAnnualPf = settings.TargetAnnualPf,
            Route = Study.Route(settings.Route),
            Sampling = settings.Sampling(),
            AfterDetection = AfterDetectionOption.Parse(settings.AfterDetection),
            Schedule = settings.Schedule,
        };
        if (exposed)
        {
            Host.Error.WriteLine($"warning: --listen {settings.Listen} serves the register beyond this machine. The view has no sign-in: anyone who reaches {url} can read the register and log, correct and withdraw findings (recorded as the user running this process). Use it only on a network you trust.");
        }

        using var app = WebView.Build([], options, [url], Host.Clock);
        app.StartAsync(cancellation).GetAwaiter().GetResult();
        Line($"Serving {Path.GetFileName(path)} at {string.Join(", ", app.Urls)}/ (press Ctrl+C to stop).");
        Caution();
        app.WaitForShutdownAsync(cancellation).GetAwaiter().GetResult();
        return ExitCodes.Ok;
    }
}
