using System.Globalization;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Time;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Planning;

/// <summary>
/// Plans inspections of one component against an annual failure-probability target: the next due date, the
/// remaining life without inspection, a life-cycle schedule and a comparison of methods. Thread-safe when the
/// updater is; every call works on its own state.
/// </summary>
/// <remarks>
/// The annual measure at t is ΔPf(t) = Pf(t | E) − Pf(t − 1 | E) or the hazard ΔPf/(1 − Pf(t − 1 | E)) of the
/// updated cumulative Pf (see <see cref="AnnualMeasure"/>). Due dates are the first crossing of the target on
/// continuous time: a scan every <see cref="PlanningOptions.ScanStepYears"/> (<see cref="TimeVariant.TargetCrossing"/>)
/// brackets it and regula falsi (Illinois) narrows the bracket to <see cref="PlanningOptions.ToleranceYears"/>;
/// the date reported is the bracket's lower end, where the measure is still below the target. A schedule assumes
/// each planned inspection finds nothing (JCSS Probabilistic Model Code Part 1, Annex B event-tree updating with
/// the "no indication" branch).
/// </remarks>
public sealed partial class InspectionPlanner
{
    /// <summary>The caution every user-facing planning output carries.</summary>
    public const string Caution =
        "These results support, never replace, engineering judgement; defer to the applicable codes and licensed practice.";

    private readonly IReliabilityUpdater _updater;

    /// <summary>Creates a planner on an updater (the source of every updated failure probability).</summary>
    /// <exception cref="ArgumentNullException">updater is null.</exception>
    public InspectionPlanner(IReliabilityUpdater updater)
    {
        ArgumentNullException.ThrowIfNull(updater);
        _updater = updater;
    }

    /// <summary>
    /// The latest date for the next inspection: the first time after the start at which the updated annual measure
    /// reaches the target. When it is already above the target, says so and searches back for when it crossed.
    /// </summary>
    /// <exception cref="ArgumentException">The request is not valid (the message lists every problem).</exception>
    public NextInspection NextInspection(PlanningRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        request.ThrowIfInvalid(nameof(request));
        var log = new EstimateLog();
        var curve = NewCurve(request, DetectionBranch.PlanningEvidence(request), log);
        var target = request.Target;
        var start = request.EffectiveStartYears;
        var end = request.EndOfServiceYears;
        var c = CrossingSearch.Forward(curve.Value, target.AnnualPf, start, end, request.Options);
        var measureName = AnnualTarget.MeasureName(target.Measure);
        var assumptions = CommonAssumptions(request, null);

        if (!c.Found)
        {
            var atEnd = curve.Point(end);
            return new NextInspection
            {
                Status = NextInspectionStatus.NotReachedBeforeEndOfService,
                Target = target,
                FromYears = start,
                FromDate = DateAt(request, start),
                ToYears = end,
                TimeYears = end,
                Date = atEnd.Date,
                At = atEnd,
                Message = Invariant($"The annual {measureName} stays below the target {target.AnnualPf:0.0##E+000} until the end of service on {Iso(atEnd.Date)} ({measureName} there {atEnd.Value:0.0##E+000}): no inspection is needed to meet the target."),
                Assumptions = assumptions,
                Computation = log.Summary(),
            };
        }

        if (!c.AlreadyAtOrAbove)
        {
            var at = curve.Point(c.LastBelowYears);
            return new NextInspection
            {
                Status = NextInspectionStatus.Due,
                Target = target,
                FromYears = start,
                FromDate = DateAt(request, start),
                ToYears = end,
                TimeYears = c.LastBelowYears,
                Date = at.Date,
                At = at,
                Message = Invariant($"Next inspection due by {Iso(at.Date)} ({c.LastBelowYears - start:0.00} years after {Iso(DateAt(request, start))}): the annual {measureName} reaches the target {target.AnnualPf:0.0##E+000} then (annual β {at.AnnualBeta:0.00}, cumulative Pf {at.CumulativePf:0.0##E+000})."),
                Assumptions = assumptions,
                Computation = log.Summary(),
            };
        }

        var now = curve.Point(start);
        var lower = curve.RenewalAtOrBefore(start);
        var back = CrossingSearch.Backward(curve.Value, target.AnnualPf, start, lower, request.Options);
        string message;
        double? crossedAt = null, crossedNoLater = null, exceededFor;
        DateOnly? crossedDate = null;
        if (back.Found)
        {
            crossedAt = back.LastBelowYears;
            crossedDate = DateAt(request, back.LastBelowYears);
            exceededFor = start - back.LastBelowYears;
            message = Invariant($"The target is already exceeded: the annual {measureName} is {now.Value:0.0##E+000} on {Iso(now.Date)}, {now.Value / target.AnnualPf:0.0#} times the target {target.AnnualPf:0.0##E+000}. It crossed the target on {Iso(crossedDate.Value)}, {exceededFor:0.00} years earlier. Inspect now.");
        }
        else
        {
            crossedNoLater = lower;
            exceededFor = start - lower;
            message = Invariant($"The target is already exceeded: the annual {measureName} is {now.Value:0.0##E+000} on {Iso(now.Date)}, {now.Value / target.AnnualPf:0.0#} times the target {target.AnnualPf:0.0##E+000}, and has been at or above it since {Iso(DateAt(request, lower))} ({(lower == 0 ? "entry into service" : "the last repair")}), {exceededFor:0.00} years. Inspect now.");
        }

        return new NextInspection
        {
            Status = NextInspectionStatus.AlreadyExceeded,
            Target = target,
            FromYears = start,
            FromDate = now.Date,
            ToYears = end,
            TimeYears = start,
            Date = now.Date,
            At = now,
            CrossedAtYears = crossedAt,
            CrossedDate = crossedDate,
            CrossedNoLaterThanYears = crossedNoLater,
            ExceededForYears = exceededFor,
            Message = message,
            Assumptions = [.. assumptions, "The backward search for the crossing uses the same evidence as today's estimate (what is known now about when the target was passed)."],
            Computation = log.Summary(),
        };
    }

