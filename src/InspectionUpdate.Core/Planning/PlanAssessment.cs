using System.Globalization;

namespace InspectionUpdate.Planning;

/// <summary>
/// Unit costs of a life-cycle cost comparison, in one currency of the user's choice, and the discount rate.
/// </summary>
public sealed record CostModel
{
    /// <summary>Cost of one inspection, finite and ≥ 0.</summary>
    public required double InspectionCost { get; init; }

    /// <summary>Cost of one repair after an indication, finite and ≥ 0.</summary>
    public required double RepairCost { get; init; }

    /// <summary>Cost of a failure (all consequences), finite and ≥ 0.</summary>
    public required double FailureCost { get; init; }

    /// <summary>Real discount rate per year r in [0, 1): a cost at t is weighted by (1 + r)^−(t − start).</summary>
    public double DiscountRatePerYear { get; init; }

    /// <summary>Every problem with these costs (empty when valid), each naming the field and its value.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        void NonNegative(string field, double v)
        {
            if (!(double.IsFinite(v) && v >= 0)) problems.Add(string.Create(CultureInfo.InvariantCulture, $"{field} = {v} must be finite and ≥ 0."));
        }

        NonNegative(nameof(InspectionCost), InspectionCost);
        NonNegative(nameof(RepairCost), RepairCost);
        NonNegative(nameof(FailureCost), FailureCost);
        if (!(DiscountRatePerYear >= 0 && DiscountRatePerYear < 1))
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture, $"{nameof(DiscountRatePerYear)} = {DiscountRatePerYear} must lie in [0, 1)."));
        }

        return problems;
    }
}

/// <summary>Expected discounted costs of one plan (see <see cref="PlanAssessment"/> for what they include).</summary>
public sealed record ExpectedCosts
{
    /// <summary>Σ_k C_I·d(t_k): every planned inspection is carried out.</summary>
    public required double Inspections { get; init; }

    /// <summary>Σ_k C_R·P(first indication at k)·d(t_k).</summary>
    public required double Repairs { get; init; }

    /// <summary>C_F·Σ P(failure in the step ∩ no indication so far)·d(step end).</summary>
    public required double Failures { get; init; }

    /// <summary>The sum of the three.</summary>
    public double Total => Inspections + Repairs + Failures;
}

/// <summary>
/// How a given plan (a list of inspection times with one method) performs: the largest ratio of the annual measure
/// to the target, the event-tree probabilities and, with a <see cref="CostModel"/>, expected discounted costs.
/// Immutable.
/// </summary>
/// <remarks>
/// Probabilities and costs follow the branch on which no planned inspection has found anything yet, each planned
/// inspection appending a "no indication" finding. The first indication ends that branch with a repair; what
/// happens after a repair is not followed, so the repair and failure costs are lower bounds, the same way for
/// every plan compared.
/// </remarks>
public sealed record PlanAssessment
{
    /// <summary>e.g. "threshold plan" or "every 5 years".</summary>
    public required string Label { get; init; }

    /// <summary>The inspection method.</summary>
    public required string MethodName { get; init; }

    /// <summary>Planned inspection times (years since entry into service), in increasing order.</summary>
    public required IReadOnlyList<double> InspectionTimesYears { get; init; }

    /// <summary>Their calendar dates.</summary>
    public required IReadOnlyList<DateOnly> Dates { get; init; }

    /// <summary>The check of the annual measure against the target between the inspections, to the end of service.</summary>
    public required ScheduleVerification Verification { get; init; }

    /// <summary>P(the first indication of the plan is at inspection k | existing evidence), per inspection; empty when P(E) is unavailable.</summary>
    public required IReadOnlyList<double> FirstIndicationProbabilities { get; init; }

    /// <summary>P(no planned inspection finds anything | existing evidence), null when P(E) is unavailable.</summary>
    public double? ProbabilityNothingFound { get; init; }

    /// <summary>P(failure before the end of service without any indication first | existing evidence), null when P(E) is unavailable.</summary>
    public double? FailureProbabilityBeforeIndication { get; init; }

    /// <summary>Expected discounted costs, when a cost model was given and P(E) is available.</summary>
    public ExpectedCosts? Costs { get; init; }

    /// <summary>The assumptions behind the result.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed.</summary>
    public required ComputationSummary Computation { get; init; }
}

/// <summary>The threshold plan (the life-cycle schedule) and fixed-interval plans with one method, side by side. Immutable.</summary>
public sealed record PlanComparison
{
    /// <summary>The unit costs and discount rate used.</summary>
    public required CostModel Costs { get; init; }

    /// <summary>The threshold plan: the schedule under the target.</summary>
    public required PlanAssessment Threshold { get; init; }

    /// <summary>The fixed-interval plans, in the order of the intervals given.</summary>
    public required IReadOnlyList<PlanAssessment> FixedIntervals { get; init; }

    /// <summary>Label of the plan with the least expected total cost among those that keep the target, or null when none does or costs are unavailable.</summary>
    public string? CheapestWithinTarget { get; init; }

    /// <summary>The assumptions behind the comparison.</summary>
    public required IReadOnlyList<string> Assumptions { get; init; }

    /// <summary>How the underlying estimates were computed (all plans together).</summary>
    public required ComputationSummary Computation { get; init; }
}
