using InspectionUpdate.Degradation;

namespace InspectionUpdate.Updating;

/// <summary>One component's degradation model and the findings logged on it.</summary>
/// <param name="ComponentId">Identifier of the component, unique within an <see cref="UpdatingCase"/>.</param>
/// <param name="Model">The component's degradation model (time in years since entry into service).</param>
/// <param name="Evidence">Findings in any order; they are sorted by time when the events are built.</param>
public sealed record ComponentEvidence(string ComponentId, IDegradationModel Model, IReadOnlyList<InspectionOutcome> Evidence);

/// <summary>
/// An updating problem: one or several components whose findings are combined in one posterior. Inputs named in
/// <see cref="SharedInputs"/> are one random variable common to every component that has an input of that name
/// (the shared-parameter model, e.g. the corrosion rate of one environment seen by sister components); every other
/// input is a separate, independent copy per component.
/// </summary>
/// <remarks>
/// Shared inputs must have the same marginal in every component that uses them. With a single component every input
/// keeps its name; with several, component-own inputs are named "componentId/input".
/// </remarks>
public sealed record UpdatingCase
{
    /// <summary>Creates a case and validates component ids and shared inputs.</summary>
    /// <exception cref="ArgumentException">No component, a duplicate or empty component id, or a shared input unknown to every component.</exception>
    public UpdatingCase(IReadOnlyList<ComponentEvidence> components, IReadOnlyList<string>? sharedInputs = null)
    {
        ArgumentNullException.ThrowIfNull(components);
        if (components.Count == 0) throw new ArgumentException("An updating case needs at least one component.", nameof(components));
        var ids = new HashSet<string>(StringComparer.Ordinal);
        foreach (var c in components)
        {
            ArgumentNullException.ThrowIfNull(c);
            ArgumentNullException.ThrowIfNull(c.Model);
            ArgumentNullException.ThrowIfNull(c.Evidence);
            if (string.IsNullOrWhiteSpace(c.ComponentId)) throw new ArgumentException("A component id must not be empty.", nameof(components));
            if (!ids.Add(c.ComponentId)) throw new ArgumentException($"Component id '{c.ComponentId}' appears twice.", nameof(components));
        }

        sharedInputs ??= [];
        foreach (var name in sharedInputs)
        {
            if (!components.Any(c => c.Model.Inputs.IndexOf(name) >= 0))
            {
                throw new ArgumentException($"Shared input '{name}' is not an input of any component.", nameof(sharedInputs));
            }
        }

        Components = components.ToArray();
        SharedInputs = sharedInputs.ToArray();
    }

    /// <summary>The components, in the order given.</summary>
    public IReadOnlyList<ComponentEvidence> Components { get; }

    /// <summary>Names of inputs shared across components.</summary>
    public IReadOnlyList<string> SharedInputs { get; }

    /// <summary>A case of one component (identifier "component").</summary>
    public static UpdatingCase Single(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence) =>
        new([new ComponentEvidence(SingleComponentId, model, evidence)]);

    /// <summary>The component id used by <see cref="Single"/>.</summary>
    public const string SingleComponentId = "component";
}
