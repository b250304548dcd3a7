using System.Globalization;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Sorm;

namespace InspectionUpdate.Reliability.Verification;

/// <summary>How a route did on a benchmark problem.</summary>
public enum BenchmarkOutcome
{
    /// <summary>Converged and within the tolerance of the reference.</summary>
    Passed,

    /// <summary>Outside the tolerance, but the engine said so (not converged, or a diagnostic flag).</summary>
    Flagged,

    /// <summary>Outside the tolerance, converged and unflagged: the failure the suite exists to catch.</summary>
    WrongAndConverged,

    /// <summary>The route was not run (e.g. crude Monte Carlo where the reference Pf makes it unaffordable).</summary>
    NotRun,
}

/// <summary>One route's result on one problem.</summary>
public sealed record BenchmarkRouteResult
{
    /// <summary>Route name, e.g. "FORM (multi-start)".</summary>
    public required string Route { get; init; }

    /// <summary>True for sampling routes (pass rule in standard errors, not 5 %).</summary>
    public required bool IsSimulation { get; init; }

    /// <summary>The estimate; NaN when the route produced none.</summary>
    public required double FailureProbability { get; init; }

    /// <summary>Estimated CoV of a simulation estimate; null for approximations.</summary>
    public double? CoefficientOfVariation { get; init; }

    /// <summary>Limit-state evaluations this route needed in all (a SORM or importance-sampling row includes its FORM search).</summary>
    public required long LimitStateEvaluations { get; init; }

    /// <summary>Whether the route says it converged.</summary>
    public required bool Converged { get; init; }

    /// <summary>The engine's diagnostic flags on this result (multiple design points, unstable curvatures, disagreement with simulation…).</summary>
    public IReadOnlyList<string> Flags { get; init; } = [];

    /// <summary>A note (why not converged, seed, samples), or null.</summary>
    public string? Note { get; init; }

    /// <summary>
    /// Limit-state evaluations of the engine's simulation check of this result (<see cref="DesignPointSimulationCheck"/>),
    /// not included in <see cref="LimitStateEvaluations"/>; null when the result was not checked.
    /// </summary>
    public long? CheckEvaluations { get; init; }
}

/// <summary>A row of the benchmark table.</summary>
/// <param name="Problem">The problem.</param>
/// <param name="Result">The route's result; null when not run.</param>
/// <param name="RouteName">The route's name (also when not run).</param>
/// <param name="Outcome">Pass, flagged, wrong and converged, or not run.</param>
/// <param name="RelativeError">(obtained − reference)/reference; NaN when not run or no estimate.</param>
/// <param name="FlaggedOnlyByCrossCheck">True when the only flag is the cross-check against simulation.</param>
public sealed record BenchmarkRow(BenchmarkProblem Problem, string RouteName, BenchmarkRouteResult? Result, BenchmarkOutcome Outcome, double RelativeError, bool FlaggedOnlyByCrossCheck);

/// <summary>Per-route figures over a benchmark run.</summary>
/// <param name="Route">Route name.</param>
/// <param name="Passed">Problems passed.</param>
/// <param name="Flagged">Problems outside tolerance that the engine flagged.</param>
/// <param name="FlaggedOnlyByCrossCheck">Of those, the ones flagged only by the cross-check against simulation.</param>
/// <param name="WrongAndConverged">Problems outside tolerance, converged and unflagged.</param>
/// <param name="NotRun">Problems the route was not run on.</param>
/// <param name="MedianEvaluations">Median limit-state evaluations over the problems it ran on.</param>
/// <param name="MedianCheckEvaluations">Median evaluations of the simulation check over the problems where it ran; NaN when it never ran.</param>
public sealed record BenchmarkRouteSummary(string Route, int Passed, int Flagged, int FlaggedOnlyByCrossCheck, int WrongAndConverged, int NotRun, double MedianEvaluations,
    double MedianCheckEvaluations);

/// <summary>Settings of a benchmark run.</summary>
public sealed record BenchmarkOptions
{
    /// <summary>Multi-start FORM settings (its design point also centres importance sampling and SORM).</summary>
    public MultiStartFormOptions Form { get; init; } = MultiStartFormOptions.Default;

    /// <summary>Importance sampling: target CoV 0.05, at most 100 000 samples.</summary>
    public SamplingOptions ImportanceSampling { get; init; } = new() { TargetCoefficientOfVariation = 0.05, MaxSamples = 100_000, Seed = 11 };

