using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>An event function h(x) seen in standard normal space, with finite-difference gradients.</summary>
internal sealed class EventFunction
{
    private readonly IProbabilityTransformation _transformation;
    private readonly double[] _x;
    private readonly double[] _xStep;
    private readonly bool _oneEntryPerStep;
    private readonly ILimitState? _limitState;

    public EventFunction(string name, bool isEquality, LimitStateFunction function, IProbabilityTransformation transformation, ILimitState? limitState = null)
    {
        _limitState = limitState;
        Name = name;
        IsEquality = isEquality;
        Function = function;
        _transformation = transformation;
        _x = new double[transformation.PhysicalDimension];
        _xStep = new double[transformation.PhysicalDimension];
        // Independent inputs: a step in one coordinate of u moves one entry of x, transformed alone.
        _oneEntryPerStep = transformation.StandardDimension > 0 && transformation.TryMoveStandardCoordinate(0, 0, _xStep);
    }

    public string Name { get; }

    public bool IsEquality { get; }

    public LimitStateFunction Function { get; }

    public int Evaluations { get; private set; }

    /// <summary>h(x(u)). Not thread-safe (one scratch vector).</summary>
    public double ValueAtU(ReadOnlySpan<double> u)
    {
        _transformation.ToPhysical(u, _x);
        Evaluations++;
        return Function(_x);
    }

    /// <summary>h(u) and ∇ᵤh by central differences (step 1e-5 in u, where the scale is one standard deviation).</summary>
    public double ValueAndGradientAtU(double[] u, double[] gradient)
    {
        const double step = 1e-5;
        var h = ValueAtU(u);
        if (_oneEntryPerStep)
        {
            for (var i = 0; i < u.Length; i++)
            {
                _x.CopyTo(_xStep, 0);
                _transformation.TryMoveStandardCoordinate(i, u[i] + step, _xStep);
                var hp = Function(_xStep);
                _transformation.TryMoveStandardCoordinate(i, u[i] - step, _xStep);
                var hm = Function(_xStep);
                Evaluations += 2;
                gradient[i] = (hp - hm) / (2 * step);
            }

            return h;
        }

        var work = (double[])u.Clone();
        for (var i = 0; i < u.Length; i++)
        {
            work[i] = u[i] + step;
            var hp = ValueAtU(work);
            work[i] = u[i] - step;
            var hm = ValueAtU(work);
            work[i] = u[i];
            gradient[i] = (hp - hm) / (2 * step);
        }

        return h;
    }

    /// <summary>h(u) and ∇ᵤh by forward differences (step 1e-6): cheaper, for the iterations of a search.</summary>
    public double ValueAndForwardGradientAtU(double[] u, double[] gradient)
    {
        const double step = 1e-6;
        var h = ValueAtU(u);
        if (_oneEntryPerStep)
        {
            for (var i = 0; i < u.Length; i++)
            {
                _x.CopyTo(_xStep, 0);
                _transformation.TryMoveStandardCoordinate(i, u[i] + step, _xStep);
                Evaluations++;
                gradient[i] = (Function(_xStep) - h) / step;
            }

            return h;
        }

        var work = (double[])u.Clone();
        for (var i = 0; i < u.Length; i++)
        {
            work[i] = u[i] + step;
            gradient[i] = (ValueAtU(work) - h) / step;
            work[i] = u[i];
        }

        return h;
    }

    /// <summary>Linearizes h at u: β = αᵀu + h(u)/‖∇h‖ (so that an on-surface point gives β = αᵀu).</summary>
    public LinearizedEvent LinearizeAt(double[] u, bool converged, string? diagnostic)
    {
        var before = Evaluations;
        var grad = new double[u.Length];
        var h = ValueAndGradientAtU(u, grad);
        var norm = Math.Sqrt(grad.Sum(g => g * g));
        var alpha = new double[u.Length];
        var beta = double.NaN;
        if (norm > 0 && double.IsFinite(norm) && double.IsFinite(h))
        {
            beta = h / norm;
            for (var i = 0; i < u.Length; i++)
            {
                alpha[i] = -grad[i] / norm;
                beta += alpha[i] * u[i];
            }
        }
        else
        {
            converged = false;
            diagnostic ??= FormattableString.Invariant($"The gradient of '{Name}' vanished or is not finite (‖∇h‖ = {norm}, h = {h}).");
        }

        return new LinearizedEvent(Name, IsEquality, beta, alpha, (double[])u.Clone(), norm, converged, diagnostic, Evaluations - before);
    }

    /// <summary>FORM on h (equality or inequality alike: the nearest point of h = 0), then the linearization there.</summary>
    public LinearizedEvent LinearizeAtDesignPoint(FormOptions options, IReadOnlyList<double>? start)
    {
        var problem = new ReliabilityProblem(_transformation, _limitState ?? new LimitState(Name, Function));
        var form = FormSolver.Solve(problem, start is null ? options : options with { StartPoint = start });
        var u = form.DesignPointU.ToArray();
        if (!form.Converged)
        {
            // Second attempt from FORM's last iterate: the Newton projection onto h = 0 (the one-constraint case of
            // the joint search), which does not need the alignment test that FORM can miss on noisy gradients.
            var projection = JointDesignPoint.Find([new EventFunction(Name, true, Function, _transformation)], [true], u);
            if (projection.Converged)
            {
                var retry = LinearizeAt(projection.U, true, null);
                return retry with { Evaluations = retry.Evaluations + form.LimitStateEvaluations + projection.Evaluations };
            }
        }

        var lin = LinearizeAt(u, form.Converged, form.Converged ? null : form.Diagnostic);
        // FORM's own β and α are the reference at its design point; the central-difference normal is used for the
        // nonlinearity checks only.
        return lin with
        {
            Beta = form.Converged ? form.Beta : lin.Beta,
            Alpha = form.Converged ? form.Alpha.ToArray() : lin.Alpha,
            Evaluations = lin.Evaluations + form.LimitStateEvaluations,
        };
    }
}
