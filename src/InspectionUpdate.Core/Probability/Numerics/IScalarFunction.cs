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

/// <summary>A scalar function that also returns its derivative, for the safeguarded Newton iteration.</summary>
internal interface IDifferentiableFunction
{
    /// <summary>f(t), with f′(t) in <paramref name="derivative"/>.</summary>
    double Evaluate(double t, out double derivative);
}
