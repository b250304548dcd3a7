using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.TimeVariant;

/// <summary>
/// The default fallback for a step whose FORM run did not converge: importance sampling centred at FORM's last
/// iterate (unbiased wherever the centre is), then crude Monte Carlo when importance sampling misses its accuracy.
/// </summary>
public sealed class ImportanceSamplingFallback : ISimulationFallback
{
    /// <summary>Creates the fallback with the given sampling settings (seeded; default target CoV 0.05, at most 10⁶ samples).</summary>
    public ImportanceSamplingFallback(SamplingOptions? sampling = null)
    {
        Sampling = sampling ?? SamplingOptions.Default;
        Sampling.Validate();
    }

    /// <summary>The sampling settings.</summary>
    public SamplingOptions Sampling { get; }

    /// <inheritdoc />
    /// <remarks>Importance sampling; a step that had to fall through to crude Monte Carlo says so in its note (the method name).</remarks>
    public ComputationRoute Route => ComputationRoute.ImportanceSampling;

    /// <inheritdoc />
    public SimulationResult Run(ReliabilityProblem problem, FormResult failedForm)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(failedForm);
        var centreUsable = failedForm.DesignPointU.All(double.IsFinite) && failedForm.DesignPointU.Any(u => u != 0); // at the origin IS is crude MC
        if (centreUsable)
        {
            var importance = ImportanceSampling.Run(problem, failedForm, Sampling);
            if (importance.Converged) return importance;
        }

        var crude = CrudeMonteCarlo.Run(problem, Sampling);
        return crude with
        {
            Diagnostic = crude.Diagnostic is null
                ? "importance sampling at FORM's last iterate missed its accuracy; crude Monte Carlo used"
                : $"importance sampling at FORM's last iterate missed its accuracy; crude Monte Carlo: {crude.Diagnostic}",
        };
    }
}
