namespace InspectionUpdate.Reliability.Verification;

/// <summary>What makes a benchmark problem hard for one method or another.</summary>
[Flags]
public enum BenchmarkFeature
{
    /// <summary>Nothing in particular.</summary>
    None = 0,

    /// <summary>The limit state is the minimum (series) or maximum (parallel) of several branches.</summary>
    System = 1,

    /// <summary>Several design points contribute to Pf.</summary>
    MultipleDesignPoints = 2,

    /// <summary>At least 20 random inputs.</summary>
    ManyInputs = 4,

    /// <summary>Some inputs do not enter the limit state, or enter it with negligible variance.</summary>
    UnusedInputs = 8,

    /// <summary>FORM is known (from the collection's published results) to be far off.</summary>
    FormKnownToFail = 16,

    /// <summary>Non-normal inputs (lognormal, Gumbel, uniform, exponential).</summary>
    NonNormalInputs = 32,

    /// <summary>The limit state has kinks or jumps.</summary>
    NonSmooth = 64,
}

/// <summary>
/// One problem of a public reliability benchmark collection: the random inputs and the limit state (written by this
/// project from the published description), the reference failure probability chosen and where it comes from.
/// </summary>
public sealed record BenchmarkProblem
{
    /// <summary>Identifier in the collection, e.g. "RP22".</summary>
    public required string Id { get; init; }

    /// <summary>The collection and where the problem is described.</summary>
    public required string Source { get; init; }

    /// <summary>One line: the limit state and its inputs.</summary>
    public required string Description { get; init; }

    /// <summary>The random inputs and the limit state.</summary>
    public required ReliabilityProblem Problem { get; init; }

    /// <summary>The reference failure probability used for the pass rule.</summary>
    public required double ReferencePf { get; init; }

    /// <summary>
    /// Relative standard uncertainty of the reference (0 for a closed form, the quoted precision for a published
    /// value); combined with a simulation's own standard error in the pass rule.
    /// </summary>
    public required double ReferenceRelativeUncertainty { get; init; }

    /// <summary>Where the reference value comes from.</summary>
    public required string ReferenceSource { get; init; }

    /// <summary>What makes the problem hard.</summary>
    public BenchmarkFeature Features { get; init; }

    /// <summary>Number of random inputs.</summary>
    public int Dimension => Problem.Transformation.StandardDimension;
}