    /// <summary>
    /// Remaining life without further inspection: time from the start until the annual measure reaches the target
    /// and, when <paramref name="cumulativePfLimit"/> is given, separately until the cumulative Pf reaches it.
    /// </summary>
    /// <param name="request">The component, evidence and target.</param>
    /// <param name="cumulativePfLimit">Limit on the cumulative Pf in (0, 1), or null.</param>
    /// <param name="horizonYears">End of the search (years since entry into service, after the start); null: the end of service.</param>
    /// <exception cref="ArgumentException">The request is not valid.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The limit or the horizon is out of range.</exception>
    public RemainingLife RemainingLife(PlanningRequest request, double? cumulativePfLimit = null, double? horizonYears = null)
    {
        ArgumentNullException.ThrowIfNull(request);
        request.ThrowIfInvalid(nameof(request));
        var start = request.EffectiveStartYears;
        if (cumulativePfLimit is { } limit && !(limit > 0 && limit < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(cumulativePfLimit), limit, "The cumulative Pf limit must lie in (0, 1).");
        }

        var horizon = horizonYears ?? request.EndOfServiceYears;
        if (!(double.IsFinite(horizon) && horizon > start))
        {
            throw new ArgumentOutOfRangeException(nameof(horizonYears), horizon, Invariant($"The horizon must be finite and after the start at {start} years."));
        }

        var log = new EstimateLog();
        var curve = NewCurve(request, DetectionBranch.PlanningEvidence(request), log);
        var target = request.Target;
        var annualText = Invariant($"annual {AnnualTarget.MeasureName(target.Measure)} ≤ {target.AnnualPf:0.0##E+000}");
        var annual = Limit(request, annualText, CrossingSearch.Forward(curve.Value, target.AnnualPf, start, horizon, request.Options), start);
        LifeLimit? cumulative = null;
        if (cumulativePfLimit is { } cl)
        {
            var cumulativeText = Invariant($"cumulative Pf ≤ {cl:0.0##E+000}");
            cumulative = Limit(request, cumulativeText,
                CrossingSearch.Forward(curve.CumulativeFromRenewal, cl, start, horizon, request.Options), start);
        }

        var message = Describe(annual, horizon, request) + (cumulative is null ? "" : " " + Describe(cumulative, horizon, request));
        return new RemainingLife
        {
            FromYears = start,
            FromDate = DateAt(request, start),
            HorizonYears = horizon,
            UntilAnnualTarget = annual,
            UntilCumulativeLimit = cumulative,
            CumulativePfLimit = cumulativePfLimit,
            Message = message,
            Assumptions = [.. CommonAssumptions(request, null), "No further inspection or repair after the start."],
            Computation = log.Summary(),
        };
    }

