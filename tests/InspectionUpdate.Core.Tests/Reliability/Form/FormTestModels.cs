using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Form;

/// <summary>
/// The Gumbel (largest values) closed form written out in the test, F(x) = exp(−exp(−(x − u)/b)) (Gumbel 1958; any
/// statistics handbook), so the reference computations do not depend on the library's own distribution.
/// </summary>
/// <param name="Location">Mode u.</param>
/// <param name="Scale">Scale b.</param>
internal readonly record struct GumbelClosedForm(double Location, double Scale)
{
    private const double EulerGamma = 0.57721566490153286061;

    /// <summary>From mean and CoV: b = σ√6/π, u = μ − γ_E·b.</summary>
    public static GumbelClosedForm FromMeanCov(double mean, double cov)
    {
        var scale = mean * cov * Math.Sqrt(6) / Math.PI;
        return new GumbelClosedForm(mean - EulerGamma * scale, scale);
    }

    /// <summary>1 − F(x) = −expm1(−exp(−z)), with Kahan's expm1 so the upper tail keeps its digits.</summary>
    public double Ccdf(double x) => -Expm1(-Math.Exp(-(x - Location) / Scale));

    private static double Expm1(double x)
    {
        var e = Math.Exp(x);
        if (e == 1.0) return x;
        var em1 = e - 1.0;
        return em1 == -1.0 ? -1.0 : em1 * x / Math.Log(e);
    }
}

/// <summary>Delegates to a Nataf transformation but hides its type, so the general-Jacobian route is used.</summary>
internal sealed class OpaqueTransformation(IProbabilityTransformation inner) : IProbabilityTransformation
{
    public StochasticModel Model => inner.Model;

    public int StandardDimension => inner.StandardDimension;

    public int PhysicalDimension => inner.PhysicalDimension;

    public void ToPhysical(ReadOnlySpan<double> u, Span<double> x) => inner.ToPhysical(u, x);

    public void ToStandard(ReadOnlySpan<double> x, Span<double> u) => inner.ToStandard(x, u);

    public void JacobianPhysicalByStandard(ReadOnlySpan<double> u, Span<double> jacobian) => inner.JacobianPhysicalByStandard(u, jacobian);
}

/// <summary>A limit state that counts every call, to check the solver's evaluation count.</summary>
internal sealed class CountingLimitState(ILimitState inner) : ILimitState
{
    private int _calls;

    public int Calls => _calls;

    public string Name => inner.Name;

    public bool HasGradient => inner.HasGradient;

    public double Evaluate(ReadOnlySpan<double> x)
    {
        Interlocked.Increment(ref _calls);
        return inner.Evaluate(x);
    }

    public double EvaluateWithGradient(ReadOnlySpan<double> x, Span<double> gradient)
    {
        Interlocked.Increment(ref _calls);
        return inner.EvaluateWithGradient(x, gradient);
    }
}

/// <summary>The nonlinear cases of the FORM tests, each with its independent reference computation.</summary>
internal static class FormTestModels
{
    /// <summary>Φ⁻¹ from MathNet, independent of the library's StandardNormal.</summary>
    public static double InvPhi(double p) => Normal.InvCDF(0, 1, p);

    /// <summary>
    /// g = X1·X2 − X3, X1 ~ N(40, 5), X2 ~ N(50, 2.5), X3 ~ N(1000, 200) (docs/references.md, non-trivial FORM cases).
    /// </summary>
    public static ReliabilityProblem ProductOfNormals(bool analyticGradient = false)
    {
        var model = new StochasticModel(
        [
            new NormalVariable("X1", 40, 5),
            new NormalVariable("X2", 50, 2.5),
            new NormalVariable("X3", 1000, 200),
        ]);
        LimitStateWithGradient? withGradient = analyticGradient
            ? (x, grad) =>
            {
                grad[0] = x[1];
                grad[1] = x[0];
                grad[2] = -1;
                return x[0] * x[1] - x[2];
            }
        : null;
        return new ReliabilityProblem(model, new LimitState("X1*X2-X3", x => x[0] * x[1] - x[2], withGradient));
    }

