using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation;

/// <summary>One named input of a built-in degradation model.</summary>
/// <param name="Name">Variable name the model looks for in its stochastic model, with its unit, e.g. "rate_mmPerYear".</param>
/// <param name="Unit">Unit in words, e.g. "mm/year"; "-" when dimensionless.</param>
/// <param name="Meaning">What the input is.</param>
/// <param name="DefaultValue">Value used when the input is not given; null when the input is required.</param>
public sealed record ModelInput(string Name, string Unit, string Meaning, double? DefaultValue = null)
{
    /// <summary>True when the model cannot run without this input.</summary>
    public bool Required => DefaultValue is null;
}

/// <summary>Resolves a model's named inputs to positions in the physical vector x, listing every problem at once.</summary>
internal sealed class InputLayout
{
    private readonly Dictionary<string, int> _index;
    private readonly Dictionary<string, double> _defaults;

    private InputLayout(Dictionary<string, int> index, Dictionary<string, double> defaults)
    {
        _index = index;
        _defaults = defaults;
    }

    /// <summary>Maps each expected input to its index in <paramref name="model"/>.</summary>
    /// <exception cref="ArgumentException">Required inputs are missing or the model has inputs the mechanism does not use; the message lists all of them.</exception>
    public static InputLayout Resolve(string modelName, StochasticModel model, IReadOnlyList<ModelInput> expected)
    {
        ArgumentNullException.ThrowIfNull(model);
        var problems = new List<string>();
        var index = new Dictionary<string, int>(StringComparer.Ordinal);
        var defaults = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var input in expected)
        {
            var i = model.IndexOf(input.Name);
            if (i >= 0)
            {
                index[input.Name] = i;
            }
            else if (input.DefaultValue is { } d)
            {
                defaults[input.Name] = d;
            }
            else
            {
                problems.Add($"required input '{input.Name}' ({input.Meaning}, {input.Unit}) is missing");
            }
        }

        var known = expected.Select(e => e.Name).ToHashSet(StringComparer.Ordinal);
        foreach (var v in model.Variables)
        {
            if (!known.Contains(v.Name))
            {
                problems.Add($"input '{v.Name}' is not used by this mechanism (expected: {string.Join(", ", expected.Select(e => e.Name))})");
            }
        }

        if (problems.Count > 0)
        {
            throw new ArgumentException($"{modelName}: {string.Join("; ", problems)}.", nameof(model));
        }

        return new InputLayout(index, defaults);
    }

    /// <summary>Index of the input in x, or −1 when it takes its default value.</summary>
    public int IndexOf(string name) => _index.TryGetValue(name, out var i) ? i : -1;

    /// <summary>Default value of an absent optional input (NaN when the input is present).</summary>
    public double DefaultOf(string name) => _defaults.TryGetValue(name, out var d) ? d : double.NaN;

    /// <summary>True when the input is present in the stochastic model.</summary>
    public bool Has(string name) => _index.ContainsKey(name);
}

/// <summary>Reads an input from x, or its default when absent; writes gradient entries only for present inputs.</summary>
internal readonly struct InputSlot
{
    private readonly int _index;
    private readonly double _default;

    public InputSlot(InputLayout layout, string name)
    {
        _index = layout.IndexOf(name);
        _default = layout.DefaultOf(name);
    }

    public bool IsPresent => _index >= 0;

    public double Read(ReadOnlySpan<double> x) => _index >= 0 ? x[_index] : _default;

    public void Add(Span<double> gradient, double value)
    {
        if (_index >= 0) gradient[_index] += value;
    }
}