    /// <summary>
    /// A life-cycle schedule to the end of the service life with <paramref name="method"/>: each planned inspection
    /// is assumed to find nothing, and the next is due where the updated measure reaches the target again. Stops
    /// and explains when the intervals collapse.
    /// </summary>
    /// <exception cref="ArgumentException">The request is not valid.</exception>
    /// <exception cref="ArgumentNullException">method is null.</exception>
    public InspectionSchedule Schedule(PlanningRequest request, InspectionMethod method)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(method);
        request.ThrowIfInvalid(nameof(request));
        var log = new EstimateLog();
        return BuildSchedule(request, method, DetectionBranch.PlanningEvidence(request), request.EffectiveStartYears, request.Options.RepairBranchDepth, log, "");
    }

    /// <summary>Schedules with each of <paramref name="methods"/>, side by side: the number of inspections and the first three dates.</summary>
    /// <exception cref="ArgumentException">The request is not valid, or no method is given, or two share a name.</exception>
    public MethodComparison CompareMethods(PlanningRequest request, IReadOnlyList<InspectionMethod> methods)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(methods);
        request.ThrowIfInvalid(nameof(request));
        if (methods.Count == 0) throw new ArgumentException("Give at least one inspection method to compare.", nameof(methods));
        if (methods.Any(m => m is null)) throw new ArgumentException("A method in the list is null.", nameof(methods));
        var duplicate = methods.GroupBy(m => m.Name, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1);
        if (duplicate is not null) throw new ArgumentException($"Method name '{duplicate.Key}' appears twice.", nameof(methods));

        var rows = methods.Select(m =>
        {
            var s = Schedule(request, m);
            var first = s.Inspections.Take(3).ToArray();
            return new MethodComparisonRow
            {
                MethodName = m.Name,
                InspectionCount = s.Inspections.Count,
                FirstDates = first.Select(i => i.Date).ToArray(),
                FirstTimesYears = first.Select(i => i.TimeYears).ToArray(),
                Status = s.Status,
                Schedule = s,
            };
        }).ToArray();
        return new MethodComparison
        {
            Target = request.Target,
            FromYears = request.EffectiveStartYears,
            ToYears = request.EndOfServiceYears,
            Rows = rows,
            Assumptions = [.. CommonAssumptions(request, null), "Every method is planned with the same target, evidence and numerical settings; each row assumes its own planned inspections find nothing."],
            Computation = ComputationSummary.Combine(rows.Select(r => r.Schedule.Computation)),
        };
    }

    private InspectionSchedule BuildSchedule(PlanningRequest request, InspectionMethod method, IReadOnlyList<InspectionOutcome> initialEvidence,
        double start, int depth, EstimateLog log, string referencePrefix)
    {
        var options = request.Options;
        var target = request.Target;
        var end = request.EndOfServiceYears;
        var measureName = AnnualTarget.MeasureName(target.Measure);
        var evidence = initialEvidence.ToList();
        var curve = NewCurve(request, evidence, log);
        var segments = new List<(AnnualMeasureCurve Curve, double From, double To)>();
        var inspections = new List<PlannedInspection>();
        var status = ScheduleStatus.Complete;
        var overdue = false;
        var stopReason = "";
        var p0 = curve.EvidenceProbability(start);
        var branchProbabilitiesAvailable = double.IsFinite(p0) && p0 > 0;
        double? expectedRepairs = depth >= 1 && branchProbabilitiesAvailable ? 0 : null;
        var truncated = false;
        var t0 = start;

        while (true)
        {
            var c = CrossingSearch.Forward(curve.Value, target.AnnualPf, t0, end, options);
            if (!c.Found)
            {
                segments.Add((curve, t0, end));
                break;
            }

            double tk;
            if (c.AlreadyAtOrAbove)
            {
                if (inspections.Count > 0)
                {
                    // Guarded after each inspection below; kept so that no path plans an inspection at the same time twice.
                    status = ScheduleStatus.Degenerate;
                    stopReason = Invariant($"After planned inspection {inspections.Count} the annual {measureName} is still at or above the target.");
                    break;
                }

                overdue = true;
                tk = t0;
            }
            else
            {
                tk = c.LastBelowYears;
            }

            segments.Add((curve, t0, tk));
            var interval = tk - t0;
            if (inspections.Count > 0 && interval < options.MinimumIntervalYears)
            {
                status = ScheduleStatus.Degenerate;
                stopReason = Invariant($"After planned inspection {inspections.Count} on {Iso(DateAt(request, t0))} the next would be due only {interval * ServiceTime.DaysPerYear:0} days later, under the minimum interval of {options.MinimumIntervalYears:0.###} years: inspections with {method.Name} that find nothing no longer reduce the failure probability enough to keep the target with practical intervals. The schedule stops there; consider a better method, a repair or a different target.");
                break;
            }

            if (inspections.Count >= options.MaximumInspections)
            {
                status = ScheduleStatus.InspectionLimitReached;
                stopReason = Invariant($"Stopped at the limit of {options.MaximumInspections} planned inspections on {Iso(DateAt(request, tk))}.");
                break;
            }

            var number = inspections.Count + 1;
            var before = curve.Point(tk);
            var pBefore = curve.EvidenceProbability(tk);
            var withFinding = new List<InspectionOutcome>(evidence)
            {
                new NoIndication(tk, Invariant($"{referencePrefix}planned-{number}"), method),
            };
            var next = NewCurve(request, withFinding, log);
            var after = next.Point(tk);
            var pAfter = next.EvidenceProbability(tk);

            RepairBranch? branch = null;
            if (depth >= 1 && branchProbabilitiesAvailable && double.IsFinite(pBefore) && double.IsFinite(pAfter) && pBefore > 0)
            {
                var conditional = Math.Clamp(1 - pAfter / pBefore, 0, 1);
                var path = Math.Max(0, pBefore - pAfter) / p0;
                InspectionSchedule? afterRepair = null;
                if (depth >= 2 && tk < end)
                {
                    var repaired = new List<InspectionOutcome>(evidence)
                    {
                        new IndicationNotSized(tk, Invariant($"{referencePrefix}planned-{number}-indication"), method),
                        new Repair(tk, Invariant($"{referencePrefix}planned-{number}-repair"), DetectionBranch.PlannedRepairInputs(request)),
                    };
                    afterRepair = BuildSchedule(request, method, repaired, tk, depth - 1, log, Invariant($"{referencePrefix}after-repair-{number}/"));
                }

                truncated |= path > 0 && (afterRepair is null ? tk < end : afterRepair.ExpectedRepairsTruncated || afterRepair.Status != ScheduleStatus.Complete);
                expectedRepairs += path * (1 + (afterRepair?.ExpectedRepairs ?? 0));
                branch = new RepairBranch { ConditionalProbability = conditional, PathProbability = path, AfterRepair = afterRepair };
            }
            else if (depth >= 1)
            {
                truncated = true;
            }

            inspections.Add(new PlannedInspection
            {
                Number = number,
                TimeYears = tk,
                Date = before.Date,
                IntervalYears = interval,
                Before = before,
                After = after,
                Repair = branch,
            });
            evidence = withFinding;
            curve = next;
            t0 = tk;

            if (!(after.Value < target.AnnualPf))
            {
                status = ScheduleStatus.Degenerate;
                stopReason = Invariant($"Planned inspection {number} on {Iso(before.Date)} with {method.Name}, assumed to find nothing, leaves the annual {measureName} at {after.Value:0.0##E+000}, {after.Value / target.AnnualPf:0.0#} times the target: the method cannot bring the failure probability back under the target, so the intervals would collapse to zero. The schedule stops there; consider a better method, a repair or a different target.");
                if (after.Value > before.Value)
                {
                    // Finding nothing cannot raise the failure probability of a monotone degradation with a
                    // non-decreasing PoD: the estimate itself is suspect.
                    stopReason += Invariant($" Note: the measure rose from {before.Value:0.0##E+000} to {after.Value:0.0##E+000} on a finding of nothing, which monotone degradation does not allow; check the updated estimate (route {after.Route}).");
                    log.AddNote(Invariant($"t = {tk:0.###} years: the annual {measureName} rose after a planned no-indication finding ({before.Value:0.0##E+000} → {after.Value:0.0##E+000}, route {after.Route}); the updated estimate is suspect."));
                }

                break;
            }
        }

        var verification = Verify(segments, target, options);
        var pEnd = curve.EvidenceProbability(t0);
        double? nothingFound = branchProbabilitiesAvailable && double.IsFinite(pEnd) ? pEnd / p0 : null;
        var coveredTo = segments.Count == 0 ? start : segments[^1].To;
        var summary = status switch
        {
            // A plan never claims to keep a target it does not keep: above it anywhere (an overdue start included), it says so.
            ScheduleStatus.Complete when verification.WithinTarget => Invariant($"{inspections.Count} planned inspection(s) with {method.Name} from {Iso(DateAt(request, start))} to the end of service on {Iso(DateAt(request, end))} keep the annual {measureName} under the target {target.AnnualPf:0.0##E+000} (largest ratio to the target {verification.MaxRatio:0.000})."),
            ScheduleStatus.Complete => Invariant($"{inspections.Count} planned inspection(s) with {method.Name} from {Iso(DateAt(request, start))} to the end of service on {Iso(DateAt(request, end))} do NOT keep the annual {measureName} under the target {target.AnnualPf:0.0##E+000} throughout: its largest ratio to the target is {verification.MaxRatio:0.000}{(overdue ? ", at the overdue start." : ".")}"),
            _ => Invariant($"{inspections.Count} planned inspection(s) with {method.Name} keep the annual {measureName} under the target {target.AnnualPf:0.0##E+000} only up to {Iso(DateAt(request, coveredTo))} (largest ratio {verification.MaxRatio:0.000}). {stopReason}"),
        };
        if (overdue) summary = Invariant($"The target is already exceeded at the start on {Iso(DateAt(request, start))}: the first inspection is due now. ") + summary;
        if (depth >= 1 && !branchProbabilitiesAvailable)
        {
            log.AddNote("Repair-branch probabilities need P(E) of the evidence, which is not a probability when the evidence holds a sized indication (an equality); they were not computed.");
        }

        var assumptions = CommonAssumptions(request, method);
        if (depth >= 1)
        {
            assumptions.Add(Invariant($"Repair branch: an indication at a planned inspection has probability 1 − P(E_k)/P(E_k−1); the component is then repaired at once (an unsized indication and a renewal appended), followed to depth {depth}. Expected repairs sum the branch probabilities over the branches followed."));
        }

        return new InspectionSchedule
        {
            MethodName = method.Name,
            Target = target,
            FromYears = start,
            ToYears = end,
            Status = status,
            OverdueAtStart = overdue,
            Inspections = inspections,
            Verification = verification,
            ExpectedRepairs = expectedRepairs,
            ExpectedRepairsTruncated = expectedRepairs is not null && truncated,
            ProbabilityNothingFound = nothingFound,
            Message = summary,
            Assumptions = assumptions,
            Computation = log.Summary(),
        };
    }

    private static ScheduleVerification Verify(List<(AnnualMeasureCurve Curve, double From, double To)> segments, AnnualTarget target, PlanningOptions options)
    {
        var max = double.NegativeInfinity;
        var at = double.NaN;
        var count = 0;
        foreach (var (curve, from, to) in segments)
        {
            var n = Math.Max(1, (int)Math.Ceiling((to - from) / options.VerificationStepYears - 1e-9));
            for (var i = 0; i <= n; i++)
            {
                var t = i == n ? to : from + i * options.VerificationStepYears;
                var v = curve.Value(t);
                var ratio = double.IsNaN(v) ? double.PositiveInfinity : v / target.AnnualPf;
                count++;
                if (ratio > max)
                {
                    max = ratio;
                    at = t;
                }
            }
        }

        return new ScheduleVerification { MaxRatio = max, MaxRatioAtYears = at, GridStepYears = options.VerificationStepYears, PointsChecked = count };
    }

    private AnnualMeasureCurve NewCurve(PlanningRequest request, IReadOnlyList<InspectionOutcome> evidence, EstimateLog log) =>
        new(_updater, request.Model, evidence, request.InServiceDate, request.Target.Measure, log);

    private static LifeLimit Limit(PlanningRequest request, string text, Crossing c, double start) => new()
    {
        Limit = text,
        Reached = c.Found,
        AlreadyReached = c.AlreadyAtOrAbove,
        TimeYears = c.LastBelowYears,
        Date = DateAt(request, c.LastBelowYears),
        RemainingYears = c.LastBelowYears - start,
    };

    private static string Describe(LifeLimit l, double horizon, PlanningRequest request) =>
        l.AlreadyReached ? Invariant($"The limit {l.Limit} is already reached at the start: no remaining life against it.")
        : l.Reached ? Invariant($"Without further inspection the limit {l.Limit} is reached on {Iso(l.Date)}, {l.RemainingYears:0.00} years from the start.")
        : Invariant($"Without further inspection the limit {l.Limit} holds until the horizon on {Iso(DateAt(request, horizon))}: at least {l.RemainingYears:0.00} years.");

    private static List<string> CommonAssumptions(PlanningRequest request, InspectionMethod? method)
    {
        var options = request.Options;
        var list = new List<string>
        {
            "Target: " + request.Target.Describe() + ".",
            request.Target.Measure == AnnualMeasure.Hazard
                ? "Annual measure: the hazard ΔPf(t)/(1 − Pf(t − 1)) of the updated cumulative failure probability, over the year ending at t."
                : "Annual measure: ΔPf(t) = Pf(t) − Pf(t − 1) of the updated cumulative failure probability, over the year ending at t.",
            "In the first year after entry into service or after a repair the annual window starts at that time, with Pf = 0 there, not a year earlier.",
            Invariant($"Due dates are the last time still under the target: a scan every {options.ScanStepYears:0.###} years brackets the first crossing and regula falsi narrows it to {options.ToleranceYears:0.####} years ({options.ToleranceYears * ServiceTime.DaysPerYear:0.0#} days); a crossing that starts and ends between two scan points would be missed."),
            Invariant($"Evidence used: {request.Evidence.Count} finding(s) and repair(s) up to {request.LatestEvidenceYears:0.###} years; service time is counted from {Iso(request.InServiceDate)} in years of 365.2425 days."),
        };
        if (DetectionBranch.Statement(request, DateAt(request, request.EffectiveStartYears)) is { } branch) list.Add(branch);
        if (method is not null)
        {
            list.Add(Invariant($"Each planned inspection with {method.Name} is assumed to find nothing (a 'no indication' finding is appended to the evidence): the usual planning assumption."));
            list.Add(Invariant($"A planned interval under {options.MinimumIntervalYears:0.###} years, or an inspection that leaves the measure at or above the target, stops the schedule as degenerate."));
        }

        list.Add(Caution);
        return list;
    }

    private static DateOnly DateAt(PlanningRequest request, double timeYears) => ServiceTime.DateAt(request.InServiceDate, timeYears);

    private static string Iso(DateOnly d) => d.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
