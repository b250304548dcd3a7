using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// A fixed value (a point mass). It takes part in the physical vector x but has no coordinate in standard normal
/// space, and correlations with it are ignored by the transformation.
/// </summary>
public sealed class DeterministicVariable : RandomVariable
{
    /// <summary>Creates the point mass at a finite value.</summary>
    /// <exception cref="DistributionParameterException">value not finite.</exception>
    public DeterministicVariable(string name, double value) : base(name)
    {
        DistributionParameterException.RequireFinite(name, nameof(value), value);
        Value = value;
    }

    /// <summary>The fixed value.</summary>
    public double Value { get; }

    /// <inheritdoc />
    public override string Family => "Deterministic";

    /// <inheritdoc />
    public override bool IsDeterministic => true;

    /// <inheritdoc />
    public override double Mean => Value;

    /// <inheritdoc />
    public override double StandardDeviation => 0;

    /// <summary>The density of a point mass: +∞ at the value (a Dirac delta), 0 elsewhere.</summary>
    public override double Pdf(double x) => x == Value ? double.PositiveInfinity : 0;

    /// <inheritdoc />
    public override double Cdf(double x) => x < Value ? 0 : 1;

    /// <inheritdoc />
    public override double Ccdf(double x) => x < Value ? 1 : 0;

    /// <summary>The value, for every p in [0, 1].</summary>
    public override double InverseCdf(double p)
    {
        ProbabilityArgument.Check(p, nameof(p));
        return Value;
    }

    /// <summary>The value, for every q in [0, 1].</summary>
    public override double InverseCcdf(double q)
    {
        ProbabilityArgument.Check(q, nameof(q));
        return Value;
    }
}
