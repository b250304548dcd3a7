using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.TimeVariant;

/// <summary>A limit state g(x, s, t) with time-invariant inputs x, the value s of a load process and the time t (years); failure when g ≤ 0.</summary>
/// <param name="x">The time-invariant inputs (all variables of the model, deterministic ones included, in model order).</param>
/// <param name="load">The value of the load process at <paramref name="timeYears"/>.</param>
/// <param name="timeYears">Time in years.</param>
public delegate double ProcessLimitState(ReadOnlySpan<double> x, double load, double timeYears);

/// <summary>The PHI2 outcrossing rate at one time.</summary>
/// <param name="TimeYears">Time t in years.</param>
/// <param name="Beta">Instantaneous reliability index β(t) (FORM with the load as a normal variable).</param>
/// <param name="InstantaneousPf">Φ(−β(t)).</param>
/// <param name="BetaRatePerYear">dβ/dt.</param>
/// <param name="AlphaRatePerYear">‖dα/dt‖ in the space that holds S(t) and S(t + dt).</param>
/// <param name="OutcrossingRatePerYear">ν⁺(t), the mean rate of crossings into the failure domain, per year.</param>
/// <param name="Converged">Whether the three FORM runs behind this point converged.</param>
public sealed record Phi2Point(double TimeYears, double Beta, double InstantaneousPf, double BetaRatePerYear, double AlphaRatePerYear, double OutcrossingRatePerYear, bool Converged);

/// <summary>Cumulative failure probability over [t₀, T] from the PHI2 outcrossing rates.</summary>
/// <param name="Points">ν⁺ on the time grid.</param>
/// <param name="UpperBoundPf">P_f⁺(t₀, T) = P_f,i(t₀) + ∫ν⁺(t)dt (trapezoidal rule on the grid): the classical upper bound.</param>
/// <param name="PoissonPf">1 − (1 − P_f,i(t₀))·exp(−∫ν⁺dt): the same rates under the assumption of independent (Poisson) crossings.</param>
/// <param name="LowerBoundPf">max_t P_f,i(t) on the grid: the cumulative probability is never smaller.</param>
/// <param name="Converged">Whether every FORM run converged.</param>
/// <param name="LimitStateEvaluations">Limit-state evaluations used.</param>
public sealed record Phi2Result(IReadOnlyList<Phi2Point> Points, double UpperBoundPf, double PoissonPf, double LowerBoundPf, bool Converged, long LimitStateEvaluations);

