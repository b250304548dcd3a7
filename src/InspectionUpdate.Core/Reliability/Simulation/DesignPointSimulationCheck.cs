using System.Globalization;

namespace InspectionUpdate.Reliability.Simulation;

/// <summary>Settings of <see cref="DesignPointSimulationCheck"/>. Immutable; validated when a check starts.</summary>
public sealed record DesignPointSimulationCheckOptions
{
    /// <summary>
    /// The importance sampling of the check: target CoV 0.01, at most 200 000 samples, seed 19. At the target, three
    /// standard errors are 3 % of Pf, and with <see cref="Margin"/> 2 % an estimate is flagged once it differs from the
    /// simulation by more than about 5 %, the benchmark suite's pass tolerance for FORM and SORM.
    /// </summary>
    public SamplingOptions Sampling { get; init; } = new() { TargetCoefficientOfVariation = 0.01, MaxSamples = 200_000, Seed = 19 };

    /// <summary>An estimate disagrees when it differs from the simulation by more than this many of its standard errors plus the margin (> 0). Default 3.</summary>
    public double StandardErrors { get; init; } = 3;

    /// <summary>Relative margin added to the standard errors (≥ 0), so that a very precise simulation does not flag differences of no engineering weight. Default 0.02.</summary>
    public double Margin { get; init; } = 0.02;

    /// <summary>The default settings.</summary>
    public static DesignPointSimulationCheckOptions Default { get; } = new();

    /// <summary>Throws when a setting is out of range; the message names the setting and its value.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A setting is out of range.</exception>
    public void Validate()
    {
        ArgumentNullException.ThrowIfNull(Sampling);
        Sampling.Validate();
        if (Sampling.TargetCoefficientOfVariation is null)
        {
            throw new ArgumentOutOfRangeException(nameof(Sampling), "null target CoV",
                "DesignPointSimulationCheckOptions.Sampling.TargetCoefficientOfVariation must be set: the check is judged by reaching it.");
        }

        if (!(double.IsFinite(StandardErrors) && StandardErrors > 0))
            throw new ArgumentOutOfRangeException(nameof(StandardErrors), StandardErrors, "DesignPointSimulationCheckOptions.StandardErrors must be finite and > 0.");
        if (!(double.IsFinite(Margin) && Margin >= 0))
            throw new ArgumentOutOfRangeException(nameof(Margin), Margin, "DesignPointSimulationCheckOptions.Margin must be finite and ≥ 0.");
    }
}

/// <summary>The simulation of a <see cref="DesignPointSimulationCheck"/> and the judgement of estimates against it.</summary>
public sealed record DesignPointSimulationCheckResult
{
    /// <summary>The text every flag of the check starts with.</summary>
    public const string FlagPrefix = "simulation check";

    /// <summary>The importance-sampling estimate at the design point.</summary>
    public required SimulationResult Simulation { get; init; }

    /// <summary>The settings used.</summary>
    public required DesignPointSimulationCheckOptions Options { get; init; }

    /// <summary>
    /// True when the simulation reached its target CoV with a positive estimate, so that it can confirm or contradict
    /// an estimate. When false, the failure domain is not described by the design point (the weights are
    /// heavy-tailed: failure regions far from the design point, or other design points), and no FORM or SORM estimate
    /// at this point is confirmed.
    /// </summary>
    public bool Conclusive => Simulation.Converged && Simulation.FailureProbability > 0 && double.IsFinite(Simulation.CoefficientOfVariation);

    /// <summary>
    /// The flag on an estimate of Pf from the same design point (FORM or a SORM formula), or null when the simulation
    /// confirms it: a flag when the check is not <see cref="Conclusive"/>, or when |estimate − p̂| exceeds
    /// <see cref="DesignPointSimulationCheckOptions.StandardErrors"/> standard errors plus
    /// <see cref="DesignPointSimulationCheckOptions.Margin"/>·p̂. A non-finite estimate is not judged (null).
    /// </summary>
    public string? Flag(double estimate)
    {
        if (!double.IsFinite(estimate)) return null;
        var s = Simulation;
        if (!Conclusive)
        {
            return string.Create(CultureInfo.InvariantCulture,
                $"{FlagPrefix}: not confirmed; importance sampling at the design point reached CoV {s.CoefficientOfVariation:0.###} (target {Options.Sampling.TargetCoefficientOfVariation:0.###}) after {s.Samples} samples with Pf {s.FailureProbability:G3}: the design point does not describe the failure domain (heavy-tailed weights, other failure regions); use subset simulation or crude Monte Carlo.");
        }

        var se = s.StandardError;
        var allowed = Options.StandardErrors * se + Options.Margin * s.FailureProbability;
        var difference = estimate - s.FailureProbability;
        if (Math.Abs(difference) <= allowed) return null;
        return string.Create(CultureInfo.InvariantCulture,
            $"{FlagPrefix}: disagrees with simulation; importance sampling at the design point gives {s.FailureProbability:G4} ± {se:G2} ({s.Samples} samples), {difference / s.FailureProbability:+0.0%;-0.0%} off, more than {Options.StandardErrors:0.#} standard errors + {Options.Margin:0.#%}.");
    }
}

/// <summary>
/// Checks FORM and SORM estimates by importance sampling at their own design point. The FORM and SORM estimates are
/// approximations whose error none of their own diagnostics bounds (a nearly flat, nearly quadratic surface in u can
/// still be 10 % off when the tails of non-normal inputs bend it further out); importance sampling at the same point
/// is unbiased and, where the design point describes the failure domain, cheap. The check flags an estimate that the
/// simulation contradicts beyond its standard errors and a stated margin, and every estimate when the simulation does
/// not reach its target CoV within its sample cap (the design point then does not describe the failure domain).
/// </summary>
/// <remarks>
/// The check costs samples (with the defaults about 10⁴–10⁵ limit-state evaluations where it converges, 2·10⁵ where it
/// does not); it is meant for verification and for results that decisions rest on. It cannot see failure regions that
/// the importance density never reaches: a flag-free check is evidence, not proof. A simulation centred elsewhere
/// (subset simulation, crude Monte Carlo) is the independent witness.
/// </remarks>
public static class DesignPointSimulationCheck
{
    /// <summary>Runs the importance sampling of the check at the design point of <paramref name="form"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    /// <exception cref="ArgumentException">The design point does not match the problem or is not finite.</exception>
    public static DesignPointSimulationCheckResult Run(ReliabilityProblem problem, FormResult form, DesignPointSimulationCheckOptions? options = null,
        CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(form);
        options ??= DesignPointSimulationCheckOptions.Default;
        options.Validate();
        return new DesignPointSimulationCheckResult
        {
            Simulation = ImportanceSampling.Run(problem, form, options.Sampling, cancellationToken),
            Options = options,
        };
    }
}