    /// <summary>Exact Pf of <see cref="ProductOfNormals"/>: ∫∫ φ(a)φ(b)·Q((x1·x2 − 1000)/200) da db, Gauss–Legendre on [−9, 9]².</summary>
    public static double ProductOfNormalsExactPf() =>
        MathNet.Numerics.Integrate.OnRectangle(
            (a, b) => Normal.PDF(0, 1, a) * Normal.PDF(0, 1, b) * (1 - Normal.CDF(0, 1, ((40 + 5 * a) * (50 + 2.5 * b) - 1000) / 200)),
            -9, 9, -9, 9, 256);

    /// <summary>R ~ LN(mean 300, CoV 0.1), S ~ Gumbel-max(mean 150, CoV 0.3), g = R − S (docs/references.md).</summary>
    public static ReliabilityProblem LognormalMinusGumbel(out LognormalVariable r, out GumbelClosedForm s)
    {
        r = LognormalVariable.FromMeanCov("R", 300, 0.1);
        s = GumbelClosedForm.FromMeanCov(150, 0.3);
        return new ReliabilityProblem(new StochasticModel([r, GumbelVariable.FromMeanCov("S", 150, 0.3)]), new LimitState("R-S", x => x[0] - x[1]));
    }

    /// <summary>
    /// g = X1·X2 − S with X1 ~ LN(1.0, CoV 0.1) (model factor), X2 ~ LN(400, CoV 0.08) (capacity), S ~ Gumbel-max
    /// (mean 150, CoV 0.3) (load): an invented case whose product X1·X2 is lognormal with λ = λ1 + λ2 and
    /// ζ = √(ζ1² + ζ2²), so the exact Pf and the FORM design point reduce to one dimension.
    /// </summary>
    public static ReliabilityProblem LognormalProductMinusGumbel(out LognormalVariable x1, out LognormalVariable x2, out GumbelClosedForm s)
    {
        x1 = LognormalVariable.FromMeanCov("X1", 1.0, 0.1);
        x2 = LognormalVariable.FromMeanCov("X2", 400, 0.08);
        s = GumbelClosedForm.FromMeanCov(150, 0.3);
        return new ReliabilityProblem(
            new StochasticModel([x1, x2, GumbelVariable.FromMeanCov("S", 150, 0.3)]), new LimitState("X1*X2-S", x => x[0] * x[1] - x[2]));
    }

    /// <summary>
    /// Exact P(exp(λ + ζT) ≤ S), T ~ N(0, 1), by one-dimensional Gauss–Legendre integration (order 1024) of
    /// φ(t)·Q_S(exp(λ + ζt)) over [−12, 12]; the integrand is smooth and negligible outside.
    /// </summary>
    public static double LognormalBelowGumbelExactPf(double lambda, double zeta, GumbelClosedForm s) =>
        MathNet.Numerics.Integrate.GaussLegendre(
            t => Normal.PDF(0, 1, t) * s.Ccdf(Math.Exp(lambda + zeta * t)), -12, 12, 1024);

    /// <summary>
    /// The FORM β of the same problem by direct one-dimensional minimization: on the limit-state surface
    /// exp(λ + ζt) = s the Gumbel coordinate is u_S(t) = Φ⁻¹(F_S(exp(λ + ζt))), and β² = min_t t² + u_S(t)².
    /// Returns β and the minimizing t.
    /// </summary>
    public static (double Beta, double T) LognormalBelowGumbelFormBeta(double lambda, double zeta, GumbelClosedForm s)
    {
        double Objective(double t)
        {
            var us = UpperTailInvPhi(s.Ccdf(Math.Exp(lambda + zeta * t)));
            return t * t + us * us;
        }

        var t = MathNet.Numerics.FindMinimum.OfScalarFunctionConstrained(Objective, -8, 2, 1e-12, 10_000);
        return (Math.Sqrt(Objective(t)), t);
    }

    /// <summary>u with Q(u) = q.</summary>
    public static double UpperTailInvPhi(double q) => -InvPhi(q);
}
