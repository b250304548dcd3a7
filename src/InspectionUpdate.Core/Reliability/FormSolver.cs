using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability;

/// <summary>
/// First-order reliability method: the design point by the improved HL-RF iteration with an Armijo line search on
/// the merit function m(u) = ½‖u‖² + c|G(u)| (Zhang &amp; Der Kiureghian 1995; HL-RF step of Rackwitz &amp; Fiessler 1978).
/// </summary>
public static class FormSolver
{
    private const double ArmijoA = 0.5;
    private const double ArmijoB = 0.5;
    private const int MaxLineSearchSteps = 30;
    private const double PenaltyFactor = 2.0;

    /// <summary>Runs FORM. Never throws for non-convergence: check <see cref="FormResult.Converged"/>.</summary>
    public static FormResult Solve(ReliabilityProblem problem, FormOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= FormOptions.Default;
        var work = new Workspace(problem, options);
        return work.Run();
    }

    private sealed class Workspace
    {
        private readonly ReliabilityProblem _problem;
        private readonly FormOptions _options;
        private readonly IProbabilityTransformation _t;
        private readonly int _n;
        private readonly int _m;
        private readonly double[] _x;
        private readonly double[] _xStep;
        private readonly double[] _gradX;
        private readonly double[] _jac;
        private readonly double[] _scale;
        private readonly bool _analytic;
        private readonly bool _central;
        private int _evaluations;

        public Workspace(ReliabilityProblem problem, FormOptions options)
        {
            _problem = problem;
            _options = options;
            _t = problem.Transformation;
            _n = _t.StandardDimension;
            _m = _t.PhysicalDimension;
            _x = new double[_m];
            _xStep = new double[_m];
            _gradX = new double[_m];
            _jac = new double[_m * _n];
            _scale = problem.Model.Variables.Select(v => v.StandardDeviation).ToArray();
            _analytic = options.Gradient == GradientMethod.Automatic && problem.LimitState.HasGradient;
            _central = options.Gradient == GradientMethod.CentralDifference;
        }

        public FormResult Run()
        {
            var u = new double[_n];
            if (_options.StartPoint is { } start)
            {
                if (start.Count != _n)
                {
                    throw new ArgumentException($"Start point has {start.Count} entries; the problem has {_n} random variables.", nameof(_options.StartPoint));
                }

                for (var i = 0; i < _n; i++) u[i] = start[i];
            }

            var grad = new double[_n];
            var d = new double[_n];
            var trial = new double[_n];
            var g = ValueAndGradient(u, grad);
            var g0 = _options.StartPoint is null ? g : Value(new double[_n]);
            var gScale = Math.Abs(g0) > 0 && double.IsFinite(g0) ? Math.Abs(g0) : 1.0;
            string? diagnostic = null;
            var converged = false;
            var iterations = 0;

            for (; iterations < _options.MaxIterations; iterations++)
            {
                if (!double.IsFinite(g))
                {
                    diagnostic = FormattableString.Invariant($"The limit state returned {g} at iteration {iterations}.");
                    break;
                }

                var gradNorm2 = Dot(grad, grad);
                if (!(gradNorm2 > 0) || !double.IsFinite(gradNorm2))
                {
                    diagnostic = FormattableString.Invariant($"The gradient vanished or is not finite at iteration {iterations} (‖∇G‖² = {gradNorm2}).");
                    break;
                }

                if (IsConverged(u, grad, g, gScale, gradNorm2))
                {
                    converged = true;
                    break;
                }

                // HL-RF direction.
                var factor = (Dot(grad, u) - g) / gradNorm2;
                for (var i = 0; i < _n; i++) d[i] = factor * grad[i] - u[i];

                // Merit penalty c > ‖u‖/‖∇G‖ keeps d a descent direction (Zhang & Der Kiureghian 1995).
                var gradNorm = Math.Sqrt(gradNorm2);
                var c = PenaltyFactor * Math.Max(Norm(u) / gradNorm, Math.Sqrt(Dot(d, d) + Dot(u, u)) / gradNorm);
                var merit = 0.5 * Dot(u, u) + c * Math.Abs(g);
                // Gradient of the merit: u + c·sign(G)·∇G; its product with d gives the Armijo slope.
                var sign = Math.Sign(g);
                var slope = 0.0;
                for (var i = 0; i < _n; i++) slope += (u[i] + c * sign * grad[i]) * d[i];

                var step = 1.0;
                var gTrial = double.NaN;
                var accepted = false;
                for (var k = 0; k < MaxLineSearchSteps; k++)
                {
                    for (var i = 0; i < _n; i++) trial[i] = u[i] + step * d[i];
                    gTrial = Value(trial);
                    if (double.IsFinite(gTrial))
                    {
                        var meritTrial = 0.5 * Dot(trial, trial) + c * Math.Abs(gTrial);
                        if (meritTrial - merit <= ArmijoA * step * Math.Min(slope, 0) || slope >= 0 && meritTrial < merit)
                        {
                            accepted = true;
                            break;
                        }
                    }

                    step *= ArmijoB;
                }

                if (!accepted && !double.IsFinite(gTrial))
                {
                    diagnostic = FormattableString.Invariant($"The line search found no point with a finite limit-state value at iteration {iterations}.");
                    break;
                }

                Array.Copy(trial, u, _n);
                g = ValueAndGradient(u, grad);
            }

            if (!converged && diagnostic is null)
            {
                diagnostic = FormattableString.Invariant($"No convergence within {_options.MaxIterations} iterations (|G|/|G0| = {Math.Abs(g) / gScale:G3}).");
            }

            return BuildResult(u, grad, iterations, converged, diagnostic);
        }

