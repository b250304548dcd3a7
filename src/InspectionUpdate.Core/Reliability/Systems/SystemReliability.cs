using System.Globalization;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Reliability.Systems;

/// <summary>How the system events are joined.</summary>
public enum SystemKind
{
    /// <summary>Series system: failure if any component fails (union of the failure events).</summary>
    Series,

    /// <summary>Parallel system: failure only if every component fails (intersection of the failure events).</summary>
    Parallel,
}

/// <summary>Where the component limit states are linearized.</summary>
public enum SystemLinearization
{
    /// <summary>Each limit state at its own FORM design point.</summary>
    IndividualDesignPoints,

    /// <summary>
    /// All limit states at the joint design point of the intersection (the point of the intersection of the failure
    /// domains closest to the origin). Only meaningful for parallel systems; a series system falls back to the
    /// individual points and says so.
    /// </summary>
    JointDesignPoint,
}

/// <summary>Settings of a first-order system analysis.</summary>
public sealed record SystemOptions
{
    /// <summary>Linearization points. Default: each event's own design point.</summary>
    public SystemLinearization Linearization { get; init; } = SystemLinearization.IndividualDesignPoints;

    /// <summary>Settings of the component FORM runs.</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>Settings of the multinormal integration.</summary>
    public MultinormalOptions Multinormal { get; init; } = MultinormalOptions.Default;

    /// <summary>Iteration cap of the joint design-point search.</summary>
    public int JointMaxIterations { get; init; } = 100;

    /// <summary>Tolerance of the joint search: on the step ‖Δu‖/max(1, ‖u‖) and on the constraint violation max Gᵢ⁺/‖∇Gᵢ‖.</summary>
    public double JointTolerance { get; init; } = 1e-7;

    /// <summary>The default settings.</summary>
    public static SystemOptions Default { get; } = new();
}

/// <summary>Outcome of a first-order system analysis.</summary>
public sealed record SystemResult
{
    /// <summary>Series or parallel.</summary>
    public required SystemKind Kind { get; init; }

    /// <summary>The linearization actually used (a series system always reports individual points).</summary>
    public required SystemLinearization Linearization { get; init; }

    /// <summary>First-order system failure probability.</summary>
    public required double FailureProbability { get; init; }

    /// <summary>Generalized reliability index −Φ⁻¹(Pf).</summary>
    public required double GeneralizedBeta { get; init; }

    /// <summary>The multinormal integral behind <see cref="FailureProbability"/> (method, error estimate, evaluations).</summary>
    public required MultinormalResult Integral { get; init; }

    /// <summary>FORM result of each component at its own design point, in input order.</summary>
    public required IReadOnlyList<FormResult> Components { get; init; }

    /// <summary>The linearized events used (β, α per component), in input order.</summary>
    public required IReadOnlyList<LinearizedEvent> Events { get; init; }

    /// <summary>ρᵢⱼ = αᵢᵀαⱼ of the events used.</summary>
    public required double[,] Correlation { get; init; }

    /// <summary>The joint design point in u, when <see cref="Linearization"/> is the joint point.</summary>
    public IReadOnlyList<double>? JointDesignPointU { get; init; }

    /// <summary>True when every FORM run, the joint search (if used) and the integration converged.</summary>
    public required bool Converged { get; init; }

    /// <summary>What did not converge, or a note (e.g. a fallback), or null.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>A one-line description of how the result was computed.</summary>
    public required string Method { get; init; }

    /// <summary>Limit-state evaluations over all components and searches.</summary>
    public required long LimitStateEvaluations { get; init; }
}

