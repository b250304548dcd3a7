using InspectionUpdate.Application;
using InspectionUpdate.Planning;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Web;

/// <summary>What the web view serves and how it computes: the register and the options that change numbers.</summary>
/// <param name="RegisterPath">The register file (given on the command line only; no request names a file).</param>
public sealed record WebViewOptions(string RegisterPath)
{
    /// <summary>Configuration section read when the web view is started on its own.</summary>
    public const string Section = "WebView";

    /// <summary>Evidence date; null: today (the clock's date, UTC).</summary>
    public DateOnly? AsOf { get; init; }

    /// <summary>Target annual failure probability ΔPf of the plans.</summary>
    public double TargetAnnualPf { get; init; } = 1e-4;

    /// <summary>Updating route.</summary>
    public UpdatingRoute Route { get; init; } = UpdatingRoute.Auto;

    /// <summary>Accuracy and seed of the sampling route.</summary>
    public SamplingSettings Sampling { get; init; } = SamplingSettings.Default;

    /// <summary>The branch plans assume after a detection not yet repaired (default monitor).</summary>
    public AfterDetection AfterDetection { get; init; } = AfterDetection.Monitor;

    /// <summary>Horizon in years since entry into service; null: the model's service life, else 40.</summary>
    public double? HorizonYears { get; init; }

    /// <summary>Also compute each component's life-cycle schedule with its latest method (component pages only; slower).</summary>
    public bool Schedule { get; init; }

    /// <summary>Components computed at once by a whole-register run; null: one per processor.</summary>
    public int? Parallelism { get; init; }

    /// <summary>The run options as of <paramref name="today"/> (when no evidence date is fixed).</summary>
    public PortfolioOptions Run(DateOnly today) =>
        new(AsOf ?? today, AnnualTarget.FromAnnualPf(TargetAnnualPf, AnnualMeasure.IntervalPf), Route, HorizonYears) { Sampling = Sampling, Parallelism = Parallelism, AfterDetection = AfterDetection };

    /// <summary>Reads the options from configuration (WebView:Register, WebView:AsOf, WebView:TargetAnnualPf, WebView:Route); bad values name the key.</summary>
    public static WebViewOptions From(IConfiguration configuration)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        var section = configuration.GetSection(Section);
        var register = section["Register"] ?? configuration["register"];
        if (string.IsNullOrWhiteSpace(register)) throw new InvalidOperationException("WebView:Register is missing: give --register FILE.");
        var options = new WebViewOptions(Path.GetFullPath(register));
        if (section["AsOf"] is { } asOf)
        {
            options = options with
            {
                AsOf = DateOnly.TryParseExact(asOf, "yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture, System.Globalization.DateTimeStyles.None, out var d)
                    ? d : throw new InvalidOperationException($"WebView:AsOf '{asOf}' is not an ISO 8601 date (yyyy-MM-dd)."),
            };
        }

        if (section["AfterDetection"] is { } branch)
        {
            options = options with
            {
                AfterDetection = DetectionBranch.TryParse(branch, out var b) ? b : throw new InvalidOperationException($"WebView:AfterDetection '{branch}' must be monitor or repair."),
            };
        }

        if (section["TargetAnnualPf"] is { } target)
        {
            options = options with
            {
                TargetAnnualPf = double.TryParse(target, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var p) && p > 0 && p < 1
                    ? p : throw new InvalidOperationException($"WebView:TargetAnnualPf '{target}' must be a probability strictly between 0 and 1."),
            };
        }

        if (section["Route"] is { } route)
        {
            options = options with
            {
                Route = route switch
                {
                    "auto" => UpdatingRoute.Auto,
                    "first-order" => UpdatingRoute.FirstOrder,
                    "simulation" => UpdatingRoute.Simulation,
                    _ => throw new InvalidOperationException($"WebView:Route '{route}' must be auto, first-order or simulation."),
                },
            };
        }

        return options;
    }
}
