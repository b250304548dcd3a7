using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>Prior and posterior summary of one uncertain input (physical units of the input).</summary>
/// <param name="Name">Input name in the augmented model (e.g. "rate_mmPerYear", "a0_mm@repair1", "C-7/a0_mm").</param>
/// <param name="PriorMean">Prior mean.</param>
/// <param name="PriorStandardDeviation">Prior standard deviation.</param>
/// <param name="Mean">Posterior mean.</param>
/// <param name="StandardDeviation">Posterior standard deviation.</param>
/// <param name="Quantile05">Posterior 5 % quantile.</param>
/// <param name="Quantile50">Posterior median.</param>
/// <param name="Quantile95">Posterior 95 % quantile.</param>
public sealed record InputPosterior(string Name, double PriorMean, double PriorStandardDeviation, double Mean, double StandardDeviation,
    double Quantile05, double Quantile50, double Quantile95);

/// <summary>Posterior summaries of the model inputs given all findings, with the sampler's diagnostic.</summary>
public sealed record PosteriorSummary
{
    /// <summary>One entry per random model input (shared, component-own and renewed copies).</summary>
    public required IReadOnlyList<InputPosterior> Inputs { get; init; }

    /// <summary>Kish effective sample size (Σw)²/Σw² of the importance weights.</summary>
    public required double EffectiveSampleSize { get; init; }

    /// <summary>Number of weighted samples.</summary>
    public required int Samples { get; init; }

    /// <summary>Always <see cref="ComputationRoute.ImportanceSampling"/> for now.</summary>
    public required ComputationRoute Route { get; init; }

    /// <summary>True when the evidence estimate met its CoV target and the effective sample size is at least 200.</summary>
    public required bool Converged { get; init; }

    /// <summary>How the summaries were computed.</summary>
    public string? Note { get; init; }

    /// <summary>The summary of the input with this name.</summary>
    /// <exception cref="KeyNotFoundException">No such input.</exception>
    public InputPosterior this[string name] =>
        Inputs.FirstOrDefault(i => i.Name == name) ?? throw new KeyNotFoundException($"No input named '{name}' in the posterior summary.");
}