    /// <summary>The simulation check of converged FORM and SORM estimates (importance sampling at their design point, target CoV 0.01).</summary>
    public DesignPointSimulationCheckOptions SimulationCheck { get; init; } = DesignPointSimulationCheckOptions.Default;

    /// <summary>Subset simulation: 2000 samples per level.</summary>
    public SubsetSimulationOptions Subset { get; init; } = new() { SamplesPerLevel = 2000, Seed = 13 };

    /// <summary>Crude Monte Carlo: target CoV 0.1, at most 2·10⁶ samples.</summary>
    public SamplingOptions CrudeMonteCarlo { get; init; } = new() { TargetCoefficientOfVariation = 0.1, MaxSamples = 2_000_000, Seed = 17 };

    /// <summary>Crude Monte Carlo runs only where the reference Pf is at least this (10⁻⁴: 10⁶ samples for CoV 0.1).</summary>
    public double CrudeMonteCarloMinimumPf { get; init; } = 1e-4;

    /// <summary>Pass tolerance of approximations (FORM, SORM): relative error 5 %.</summary>
    public double RelativeTolerance { get; init; } = 0.05;

    /// <summary>Pass tolerance of simulations: this many combined standard errors (the estimate's and the reference's).</summary>
    public double StandardErrors { get; init; } = 3;

    /// <summary>The default settings.</summary>
    public static BenchmarkOptions Default { get; } = new();
}

/// <summary>Per-problem state shared by the routes: the multi-start FORM and SORM results are computed once.</summary>
public sealed class BenchmarkContext
{
    private MultiStartFormResult? _form;
    private SormResult? _sorm;
    private DesignPointSimulationCheckResult? _check;
    private bool _checkDone;

    internal BenchmarkContext(BenchmarkProblem problem, BenchmarkOptions options)
    {
        Problem = problem;
        Options = options;
    }

    /// <summary>The problem.</summary>
    public BenchmarkProblem Problem { get; }

    /// <summary>The run's settings.</summary>
    public BenchmarkOptions Options { get; }

    /// <summary>The multi-start FORM result (computed on first use).</summary>
    public MultiStartFormResult Form => _form ??= MultiStartFormSolver.Solve(Problem.Problem, Options.Form);

    /// <summary>SORM with the curvature check around <see cref="Form"/>'s kept design point (computed on first use).</summary>
    public SormResult Sorm => _sorm ??= SormSolver.SolveWithCurvatureCheck(Problem.Problem, Form.Best);

    /// <summary>
    /// The simulation check at <see cref="Form"/>'s kept design point (computed on first use); null when FORM did not
    /// converge (its result is flagged already and the design point may not be finite).
    /// </summary>
    public DesignPointSimulationCheckResult? Check(CancellationToken cancellationToken)
    {
        if (_checkDone) return _check;
        if (Form.Converged && Form.Best.DesignPointU.All(double.IsFinite))
        {
            _check = DesignPointSimulationCheck.Run(Problem.Problem, Form.Best, Options.SimulationCheck, cancellationToken);
        }

        _checkDone = true;
        return _check;
    }
}

/// <summary>
/// One route of the benchmark suite. The engine's routes are in <see cref="BenchmarkRunner.DefaultRoutes"/>; a new
/// route (e.g. a sampling route for time-variant profiles) implements this and is passed to
/// <see cref="BenchmarkRunner.Run"/> with the defaults, and `verify` shows it like the others.
/// </summary>
public interface IBenchmarkRoute
{
    /// <summary>Name shown in the table.</summary>
    string Name { get; }

    /// <summary>True for sampling routes.</summary>
    bool IsSimulation { get; }

    /// <summary>Runs the route; null when it does not apply or is not affordable for this problem.</summary>
    BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken);
}

/// <summary>
/// Runs every route of the engine on benchmark problems and classifies each result against the reference: passed
/// (converged and within 5 %, or for simulation within three combined standard errors), flagged (outside but not
/// converged or flagged by a diagnostic), or wrong and converged.
/// </summary>
/// <remarks>
/// Flags come from the engine's own diagnostics: FORM's convergence, multi-start FORM's other significant design
/// points, SORM's curvature and second-order model checks, the simulation check of converged FORM and SORM estimates
/// at their design point (<see cref="DesignPointSimulationCheck"/>; its evaluations are counted apart, in
/// <see cref="BenchmarkRouteResult.CheckEvaluations"/>), and, after all routes ran, the cross-checks between routes
/// (see <c>CrossCheck</c>: simulations against each other, FORM and SORM against the best simulation, simulations
/// against a FORM or SORM estimate that passed its own checks). Summaries count separately the results flagged only by
/// a cross-check.
/// </remarks>
public static class BenchmarkRunner
{
    /// <summary>The flag text of the cross-check against simulation starts with this.</summary>
    public const string CrossCheckFlag = "disagrees with simulation";

