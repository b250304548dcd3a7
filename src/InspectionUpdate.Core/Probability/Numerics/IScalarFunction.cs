namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// A scalar function passed by value to the generic root finders, so the hot inversion paths of the
/// distributions allocate nothing (no closures, no delegates).
/// </summary>
internal interface IScalarFunction
{
    /// <summary>f(t).</summary>
    double Evaluate(double t);
}
