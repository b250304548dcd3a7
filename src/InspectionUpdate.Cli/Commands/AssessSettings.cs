using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>assess</c>: a component of the register, or a model file with an optional findings file.</summary>
public class AssessSettings : SampledSettings
{
    /// <summary>Component of the register.</summary>
    [CommandArgument(0, "[COMPONENT]")]
    [Description("Component identifier in the register (leave out with --model).")]
    public string? Component { get; init; }

    /// <summary>Help of --as-of (assess, plan, report).</summary>
    public const string AsOfHelp =
        "Evidence up to this date (ISO 8601, default today): inspections and repairs dated after it are left out, and the profile's 'now' is this date. Which records count is set by --known-on.";

    /// <summary>Help of --known-on (assess, plan, report).</summary>
    public const string KnownOnHelp =
        "The register as it was recorded on this date (ISO 8601, default today): components, model revisions, methods, findings, corrections and repairs recorded after it are left out, so an earlier result is reproduced. A component recorded after it is refused.";

    /// <summary>Register date.</summary>
    [CommandOption("--known-on <DATE>")]
    [Description(KnownOnHelp)]
    public string? KnownOn { get; init; }

    /// <summary>Model file route.</summary>
    [CommandOption("--model <FILE>")]
    [Description("Run on a component model file instead of the register (what-if studies).")]
    public string? Model { get; init; }

    /// <summary>Findings beside the model file.</summary>
    [CommandOption("--findings <FILE>")]
    [Description("Findings file (CSV) for --model; default: <model>.findings.csv beside the model when it exists.")]
    public string? Findings { get; init; }

    /// <summary>Date of entry into service for --model.</summary>
    [CommandOption("--in-service <DATE>")]
    [Description("With --model: the date the component entered service (needed when there are findings).")]
    public string? InService { get; init; }

    /// <summary>Updating route.</summary>
    [CommandOption("--route <ROUTE>")]
    [Description("Route: auto (one weighted sample set per component, first order below its resolution and as a cross-check), first-order (fast estimate) or simulation (the sample set alone).")]
    [DefaultValue("auto")]
    public string Route { get; init; } = "auto";

    /// <summary>Evidence date.</summary>
    [CommandOption("--as-of <DATE>")]
    [Description(AsOfHelp)]
    public string? AsOf { get; init; }

    /// <summary>Profile horizon.</summary>
    [CommandOption("--horizon-years <YEARS>")]
    [Description("Profile horizon and end of service in years since entry into service (default: the model's service life, else 40).")]
    public double? HorizonYears { get; init; }

    /// <summary>The horizon: the option, else the model's service life, else 40 years.</summary>
    public double Horizon(double? serviceLifeYears) => HorizonYears ?? serviceLifeYears ?? 40;

    /// <summary>Grid steps per year.</summary>
    [CommandOption("--steps-per-year <N>")]
    [Description("Grid steps per year, 1 to 12 (1 gives annual failure probabilities).")]
    [DefaultValue(1)]
    public int StepsPerYear { get; init; } = 1;

    /// <inheritdoc />
    public override ValidationResult Validate()
    {
        if (Model is null && Component is null) return ValidationResult.Error("Name a COMPONENT of the register or give --model FILE.");
        if (Model is not null && Component is not null) return ValidationResult.Error($"Give either COMPONENT '{Component}' or --model '{Model}', not both.");
        if (HorizonYears is { } h && (!(h > 0) || !double.IsFinite(h))) return ValidationResult.Error($"--horizon-years '{HorizonYears?.ToString(CultureInfo.InvariantCulture)}' must be a positive number of years.");
        if (StepsPerYear is < 1 or > 12) return ValidationResult.Error($"--steps-per-year '{StepsPerYear.ToString(CultureInfo.InvariantCulture)}' must be a whole number from 1 to 12.");
        if (HorizonYears is > 200) return ValidationResult.Error($"--horizon-years '{HorizonYears?.ToString(CultureInfo.InvariantCulture)}' is more than 200 years of service.");
        if (SamplingProblem() is { } sampling) return sampling;
        if (AsOf is not null && !DateOnly.TryParseExact(AsOf, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out _))
        {
            return ValidationResult.Error($"--as-of '{AsOf}' is not an ISO 8601 date (yyyy-MM-dd).");
        }

        if (KnownOn is not null && !DateOnly.TryParseExact(KnownOn, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out _))
        {
            return ValidationResult.Error($"--known-on '{KnownOn}' is not an ISO 8601 date (yyyy-MM-dd).");
        }

        if (KnownOn is not null && Model is not null) return ValidationResult.Error($"--known-on '{KnownOn}' reads the register; it does not apply to --model.");

        return ValidationResult.Success();
    }

    /// <summary>The date the register is read as recorded on (default today).</summary>
    public DateOnly KnownOnDate(CliHost host) =>
        KnownOn is null ? host.Today() : DateOnly.ParseExact(KnownOn, "yyyy-MM-dd", CultureInfo.InvariantCulture);