    /// <summary>FORM (multi-start), SORM (three formulas), importance sampling at the design point, subset simulation, crude Monte Carlo.</summary>
    public static IReadOnlyList<IBenchmarkRoute> DefaultRoutes { get; } =
    [
        new FormRoute(), new SormRoute(0), new SormRoute(1), new SormRoute(2), new ImportanceSamplingRoute(), new SubsetRoute(), new CrudeRoute(),
    ];

    /// <summary>Runs the routes on the problems (in order) and classifies every result.</summary>
    /// <param name="problems">The problems.</param>
    /// <param name="options">Settings; null for defaults.</param>
    /// <param name="routes">The routes; null for <see cref="DefaultRoutes"/>.</param>
    /// <param name="progress">Called with the fraction done after each problem, or null.</param>
    /// <param name="cancellationToken">Stops between routes.</param>
    public static IReadOnlyList<BenchmarkRow> Run(IEnumerable<BenchmarkProblem> problems, BenchmarkOptions? options = null,
        IReadOnlyList<IBenchmarkRoute>? routes = null, Action<double>? progress = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(problems);
        options ??= BenchmarkOptions.Default;
        routes ??= DefaultRoutes;
        var list = problems.ToList();
        var rows = new List<BenchmarkRow>();
        for (var p = 0; p < list.Count; p++)
        {
            var context = new BenchmarkContext(list[p], options);
            var results = new List<(IBenchmarkRoute Route, BenchmarkRouteResult? Result)>();
            foreach (var route in routes)
            {
                cancellationToken.ThrowIfCancellationRequested();
                results.Add((route, route.Run(context, cancellationToken)));
            }

            var crossChecked = CrossCheck(results.Select(r => r.Result).ToArray(), options);
            for (var r = 0; r < results.Count; r++) rows.Add(Classify(list[p], results[r].Route.Name, crossChecked[r], options));

            progress?.Invoke((p + 1.0) / list.Count);
        }

        return rows;
    }

    /// <summary>
    /// The cross-checks between routes on one problem: (1) two converged simulations that differ by more than three
    /// combined standard errors are both flagged; (2) every FORM or SORM estimate is compared with the converged,
    /// unflagged simulation of smallest CoV and flagged when they differ by more than three of its standard errors
    /// plus the 5 % tolerance; (3) a converged simulation is flagged when a converged, unflagged FORM or SORM estimate
    /// differs from it by more than a factor 2 (FORM and SORM are rarely off by more on a problem their own
    /// diagnostics pass: common practice, no source).
    /// </summary>
    private static BenchmarkRouteResult?[] CrossCheck(BenchmarkRouteResult?[] results, BenchmarkOptions options)
    {
        var checkedResults = (BenchmarkRouteResult?[])results.Clone();
        static double Se(BenchmarkRouteResult r) => r.CoefficientOfVariation is { } c && double.IsFinite(c) ? c * r.FailureProbability : double.PositiveInfinity;
        void Flag(int i, string text) => checkedResults[i] = checkedResults[i]! with { Flags = [.. checkedResults[i]!.Flags, text] };

        var sims = Enumerable.Range(0, results.Length).Where(i => results[i] is { IsSimulation: true, Converged: true } r && double.IsFinite(Se(r))).ToArray();
        foreach (var i in sims)
        {
            foreach (var j in sims)
            {
                if (i == j) continue;
                var a = results[i]!;
                var b = results[j]!;
                var combined = Math.Sqrt(Se(a) * Se(a) + Se(b) * Se(b));
                if (Math.Abs(a.FailureProbability - b.FailureProbability) > options.StandardErrors * combined)
                {
                    Flag(i, string.Create(CultureInfo.InvariantCulture, $"{CrossCheckFlag} ({b.Route}: {b.FailureProbability:G3} ± {Se(b):G2})"));
                }
            }
        }

        var yardstick = sims.Select(i => checkedResults[i]!).Where(r => r.Flags.Count == 0 && r.FailureProbability > 0)
            .OrderBy(r => r.CoefficientOfVariation).FirstOrDefault();
        for (var i = 0; i < results.Length; i++)
        {
            if (results[i] is not { IsSimulation: false } approx || yardstick is null || !double.IsFinite(approx.FailureProbability)) continue;
            var se = Se(yardstick);
            if (Math.Abs(approx.FailureProbability - yardstick.FailureProbability) > options.StandardErrors * se + options.RelativeTolerance * yardstick.FailureProbability)
            {
                Flag(i, string.Create(CultureInfo.InvariantCulture, $"{CrossCheckFlag} ({yardstick.Route}: {yardstick.FailureProbability:G3} ± {se:G2})"));
            }
        }

        var trusted = checkedResults.Where(r => r is { IsSimulation: false, Converged: true, Flags.Count: 0 } && r.FailureProbability > 0).ToArray();
        foreach (var i in sims)
        {
            var s = results[i]!;
            var against = trusted.FirstOrDefault(t => s.FailureProbability <= 0 || Math.Abs(Math.Log(s.FailureProbability / t!.FailureProbability)) > Math.Log(2));
            if (against is not null)
            {
                Flag(i, string.Create(CultureInfo.InvariantCulture, $"{CrossCheckFlag}: differs by more than a factor 2 from {against.Route} ({against.FailureProbability:G3})"));
            }
        }

        return checkedResults;
    }

