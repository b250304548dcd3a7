using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Reliability.Verification;

/// <summary>
/// Independent reference computations for the benchmark problems: Pf of two independent inputs by an outer composite
/// Gauss–Legendre rule over x1 and, for each x1, the exact probability mass of the failure intervals in x2 (sign
/// changes of g located on a fine grid and refined by bisection, masses from the marginal CDF). No sampling, no
/// design point: accurate to about 1e-6 relative for the problems here (checked by halving the grids).
/// </summary>
internal static class BenchmarkQuadrature
{
    private static readonly GaussLegendreRule Rule = new(-1, 1, 10);

    /// <summary>∫ f(x) dx over [a, b] by the 10-point Gauss–Legendre rule on <paramref name="panels"/> equal panels.</summary>
    public static double Composite(Func<double, double> f, double a, double b, int panels)
    {
        var h = (b - a) / panels;
        var sum = 0.0;
        for (var p = 0; p < panels; p++)
        {
            var lo = a + p * h;
            for (var i = 0; i < Rule.Order; i++)
            {
                var x = lo + (Rule.Abscissas[i] + 1) * h / 2;
                sum += Rule.Weights[i] * h / 2 * f(x);
            }
        }

        return sum;
    }

    /// <summary>P(g(X1, X2) ≤ 0) for independent X1, X2 with the given marginals.</summary>
    public static double TwoInputs(ReliabilityProblem problem, int panels = 400, int grid = 2000)
    {
        var v1 = problem.Model.Variables[0];
        var v2 = problem.Model.Variables[1];
        var (a1, b1) = Range(v1);
        var (a2, b2) = Range(v2);
        var g = problem.LimitState;
        return Composite(x1 =>
        {
            var f = v1.Pdf(x1);
            if (f == 0) return 0;
            var x = new double[2];
            x[0] = x1;
            double G(double x2)
            {
                x[1] = x2;
                return g.Evaluate(x);
            }

            var mass = 0.0;
            var h = (b2 - a2) / grid;
            var prev = a2;
            var failing = G(a2) <= 0;
            var start = failing ? a2 : double.NaN;
            for (var k = 1; k <= grid; k++)
            {
                var xk = a2 + k * h;
                var fk = G(xk) <= 0;
                if (fk != failing)
                {
                    double lo = prev, hi = xk;
                    for (var it = 0; it < 60; it++)
                    {
                        var mid = 0.5 * (lo + hi);
                        if ((G(mid) <= 0) == failing) lo = mid;
                        else hi = mid;
                    }

                    var edge = 0.5 * (lo + hi);
                    if (failing) mass += Mass(v2, start, edge);
                    else start = edge;
                    failing = fk;
                }

                prev = xk;
            }

            if (failing) mass += Mass(v2, start, b2);
            return f * mass;
        }, a1, b1, panels);
    }

    private static double Mass(RandomVariable v, double lo, double hi) =>
        lo >= v.Mean ? v.Ccdf(lo) - v.Ccdf(hi) : v.Cdf(hi) - v.Cdf(lo);

    private static (double, double) Range(RandomVariable v) =>
        v is UniformVariable u ? (u.Lower, u.Upper) : (v.Mean - 10 * v.StandardDeviation, v.Mean + 10 * v.StandardDeviation);
}
