using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>Which route computes an updated failure probability.</summary>
/// <remarks>
/// For <see cref="ReliabilityUpdater"/> (per-time estimates) the members mean what their docs say. The application layer
/// maps <see cref="Auto"/> and <see cref="Simulation"/> to the sample-set route (<see cref="Sampling.SampleSetUpdater"/>,
/// with and without first order below its resolution) and <see cref="FirstOrder"/> to this updater's first order.
/// </remarks>
public enum UpdatingRoute
{
    /// <summary>First order; falls back to simulation where the first-order result is flagged unreliable.</summary>
    Auto,

    /// <summary>First order only (linearized events, conditioned multinormal); flags are reported in the note.</summary>
    FirstOrder,

    /// <summary>Likelihood-weighted importance sampling only.</summary>
    Simulation,
}

/// <summary>Settings of <see cref="ReliabilityUpdater"/>. Immutable; validated by the updater's constructor.</summary>
public sealed record UpdatingOptions
{
    /// <summary>Route; <see cref="UpdatingRoute.Auto"/> by default.</summary>
    public UpdatingRoute Route { get; init; } = UpdatingRoute.Auto;

    /// <summary>Settings of each FORM design-point search (events and failure).</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>
    /// Largest allowed difference, in standard deviations of u, between an event function (divided by its gradient
    /// norm) and its linearization, checked at every other event's design point. Above it the individual
    /// linearizations are flagged as misleading and the joint design point is used. Default 0.1.
    /// </summary>
    public double NonlinearityTolerance { get; init; } = 0.1;

    /// <summary>Largest relative difference between the individual and joint first-order results accepted as reliable. Default 0.1.</summary>
    public double FirstOrderAgreement { get; init; } = 0.1;

    /// <summary>Random-number seed of the simulation route (results are reproducible from it).</summary>
    public int Seed { get; init; } = 1;

    /// <summary>Samples per batch of the simulation route (each batch is checked against the target CoV). Default 4000.</summary>
    public int SamplesPerBatch { get; init; } = 4000;

    /// <summary>Sample cap per estimated quantity of the simulation route. Default 400 000.</summary>
    public int MaxSamples { get; init; } = 400_000;

    /// <summary>Target coefficient of variation of a simulated updated Pf; above it the result is not converged. Default 0.05.</summary>
    public double TargetCoefficientOfVariation { get; init; } = 0.05;

    /// <summary>
    /// A simulated P(F | data) whose estimate plus three standard errors lies below this level stops sampling and
    /// counts as converged (the note says so). Default 1e-9: two orders below the smallest annual target of the
    /// JCSS Probabilistic Model Code table (β = 4.7, about 1.3e-6), so no planning decision depends on more digits.
    /// </summary>
    public double NegligibleProbability { get; init; } = 1e-9;

    /// <summary>Weight of the wide defensive component of the importance-sampling mixtures (Hesterberg 1995), in (0, 1). Default 0.1.</summary>
    public double DefensiveWeight { get; init; } = 0.1;

    /// <summary>The defaults.</summary>
    public static UpdatingOptions Default { get; } = new();

    internal void Validate()
    {
        ArgumentNullException.ThrowIfNull(Form, nameof(Form));
        if (!Enum.IsDefined(Route)) throw new ArgumentOutOfRangeException(nameof(Route), Route, "Unknown updating route.");
        if (!(NonlinearityTolerance > 0)) throw new ArgumentOutOfRangeException(nameof(NonlinearityTolerance), NonlinearityTolerance, "Must be > 0.");
        if (!(FirstOrderAgreement > 0)) throw new ArgumentOutOfRangeException(nameof(FirstOrderAgreement), FirstOrderAgreement, "Must be > 0.");
        if (SamplesPerBatch < 100) throw new ArgumentOutOfRangeException(nameof(SamplesPerBatch), SamplesPerBatch, "Must be ≥ 100.");
        if (MaxSamples < SamplesPerBatch) throw new ArgumentOutOfRangeException(nameof(MaxSamples), MaxSamples, "Must be ≥ SamplesPerBatch.");
        if (!(TargetCoefficientOfVariation > 0 && TargetCoefficientOfVariation < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(TargetCoefficientOfVariation), TargetCoefficientOfVariation, "Must lie in (0, 1).");
        }

        if (!(NegligibleProbability >= 0 && NegligibleProbability < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(NegligibleProbability), NegligibleProbability, "Must lie in [0, 1).");
        }

        if (!(DefensiveWeight > 0 && DefensiveWeight < 1)) throw new ArgumentOutOfRangeException(nameof(DefensiveWeight), DefensiveWeight, "Must lie in (0, 1).");
    }
}
