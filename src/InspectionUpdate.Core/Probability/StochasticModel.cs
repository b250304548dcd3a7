namespace InspectionUpdate.Probability;

/// <summary>
/// The random inputs of a reliability problem: named marginals and, optionally, their correlation matrix
/// (Pearson correlations of the physical variables). Immutable.
/// </summary>
/// <remarks>
/// Deterministic variables take part in the physical vector x but have no coordinate in standard normal space,
/// so <see cref="StandardDimension"/> can be smaller than <see cref="PhysicalDimension"/>.
/// </remarks>
public sealed class StochasticModel
{
    /// <summary>Creates a model. <paramref name="correlation"/> null means independent inputs.</summary>
    /// <exception cref="ArgumentException">Duplicate names, or a correlation matrix of the wrong size.</exception>
    public StochasticModel(IReadOnlyList<RandomVariable> variables, CorrelationMatrix? correlation = null)
    {
        ArgumentNullException.ThrowIfNull(variables);
        if (variables.Count == 0)
        {
            throw new ArgumentException("A stochastic model needs at least one variable.", nameof(variables));
        }

        var names = new HashSet<string>(StringComparer.Ordinal);
        foreach (var v in variables)
        {
            if (!names.Add(v.Name))
            {
                throw new ArgumentException($"Variable name '{v.Name}' appears twice in the stochastic model.", nameof(variables));
            }
        }

        if (correlation is not null && correlation.Dimension != variables.Count)
        {
            throw new ArgumentException(
                $"The correlation matrix is {correlation.Dimension}×{correlation.Dimension} but the model has {variables.Count} variables.",
                nameof(correlation));
        }

        Variables = variables.ToArray();
        Correlation = correlation;
        RandomIndices = Enumerable.Range(0, Variables.Count).Where(i => !Variables[i].IsDeterministic).ToArray();
    }

    /// <summary>The marginals, in the order of the physical vector x.</summary>
    public IReadOnlyList<RandomVariable> Variables { get; }

    /// <summary>Correlation of the physical variables, or null when independent.</summary>
    public CorrelationMatrix? Correlation { get; }

    /// <summary>Indices (into <see cref="Variables"/>) of the non-deterministic variables, in the order of u.</summary>
    public IReadOnlyList<int> RandomIndices { get; }

    /// <summary>Length of the physical vector x.</summary>
    public int PhysicalDimension => Variables.Count;

    /// <summary>Length of the standard normal vector u (non-deterministic variables only).</summary>
    public int StandardDimension => RandomIndices.Count;

    /// <summary>Index of the variable with this name, or −1.</summary>
    public int IndexOf(string name)
    {
        for (var i = 0; i < Variables.Count; i++)
        {
            if (Variables[i].Name == name) return i;
        }

        return -1;
    }
}
