using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability;

/// <summary>
/// First-order reliability method: the design point u* = argmin ‖u‖ subject to G(u) = 0 by the improved HL-RF
/// iteration (Zhang &amp; Der Kiureghian 1995) with an Armijo line search on the merit function
/// m(u) = ½‖u‖² + c|G(u)|. The search direction is the HL-RF step of Rackwitz &amp; Fiessler (1978).
/// </summary>
/// <remarks>
/// <para>
/// Gradients: ∇ᵤG = Jᵀ∇ₓg with J = ∂x/∂u from the transformation; ∇ₓg is the limit state's analytic gradient or
/// a forward/central finite difference with the relative step of <see cref="FormOptions.RelativeStep"/>. A
/// difference that steps outside the domain of g (non-finite value) is retried on the other side.
/// </para>
/// <para>
/// Penalty: c = 2·max(‖u‖, ‖u + d‖)/‖∇G‖ at each iteration. The first term is the descent condition
/// c &gt; ‖u‖/‖∇G‖ of Zhang &amp; Der Kiureghian (from memory); the second, the magnitude of the Lagrange multiplier
/// of the linearized problem (‖u + d‖ is the HL-RF estimate of |β|), keeps c &gt; 0 at the origin. Both scale as
/// u²/g, so the merit does not depend on the units of g.
/// </para>
/// <para>
/// Convergence: |G(u)|/G_scale ≤ <see cref="FormOptions.LimitStateTolerance"/> and
/// ‖u − (αᵀu)α‖ ≤ <see cref="FormOptions.AlignmentTolerance"/>·max(‖u‖, 1), and, as a guard against limit states
/// that decay towards zero without crossing it, the distance to the linearized surface |G|/‖∇G‖ ≤ 10⁻³·max(‖u‖, 1).
/// The result is signed:
/// β = αᵀu* is negative when G(0) &lt; 0. A run that stops for any other reason (iteration cap, zero or non-finite
/// gradient, non-finite limit state, failed line search) returns its last iterate with
/// <see cref="FormResult.Converged"/> false and a <see cref="FormResult.Diagnostic"/>.
/// </para>
/// </remarks>
public static class FormSolver
{
    private const double ArmijoSlopeFraction = 1e-4;
    private const double ArmijoShrink = 0.5;
    private const int MaxLineSearchSteps = 30;
    private const double PenaltyFactor = 2.0;
    private const double SurfaceDistanceGuard = 1e-3;

    /// <summary>Runs FORM. Never throws for non-convergence: check <see cref="FormResult.Converged"/>.</summary>
    /// <param name="problem">The random inputs, their transformation and the limit state.</param>
    /// <param name="options">Settings; null takes <see cref="FormOptions.Default"/>.</param>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    /// <exception cref="ArgumentException">The problem has no random variables, the start point does not match the
    /// problem, or an analytic gradient was requested from a limit state that has none.</exception>
    public static FormResult Solve(ReliabilityProblem problem, FormOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= FormOptions.Default;
        if (problem.Transformation.StandardDimension == 0)
        {
            throw new ArgumentException("The problem has no random variables (all inputs are deterministic): there is no reliability index to find.", nameof(problem));
        }

        options.Validate(problem.Transformation.StandardDimension);
        if (options.Gradient == GradientMethod.Analytic && !problem.LimitState.HasGradient)
        {
            throw new ArgumentException(
                $"FormOptions.Gradient is Analytic but limit state '{problem.LimitState.Name}' supplies no gradient.",
                nameof(options));
        }

        return new Workspace(problem, options).Run();
    }

    /// <summary>Runs FORM and returns whether it converged; <paramref name="result"/> is always set.</summary>
    /// <param name="problem">The random inputs, their transformation and the limit state.</param>
    /// <param name="options">Settings; null takes <see cref="FormOptions.Default"/>.</param>
    /// <param name="result">The result, converged or not (with its diagnostic).</param>
    public static bool TrySolve(ReliabilityProblem problem, FormOptions? options, out FormResult result)
    {
        result = Solve(problem, options);
        return result.Converged;
    }

    private sealed class Workspace
    {
        private readonly ReliabilityProblem _problem;
        private readonly FormOptions _options;
        private readonly IProbabilityTransformation _t;
        private readonly ILimitState _g;
        private readonly int _n;
        private readonly int _m;
        private readonly double[] _scale;
        private readonly double[] _xStep;
        private readonly double[] _jac;
        private readonly GradientMethod _method;
        private readonly NatafTransformation? _nataf;
        private int _evaluations;

