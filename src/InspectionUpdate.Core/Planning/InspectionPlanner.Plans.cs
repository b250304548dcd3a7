using System.Globalization;
using InspectionUpdate.Inspection;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>Assessment of given plans and the life-cycle cost comparison of threshold and fixed-interval plans.</summary>
public sealed partial class InspectionPlanner
{
    /// <summary>
    /// Assesses a given plan: each inspection at <paramref name="inspectionTimesYears"/> with <paramref name="method"/>
    /// is assumed to find nothing; reports the largest ratio of the annual measure to the target up to the end of
    /// service, the event-tree probabilities and, with <paramref name="costs"/>, expected discounted costs.
    /// </summary>
    /// <param name="request">The component, evidence, target and service life.</param>
    /// <param name="method">The method used at every planned inspection.</param>
    /// <param name="inspectionTimesYears">Strictly increasing times in [start, end of service] (may be empty).</param>
    /// <param name="costs">Unit costs and discount rate, or null for no costs.</param>
    /// <param name="label">Name of the plan in results.</param>
    /// <exception cref="ArgumentException">The request, the times or the costs are not valid (the message lists every problem).</exception>
    public PlanAssessment AssessPlan(PlanningRequest request, InspectionMethod method, IReadOnlyList<double> inspectionTimesYears,
        CostModel? costs = null, string label = "plan")
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(method);
        ArgumentNullException.ThrowIfNull(inspectionTimesYears);
        request.ThrowIfInvalid(nameof(request));
        var start = request.EffectiveStartYears;
        var end = request.EndOfServiceYears;
        var problems = new List<string>();
        for (var i = 0; i < inspectionTimesYears.Count; i++)
        {
            var t = inspectionTimesYears[i];
            if (!(double.IsFinite(t) && t >= start && t <= end))
            {
                problems.Add(Invariant($"inspectionTimesYears[{i}] = {t} must lie in [{start}, {end}] (the start and the end of service)."));
            }
            else if (i > 0 && !(t > inspectionTimesYears[i - 1]))
            {
                problems.Add(Invariant($"inspectionTimesYears[{i}] = {t} must be after the one before it ({inspectionTimesYears[i - 1]})."));
            }
        }

        if (problems.Count > 0) throw new ArgumentException("The plan is not valid:" + Environment.NewLine + "- " + string.Join(Environment.NewLine + "- ", problems), nameof(inspectionTimesYears));
        if (costs is not null && costs.Problems() is { Count: > 0 } costProblems)
        {
            throw new ArgumentException("The cost model is not valid:" + Environment.NewLine + "- " + string.Join(Environment.NewLine + "- ", costProblems), nameof(costs));
        }

