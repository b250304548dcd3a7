namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Globally adaptive Gauss–Kronrod quadrature (7-point Gauss, 15-point Kronrod; Piessens et al. 1983, QUADPACK's
/// QAG with key 1): the interval with the largest error estimate is bisected until the summed estimate meets
/// max(absolute, relative·|I|) or the interval budget is spent.
/// </summary>
/// <remarks>
/// Bounded on purpose: a recursive rule with a depth limit and a relative target near machine precision can split
/// every interval down to the depth limit (2^depth evaluations) when rounding keeps the local error above the target.
/// Here the cost is at most 15·(2·<c>maxIntervals</c> − 1) evaluations, and the caller gets the honest error
/// estimate when the budget ran out.
/// </remarks>
internal static class AdaptiveGaussKronrod
{
    // Kronrod nodes of the 15-point rule on [-1, 1] (positive half; QUADPACK qk15), Kronrod and Gauss weights.
    private static readonly double[] Xk =
    [
        0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
        0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
        0.207784955007898467600689403773245, 0.000000000000000000000000000000000,
    ];

    private static readonly double[] Wk =
    [
        0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
        0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
        0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
    ];

    private static readonly double[] Wg =
    [
        0.129484966168869693270611432679082, 0.279705391489276667901467771423780, 0.381830050505118944950369775488975,
        0.417959183673469387755102040816327,
    ];

    /// <summary>The integral of <paramref name="f"/> over [a, b] with its error estimate.</summary>
    /// <param name="f">Integrand, finite on [a, b].</param>
    /// <param name="a">Lower limit (finite).</param>
    /// <param name="b">Upper limit (finite).</param>
    /// <param name="absoluteTolerance">Absolute error target (≥ 0).</param>
    /// <param name="relativeTolerance">Relative error target (≥ 0).</param>
    /// <param name="maxIntervals">Largest number of subintervals (≥ 1).</param>
    /// <returns>The estimate, its error estimate and whether the target was met.</returns>
    public static (double Value, double Error, bool Converged) Integrate(Func<double, double> f, double a, double b,
        double absoluteTolerance, double relativeTolerance, int maxIntervals = 200)
    {
        var intervals = new List<(double A, double B, double Value, double Error)>(Math.Min(maxIntervals, 256));
        var first = Rule(f, a, b);
        intervals.Add((a, b, first.Value, first.Error));
        var total = first.Value;
        var error = first.Error;
        while (true)
        {
            if (error <= Math.Max(absoluteTolerance, relativeTolerance * Math.Abs(total))) return (total, error, true);
            if (intervals.Count >= maxIntervals) return (total, error, false);

            var worst = 0;
            for (var i = 1; i < intervals.Count; i++)
            {
                if (intervals[i].Error > intervals[worst].Error) worst = i;
            }

            var (lo, hi, v, e) = intervals[worst];
            var mid = 0.5 * (lo + hi);
            if (!(mid > lo && mid < hi)) return (total, error, false); // the interval cannot be split further
            var left = Rule(f, lo, mid);
            var right = Rule(f, mid, hi);
            intervals[worst] = (lo, mid, left.Value, left.Error);
            intervals.Add((mid, hi, right.Value, right.Error));
            total += left.Value + right.Value - v;
            error += left.Error + right.Error - e;
        }
    }

    private static (double Value, double Error) Rule(Func<double, double> f, double a, double b)
    {
        var center = 0.5 * (a + b);
        var half = 0.5 * (b - a);
        var fc = f(center);
        var kronrod = fc * Wk[7];
        var gauss = fc * Wg[3];
        for (var j = 0; j < 7; j++)
        {
            var dx = half * Xk[j];
            var sum = f(center - dx) + f(center + dx);
            kronrod += Wk[j] * sum;
            if (j % 2 == 1) gauss += Wg[j / 2] * sum;
        }

        kronrod *= half;
        gauss *= half;
        // QUADPACK's error heuristic is sharper but assumes smoothness; the plain difference is the safe bound here.
        return (kronrod, Math.Abs(kronrod - gauss));
    }
}