        public Workspace(ReliabilityProblem problem, FormOptions options)
        {
            _problem = problem;
            _options = options;
            _t = problem.Transformation;
            _g = problem.LimitState;
            _n = _t.StandardDimension;
            _m = _t.PhysicalDimension;
            _scale = problem.StepScales;
            _xStep = new double[_m];
            _jac = new double[_m * _n];
            _nataf = _t as NatafTransformation;
            _method = options.Gradient switch
            {
                GradientMethod.Automatic => _g.HasGradient ? GradientMethod.Analytic : GradientMethod.ForwardDifference,
                var other => other,
            };
        }

        private bool Analytic => _method == GradientMethod.Analytic;

        public FormResult Run()
        {
            var u = new double[_n];
            var trial = new double[_n];
            var grad = new double[_n];
            var d = new double[_n];
            var x = new double[_m];
            var xTrial = new double[_m];
            var gradX = new double[_m];
            var gradXTrial = new double[_m];

            if (_options.StartPoint is { } start)
            {
                for (var i = 0; i < _n; i++) u[i] = start[i];
            }

            var g = Evaluate(u, x, gradX);
            var gradientOk = double.IsFinite(g) && GradientU(u, x, g, gradX, grad);
            var gScale = LimitStateScale(g, grad);

            string? diagnostic = null;
            var converged = false;
            var iterations = 0;
            var alignment = double.NaN;
            while (true)
            {
                if (!double.IsFinite(g))
                {
                    diagnostic = Invariant($"The limit state returned {g} at iteration {iterations} (‖u‖ = {Norm(u):G6}).");
                    break;
                }

                var gradNorm2 = Dot(grad, grad);
                if (!gradientOk || !double.IsFinite(gradNorm2))
                {
                    diagnostic = Invariant($"The gradient is not finite at iteration {iterations} (‖u‖ = {Norm(u):G6}).");
                    break;
                }

                if (!(gradNorm2 > 0))
                {
                    diagnostic = Invariant(
                        $"The gradient vanished at iteration {iterations} (‖u‖ = {Norm(u):G6}, G = {g:G6}): the limit state is flat there; try another start point.");
                    break;
                }

                var gradNorm = Math.Sqrt(gradNorm2);
                alignment = AlignmentResidual(u, grad, gradNorm);
                var uNorm = Norm(u);
                if (Math.Abs(g) / gScale <= _options.LimitStateTolerance
                    && alignment <= _options.AlignmentTolerance * Math.Max(uNorm, 1.0))
                {
                    // Guard: a small |G| far from the linearized surface (|G|/‖∇G‖ is that distance in u) means G
                    // decays without crossing zero, as exp(u) does; keep iterating so the run reports it.
                    if (Math.Abs(g) / gradNorm <= SurfaceDistanceGuard * Math.Max(uNorm, 1.0))
                    {
                        converged = true;
                        break;
                    }
                }

                if (iterations >= _options.MaxIterations)
                {
                    diagnostic = Invariant(
                        $"No convergence within {_options.MaxIterations} iterations: |G|/G_scale = {Math.Abs(g) / gScale:G3}, alignment residual = {alignment:G3}, ‖u‖ = {Norm(u):G6}.");
                    break;
                }

                // HL-RF direction: d = [(∇G·u − G)/‖∇G‖²]∇G − u, so u + d is the foot of the linearized surface.
                var factor = (Dot(grad, u) - g) / gradNorm2;
                for (var i = 0; i < _n; i++) d[i] = factor * grad[i] - u[i];

                var uNorm2 = Dot(u, u);
                // |factor| = ‖u + d‖/‖∇G‖ is the multiplier of the linearized problem: c above it keeps d a descent
                // direction even at the origin, where ‖u‖ = 0.
                var c = PenaltyFactor * Math.Max(Math.Sqrt(uNorm2) / gradNorm, Math.Abs(factor));
                var merit = 0.5 * uNorm2 + c * Math.Abs(g);
                // Directional derivative of the merit along d: u·d + c·sign(G)·∇G·d with ∇G·d = −G.
                var slope = Dot(u, d) - c * Math.Abs(g);

                var step = 1.0;
                var gTrial = double.NaN;
                var accepted = false;
                var sawFinite = false;
                var bestStep = double.NaN;
                var bestMerit = merit;
                for (var k = 0; k < MaxLineSearchSteps; k++)
                {
                    for (var i = 0; i < _n; i++) trial[i] = u[i] + step * d[i];
                    gTrial = Evaluate(trial, xTrial, gradXTrial);
                    if (double.IsFinite(gTrial))
                    {
                        sawFinite = true;
                        var meritTrial = 0.5 * Dot(trial, trial) + c * Math.Abs(gTrial);
                        if (meritTrial <= merit + ArmijoSlopeFraction * step * Math.Min(slope, 0.0))
                        {
                            accepted = true;
                            break;
                        }

                        if (meritTrial < bestMerit)
                        {
                            bestMerit = meritTrial;
                            bestStep = step;
                        }
                    }

                    step *= ArmijoShrink;
                }

                if (!accepted && double.IsFinite(bestStep))
                {
                    // No step met the Armijo condition but one still lowered the merit: take it.
                    for (var i = 0; i < _n; i++) trial[i] = u[i] + bestStep * d[i];
                    gTrial = Evaluate(trial, xTrial, gradXTrial);
                    accepted = double.IsFinite(gTrial);
                }

                if (!accepted)
                {
                    diagnostic = sawFinite
                        ? Invariant($"The line search found no step that lowers the merit function at iteration {iterations} (|G|/G_scale = {Math.Abs(g) / gScale:G3}, alignment residual = {alignment:G3}, ‖∇G‖ = {gradNorm:G3}).")
                        : Invariant($"The line search found no point with a finite limit-state value at iteration {iterations}.");
                    break;
                }

                (u, trial) = (trial, u);
                (x, xTrial) = (xTrial, x);
                (gradX, gradXTrial) = (gradXTrial, gradX);
                g = gTrial;
                gradientOk = GradientU(u, x, g, gradX, grad);
                iterations++;
            }

            if (!converged)
            {
                // Hints for the usual cause: a limit state that never reaches zero.
                // A search that ended on the limit state far out has found a point with β > 10 that only failed to
                // align; the hint would mislead there.
                var onSurface = Math.Abs(g) / gScale <= FormResult.OnLimitStateTolerance;
                if (Norm(u) > 10 && !onSurface) diagnostic += " ‖u‖ is far out: the limit state may never reach zero.";
                else if (Math.Abs(g) / gScale > 0.1) diagnostic += " |G| stays far from zero: the limit state may never reach zero.";
                else if (onSurface) diagnostic += Invariant($" The search ended on the limit state (‖u‖ = {Norm(u):G4}) without meeting the alignment tolerance.");
            }

            return BuildResult(u, x, g, gScale, grad, iterations, converged, diagnostic);
        }