/// <summary>
/// The PHI2 method for a limit state with time-invariant random inputs and one stationary Gaussian load process:
/// the outcrossing rate ν⁺(t) = lim P(g(t) &gt; 0 ∩ g(t + Δt) ≤ 0)/Δt from two time-invariant FORM analyses, and the
/// cumulative failure probability over a period from ν⁺.
/// </summary>
/// <remarks>
/// Method: Andrieu-Renaud, Sudret &amp; Lemaire (2004), The PHI2 method: a way to compute time-variant reliability,
/// Reliability Engineering &amp; System Safety 84, 75–86; the limit Δt → 0 written analytically as in Sudret (2008),
/// Analytical derivation of the outcrossing rate in time-variant reliability problems, Structure and Infrastructure
/// Engineering 4(5), 353–362. With β(t) and α(t) from FORM on (x, S) where S ~ N(μ_S, σ_S), the load at t + Δt is
/// written S(t + Δt) = μ_S + σ_S(ρ U_S + √(1 − ρ²) U_V) with ρ = ρ(Δt) and U_V independent, so α(t + Δt) in the space
/// (U_x, U_S, U_V) is (α_x, ρα_S, √(1 − ρ²)α_S) evaluated at t + Δt. As Δt → 0, with ρ(Δt) ≈ 1 − ω₀²Δt²/2,
/// the parallel-system probability Φ₂(β(t), −β(t + Δt); −α(t)·α(t + Δt)) divided by Δt tends to
/// ν⁺(t) = φ(β)·‖α̇‖·Ψ(β̇/‖α̇‖), Ψ(x) = φ(x) − xΦ(−x), with ‖α̇‖² = ‖α̇_x‖² + α̇_S² + ω₀²α_S².
/// β̇, α̇_x and α̇_S are central differences of FORM at t ± h (h a small fraction of the grid step); the term of the
/// process's own fluctuation, ω₀²α_S², is exact. This avoids the loss of digits of the finite-Δt form noted in
/// Sudret (2008). The written formulas are this project's, from those descriptions.
/// </remarks>
public static class Phi2Outcrossing
{
    /// <summary>Computes ν⁺ on a regular grid of <paramref name="intervals"/> steps over [start, end] and the cumulative Pf.</summary>
    /// <param name="inputs">The time-invariant inputs (independent, or correlated through the model's correlation matrix).</param>
    /// <param name="load">The load process.</param>
    /// <param name="limitState">g(x, s, t).</param>
    /// <param name="startYears">Start of the period t₀.</param>
    /// <param name="endYears">End of the period T &gt; t₀.</param>
    /// <param name="intervals">Grid steps (at least 2; the trapezoidal rule integrates ν⁺ over them).</param>
    /// <param name="options">FORM options (tight tolerances are used when null).</param>
    public static Phi2Result Compute(StochasticModel inputs, GaussianProcessLoad load, ProcessLimitState limitState, double startYears, double endYears,
        int intervals = 50, FormOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        ArgumentNullException.ThrowIfNull(load);
        ArgumentNullException.ThrowIfNull(limitState);
        if (!(double.IsFinite(startYears) && double.IsFinite(endYears) && endYears > startYears))
            throw new ArgumentOutOfRangeException(nameof(endYears), endYears, "The period must be finite with end > start.");
        ArgumentOutOfRangeException.ThrowIfLessThan(intervals, 2);

        var model = Extended(inputs, load);
        var n = inputs.PhysicalDimension;
        var form = options ?? FormOptions.Default with { LimitStateTolerance = 1e-10, AlignmentTolerance = 1e-9 };
        var step = (endYears - startYears) / intervals;
        var h = 0.05 * step;
        var omega0 = load.CycleRatePerYear;
        var points = new List<Phi2Point>(intervals + 1);
        long evaluations = 0;
        var converged = true;
        IReadOnlyList<double>? start = null;

        FormResult Form(double t)
        {
            var problem = new ReliabilityProblem(model, new LimitState(FormattableString.Invariant($"g(x, {load.Name}, t = {t:R})"), x => limitState(x[..n], x[n], t)));
            var result = FormSolver.Solve(problem, form with { StartPoint = start });
            evaluations += result.LimitStateEvaluations;
            converged &= result.Converged;
            start = result.DesignPointU;
            return result;
        }

        for (var i = 0; i <= intervals; i++)
        {
            var t = startYears + i * step;
            var before = Form(t - h);
            var now = Form(t);
            var after = Form(t + h);
            var sIndex = now.Alpha.Count - 1; // the load is the last random variable
            var betaRate = (after.Beta - before.Beta) / (2 * h);
            var alphaRate2 = 0.0;
            for (var k = 0; k < now.Alpha.Count; k++)
            {
                var d = (after.Alpha[k] - before.Alpha[k]) / (2 * h);
                alphaRate2 += d * d;
            }

            alphaRate2 += omega0 * omega0 * now.Alpha[sIndex] * now.Alpha[sIndex];
            var alphaRate = Math.Sqrt(alphaRate2);
            var nu = alphaRate > 0 ? StandardNormal.Pdf(now.Beta) * alphaRate * Psi(betaRate / alphaRate) : 0;
            points.Add(new Phi2Point(t, now.Beta, now.FailureProbability, betaRate, alphaRate, nu, before.Converged && now.Converged && after.Converged));
        }

        var integral = 0.0;
        for (var i = 1; i < points.Count; i++) integral += 0.5 * (points[i - 1].OutcrossingRatePerYear + points[i].OutcrossingRatePerYear) * step;
        var pf0 = points[0].InstantaneousPf;
        return new Phi2Result(points, Math.Min(1, pf0 + integral), 1 - (1 - pf0) * Math.Exp(-integral), points.Max(p => p.InstantaneousPf), converged, evaluations);
    }

    /// <summary>Ψ(x) = φ(x) − xΦ(−x), the mean of (Z − x)⁺ for Z standard normal.</summary>
    public static double Psi(double x) => StandardNormal.Pdf(x) - x * StandardNormal.Ccdf(x);

    private static StochasticModel Extended(StochasticModel inputs, GaussianProcessLoad load)
    {
        var variables = inputs.Variables.Append(new NormalVariable(load.Name, load.Mean, load.StandardDeviation)).ToArray();
        if (inputs.Correlation is null || inputs.Correlation.IsIdentity) return new StochasticModel(variables);
        // The load process is independent of the time-invariant inputs.
        var m = inputs.Correlation.Dimension;
        var values = new double[m + 1, m + 1];
        for (var i = 0; i < m; i++)
        {
            for (var j = 0; j < m; j++) values[i, j] = inputs.Correlation[i, j];
        }

        values[m, m] = 1;
        return new StochasticModel(variables, new CorrelationMatrix(values));
    }
}