    /// <summary>Classifies one result (public so that added routes are judged by the same rule).</summary>
    public static BenchmarkRow Classify(BenchmarkProblem problem, string routeName, BenchmarkRouteResult? result, BenchmarkOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= BenchmarkOptions.Default;
        if (result is null) return new BenchmarkRow(problem, routeName, null, BenchmarkOutcome.NotRun, double.NaN, false);
        var reference = problem.ReferencePf;
        var p = result.FailureProbability;
        var relative = double.IsFinite(p) ? (p - reference) / reference : double.NaN;
        bool within;
        if (result.IsSimulation)
        {
            var se = result.CoefficientOfVariation is { } c && double.IsFinite(c) ? c * p : double.PositiveInfinity;
            var combined = Math.Sqrt(se * se + Math.Pow(problem.ReferenceRelativeUncertainty * reference, 2));
            within = double.IsFinite(p) && Math.Abs(p - reference) <= options.StandardErrors * combined;
        }
        else
        {
            within = double.IsFinite(relative) && Math.Abs(relative) <= options.RelativeTolerance;
        }

        var outcome = result.Converged && within ? BenchmarkOutcome.Passed
            : !result.Converged || result.Flags.Count > 0 ? BenchmarkOutcome.Flagged
            : BenchmarkOutcome.WrongAndConverged;
        var onlyCross = outcome == BenchmarkOutcome.Flagged && result.Converged && result.Flags.Count > 0
            && result.Flags.All(f => f.StartsWith(CrossCheckFlag, StringComparison.Ordinal));
        return new BenchmarkRow(problem, routeName, result, outcome, relative, onlyCross);
    }

    /// <summary>The per-route figures, routes in the order they first appear.</summary>
    public static IReadOnlyList<BenchmarkRouteSummary> Summarize(IReadOnlyList<BenchmarkRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        return rows.GroupBy(r => r.RouteName).Select(g =>
        {
            var median = Median(g.Where(r => r.Result is not null).Select(r => (double)r.Result!.LimitStateEvaluations));
            var checkMedian = Median(g.Where(r => r.Result?.CheckEvaluations is not null).Select(r => (double)r.Result!.CheckEvaluations!.Value));
            return new BenchmarkRouteSummary(g.Key,
                g.Count(r => r.Outcome == BenchmarkOutcome.Passed),
                g.Count(r => r.Outcome == BenchmarkOutcome.Flagged),
                g.Count(r => r.FlaggedOnlyByCrossCheck),
                g.Count(r => r.Outcome == BenchmarkOutcome.WrongAndConverged),
                g.Count(r => r.Outcome == BenchmarkOutcome.NotRun),
                median,
                checkMedian);
        }).ToArray();
    }

    private static double Median(IEnumerable<double> values)
    {
        var v = values.Order().ToArray();
        return v.Length == 0 ? double.NaN : v.Length % 2 == 1 ? v[v.Length / 2] : 0.5 * (v[v.Length / 2 - 1] + v[v.Length / 2]);
    }

    /// <summary>The simulation check's flag on a converged estimate, if any (added to the route's own flags).</summary>
    private static IEnumerable<string> CheckFlags(DesignPointSimulationCheckResult? check, bool converged, double estimate) =>
        converged && check?.Flag(estimate) is { } flag ? [flag] : [];

    private static string[] FormFlags(MultiStartFormResult form) =>
        form.SignificantOtherDesignPoints.Count > 0 && form.Warning is { } w ? ["multiple design points: " + w] : [];

