using System.Globalization;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;

namespace InspectionUpdate.Application;

/// <summary>What the owner records in the register for the reports: document control (with its history).</summary>
public static class OwnerRecords
{
    /// <summary>The register's document control in force, with its history; empty when none was recorded.</summary>
    public static ReportDocumentControl DocumentControl(IRegister store)
    {
        ArgumentNullException.ThrowIfNull(store);
        var d = store.DocumentControl();
        if (d is null) return new ReportDocumentControl();
        return new ReportDocumentControl(d.Title, d.Owner, d.Author, d.Checker, d.Approver, d.Revision, d.RevisionDate, d.TargetSource)
        {
            History = store.DocumentControlHistory().Select(h => string.Create(CultureInfo.InvariantCulture,
                $"{h.Recorded.RecordedUtc:yyyy-MM-dd} by {h.Recorded.RecordedBy}: revision {h.Revision ?? "not set"}{(h.RevisionDate is { } rd ? " of " + rd.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) : string.Empty)}; author {h.Author ?? "not set"}, checker {h.Checker ?? "not set"}, approver {h.Approver ?? "not set"} ({h.Recorded.Reason})")).ToArray(),
        };
    }

    /// <summary>
    /// Each component's consequence in force as known on <paramref name="knownOn"/>, by component code: its class, the
    /// class's meaning and target (from the class's preset; null when it has none), and the cost of failure.
    /// </summary>
    public static IReadOnlyDictionary<string, ComponentConsequence> Consequences(IRegister store, DateTimeOffset? knownOn = null)
    {
        ArgumentNullException.ThrowIfNull(store);
        var classes = store.ConsequenceClasses().ToDictionary(k => k.Class);
        var result = new Dictionary<string, ComponentConsequence>(StringComparer.Ordinal);
        foreach (var c in store.ComponentConsequences(knownOn))
        {
            var k = classes.GetValueOrDefault(c.Class);
            result[c.ComponentCode] = new ComponentConsequence(c.Class, k?.Meaning, k?.TargetPreset is { } key ? TargetPresetKeys.Resolve(key) : null, c.CostOfFailure);
        }

        return result;
    }

    /// <summary>The owner's classes in force as the register page states them: "class 3: meaning (target …)".</summary>
    public static IReadOnlyList<string> ClassLegend(IRegister store)
    {
        ArgumentNullException.ThrowIfNull(store);
        return store.ConsequenceClasses().Select(k => "Class " + k.Class.ToString(CultureInfo.InvariantCulture) + ": " + k.Meaning + "; target "
            + (k.TargetPreset is { } key ? TargetPresetKeys.Resolve(key).Describe() + " (preset " + key + ")" : "the run's target")).ToArray();
    }
}

/// <summary>A component's consequence as the owner records it: class 1–5, its meaning, the class's target, the cost of failure.</summary>
/// <param name="Class">Consequence class, 1 (least severe) to 5 (most severe).</param>
/// <param name="Meaning">The class's meaning in the owner's words, or null when the class has none recorded.</param>
/// <param name="Target">The class's target (from its preset), or null: the run's target applies.</param>
/// <param name="CostOfFailure">Cost of failure in the owner's currency, or null.</param>
public sealed record ComponentConsequence(int Class, string? Meaning, Planning.AnnualTarget? Target, double? CostOfFailure);

/// <summary>Keys of the published target presets a consequence class may choose.</summary>
public static class TargetPresetKeys
{
    /// <summary>Every key with its target: jcss-{large|normal|small}-{minor|moderate|large} (relative cost of safety measure, consequence), pipeline-{low|medium|high}.</summary>
    public static IReadOnlyDictionary<string, Planning.AnnualTarget> All { get; } = Build();

    /// <summary>The target of a preset key.</summary>
    /// <exception cref="ApplicationFailureException">The key is unknown (bad input, naming the key and the known ones).</exception>
    public static Planning.AnnualTarget Resolve(string key)
    {
        ArgumentNullException.ThrowIfNull(key);
        return All.TryGetValue(key.Trim().ToLowerInvariant(), out var t) ? t
            : throw ApplicationFailureException.BadInput("--target-preset", key, "is not a target preset; known: " + string.Join(", ", All.Keys) + ".");
    }

    private static Dictionary<string, Planning.AnnualTarget> Build()
    {
        var d = new Dictionary<string, Planning.AnnualTarget>(StringComparer.Ordinal);
        foreach (var cost in Enum.GetValues<Planning.RelativeCostOfSafetyMeasure>())
        {
            foreach (var consequence in Enum.GetValues<Planning.ConsequenceClass>())
            {
                d[$"jcss-{cost.ToString().ToLowerInvariant()}-{consequence.ToString().ToLowerInvariant()}"] = Planning.TargetPresets.Jcss(cost, consequence);
            }
        }

        foreach (var safety in Enum.GetValues<Planning.PipelineSafetyClass>()) d[$"pipeline-{safety.ToString().ToLowerInvariant()}"] = Planning.TargetPresets.OffshorePipeline(safety);
        return d;
    }
}