/// <summary>
/// First-order reliability of series and parallel systems of limit states over one transformation x ↔ u.
/// </summary>
/// <remarks>
/// Each component is linearized (at its own design point, or, for a parallel system, at the joint design point of
/// the intersection found by a sequential quadratic programming iteration: minimize ½‖u‖² subject to the linearized
/// constraints Gᵢ(uₖ) + ∇Gᵢᵀ(u − uₖ) ≤ 0, each subproblem solved exactly through its dual by Hildreth's
/// coordinate-ascent method), and the linearized events are integrated by <see cref="FirstOrderSystem"/>.
/// Linearizing at the joint point follows Hohenbichler &amp; Rackwitz (1983) [from memory]; it matters when the
/// individual design points lie far from the intersection.
/// </remarks>
public static class SystemReliability
{
    /// <summary>Analyses the system. Never throws for non-convergence: check <see cref="SystemResult.Converged"/>.</summary>
    /// <param name="transformation">The shared map x ↔ u.</param>
    /// <param name="limitStates">Component limit states (at least one), failure when gᵢ ≤ 0.</param>
    /// <param name="kind">Series or parallel.</param>
    /// <param name="options">Settings; null for defaults.</param>
    /// <exception cref="ArgumentException">No limit states, or a null entry.</exception>
    public static SystemResult Analyze(IProbabilityTransformation transformation, IReadOnlyList<ILimitState> limitStates, SystemKind kind, SystemOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(transformation);
        ArgumentNullException.ThrowIfNull(limitStates);
        if (limitStates.Count == 0) throw new ArgumentException("A system needs at least one limit state.", nameof(limitStates));
        if (limitStates.Any(l => l is null)) throw new ArgumentException("A limit state is null.", nameof(limitStates));
        options ??= SystemOptions.Default;

        var components = limitStates.Select(ls => FormSolver.Solve(new ReliabilityProblem(transformation, ls), options.Form)).ToArray();
        long evaluations = components.Sum(c => (long)c.LimitStateEvaluations);
        var notes = new List<string>();
        var converged = true;
        for (var i = 0; i < components.Length; i++)
        {
            if (!components[i].Converged)
            {
                converged = false;
                notes.Add($"FORM for '{limitStates[i].Name}' did not converge: {components[i].Diagnostic}");
            }
        }

        var linearization = options.Linearization;
        if (linearization == SystemLinearization.JointDesignPoint && kind == SystemKind.Series)
        {
            linearization = SystemLinearization.IndividualDesignPoints;
            notes.Add("A series system is linearized at each component's own design point; the joint point applies to intersections only.");
        }

        IReadOnlyList<LinearizedEvent> events;
        double[]? joint = null;
        if (linearization == SystemLinearization.JointDesignPoint && limitStates.Count > 1)
        {
            var functions = limitStates.Select(ls => new StandardSpaceLimitState(transformation, ls)).ToArray();
            var start = StartPoint(components);
            var (u, ok, note) = JointDesignPoint(functions, start, options);
            evaluations += functions.Sum(f => f.Evaluations);
            joint = u;
            if (!ok)
            {
                converged = false;
                notes.Add(note!);
            }

            events = Linearize(functions, u);
            evaluations += functions.Length;
        }
        else
        {
            linearization = SystemLinearization.IndividualDesignPoints;
            events = components.Select(LinearizedEvent.FromForm).ToArray();
        }

        var integral = kind == SystemKind.Parallel
            ? FirstOrderSystem.Intersection(events, options.Multinormal)
            : FirstOrderSystem.Union(events, options.Multinormal);
        if (!integral.Converged)
        {
            converged = false;
            notes.Add("Multinormal integration: " + integral.Diagnostic);
        }

        var where = linearization == SystemLinearization.JointDesignPoint ? "joint design point of the intersection" : "each component's own design point";
        var method = string.Create(CultureInfo.InvariantCulture,
            $"first-order {(kind == SystemKind.Parallel ? "parallel" : "series")} system, linearized at {where}; {integral.Method}");
        return new SystemResult
        {
            Kind = kind,
            Linearization = linearization,
            FailureProbability = integral.Value,
            GeneralizedBeta = FirstOrderSystem.GeneralizedBeta(integral.Value),
            Integral = integral,
            Components = components,
            Events = events,
            Correlation = FirstOrderSystem.Correlation(events),
            JointDesignPointU = joint,
            Converged = converged,
            Diagnostic = notes.Count == 0 ? null : string.Join(" ", notes),
            Method = method,
            LimitStateEvaluations = evaluations,
        };
    }

    /// <summary>Convenience overload: the limit states share the problem's transformation (its own limit state is not added).</summary>
    public static SystemResult Analyze(ReliabilityProblem problem, IReadOnlyList<ILimitState> limitStates, SystemKind kind, SystemOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        return Analyze(problem.Transformation, limitStates, kind, options);
    }

    /// <summary>Starts the joint search at the component design point farthest from the origin.</summary>
    private static double[] StartPoint(FormResult[] components) =>
        components.OrderByDescending(c => c.Beta).First().DesignPointU.ToArray();

    /// <summary>Linearizes every limit state at u: αᵢ = −∇Gᵢ/‖∇Gᵢ‖, βᵢ = Gᵢ(u)/‖∇Gᵢ‖ + αᵢᵀu.</summary>
    internal static LinearizedEvent[] Linearize(StandardSpaceLimitState[] functions, double[] u)
    {
        var n = u.Length;
        var grad = new double[n];
        var events = new LinearizedEvent[functions.Length];
        for (var i = 0; i < functions.Length; i++)
        {
            var g = functions[i].ValueAndGradient(u, grad);
            var norm = Math.Sqrt(grad.Sum(v => v * v));
            var alpha = grad.Select(v => -v / norm).ToArray();
            var beta = g / norm;
            for (var k = 0; k < n; k++) beta += alpha[k] * u[k];
            events[i] = new LinearizedEvent(beta, alpha);
        }

        return events;
    }

