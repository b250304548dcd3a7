using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.TimeVariant;

/// <summary>A time-stepped run: the profile and, per point, the FORM run behind it.</summary>
public sealed record TimeVariantResult
{
    /// <summary>The profile: Pf(t), ΔPf(t), hazard, β(t), α(t), design points, route per step.</summary>
    public required ReliabilityProfile Profile { get; init; }

    /// <summary>Per profile point, the FORM run of the event at that time (for an annual maximum: the event of that year).</summary>
    public required IReadOnlyList<FormResult> FormResults { get; init; }

    /// <summary>Per profile point, the simulation that replaced a non-converged FORM run, or null.</summary>
    public required IReadOnlyList<SimulationResult?> Simulations { get; init; }

    /// <summary>Cumulative Pf at the grid start (0 when the grid starts at 0).</summary>
    public required double StartPf { get; init; }

    /// <summary>Limit-state evaluations over the whole run (the start point included).</summary>
    public required long TotalEvaluations { get; init; }
}

/// <summary>
/// Time-stepped reliability of a degradation model: FORM at each grid time, warm-started from the previous design
/// point, giving the cumulative Pf(t) = P(g(X, t) ≤ 0), the interval probability ΔPf(t) = Pf(t) − Pf(t_prev) (the
/// annual failure probability on a yearly grid), the hazard ΔPf/(1 − Pf(t_prev)), β(t), α(t) and design points.
/// </summary>
/// <remarks>
/// <para>Pf(t) = P(g(X, t) ≤ 0) holds for monotone degradation under time-invariant inputs. With an annual-maximum
/// input (<see cref="IDegradationModel.AnnualMaximumInput"/>) the cumulative Pf(t) is the series system of the yearly
/// events {g(X, Pⱼ, j) ≤ 0}, j = 1…t, with independent yearly maxima Pⱼ: each year's event is linearized by FORM and
/// the union is evaluated by <see cref="ProfileOptions.SeriesEngine"/> with correlations ρᵢⱼ = Σₖ αᵢₖαⱼₖ over the
/// shared (non-renewed) inputs.</para>
/// <para>A step whose FORM run does not converge is recomputed by <see cref="ProfileOptions.Fallback"/> when one is
/// given; either way the profile point records its route and whether it converged.</para>
/// </remarks>
public static class TimeVariantReliability
{
    /// <summary>The profile of <paramref name="model"/> on <paramref name="grid"/>.</summary>
    public static ReliabilityProfile Profile(IDegradationModel model, TimeGrid grid, ProfileOptions? options = null) =>
        Run(model, grid, options).Profile;

    /// <summary>The profile with the FORM runs behind it.</summary>
    /// <exception cref="ArgumentException">An annual-maximum model on a grid that is not in whole years, or an annual-maximum input that is correlated with others.</exception>
    public static TimeVariantResult Run(IDegradationModel model, TimeGrid grid, ProfileOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(grid);
        options ??= ProfileOptions.Default;
        var transformation = new NatafTransformation(model.Inputs);
        return model.AnnualMaximumInput is null
            ? RunTimeInvariant(model, transformation, grid, options)
            : RunAnnualMaximum(model, transformation, grid, options);
    }

    /// <summary>Cumulative Pf at one time by FORM (for time-invariant inputs), falling back to simulation when configured.</summary>
    public static ProfilePoint CumulativeAt(IDegradationModel model, double timeYears, ProfileOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        var grid = TimeGrid.FromTimes([timeYears], 0);
        return Run(model, grid, options).Profile.Points[0];
    }

