using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>A first-order updated failure probability with its flags.</summary>
internal sealed record FirstOrderEstimate(
    double Pf,
    double EvidenceProbability,
    double IntegrationError,
    bool Converged,
    bool Reliable,
    bool Joint,
    IReadOnlyList<string> Flags,
    LinearizedEvent Failure,
    int Evaluations,
    string? Problem);

/// <summary>
/// The first-order route over one <see cref="EvidenceModel"/>: the evidence events are linearized once (FORM on each),
/// the failure event per time; the result is Gaussian conditioning on the equalities and multinormal probabilities of
/// the inequalities. Where the individual linearizations mislead (an event's function differs from its linearization
/// at another event's design point by more than the tolerance), everything is re-linearized at the joint design
/// points of F ∩ I ∩ E (numerator) and I ∩ E (denominator).
/// </summary>
/// <remarks>Not thread-safe (event functions keep scratch vectors).</remarks>
internal sealed class FirstOrderUpdater
{
    private readonly EvidenceModel _model;
    private readonly IProbabilityTransformation _transformation;
    private readonly UpdatingOptions _options;
    private EventFunction[] _events;
    private LinearizedEvent[]? _linear;
    private List<string>? _evidenceFlags;
    private List<string>? _certainNotes;
    private int _evidenceEvaluations;
    private JointDesignPoint.Result? _denominatorPoint;
    private LinearizedEvent[]? _denominatorLinear;
    private (double Value, double Error, string? Problem)? _individualDenominator;
    private (double Value, double Error, string? Problem)? _jointDenominator;
    private readonly Dictionary<string, double[]> _jointWarm = new(StringComparer.Ordinal);

    public FirstOrderUpdater(EvidenceModel model, IProbabilityTransformation transformation, UpdatingOptions options)
    {
        _model = model;
        _transformation = transformation;
        _options = options;
        _events = model.Events
            .Select(e => new EventFunction(e.Name, e.Kind == EvidenceEventKind.Equality, e.Function, transformation))
            .ToArray();
    }

    /// <summary>Evidence events left out because they hold almost surely (empty until the first estimate).</summary>
    public IReadOnlyList<string> CertainEventNotes => _certainNotes ?? [];