        var log = new EstimateLog();
        return Assess(request, method, inspectionTimesYears, costs, label, log);
    }

    /// <summary>
    /// Compares the threshold plan (the life-cycle schedule under the target) with fixed-interval plans, all with
    /// <paramref name="method"/>: the largest ratio to the target and the expected discounted life-cycle cost of each.
    /// </summary>
    /// <param name="request">The component, evidence, target and service life.</param>
    /// <param name="method">The inspection method of every plan.</param>
    /// <param name="costs">Unit costs and discount rate.</param>
    /// <param name="fixedIntervalsYears">Intervals (years, finite and &gt; 0) of the fixed-interval plans, the first inspection one interval after the start.</param>
    /// <exception cref="ArgumentException">A parameter is not valid.</exception>
    public PlanComparison ComparePlans(PlanningRequest request, InspectionMethod method, CostModel costs, IReadOnlyList<double> fixedIntervalsYears)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(method);
        ArgumentNullException.ThrowIfNull(costs);
        ArgumentNullException.ThrowIfNull(fixedIntervalsYears);
        request.ThrowIfInvalid(nameof(request));
        if (costs.Problems() is { Count: > 0 } costProblems)
        {
            throw new ArgumentException("The cost model is not valid:" + Environment.NewLine + "- " + string.Join(Environment.NewLine + "- ", costProblems), nameof(costs));
        }

        var bad = fixedIntervalsYears.Where(d => !(double.IsFinite(d) && d > 0)).ToArray();
        if (bad.Length > 0)
        {
            throw new ArgumentException(Invariant($"Fixed intervals must be finite and > 0 years; got {string.Join(", ", bad)}."), nameof(fixedIntervalsYears));
        }

        var start = request.EffectiveStartYears;
        var end = request.EndOfServiceYears;
        var schedule = Schedule(request with { Options = request.Options with { RepairBranchDepth = 0 } }, method);
        var log = new EstimateLog();
        var threshold = Assess(request, method, schedule.Inspections.Select(i => i.TimeYears).ToArray(), costs, "threshold plan", log);
        var fixedPlans = fixedIntervalsYears.Select(d =>
        {
            var times = new List<double>();
            for (var k = 1; start + k * d <= end; k++) times.Add(start + k * d);
            return Assess(request, method, times, costs, Invariant($"every {d:0.###} years"), new EstimateLog());
        }).ToArray();

        var all = fixedPlans.Prepend(threshold).ToArray();
        var cheapest = all.Where(p => p.Verification.WithinTarget && p.Costs is not null).OrderBy(p => p.Costs!.Total).FirstOrDefault();
        return new PlanComparison
        {
            Costs = costs,
            Threshold = threshold,
            FixedIntervals = fixedPlans,
            CheapestWithinTarget = cheapest?.Label,
            Assumptions = threshold.Assumptions,
            Computation = ComputationSummary.Combine(all.Select(p => p.Computation).Append(schedule.Computation)),
        };
    }

    private PlanAssessment Assess(PlanningRequest request, InspectionMethod method, IReadOnlyList<double> times, CostModel? costs, string label, EstimateLog log)
    {
        var start = request.EffectiveStartYears;
        var end = request.EndOfServiceYears;
        var evidence = new List<InspectionOutcome>(DetectionBranch.PlanningEvidence(request));
        var curves = new List<AnnualMeasureCurve> { NewCurve(request, evidence, log) };
        foreach (var (t, k) in times.Select((t, k) => (t, k)))
        {
            evidence = [.. evidence, new NoIndication(t, Invariant($"{label}-{k + 1}"), method)];
            curves.Add(NewCurve(request, evidence, log));
        }

        var bounds = times.Prepend(start).Append(end).ToArray();
        var segments = curves.Select((c, k) => (c, bounds[k], bounds[k + 1])).Where(s => s.Item3 > s.Item2).ToList();
        var verification = Verify(segments, request.Target, request.Options);

        // P(E_k): the probability of the existing evidence and the first k "no indication" findings.
        var pe = curves.Select((c, k) => c.EvidenceProbability(bounds[k])).ToArray();
        var available = pe.All(p => double.IsFinite(p) && p >= 0) && pe[0] > 0;
        var firstIndication = available ? Enumerable.Range(1, times.Count).Select(k => Math.Max(0, pe[k - 1] - pe[k]) / pe[0]).ToArray() : [];
        double? failure = null;
        ExpectedCosts? expected = null;
        if (available)
        {
            double Discount(double t) => costs is null ? 1 : Math.Pow(1 + costs.DiscountRatePerYear, -(t - start));
            double failureProbability = 0, failureDiscounted = 0;
            for (var k = 0; k < curves.Count; k++)
            {
                var (a, b) = (bounds[k], bounds[k + 1]);
                if (!(b > a)) continue;
                // Steps of at most a year, so that discounting at each step's end is close to continuous.
                var steps = Math.Max(1, (int)Math.Ceiling(b - a - 1e-9));
                var previous = curves[k].CumulativeFromRenewal(a);
                for (var s = 1; s <= steps; s++)
                {
                    var t = s == steps ? b : a + s * (b - a) / steps;
                    var now = curves[k].CumulativeFromRenewal(t);
                    var joint = Math.Max(0, now - previous) * pe[k] / pe[0];
                    failureProbability += joint;
                    failureDiscounted += joint * Discount(t);
                    previous = now;
                }
            }

            failure = failureProbability;
            if (costs is not null)
            {
                expected = new ExpectedCosts
                {
                    Inspections = times.Sum(t => costs.InspectionCost * Discount(t)),
                    Repairs = times.Select((t, k) => costs.RepairCost * firstIndication[k] * Discount(t)).Sum(),
                    Failures = costs.FailureCost * failureDiscounted,
                };
            }
        }
        else
        {
            log.AddNote("P(E) of the evidence is not a probability (a sized indication is an equality): event-tree probabilities and costs were not computed.");
        }

        var assumptions = CommonAssumptions(request, method);
        assumptions.Add("Probabilities and costs follow the branch on which no planned inspection has found anything yet; the first indication ends it with a repair, and what follows a repair is not costed, so repair and failure costs are lower bounds, alike for every plan compared.");
        if (costs is not null)
        {
            assumptions.Add(Invariant($"Costs: inspection {costs.InspectionCost:G6}, repair {costs.RepairCost:G6}, failure {costs.FailureCost:G6}, discounted at {costs.DiscountRatePerYear:P2} a year from the start; every planned inspection is carried out."));
        }

        return new PlanAssessment
        {
            Label = label,
            MethodName = method.Name,
            InspectionTimesYears = times.ToArray(),
            Dates = times.Select(t => DateAt(request, t)).ToArray(),
            Verification = verification,
            FirstIndicationProbabilities = firstIndication,
            ProbabilityNothingFound = available ? pe[^1] / pe[0] : null,
            FailureProbabilityBeforeIndication = failure,
            Costs = expected,
            Assumptions = assumptions,
            Computation = log.Summary(),
        };
    }
}