        private bool IsConverged(double[] u, double[] grad, double g, double gScale, double gradNorm2)
        {
            if (Math.Abs(g) / gScale > _options.LimitStateTolerance) return false;
            // α = −∇G/‖∇G‖; residual of u against its projection on α.
            var gradNorm = Math.Sqrt(gradNorm2);
            var proj = -Dot(grad, u) / gradNorm;
            var r2 = 0.0;
            for (var i = 0; i < _n; i++)
            {
                var r = u[i] - proj * (-grad[i] / gradNorm);
                r2 += r * r;
            }

            return Math.Sqrt(r2) <= _options.AlignmentTolerance * Math.Max(Norm(u), 1.0);
        }

        private FormResult BuildResult(double[] u, double[] grad, int iterations, bool converged, string? diagnostic)
        {
            var gradNorm = Norm(grad);
            var alpha = new double[_n];
            for (var i = 0; i < _n; i++) alpha[i] = gradNorm > 0 ? -grad[i] / gradNorm : 0;
            var beta = Dot(alpha, u);
            var x = new double[_m];
            _t.ToPhysical(u, x);
            var names = _problem.Model.RandomIndices.Select(i => _problem.Model.Variables[i].Name).ToArray();
            return new FormResult
            {
                Beta = beta,
                FailureProbability = StandardNormal.Cdf(-beta),
                DesignPointU = u,
                DesignPointX = x,
                Alpha = alpha,
                ImportanceFactors = ImportanceFactors.Compute(_t, u, alpha),
                VariableNames = names,
                Iterations = iterations,
                LimitStateEvaluations = _evaluations,
                Converged = converged,
                Diagnostic = diagnostic,
            };
        }

        private double Value(double[] u)
        {
            _t.ToPhysical(u, _x);
            _evaluations++;
            return _problem.LimitState.Evaluate(_x);
        }

        /// <summary>G(u) and ∇ᵤG = Jᵀ∇ₓg.</summary>
        private double ValueAndGradient(double[] u, double[] gradU)
        {
            _t.ToPhysical(u, _x);
            double g;
            if (_analytic)
            {
                _evaluations++;
                g = _problem.LimitState.EvaluateWithGradient(_x, _gradX);
            }
            else
            {
                _evaluations++;
                g = _problem.LimitState.Evaluate(_x);
                FiniteDifference(g);
            }

            _t.JacobianPhysicalByStandard(u, _jac);
            Array.Clear(gradU);
            for (var i = 0; i < _m; i++)
            {
                var gi = _gradX[i];
                if (gi == 0) continue;
                for (var k = 0; k < _n; k++) gradU[k] += _jac[i * _n + k] * gi;
            }

            return g;
        }

        private void FiniteDifference(double g)
        {
            var variables = _problem.Model.Variables;
            Array.Copy(_x, _xStep, _m);
            for (var i = 0; i < _m; i++)
            {
                if (variables[i].IsDeterministic)
                {
                    _gradX[i] = 0;
                    continue;
                }

                var h = _options.RelativeStep * Math.Max(Math.Abs(_x[i]), _scale[i]);
                if (_central)
                {
                    h = Math.Cbrt(_options.RelativeStep) * Math.Max(Math.Abs(_x[i]), _scale[i]) * 1e-1;
                    _xStep[i] = _x[i] + h;
                    var gp = _problem.LimitState.Evaluate(_xStep);
                    _xStep[i] = _x[i] - h;
                    var gm = _problem.LimitState.Evaluate(_xStep);
                    _evaluations += 2;
                    _gradX[i] = (gp - gm) / (2 * h);
                }
                else
                {
                    _xStep[i] = _x[i] + h;
                    var gp = _problem.LimitState.Evaluate(_xStep);
                    _evaluations++;
                    _gradX[i] = (gp - g) / h;
                }

                _xStep[i] = _x[i];
            }
        }

        private static double Dot(double[] a, double[] b)
        {
            var s = 0.0;
            for (var i = 0; i < a.Length; i++) s += a[i] * b[i];
            return s;
        }

        private static double Norm(double[] a) => Math.Sqrt(Dot(a, a));
    }
}