    public FirstOrderEstimate Estimate(string componentId, double timeYears, IReadOnlyList<double>? warmStart)
    {
        EnsureEvidence();
        var linear = _linear!;
        var limitState = _model.FailureLimitState(componentId, timeYears);
        var fn = new EventFunction(limitState.Name, false, _model.FailureFunction(componentId, timeYears), _transformation, limitState);
        var failure = fn.LinearizeAtDesignPoint(_options.Form, warmStart);
        var flags = new List<string>(_evidenceFlags!);
        if (!failure.Converged) flags.Add($"FORM on the failure event did not converge: {failure.Diagnostic}");
        var converged = failure.Converged && linear.All(l => l.Converged);

        var ineq = linear.Where(l => !l.IsEquality).ToArray();
        var eq = linear.Where(l => l.IsEquality).ToArray();
        if (linear.Length == 0)
        {
            return new FirstOrderEstimate(StandardNormal.Cdf(-failure.Beta), 1.0, 0.0, failure.Converged, failure.Converged, false,
                flags, failure, failure.Evaluations + fn.Evaluations, failure.Converged ? null : failure.Diagnostic);
        }

        // The individual result is the fallback where the joint search fails, and the agreement check of a joint
        // result that nothing else has flagged; it is computed only then (a multinormal integral of the full
        // dimension per time). 1 % integration accuracy is enough for the 10 % agreement check.
        GaussianConditioning.Result? individualResult = null;
        GaussianConditioning.Result Individual()
        {
            _individualDenominator ??= GaussianConditioning.Orthant(ineq, eq);
            return individualResult ??= GaussianConditioning.Evaluate(failure, ineq, eq, _individualDenominator, relativeError: 1e-2);
        }

        flags.AddRange(NonlinearityFlags(fn, failure));
        var evaluations = fn.Evaluations + _evidenceEvaluations;

        // Always re-linearize at the joint design points of F ∩ I ∩ E (numerator) and I ∩ E (denominator): individual
        // design points can lie far from the region that carries P(F ∩ I ∩ E), and the disagreement of the two
        // linearizations is the reliability check of the first-order result.
        var all = _events.Append(fn).ToArray();
        var active = all.Select(f => ReferenceEquals(f, fn)).ToArray();
        var key = componentId + "#" + _model.RenewalStartYears(componentId, timeYears).ToString("R", System.Globalization.CultureInfo.InvariantCulture);
        var start = _jointWarm.TryGetValue(key, out var w) ? w : failure.PointU;
        var before = all.Sum(f => f.Evaluations);
        var numeratorPoint = JointDesignPoint.Find(all, active, start);
        if (!numeratorPoint.Converged && !ReferenceEquals(start, failure.PointU))
        {
            numeratorPoint = JointDesignPoint.Find(all, active, failure.PointU);
        }

        _denominatorPoint ??= JointDesignPoint.Find(_events, new bool[_events.Length], new double[_transformation.StandardDimension]);
        if (!numeratorPoint.Converged || !_denominatorPoint.Converged)
        {
            flags.Add("Joint design point: " + (numeratorPoint.Diagnostic ?? _denominatorPoint.Diagnostic));
            evaluations += all.Sum(f => f.Evaluations) - before;
            return Finish(Individual(), failure, converged, reliable: false, joint: false, flags, evaluations);
        }

        _jointWarm[key] = numeratorPoint.U;
        // Active events are linearized at the joint point; inactive ones do not bound the intersection there and keep
        // their own design-point linearization.
        var individualAll = linear.Append(failure).ToArray();
        var numLin = all.Select((f, i) => numeratorPoint.Active![i] ? f.LinearizeAt(numeratorPoint.U, true, null) : individualAll[i]).ToArray();
        _denominatorLinear ??= _events.Select((f, i) => _denominatorPoint.Active![i] ? f.LinearizeAt(_denominatorPoint.U, true, null) : linear[i]).ToArray();
        var denLin = _denominatorLinear;
        evaluations += all.Sum(f => f.Evaluations) - before;
        var fJoint = numLin[^1];
        _jointDenominator ??= GaussianConditioning.Orthant(denLin.Where(l => !l.IsEquality).ToArray(), denLin.Where(l => l.IsEquality).ToArray());
        var joint = GaussianConditioning.Evaluate(fJoint,
            numLin[..^1].Where(l => !l.IsEquality).ToArray(), numLin[..^1].Where(l => l.IsEquality).ToArray(), _jointDenominator);
        if (joint.Problem is not null)
        {
            flags.Add("Joint linearization: " + joint.Problem);
            return Finish(Individual(), failure, converged, reliable: false, joint: false, flags, evaluations);
        }

        // An already flagged result is unreliable whatever the agreement, so the check is made only where it can
        // still decide (the note then lists the departures without the agreement figures).
        if (flags.Count == 0)
        {
            var individual = Individual();
            var pi = individual.Problem is null ? individual.Conditional : double.NaN;
            var pj = joint.Conditional;
            var agree = double.IsFinite(pi) && Math.Abs(pj - pi) <= _options.FirstOrderAgreement * Math.Max(pj, pi);
            if (!agree)
            {
                flags.Add(FormattableString.Invariant(
                    $"Individual and joint linearizations disagree: {pi:G4} against {pj:G4}."));
            }
        }

        // Any flag (a departure of an event from its linearization, or the disagreement) marks the result unreliable.
        return Finish(joint, fJoint, converged, reliable: flags.Count == 0, joint: true, flags, evaluations);
    }

    private FirstOrderEstimate Finish(GaussianConditioning.Result r, LinearizedEvent failure, bool converged, bool reliable, bool joint,
        List<string> flags, int evaluations)
    {
        var ok = converged && r.Problem is null;
        var pEvidence = _linear!.Any(l => l.IsEquality) ? double.NaN : r.Evidence;
        var pf = r.Problem is null ? Math.Clamp(r.Conditional, 0.0, 1.0) : double.NaN;
        return new FirstOrderEstimate(pf, pEvidence, r.Error, ok, reliable && ok, joint, flags, failure, evaluations, r.Problem);
    }

