namespace InspectionUpdate.Degradation.Definition;

/// <summary>One random input of a component model as written in its definition: a family and named parameters.</summary>
/// <param name="Name">Input name, with its unit (e.g. "rate_mmPerYear").</param>
/// <param name="Family">Distribution family, e.g. "Lognormal".</param>
/// <param name="Parameters">Named parameters, e.g. mean and cov.</param>
public sealed record InputSpec(string Name, string Family, IReadOnlyDictionary<string, double> Parameters)
{
    /// <summary>A copy with one parameter changed (used to derive calibration variants).</summary>
    public InputSpec WithParameter(string parameter, double value)
    {
        var p = new Dictionary<string, double>(Parameters, StringComparer.Ordinal) { [parameter] = value };
        return this with { Parameters = p };
    }
}

/// <summary>A correlation between two inputs.</summary>
/// <param name="First">First input name.</param>
/// <param name="Second">Second input name.</param>
/// <param name="Rho">Pearson correlation of the physical variables, in (−1, 1).</param>
public sealed record InputCorrelation(string First, string Second, double Rho);

/// <summary>One problem found in a component-model definition.</summary>
/// <param name="Path">JSON path of the offending element, e.g. "$.inputs.rate_mmPerYear.cov".</param>
/// <param name="Value">The offending value as written (null when the element is missing).</param>
/// <param name="Message">What is wrong and what is allowed.</param>
public sealed record DefinitionProblem(string Path, string? Value, string Message)
{
    /// <inheritdoc />
    public override string ToString() => Value is null ? $"{Path}: {Message}" : $"{Path} = {Value}: {Message}";
}