    /// <summary>
    /// Sequential quadratic programming for min ½‖u‖² s.t. Gᵢ(u) ≤ 0 for all i; the step is halved while the merit
    /// ½‖u‖² + c Σ max(0, Gᵢ/‖∇Gᵢ‖) does not decrease.
    /// </summary>
    internal static (double[] U, bool Converged, string? Note) JointDesignPoint(StandardSpaceLimitState[] functions, double[] start, SystemOptions options)
    {
        var m = functions.Length;
        var n = start.Length;
        var u = (double[])start.Clone();
        var grads = new double[m][];
        var values = new double[m];
        for (var i = 0; i < m; i++) grads[i] = new double[n];

        for (var iteration = 0; iteration < options.JointMaxIterations; iteration++)
        {
            for (var i = 0; i < m; i++) values[i] = functions[i].ValueAndGradient(u, grads[i]);
            if (values.Any(v => !double.IsFinite(v)) || grads.Any(g => g.Any(v => !double.IsFinite(v))))
            {
                return (u, false, string.Create(CultureInfo.InvariantCulture, $"Joint design point: a limit state or gradient is not finite at iteration {iteration}."));
            }

            // Linearized constraints aᵢᵀu ≤ bᵢ with aᵢ = ∇Gᵢ/‖∇Gᵢ‖ (normalized for conditioning).
            var a = new double[m][];
            var b = new double[m];
            for (var i = 0; i < m; i++)
            {
                var norm = Math.Sqrt(grads[i].Sum(v => v * v));
                if (!(norm > 0)) return (u, false, $"Joint design point: the gradient of component {i} vanished.");
                a[i] = grads[i].Select(v => v / norm).ToArray();
                b[i] = -values[i] / norm;
                for (var k = 0; k < n; k++) b[i] += a[i][k] * u[k];
            }

            var target = MinimumNormPoint(a, b, n);
            var stepNorm = 0.0;
            for (var k = 0; k < n; k++) stepNorm += (target[k] - u[k]) * (target[k] - u[k]);
            stepNorm = Math.Sqrt(stepNorm);

            var violation = 0.0;
            for (var i = 0; i < m; i++) violation = Math.Max(violation, values[i] / Math.Sqrt(grads[i].Sum(v => v * v)));
            var scale = Math.Max(1, Math.Sqrt(u.Sum(v => v * v)));
            if (stepNorm <= options.JointTolerance * scale && violation <= options.JointTolerance * scale)
            {
                return (u, true, null);
            }

            // Backtracking on the merit function keeps nonlinear constraints from overshooting.
            var merit = Merit(u, values, grads, 10 * scale);
            var step = 1.0;
            var trial = new double[n];
            var trialValues = new double[m];
            for (var k = 0; k < 20; k++)
            {
                for (var j = 0; j < n; j++) trial[j] = u[j] + step * (target[j] - u[j]);
                for (var i = 0; i < m; i++) trialValues[i] = functions[i].Value(trial);
                if (trialValues.All(double.IsFinite) && Merit(trial, trialValues, grads, 10 * scale) < merit + 1e-12 * scale * scale) break;
                step *= 0.5;
            }

            Array.Copy(trial, u, n);
        }

        return (u, false, string.Create(CultureInfo.InvariantCulture, $"Joint design point: no convergence within {options.JointMaxIterations} iterations."));
    }

    private static double Merit(double[] u, double[] values, double[][] grads, double c)
    {
        var m = 0.5 * u.Sum(v => v * v);
        for (var i = 0; i < values.Length; i++) m += c * Math.Max(0, values[i]) / Math.Sqrt(grads[i].Sum(v => v * v));
        return m;
    }

    /// <summary>
    /// min ½‖u‖² s.t. Au ≤ b by its dual, min ½λᵀ(AAᵀ)λ + bᵀλ over λ ≥ 0, solved by Hildreth's (1957) coordinate
    /// method; u = −Aᵀλ.
    /// </summary>
    internal static double[] MinimumNormPoint(double[][] a, double[] b, int n)
    {
        var m = b.Length;
        var h = new double[m, m];
        for (var i = 0; i < m; i++)
            for (var j = 0; j < m; j++)
            {
                var s = 0.0;
                for (var k = 0; k < n; k++) s += a[i][k] * a[j][k];
                h[i, j] = s;
            }

        var lambda = new double[m];
        for (var sweep = 0; sweep < 100_000; sweep++)
        {
            var change = 0.0;
            for (var i = 0; i < m; i++)
            {
                var grad = b[i];
                for (var j = 0; j < m; j++) grad += h[i, j] * lambda[j];
                var next = Math.Max(0, lambda[i] - grad / h[i, i]);
                change = Math.Max(change, Math.Abs(next - lambda[i]));
                lambda[i] = next;
            }

            if (change <= 1e-15 * (1 + lambda.Max())) break;
        }

        var u = new double[n];
        for (var i = 0; i < m; i++)
            for (var k = 0; k < n; k++) u[k] -= lambda[i] * a[i][k];
        return u;
    }
}