    private void EnsureEvidence()
    {
        if (_linear is not null) return;
        _linear = _events.Select(e => e.LinearizeAtDesignPoint(_options.Form, null)).ToArray();
        _evidenceFlags = [];
        _certainNotes = [];
        var keep = new List<int>();
        for (var i = 0; i < _events.Length; i++)
        {
            if (!IsCertain(_events[i], _linear[i]))
            {
                keep.Add(i);
                continue;
            }

            // Left out, but its FORM work still counts (the kept events are counted below).
            _evidenceEvaluations += _linear[i].Evaluations + _events[i].Evaluations;
            _certainNotes.Add($"'{_linear[i].Name}' holds with probability above 1 − 1e-15 (e.g. a finding of nothing before degradation can start): it carries no information and is left out of the first-order events");
        }

        _events = keep.Select(i => _events[i]).ToArray();
        _linear = keep.Select(i => _linear[i]).ToArray();

        foreach (var l in _linear.Where(l => !l.Converged)) _evidenceFlags.Add($"FORM on '{l.Name}' did not converge: {l.Diagnostic}");
        for (var i = 0; i < _events.Length; i++)
            for (var j = 0; j < _events.Length; j++)
            {
                if (i == j) continue;
                if (Departs(_events[j], _linear[j], _linear[i].PointU, _options.NonlinearityTolerance))
                {
                    _evidenceFlags.Add(FormattableString.Invariant(
                        $"'{_linear[j].Name}' departs from its linearization by more than {_options.NonlinearityTolerance:G3} σ at the design point of '{_linear[i].Name}'."));
                }
            }

        _evidenceEvaluations += _linear.Sum(l => l.Evaluations) + _events.Sum(e => e.Evaluations);
    }

    private List<string> NonlinearityFlags(EventFunction fn, LinearizedEvent failure)
    {
        var flags = new List<string>();
        for (var i = 0; i < _events.Length; i++)
        {
            var tol = _options.NonlinearityTolerance;
            if (Departs(_events[i], _linear![i], failure.PointU, tol))
            {
                flags.Add(FormattableString.Invariant($"'{_linear[i].Name}' departs from its linearization by more than {tol:G3} σ at the failure design point."));
            }

            if (Departs(fn, failure, _linear[i].PointU, tol))
            {
                flags.Add(FormattableString.Invariant($"The failure event departs from its linearization by more than {tol:G3} σ at the design point of '{_linear[i].Name}'."));
            }
        }

        return flags;
    }

    /// <summary>
    /// True for an inequality that holds almost surely: its design point lies more than 8 (a complement probability
    /// below Φ(−8) ≈ 6e-16) on the safe side, or FORM found no surface within that distance while the median point
    /// satisfies it. Such an event (say, no indication before corrosion can start) has a flat likelihood of 1.
    /// </summary>
    private static bool IsCertain(EventFunction f, LinearizedEvent lin)
    {
        if (f.IsEquality) return false;
        if (lin.Converged) return lin.Beta <= -CertainBeta;
        var reach = Math.Sqrt(GaussianConditioning.Dot(lin.PointU, lin.PointU));
        return reach >= CertainBeta && f.ValueAtU(new double[lin.PointU.Length]) < 0;
    }

    private const double CertainBeta = 8.0;

    /// <summary>
    /// True when the event's surface lies more than <paramref name="tolerance"/> (in u) from where its linearization
    /// puts it, measured along α through u: the linearization predicts the crossing at s = β − αᵀu, so h(u + sα)
    /// must change sign between s − tol and s + tol. Only signs are used, so the check does not depend on how h is
    /// scaled or parametrized (a − A_d and ln a − ln A_d give the same answer).
    /// </summary>
    private static bool Departs(EventFunction f, LinearizedEvent lin, double[] u, double tolerance)
    {
        if (!lin.Converged) return true;
        var s = lin.Beta - GaussianConditioning.Dot(lin.Alpha, u);
        var w = new double[u.Length];
        for (var i = 0; i < u.Length; i++) w[i] = u[i] + (s - tolerance) * lin.Alpha[i];
        var before = f.ValueAtU(w);
        for (var i = 0; i < u.Length; i++) w[i] = u[i] + (s + tolerance) * lin.Alpha[i];
        var after = f.ValueAtU(w);
        return !(before > 0 && after < 0);
    }
}
