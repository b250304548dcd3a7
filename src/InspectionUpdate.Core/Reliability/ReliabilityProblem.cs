using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability;

/// <summary>A component reliability problem: random inputs, their transformation, and one limit state.</summary>
public sealed class ReliabilityProblem
{
    /// <summary>Creates the problem; the Nataf transformation is built once here.</summary>
    public ReliabilityProblem(StochasticModel model, ILimitState limitState)
        : this(new NatafTransformation(model), limitState)
    {
    }

    /// <summary>Creates the problem over an existing transformation (shared between time steps or events).</summary>
    public ReliabilityProblem(IProbabilityTransformation transformation, ILimitState limitState)
    {
        ArgumentNullException.ThrowIfNull(transformation);
        ArgumentNullException.ThrowIfNull(limitState);
        Transformation = transformation;
        LimitState = limitState;
    }

    /// <summary>The random inputs.</summary>
    public StochasticModel Model => Transformation.Model;

    /// <summary>x ↔ u.</summary>
    public IProbabilityTransformation Transformation { get; }

    /// <summary>g(x).</summary>
    public ILimitState LimitState { get; }
}