        /// <summary>G_scale of the |G| criterion: the option, else |G(0)|, else ‖∇G(u₀)‖.</summary>
        private double LimitStateScale(double gStart, double[] gradStart)
        {
            if (_options.LimitStateScale is { } s) return s;
            var g0 = gStart;
            if (_options.StartPoint is not null)
            {
                g0 = Evaluate(new double[_n], new double[_m], null);
            }

            if (double.IsFinite(g0) && g0 != 0) return Math.Abs(g0);
            var gradNorm = Norm(gradStart);
            return double.IsFinite(gradNorm) && gradNorm > 0 ? gradNorm : 1.0;
        }

        private FormResult BuildResult(double[] u, double[] x, double g, double gScale, double[] grad, int iterations, bool converged, string? diagnostic)
        {
            var gradNorm = Norm(grad);
            var alpha = new double[_n];
            var alphaOk = gradNorm > 0 && double.IsFinite(gradNorm);
            for (var i = 0; i < _n; i++) alpha[i] = alphaOk ? -grad[i] / gradNorm : double.NaN;
            var beta = alphaOk ? Dot(alpha, u) : double.NaN;
            _t.ToPhysical(u, x);
            var gamma = alphaOk ? ImportanceFactors.ImportanceVector(_t, u, alpha) : alpha;
            var factors = new double[_n];
            for (var i = 0; i < _n; i++) factors[i] = gamma[i] * gamma[i];
            return new FormResult
            {
                Beta = beta,
                FailureProbability = StandardNormal.Cdf(-beta),
                DesignPointU = u,
                DesignPointX = x,
                Alpha = alpha,
                ImportanceFactors = factors,
                ImportanceVector = gamma,
                VariableNames = _problem.RandomVariableNames,
                Iterations = iterations,
                LimitStateEvaluations = _evaluations,
                Converged = converged,
                Diagnostic = diagnostic,
                LimitStateValue = g,
                RelativeLimitStateValue = Math.Abs(g) / gScale,
                GradientNorm = gradNorm,
                GradientMethod = _method,
            };
        }

        /// <summary>G(u); with analytic gradients also ∂g/∂x into <paramref name="gradX"/> (same single call).</summary>
        private double Evaluate(double[] u, double[] x, double[]? gradX)
        {
            // A step whose direction overflowed (e.g. a gradient that underflows far out) is no point at all: report
            // it as a non-finite value so the line search rejects it, rather than letting the transformation throw.
            foreach (var ui in u)
            {
                if (!double.IsFinite(ui)) return double.NaN;
            }

            _t.ToPhysical(u, x);
            _evaluations++;
            return Analytic && gradX is not null ? _g.EvaluateWithGradient(x, gradX) : _g.Evaluate(x);
        }

