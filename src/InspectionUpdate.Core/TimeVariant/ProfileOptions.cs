using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.TimeVariant;

/// <summary>Recomputes a step by simulation when FORM did not converge.</summary>
public interface ISimulationFallback
{
    /// <summary>The route recorded on the recomputed step (Monte Carlo, importance sampling, subset simulation).</summary>
    ComputationRoute Route { get; }

    /// <summary>Simulates P(g ≤ 0) for <paramref name="problem"/>; <paramref name="failedForm"/> is the non-converged FORM run (its last iterate may centre importance sampling).</summary>
    SimulationResult Run(ReliabilityProblem problem, FormResult failedForm);
}

/// <summary>Adapts a delegate (e.g. the project's Monte Carlo or importance sampling) as a fallback.</summary>
public sealed class DelegateSimulationFallback(ComputationRoute route, Func<ReliabilityProblem, FormResult, SimulationResult> run) : ISimulationFallback
{
    /// <inheritdoc />
    public ComputationRoute Route { get; } = route;

    /// <inheritdoc />
    public SimulationResult Run(ReliabilityProblem problem, FormResult failedForm) => run(problem, failedForm);
}

/// <summary>Settings of a time-stepped reliability run.</summary>
public sealed record ProfileOptions
{
    /// <summary>FORM settings; the start point is set per step (warm start) and any given one is used for the first step only.</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>True (default) to start each step's FORM from the previous step's design point.</summary>
    public bool WarmStart { get; init; } = true;

    /// <summary>
    /// True (default) to sweep the grid backwards after the forward sweep: a step whose forward run failed, or whose
    /// design point lies more than 0.5 (in u) from the later step's, is retried from the later step's design point,
    /// keeping the converged result with the smaller β. Guards against a warm start that stays on a failure mode
    /// another one overtakes, and retries steps the forward sweep missed; costs nothing where the design points move
    /// smoothly.
    /// </summary>
    public bool BackwardSweep { get; init; } = true;

    /// <summary>Recomputes non-converged steps (default: importance sampling at FORM's last iterate, then crude Monte Carlo); null leaves them as flagged FORM results.</summary>
    public ISimulationFallback? Fallback { get; init; } = new ImportanceSamplingFallback();

    /// <summary>Union engine for annual-maximum loads; null uses <see cref="UnionBoundsEngine"/> until the system engine is wired.</summary>
    public ISeriesSystemEngine? SeriesEngine { get; init; }

    /// <summary>Profile label, e.g. "prior".</summary>
    public string Label { get; init; } = "prior";

    /// <summary>The defaults.</summary>
    public static ProfileOptions Default { get; } = new();
}
