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
        var model = transformation.Model;
        RandomVariableNames = model.RandomIndices.Select(i => model.Variables[i].Name).ToArray();
        StepScales = model.Variables.Select(StepScale).ToArray();
    }

    /// <summary>Names of the random variables in the order of u.</summary>
    public IReadOnlyList<string> RandomVariableNames { get; }

    /// <summary>σᵢ per physical variable (0 for deterministic ones): the floor of the finite-difference steps.</summary>
    internal double[] StepScales { get; }

    // A variable without a finite standard deviation still needs a positive step floor.
    private static double StepScale(RandomVariable v) =>
        v.IsDeterministic ? 0.0 : double.IsFinite(v.StandardDeviation) && v.StandardDeviation > 0 ? v.StandardDeviation : 1.0;

    /// <summary>The random inputs.</summary>
    public StochasticModel Model => Transformation.Model;

    /// <summary>x ↔ u.</summary>
    public IProbabilityTransformation Transformation { get; }

    /// <summary>g(x).</summary>
    public ILimitState LimitState { get; }
}