        /// <summary>∇ᵤG = Jᵀ∇ₓg at u; ∇ₓg is already in <paramref name="gradX"/> when analytic. False if not finite.</summary>
        private bool GradientU(double[] u, double[] x, double g, double[] gradX, double[] gradU)
        {
            if (!Analytic) FiniteDifference(x, g, gradX);
            if (_nataf is not null) NatafJacobian(u, x);
            else _t.JacobianPhysicalByStandard(u, _jac);
            Array.Clear(gradU);
            var ok = true;
            for (var i = 0; i < _m; i++)
            {
                var gi = gradX[i];
                if (_scale[i] == 0) continue; // deterministic: no coordinate in u
                if (!double.IsFinite(gi))
                {
                    ok = false;
                    continue;
                }

                if (gi == 0) continue;
                var row = i * _n;
                for (var k = 0; k < _n; k++) gradU[k] += _jac[row + k] * gi;
            }

            return ok;
        }

        /// <summary>
        /// J = ∂x/∂u of the Nataf transformation at a point whose x is already known: dxᵢ/dz_k = φ(z_k)/fᵢ(xᵢ) times
        /// row k of L₀. Same formula as <see cref="NatafTransformation.JacobianPhysicalByStandard"/>, without mapping
        /// u to x a second time (the inverse marginal CDFs dominate the cost of an iteration).
        /// </summary>
        private void NatafJacobian(double[] u, double[] x)
        {
            var random = _problem.Model.RandomIndices;
            var variables = _problem.Model.Variables;
            var l0 = _nataf!.FictiveCorrelation?.CholeskyLower;
            Array.Clear(_jac);
            for (var k = 0; k < _n; k++)
            {
                var z = u[k];
                if (l0 is not null)
                {
                    z = 0;
                    for (var j = 0; j <= k; j++) z += l0[k, j] * u[j];
                }

                var i = random[k];
                var f = variables[i].Pdf(x[i]);
                // Far tails: both densities vanish; the variable then has no first-order influence.
                var dxdz = f > 0 ? StandardNormal.Pdf(z) / f : 0.0;
                if (l0 is null)
                {
                    _jac[i * _n + k] = dxdz;
                }
                else
                {
                    for (var j = 0; j <= k; j++) _jac[i * _n + j] = dxdz * l0[k, j];
                }
            }
        }

        private void FiniteDifference(double[] x, double g, double[] gradX)
        {
            Array.Copy(x, _xStep, _m);
            var central = _method == GradientMethod.CentralDifference;
            for (var i = 0; i < _m; i++)
            {
                if (_scale[i] == 0)
                {
                    gradX[i] = 0;
                    continue;
                }

                var h = _options.RelativeStep * Math.Max(Math.Abs(x[i]), _scale[i]);
                var gp = Shifted(x, i, h);
                if (central)
                {
                    var gm = Shifted(x, i, -h);
                    gradX[i] = (double.IsFinite(gp), double.IsFinite(gm)) switch
                    {
                        (true, true) => (gp - gm) / (2 * h),
                        (true, false) => (gp - g) / h,
                        (false, true) => (g - gm) / h,
                        _ => double.NaN,
                    };
                }
                else
                {
                    // Step back when the forward step leaves the domain of g (e.g. a variable at its bound).
                    gradX[i] = double.IsFinite(gp) ? (gp - g) / h : (g - Shifted(x, i, -h)) / h;
                }
            }
        }

        private double Shifted(double[] x, int i, double h)
        {
            _xStep[i] = x[i] + h;
            _evaluations++;
            var value = _g.Evaluate(_xStep);
            _xStep[i] = x[i];
            return value;
        }

        private double AlignmentResidual(double[] u, double[] grad, double gradNorm)
        {
            // α = −∇G/‖∇G‖; residual of u against its projection (αᵀu)α.
            var proj = -Dot(grad, u) / gradNorm;
            var r2 = 0.0;
            for (var i = 0; i < _n; i++)
            {
                var r = u[i] + proj * grad[i] / gradNorm;
                r2 += r * r;
            }

            return Math.Sqrt(r2);
        }

        private static string Invariant(FormattableString s) => FormattableString.Invariant(s);

        private static double Dot(double[] a, double[] b)
        {
            var s = 0.0;
            for (var i = 0; i < a.Length; i++) s += a[i] * b[i];
            return s;
        }

        private static double Norm(double[] a) => Math.Sqrt(Dot(a, a));
    }
}