    private sealed class FormRoute : IBenchmarkRoute
    {
        public string Name => "FORM (multi-start)";

        public bool IsSimulation => false;

        public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken)
        {
            var form = context.Form;
            var check = context.Check(cancellationToken);
            return new BenchmarkRouteResult
            {
                Route = Name,
                IsSimulation = false,
                FailureProbability = form.Best.FailureProbability,
                LimitStateEvaluations = form.LimitStateEvaluations,
                Converged = form.Converged,
                Flags = [.. FormFlags(form), .. CheckFlags(check, form.Converged, form.Best.FailureProbability)],
                Note = form.Converged ? form.Warning : form.Best.Diagnostic,
                CheckEvaluations = check?.Simulation.LimitStateEvaluations,
            };
        }
    }

    private sealed class SormRoute(int formula) : IBenchmarkRoute
    {
        public string Name => formula switch { 0 => "SORM Breitung", 1 => "SORM Hohenbichler–Rackwitz", _ => "SORM Tvedt" };

        public bool IsSimulation => false;

        public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken)
        {
            var sorm = context.Sorm;
            var estimate = sorm.Estimates[formula];
            var flags = new List<string>(FormFlags(context.Form));
            if (sorm.CurvatureWarning is { } w) flags.Add(w);
            var converged = sorm.Converged && estimate.Valid;
            var check = context.Check(cancellationToken);
            flags.AddRange(CheckFlags(check, converged, estimate.FailureProbability));
            return new BenchmarkRouteResult
            {
                Route = Name,
                IsSimulation = false,
                FailureProbability = estimate.FailureProbability,
                LimitStateEvaluations = context.Form.LimitStateEvaluations + sorm.LimitStateEvaluations,
                Converged = converged,
                Flags = flags,
                Note = estimate.Note ?? (sorm.Converged ? null : sorm.Diagnostic),
                CheckEvaluations = check?.Simulation.LimitStateEvaluations,
            };
        }
    }

    private static BenchmarkRouteResult FromSimulation(string name, SimulationResult s, long extraEvaluations, IReadOnlyList<string> flags) => new()
    {
        Route = name,
        IsSimulation = true,
        FailureProbability = s.FailureProbability,
        CoefficientOfVariation = s.CoefficientOfVariation,
        LimitStateEvaluations = s.LimitStateEvaluations + extraEvaluations,
        Converged = s.Converged,
        Flags = flags,
        Note = string.Create(CultureInfo.InvariantCulture, $"CoV {s.CoefficientOfVariation:0.000}, {s.Samples} samples, seed {s.Seed}") + (s.Diagnostic is null ? "" : "; " + s.Diagnostic),
    };

    private sealed class ImportanceSamplingRoute : IBenchmarkRoute
    {
        public string Name => "importance sampling at the design point";

        public bool IsSimulation => true;

        public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken)
        {
            var form = context.Form;
            var flags = new List<string>();
            if (form.SignificantOtherDesignPoints.Count > 0) flags.Add("centred at one of several significant design points: the others' regions are sampled rarely");
            if (context.Check(cancellationToken) is { Conclusive: false } check)
            {
                flags.Add(string.Create(CultureInfo.InvariantCulture,
                    $"{DesignPointSimulationCheckResult.FlagPrefix}: a longer run at the same centre reached only CoV {check.Simulation.CoefficientOfVariation:0.###} after {check.Simulation.Samples} samples: heavy-tailed weights, the estimate and its CoV are not reliable"));
            }

            var s = ImportanceSampling.Run(context.Problem.Problem, form.Best, context.Options.ImportanceSampling, cancellationToken);
            return FromSimulation(Name, s, form.LimitStateEvaluations, flags);
        }
    }

    private sealed class SubsetRoute : IBenchmarkRoute
    {
        public string Name => "subset simulation";

        public bool IsSimulation => true;

        public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken) =>
            FromSimulation(Name, SubsetSimulation.Run(context.Problem.Problem, context.Options.Subset, cancellationToken).Simulation, 0, []);
    }

    private sealed class CrudeRoute : IBenchmarkRoute
    {
        public string Name => "crude Monte Carlo";

        public bool IsSimulation => true;

        public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken) =>
            context.Problem.ReferencePf < context.Options.CrudeMonteCarloMinimumPf
                ? null
                : FromSimulation(Name, CrudeMonteCarlo.Run(context.Problem.Problem, context.Options.CrudeMonteCarlo, cancellationToken), 0, []);
    }
}