    /// <summary>The evidence date.</summary>
    public DateOnly AsOfDate(CliHost host) =>
        AsOf is null ? host.Today() : DateOnly.ParseExact(AsOf, "yyyy-MM-dd", CultureInfo.InvariantCulture);
}

/// <summary>Settings of <c>plan</c>.</summary>
public sealed class PlanSettings : AssessSettings
{
    /// <summary>Target annual failure probability.</summary>
    [CommandOption("--target-annual-pf <P>")]
    [Description("Target annual failure probability ΔPf per year, e.g. 1e-4.")]
    public double? TargetAnnualPf { get; init; }

    /// <summary>Target annual reliability index.</summary>
    [CommandOption("--target-beta <BETA>")]
    [Description("Target annual reliability index (instead of --target-annual-pf), e.g. 3.7.")]
    public double? TargetBeta { get; init; }

    /// <summary>Method assumed for planned inspections.</summary>
    [CommandOption("--method <METHOD>")]
    [Description("Inspection method assumed for the planned inspections (default: the last one used).")]
    public string? Method { get; init; }

    /// <summary>The branch plans assume after a detection.</summary>
    [CommandOption("--after-detection <BRANCH>")]
    [Description(AfterDetectionOption.Help)]
    [DefaultValue("monitor")]
    public string AfterDetection { get; init; } = "monitor";

    /// <summary>Skip the life-cycle schedule.</summary>
    [CommandOption("--no-schedule")]
    [Description("Only the next inspection and the remaining life, no life-cycle schedule (faster).")]
    public bool NoSchedule { get; init; }

    /// <inheritdoc />
    public override ValidationResult Validate()
    {
        var baseResult = base.Validate();
        if (!baseResult.Successful) return baseResult;
        if (TargetAnnualPf is not null && TargetBeta is not null) return ValidationResult.Error("Give --target-annual-pf or --target-beta, not both.");
        if (TargetAnnualPf is { } p && !(p > 0 && p < 1)) return ValidationResult.Error($"--target-annual-pf '{p.ToString(CultureInfo.InvariantCulture)}' must be a probability strictly between 0 and 1.");
        if (TargetBeta is { } b && !double.IsFinite(b)) return ValidationResult.Error($"--target-beta '{b.ToString(CultureInfo.InvariantCulture)}' must be a finite number.");
        return ValidationResult.Success();
    }
}

/// <summary>Options of the commands that compute numbers by the sampling route: accuracy and seed.</summary>
public abstract class SampledSettings : RegisterSettings
{
    /// <summary>Target CoV of the sampling route.</summary>
    [CommandOption("--target-cov <COV>")]
    [Description("Sampling route: target coefficient of variation of each cumulative Pf (0.005 to 0.5; default 0.05).")]
    [DefaultValue(0.05)]
    public double TargetCov { get; init; } = 0.05;

    /// <summary>Sample cap of the sampling route.</summary>
    [CommandOption("--max-samples <N>")]
    [Description("Sampling route: largest number of samples per component and set of findings (8000 to 10000000; default 128000).")]
    [DefaultValue(128_000)]
    public int MaxSamples { get; init; } = 128_000;

    /// <summary>Seed of the sampling route.</summary>
    [CommandOption("--seed <N>")]
    [Description("Sampling route: random-number seed (default 1); every number is reproducible from it.")]
    [DefaultValue(1)]
    public int Seed { get; init; } = 1;

    /// <summary>Decision floor of the sampling route.</summary>
    [CommandOption("--decision-floor <P>")]
    [Description("Sampling route: a cumulative Pf whose value plus three standard errors lies below this is converged even above the target CoV (1e-9 to 1e-4; default 1e-5, and a tenth of the target when planning against a lower one).")]
    [DefaultValue(Application.SamplingSettings.DefaultDecisionFloor)]
    public double DecisionFloor { get; init; } = Application.SamplingSettings.DefaultDecisionFloor;

    /// <summary>The sampling settings of the options.</summary>
    public Application.SamplingSettings Sampling() => new(TargetCov, MaxSamples, Seed, DecisionFloor);

    /// <inheritdoc />
    public override ValidationResult Validate() => SamplingProblem() ?? base.Validate();

    /// <summary>The first problem with the sampling options as a validation error, or null.</summary>
    protected ValidationResult? SamplingProblem() =>
        Sampling().Problems() is { Count: > 0 } problems ? ValidationResult.Error(string.Join(" ", problems)) : null;
}

/// <summary>The <c>--after-detection</c> option of plan, report, register assess, register report and serve.</summary>
public static class AfterDetectionOption
{
    /// <summary>Help text.</summary>
    public const string Help = "Branch plans assume after a detection not yet repaired: monitor (the known defect stays in service and is monitored; default) or repair (repaired on detection: the component restarts from its post-repair prior). Changes numbers: part of the stored-results key.";

    /// <summary>Parses the option's value; bad input names the option and the value.</summary>
    public static Planning.AfterDetection Parse(string? value) =>
        Planning.DetectionBranch.TryParse(value, out var branch) ? branch : throw Infrastructure.CliException.BadInput("--after-detection", value, "must be monitor or repair.");
}