    /// <summary>
    /// The first time in [startYears, endYears] at which the annual failure probability ΔPf(t) = Pf(t) − Pf(t − 1)
    /// reaches <paramref name="targetAnnualPf"/>, by root finding on continuous time (<see cref="TargetCrossing"/>).
    /// </summary>
    /// <exception cref="NotSupportedException">The model has an annual-maximum input: its ΔPf is defined per whole year; read it from the yearly profile.</exception>
    public static CrossingResult FindAnnualPfCrossing(IDegradationModel model, double targetAnnualPf, double startYears, double endYears,
        ProfileOptions? options = null, double scanStepYears = 0.25, double toleranceYears = 1e-3)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (!(targetAnnualPf > 0 && targetAnnualPf < 1)) throw new ArgumentOutOfRangeException(nameof(targetAnnualPf), targetAnnualPf, "The target must lie in (0, 1).");
        if (!(startYears >= 1)) throw new ArgumentOutOfRangeException(nameof(startYears), startYears, "The annual failure probability needs t ≥ 1 year.");
        RequireTimeInvariant(model);
        var pf = new CachedPf(model, options ?? ProfileOptions.Default);
        return pf.Flag(TargetCrossing.FindFirst(t => pf.At(t) - pf.At(t - 1), targetAnnualPf, startYears, endYears, scanStepYears, toleranceYears));
    }

    /// <summary>The first time in [startYears, endYears] at which β(t) falls to <paramref name="targetBeta"/> (or below).</summary>
    /// <exception cref="NotSupportedException">The model has an annual-maximum input.</exception>
    public static CrossingResult FindBetaCrossing(IDegradationModel model, double targetBeta, double startYears, double endYears,
        ProfileOptions? options = null, double scanStepYears = 0.25, double toleranceYears = 1e-3)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (!double.IsFinite(targetBeta)) throw new ArgumentOutOfRangeException(nameof(targetBeta), targetBeta, "The target must be finite.");
        if (!(startYears > 0)) throw new ArgumentOutOfRangeException(nameof(startYears), startYears, "The window must start after 0.");
        RequireTimeInvariant(model);
        var pf = new CachedPf(model, options ?? ProfileOptions.Default);
        // β(t) ≤ target ⇔ Pf(t) ≥ Φ(−target): search on Pf, which is what FORM returns.
        return pf.Flag(TargetCrossing.FindFirst(pf.At, StandardNormal.Cdf(-targetBeta), startYears, endYears, scanStepYears, toleranceYears));
    }

    private static void RequireTimeInvariant(IDegradationModel model)
    {
        if (model.AnnualMaximumInput is not null)
        {
            throw new NotSupportedException($"Model '{model.Name}' has the annual-maximum input '{model.AnnualMaximumInput}': its annual failure probability is defined per whole year; use the yearly profile.");
        }
    }

    private static TimeVariantResult RunTimeInvariant(IDegradationModel model, IProbabilityTransformation transformation, TimeGrid grid, ProfileOptions options)
    {
        var names = RandomNames(model.Inputs);
        var stepper = new FormStepper(model, transformation, options);
        long total = 0;
        var startPf = 0.0;
        if (grid.StartYears > 0)
        {
            var start = stepper.Step(grid.StartYears);
            startPf = start.Pf;
            total += start.Evaluations;
        }

        var times = grid.TimesYears;
        var outcomes = Sweep(stepper, times, options);

        // Whatever still failed goes to the simulation fallback.
        for (var i = 0; i < times.Count; i++)
        {
            if (!outcomes[i].Converged) outcomes[i] = stepper.Fallback(times[i], outcomes[i]);
        }

        var points = new List<ProfilePoint>();
        var forms = new List<FormResult>();
        var sims = new List<SimulationResult?>();
        var previous = startPf;
        for (var i = 0; i < times.Count; i++)
        {
            var s = outcomes[i];
            total += s.Evaluations;
            points.Add(MakePoint(times[i], s.Pf, previous, s.Route, s.Converged, s.Evaluations, s.Form, s.Simulation?.CoefficientOfVariation, s.Note));
            forms.Add(s.Form);
            sims.Add(s.Simulation);
            previous = s.Pf;
        }

        return new TimeVariantResult
        {
            Profile = new ReliabilityProfile { Label = options.Label, VariableNames = names, Points = points },
            FormResults = forms,
            Simulations = sims,
            StartPf = startPf,
            TotalEvaluations = total,
        };
    }

    private static TimeVariantResult RunAnnualMaximum(IDegradationModel model, IProbabilityTransformation transformation, TimeGrid grid, ProfileOptions options)
    {
        if (!grid.IsWholeYears)
        {
            throw new ArgumentException($"Model '{model.Name}' has an annual-maximum input: the time grid must be in whole years (events are yearly).", nameof(grid));
        }

        var inputs = model.Inputs;
        var pIndex = inputs.IndexOf(model.AnnualMaximumInput!);
        if (pIndex < 0) throw new ArgumentException($"The annual-maximum input '{model.AnnualMaximumInput}' is not among the model's inputs.", nameof(model));
        if (inputs.Correlation is { } r)
        {
            for (var j = 0; j < inputs.PhysicalDimension; j++)
            {
                if (j != pIndex && r[pIndex, j] != 0)
                {
                    throw new ArgumentException($"The annual-maximum input '{model.AnnualMaximumInput}' is correlated with '{inputs.Variables[j].Name}'; yearly maxima must be independent of the other inputs.", nameof(model));
                }
            }
        }

        // Position of the renewed input in u (absent when it is deterministic: the yearly events are then fully dependent).
        var uIndex = -1;
        for (var k = 0; k < inputs.RandomIndices.Count; k++)
        {
            if (inputs.RandomIndices[k] == pIndex) uIndex = k;
        }

        // A deterministic annual maximum makes the yearly events nested under monotone degradation: the union is the last year's event.
        var engine = uIndex < 0 ? NestedEventsEngine.Instance : options.SeriesEngine ?? MultinormalSeriesEngine.Instance;
        var stepper = new FormStepper(model, transformation, options with { Fallback = null });
        var lastYear = (int)Math.Round(grid.TimesYears[^1]);
        var yearTimes = Enumerable.Range(1, lastYear).Select(y => (double)y).ToArray();
        var yearly = Sweep(stepper, yearTimes, options).ToList();
        long total = yearly.Sum(y => (long)y.Evaluations);

        var unions = CumulativeUnions(yearly, uIndex, engine);
        var startYear = (int)Math.Round(grid.StartYears);
        var startPf = startYear > 0 ? unions[startYear - 1].Probability : 0.0;
        var points = new List<ProfilePoint>();
        var forms = new List<FormResult>();
        var previous = startPf;
        var previousYear = startYear;
        foreach (var t in grid.TimesYears)
        {
            var year = (int)Math.Round(t);
            var union = unions[year - 1];
            var own = yearly[year - 1];
            var allConverged = union.Converged && yearly.Take(year).All(y => y.Form.Converged);
            var evaluations = yearly.Skip(previousYear).Take(year - previousYear).Sum(y => y.Evaluations);
            var note = union.Note;
            if (!yearly.Take(year).All(y => y.Form.Converged))
            {
                var bad = yearly.Take(year).Select((y, i) => (y, i)).Where(p => !p.y.Form.Converged).Select(p => p.i + 1);
                note = Join(note, $"FORM did not converge for the events of years {string.Join(", ", bad)}");
            }

            points.Add(MakePoint(t, union.Probability, previous, union.Route, allConverged, evaluations, own.Form, null, note));
            forms.Add(own.Form);
            previous = union.Probability;
            previousYear = year;
        }

        return new TimeVariantResult
        {
            Profile = new ReliabilityProfile { Label = options.Label, VariableNames = RandomNames(inputs), Points = points },
            FormResults = forms,
            Simulations = new SimulationResult?[points.Count],
            StartPf = startPf,
            TotalEvaluations = total,
        };
    }

    /// <summary>Forward sweep with warm starts, then the optional backward sweep; no simulation.</summary>
    private static StepOutcome[] Sweep(FormStepper stepper, IReadOnlyList<double> times, ProfileOptions options)
    {
        // Forward sweep with warm starts; simulation waits until both sweeps are done.
        var outcomes = new StepOutcome[times.Count];
        for (var i = 0; i < times.Count; i++) outcomes[i] = stepper.Step(times[i], allowFallback: false);

        // Backward sweep, each step warm-started from the later one. It catches steps the forward sweep missed
        // (typically early, where the median point lies in a flat region, e.g. before corrosion initiates) and design
        // points the forward warm start locked onto while another failure mode took over later (several local design
        // points): per step the converged result with the smaller β, i.e. the dominant design point, is kept.
        if (options.BackwardSweep && times.Count > 1)
        {
            IReadOnlyList<double>? next = null;
            if (!outcomes[^1].Converged)
            {
                // No converged step at the end to sweep back from (e.g. a short grid that ends before corrosion
                // typically starts): the backward sweep starts from a later time's design point.
                var anchor = LaterTimeStart.Find(times[^1], time =>
                {
                    var step = stepper.Step(time, allowFallback: false);
                    outcomes[^1] = outcomes[^1] with { Evaluations = outcomes[^1].Evaluations + step.Evaluations };
                    return step.Form;
                });
                next = anchor?.Form.DesignPointU;
            }

            for (var i = times.Count - 1; i >= 0; i--)
            {
                var forward = outcomes[i];
                var start = next ?? (forward.Converged ? forward.Form.DesignPointU : null);
                if (start is null)
                {
                    continue;
                }

                // Retry only where the forward point is missing or far (more than half a standard deviation in u)
                // from the later step's: neighbouring design points of one failure mode lie close together.
                var near = forward.Converged && Distance(forward.Form.DesignPointU, start) < 0.5;
                var backward = near || i == times.Count - 1 && forward.Converged ? forward : stepper.Retry(times[i], start);
                if (ReferenceEquals(backward.Form, forward.Form))
                {
                    next = forward.Form.DesignPointU;
                    continue;
                }

                var evaluations = forward.Evaluations + backward.Evaluations;
                StepOutcome chosen;
                if (forward.Converged && backward.Converged)
                {
                    var better = backward.Form.Beta < forward.Form.Beta ? backward : forward;
                    var note = Math.Abs(backward.Form.Beta - forward.Form.Beta) > 0.01
                        ? FormattableString.Invariant($"two design points found (β = {forward.Form.Beta:F3} forward, {backward.Form.Beta:F3} backward); the smaller β is reported")
                        : null;
                    chosen = better with { Evaluations = evaluations, Note = note };
                }
                else
                {
                    chosen = (backward.Converged ? backward : forward.Converged ? forward : NearerTheLimitState(backward, forward)) with { Evaluations = evaluations };
                }

                outcomes[i] = chosen;
                next = backward.Converged ? backward.Form.DesignPointU : chosen.Converged ? chosen.Form.DesignPointU : next;
            }
        }

        return outcomes;
    }

    private static IReadOnlyList<SeriesEstimate> CumulativeUnions(List<StepOutcome> yearly, int renewedU, ISeriesSystemEngine engine)
    {
        // ρᵢⱼ over the shared inputs only: each year's maximum is an independent variable of its own.
        var years = yearly.Count;
        var betas = new double[years];
        var r = new double[years, years];
        for (var i = 0; i < years; i++)
        {
            betas[i] = yearly[i].Form.Beta;
            r[i, i] = 1;
            var ai = yearly[i].Form.Alpha;
            for (var j = 0; j < i; j++)
            {
                var aj = yearly[j].Form.Alpha;
                var rho = 0.0;
                for (var k = 0; k < ai.Count; k++)
                {
                    if (k != renewedU) rho += ai[k] * aj[k];
                }

                r[i, j] = rho;
                r[j, i] = rho;
            }
        }

        return engine.CumulativeUnions(betas, r);
    }

    private static ProfilePoint MakePoint(double t, double pf, double previousPf, ComputationRoute route, bool converged, int evaluations,
        FormResult form, double? cov, string? note)
    {
        // A deterministic FORM profile has no CoV of its own; the check then allows 1e-3 relative.
        var (interval, consistent, incrementNote) = ProfileIncrement.Of(pf, cov, previousPf, null);
        converged &= consistent;
        if (incrementNote is not null) note = note is null ? incrementNote : note + "; " + incrementNote;
        var survivor = 1 - previousPf;
        return new ProfilePoint
        {
            TimeYears = t,
            Beta = -StandardNormal.InverseCdf(Math.Clamp(pf, 0, 1)),
            CumulativePf = pf,
            IntervalPf = interval,
            Hazard = survivor > 0 ? interval / survivor : double.NaN,
            Route = route,
            Converged = converged,
            CoefficientOfVariation = cov,
            Evaluations = evaluations,
            Alpha = route == ComputationRoute.FirstOrder ? form.Alpha : null,
            DesignPointX = route == ComputationRoute.FirstOrder ? form.DesignPointX : null,
            Note = note,
        };
    }

    /// <summary>
    /// Of two searches that both failed, the one that ended on (or nearer) the limit state: the simulation fallback
    /// samples around its end point, and a point far from G = 0 (e.g. a search that ran off along an input with no
    /// effect before initiation) leaves the sampling density far from the failure region, where even a small
    /// estimated CoV means nothing.
    /// </summary>
    private static StepOutcome NearerTheLimitState(StepOutcome a, StepOutcome b)
    {
        var ga = a.Form.RelativeLimitStateValue;
        var gb = b.Form.RelativeLimitStateValue;
        if (double.IsNaN(ga)) return b;
        return double.IsNaN(gb) || ga <= gb ? a : b;
    }

    private static double Distance(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        var s = 0.0;
        for (var i = 0; i < a.Count; i++) s += (a[i] - b[i]) * (a[i] - b[i]);
        return Math.Sqrt(s);
    }

    private static string? Join(string? a, string b) => a is null ? b : $"{a}; {b}";

    private static string[] RandomNames(StochasticModel model) => model.RandomIndices.Select(i => model.Variables[i].Name).ToArray();

    private readonly record struct StepOutcome(double Pf, ComputationRoute Route, bool Converged, int Evaluations, FormResult Form, SimulationResult? Simulation, string? Note);

    /// <summary>FORM over successive times with warm starts and the simulation fallback.</summary>
    private sealed class FormStepper(IDegradationModel model, IProbabilityTransformation transformation, ProfileOptions options)
    {
        private IReadOnlyList<double>? _warm = options.Form.StartPoint;
        private double? _scale = options.Form.LimitStateScale;

        public StepOutcome Step(double timeYears, bool allowFallback = true)
        {
            var (problem, extra) = Problem(timeYears);
            var form = FormSolver.Solve(problem, options.Form with { StartPoint = _warm, LimitStateScale = _scale });
            if (!form.Converged && _warm is not null)
            {
                // A misleading warm start must not cost the step: retry once from the origin.
                var cold = FormSolver.Solve(problem, options.Form with { StartPoint = null, LimitStateScale = _scale });
                extra += form.LimitStateEvaluations;
                form = cold;
            }

            var outcome = FromForm(form, extra);
            if (outcome.Converged && options.WarmStart) _warm = form.DesignPointU;
            return outcome.Converged || !allowFallback ? outcome : Fallback(timeYears, outcome);
        }

        /// <summary>FORM again from a given start (the design point of a neighbouring step).</summary>
        public StepOutcome Retry(double timeYears, IReadOnlyList<double> start)
        {
            var (problem, extra) = Problem(timeYears);
            return FromForm(FormSolver.Solve(problem, options.Form with { StartPoint = start, LimitStateScale = _scale }), extra);
        }

        /// <summary>Recomputes a non-converged step by simulation when a fallback is configured; else flags it.</summary>
        public StepOutcome Fallback(double timeYears, StepOutcome failed)
        {
            var form = failed.Form;
            if (options.Fallback is not { } fallback)
            {
                return failed with { Note = $"FORM did not converge ({form.Diagnostic}); no simulation fallback configured" };
            }

            var (problem, _) = Problem(timeYears);
            var sim = fallback.Run(problem, form);
            var note = $"FORM did not converge ({form.Diagnostic}); recomputed by {sim.Method}";
            var route = sim.Method == CrudeMonteCarlo.MethodName ? ComputationRoute.MonteCarlo : fallback.Route;
            return new StepOutcome(sim.FailureProbability, route, sim.Converged, failed.Evaluations + (int)Math.Min(int.MaxValue, sim.LimitStateEvaluations), form, sim,
                sim.Converged ? note : $"{note}, which did not converge either ({sim.Diagnostic})");
        }

        private static StepOutcome FromForm(FormResult form, int extra) =>
            form.Converged
                ? new StepOutcome(form.FailureProbability, ComputationRoute.FirstOrder, true, form.LimitStateEvaluations + extra, form, null, null)
                : new StepOutcome(form.FailureProbability, ComputationRoute.FirstOrder, false, form.LimitStateEvaluations + extra, form, null,
                    $"FORM did not converge ({form.Diagnostic})");

        private (ReliabilityProblem Problem, int ExtraEvaluations) Problem(double timeYears)
        {
            var limitState = new DegradationLimitState(model, timeYears);
            var problem = new ReliabilityProblem(transformation, limitState);
            if (_scale is not null) return (problem, 0);

            // One evaluation at the median point fixes the scale of |G| for every step, so warm starts need no extra
            // evaluation at the origin.
            var x = new double[transformation.PhysicalDimension];
            transformation.ToPhysical(new double[transformation.StandardDimension], x);
            var g0 = Math.Abs(limitState.Evaluate(x));
            _scale = g0 > 0 && double.IsFinite(g0) ? g0 : 1.0;
            return (problem, 1);
        }
    }

    /// <summary>Pf(t) by FORM with a memo and warm starts, for root finding on time.</summary>
    private sealed class CachedPf(IDegradationModel model, ProfileOptions options)
    {
        private readonly Dictionary<double, double> _memo = [];
        private readonly FormStepper _stepper = new(model, new NatafTransformation(model.Inputs), options);
        private readonly List<double> _failedTimes = [];

        public double At(double t)
        {
            if (t <= 0) return 0;
            if (_memo.TryGetValue(t, out var v)) return v;
            var s = _stepper.Step(t);
            if (!s.Converged) _failedTimes.Add(t);
            _memo[t] = s.Pf;
            return s.Pf;
        }

        public CrossingResult Flag(CrossingResult r) =>
            _failedTimes.Count == 0
                ? r
                : r with
                {
                    Converged = false,
                    Note = FormattableString.Invariant($"Pf did not converge at {_failedTimes.Count} of the times evaluated (first at t = {_failedTimes[0]:0.###} years)"),
                };
    }
}
