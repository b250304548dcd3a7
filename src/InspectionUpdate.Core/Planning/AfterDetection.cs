using System.Globalization;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>The branch a plan assumes once a defect has been detected (an indication, sized or not) and not yet repaired.</summary>
public enum AfterDetection
{
    /// <summary>The known defect stays in service and is monitored: the detection or sizing is kept as evidence, no repair is assumed.</summary>
    Monitor,

    /// <summary>
    /// The defect is repaired on detection: a recorded detection not yet followed by a repair is assumed repaired at the
    /// planning start, and the component restarts from its post-repair prior (<see cref="PlanningRequest.AssumedRepairInputs"/>).
    /// A planned inspection that would find a defect is likewise followed by that repair in the repair branches.
    /// </summary>
    Repair,
}

/// <summary>What a plan assumes after a detection: the evidence it plans on and the sentence that states the branch.</summary>
public static class DetectionBranch
{
    /// <summary>Reference of the repair the repair branch appends to the evidence.</summary>
    public const string AssumedRepairReference = "assumed repair on detection";

    /// <summary>The option's word ("monitor" or "repair"), as the command line and the exports spell it.</summary>
    public static string Key(AfterDetection branch) => branch == AfterDetection.Repair ? "repair" : "monitor";

    /// <summary>Parses "monitor" or "repair" (case-insensitive); false for anything else.</summary>
    public static bool TryParse(string? text, out AfterDetection branch)
    {
        branch = AfterDetection.Monitor;
        switch (text?.Trim().ToLowerInvariant())
        {
            case "monitor":
                return true;
            case "repair":
                branch = AfterDetection.Repair;
                return true;
            default:
                return false;
        }
    }

    /// <summary>The latest detection (indication, sized or not) after the latest repair in <paramref name="evidence"/>, or null.</summary>
    public static InspectionOutcome? OpenDetection(IReadOnlyList<InspectionOutcome> evidence)
    {
        ArgumentNullException.ThrowIfNull(evidence);
        var lastRepair = evidence.OfType<Repair>().Select(e => e.TimeYears).DefaultIfEmpty(double.NegativeInfinity).Max();
        // A finding dated at a repair describes the state before it (usually why the repair was made): the repair closes it.
        return evidence.LastOrDefault(e => e is SizedIndication or IndicationNotSized && e.TimeYears > lastRepair);
    }

    /// <summary>
    /// The evidence the planner plans on: the request's evidence, plus, on the repair branch with an open detection,
    /// a repair at the planning start with <see cref="PlanningRequest.AssumedRepairInputs"/>.
    /// </summary>
    public static IReadOnlyList<InspectionOutcome> PlanningEvidence(PlanningRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (request.AfterDetection != AfterDetection.Repair || OpenDetection(request.Evidence) is null) return request.Evidence;
        return [.. request.Evidence, new Repair(request.EffectiveStartYears, AssumedRepairReference, request.AssumedRepairInputs)];
    }

    /// <summary>The post-repair prior of repairs the planner assumes (at a planned inspection's detection, or on the repair branch).</summary>
    internal static IReadOnlyDictionary<string, RandomVariable> PlannedRepairInputs(PlanningRequest request) =>
        request.AfterDetection == AfterDetection.Repair ? request.AssumedRepairInputs : new Dictionary<string, RandomVariable>();

    /// <summary>
    /// The sentence that states the branch a plan assumes after a detection, or null when the evidence holds no
    /// detection since the last repair (the branch then changes nothing).
    /// </summary>
    /// <param name="request">The planning request.</param>
    /// <param name="startDate">Calendar date of the planning start (where the repair branch places the repair).</param>
    public static string? Statement(PlanningRequest request, DateOnly startDate)
    {
        ArgumentNullException.ThrowIfNull(request);
        var last = OpenDetection(request.Evidence);
        if (last is null) return null;
        var what = last is SizedIndication s ? Invariant($"a defect sized at {s.MeasuredSizeMm:0.##} mm") : "an indication (not sized)";
        var head = Invariant($"Branch assumed after the last detection ({what} at {last.TimeYears:0.##} years, {last.Reference}): ");
        if (request.AfterDetection == AfterDetection.Monitor)
        {
            return head + "monitor — the known defect is left in service and monitored, the finding kept as evidence; no repair is assumed. A repair, once logged, renews the component and the plan restarts from the post-repair prior.";
        }

        var renewed = request.Model.RenewedOnRepair;
        var prior = renewed.Count == 0
            ? "the model renews no input on repair, so its degradation restarts at the repair with the same inputs (service time counted from the repair, as for a logged repair)"
            : "the renewed inputs (" + string.Join(", ", renewed) + ") restart from " + (request.AssumedRepairInputs.Count == 0
                ? "their original prior"
                : "the post-repair prior " + (request.AssumedRepairSource ?? "given") + " for " + string.Join(", ", request.AssumedRepairInputs.Keys.Order(StringComparer.Ordinal))
                  + (request.AssumedRepairInputs.Count < renewed.Count ? ", the others from their original prior" : string.Empty))
              + "; the other inputs keep what the findings taught";
        return head + Invariant($"repair on detection — the defect is assumed repaired at the planning start on {startDate:yyyy-MM-dd} (no repair is logged yet) and the component restarts then: {prior}. The plan is that of the repaired component; log the repair when it is made.");
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
