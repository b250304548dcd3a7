using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>
/// Multinormal orthant probabilities P(Z ≤ b), Z ~ N(0, R) with unit variances, for the first-order updating route.
/// n ≥ 3 is interim: to be replaced by the Reliability layer's multinormal integrator when it lands.
/// </summary>
/// <remarks>
/// n = 1: Φ. n = 2: <see cref="BivariateNormal.Cdf"/> (Genz 2004). n ≥ 3: Genz (1992) separation of variables with a
/// randomly shifted Richtmyer lattice (tent-transformed), fixed shifts so results are reproducible; the error is
/// three standard errors over the shifts.
/// </remarks>
internal static class InterimMultinormal
{
    private const double CertainLimit = 8.5;

    /// <summary>
    /// P(Z ≤ b) and an error estimate (0 for n ≤ 2). Components with b above 8.5 are dropped (they hold with
    /// probability above 1 − 1e-17); the lattice doubles from <paramref name="initialPoints"/> until the error is at
    /// most <paramref name="relativeError"/> of the value or <paramref name="maxPoints"/> is reached. The shifts are
    /// fixed, so the integration error is a smooth function of the limits (common random numbers): differences such as
    /// ΔPf(t) = Pf(t) − Pf(t − 1) do not pick up lattice noise.
    /// </summary>
    public static (double Value, double Error) Cdf(double[] b, double[,] r, double relativeError = 5e-3, int initialPoints = 64, int maxPoints = 8192)
    {
        var keep = Enumerable.Range(0, b.Length).Where(i => !(b[i] > CertainLimit)).ToArray();
        if (keep.Any(i => double.IsNegativeInfinity(b[i]))) return (0.0, 0.0);
        if (keep.Length < b.Length)
        {
            var rr = new double[keep.Length, keep.Length];
            for (var i = 0; i < keep.Length; i++)
                for (var j = 0; j < keep.Length; j++) rr[i, j] = r[keep[i], keep[j]];
            b = keep.Select(i => b[i]).ToArray();
            r = rr;
        }

        var n = b.Length;
        if (n == 0) return (1.0, 0.0);
        if (n == 1) return (StandardNormal.Cdf(b[0]), 0.0);
        if (n == 2) return (BivariateNormal.Cdf(b[0], b[1], Math.Clamp(r[0, 1], -1.0, 1.0)), 0.0);
        var points = initialPoints;
        while (true)
        {
            var (value, error) = Genz(b, r, points, 8);
            if (error <= relativeError * value || points >= maxPoints || value == 0) return (value, error);
            points *= 2;
        }
    }

    private static readonly int[] Primes = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97, 101, 103, 107, 109, 113];

    private static (double, double) Genz(double[] bIn, double[,] rIn, int points, int shifts)
    {
        var n = bIn.Length;
        if (n - 1 > Primes.Length) throw new NotSupportedException($"Multinormal probabilities of dimension {n} are not supported (at most {Primes.Length + 1}).");
        // Genz & Bretz (2009, §4.1.3) variable prioritization: at each Cholesky step take the variable with the
        // smallest conditional probability given the truncated-normal means of those already placed.
        var b = (double[])bIn.Clone();
        var cov = (double[,])rIn.Clone();
        var c = new double[n, n];
        var ym = new double[n];
        for (var j = 0; j < n; j++)
        {
            var best = j;
            var bestP = double.PositiveInfinity;
            for (var i = j; i < n; i++)
            {
                var v = cov[i, i];
                var t = b[i];
                for (var k = 0; k < j; k++)
                {
                    v -= c[i, k] * c[i, k];
                    t -= c[i, k] * ym[k];
                }

                var pr = StandardNormal.Cdf(t / Math.Sqrt(Math.Max(v, 1e-14)));
                if (pr < bestP)
                {
                    bestP = pr;
                    best = i;
                }
            }

            if (best != j)
            {
                (b[j], b[best]) = (b[best], b[j]);
                for (var k = 0; k < n; k++) (cov[j, k], cov[best, k]) = (cov[best, k], cov[j, k]);
                for (var k = 0; k < n; k++) (cov[k, j], cov[k, best]) = (cov[k, best], cov[k, j]);
                for (var k = 0; k < j; k++) (c[j, k], c[best, k]) = (c[best, k], c[j, k]);
            }

            var d = cov[j, j];
            for (var k = 0; k < j; k++) d -= c[j, k] * c[j, k];
            if (d <= 1e-14) d = 1e-14; // semidefinite: the variable is (almost) a combination of the earlier ones
            c[j, j] = Math.Sqrt(d);
            for (var i = j + 1; i < n; i++)
            {
                var s = cov[i, j];
                for (var k = 0; k < j; k++) s -= c[i, k] * c[j, k];
                c[i, j] = s / c[j, j];
            }

            var tj = b[j];
            for (var k = 0; k < j; k++) tj -= c[j, k] * ym[k];
            tj /= c[j, j];
            var phiT = StandardNormal.Cdf(tj);
            ym[j] = phiT > 1e-300 ? -StandardNormal.Pdf(tj) / phiT : tj;
        }

        var alpha = new double[n - 1];
        for (var i = 0; i < n - 1; i++) alpha[i] = Math.Sqrt(Primes[i]) % 1.0;
        var rng = new Random(20260101);
        var y = new double[n];
        var means = new double[shifts];
        var e1 = StandardNormal.Cdf(b[0] / c[0, 0]);
        for (var s = 0; s < shifts; s++)
        {
            var shift = new double[n - 1];
            for (var i = 0; i < n - 1; i++) shift[i] = rng.NextDouble();
            var sum = 0.0;
            for (var p = 1; p <= 2 * points; p++)
            {
                // Antithetic pairs w and 1 − w.
                var anti = p > points;
                var f = e1;
                var e = e1;
                for (var i = 1; i < n && f > 0; i++)
                {
                    // Baker's tent transform of the lattice point keeps the rule accurate for non-periodic integrands.
                    var w = ((anti ? p - points : p) * alpha[i - 1] + shift[i - 1]) % 1.0;
                    w = 1 - Math.Abs(2 * w - 1);
                    if (anti) w = 1 - w;
                    var q = Math.Clamp(w * e, 1e-300, 1 - 1e-16);
                    y[i - 1] = FastInverseNormal(q);
                    var t = b[i];
                    for (var j = 0; j < i; j++) t -= c[i, j] * y[j];
                    e = StandardNormal.Cdf(t / c[i, i]);
                    f *= e;
                }

                sum += f;
            }

            means[s] = sum / (2 * points);
        }

        var mean = means.Average();
        var variance = shifts > 1 ? means.Sum(m => (m - mean) * (m - mean)) / (shifts - 1) : 0.0;
        return (mean, 3.0 * Math.Sqrt(variance / shifts));
    }

    /// <summary>
    /// Φ⁻¹(p) by Wichura's algorithm AS 241 (PPND16, Applied Statistics 37:477–484, 1988), relative accuracy about
    /// 1e-16: the inner loop of the lattice rule calls it millions of times.
    /// </summary>
    internal static double FastInverseNormal(double p)
    {
        var q = p - 0.5;
        double r;
        if (Math.Abs(q) <= 0.425)
        {
            r = 0.180625 - q * q;
            return q * (((((((r * 2509.0809287301226727 + 33430.575583588128105) * r + 67265.770927008700853) * r
                        + 45921.953931549871457) * r + 13731.693765509461125) * r + 1971.5909503065514427) * r + 133.14166789178437745) * r
                        + 3.387132872796366608)
                / (((((((r * 5226.495278852545925 + 28729.085735721942674) * r + 39307.89580009271061) * r
                        + 21213.794301586595867) * r + 5394.1960214247511077) * r + 687.1870074920579083) * r + 42.313330701600911252) * r + 1.0);
        }

        r = q < 0 ? p : 1 - p;
        r = Math.Sqrt(-Math.Log(r));
        double val;
        if (r <= 5)
        {
            r -= 1.6;
            val = (((((((r * 7.7454501427834140764e-4 + 0.0227238449892691845833) * r + 0.24178072517745061177) * r
                    + 1.27045825245236838258) * r + 3.64784832476320460504) * r + 5.7694972214606914055) * r + 4.6303378461565452959) * r
                    + 1.42343711074968357734)
                / (((((((r * 1.05075007164441684324e-9 + 5.475938084995344946e-4) * r + 0.0151986665636164571966) * r
                    + 0.14810397642748007459) * r + 0.68976733498510000455) * r + 1.6763848301838038494) * r + 2.05319162663775882187) * r + 1.0);
        }
        else
        {
            r -= 5;
            val = (((((((r * 2.01033439929228813265e-7 + 2.71155556874348757815e-5) * r + 0.0012426609473880784386) * r
                    + 0.026532189526576123093) * r + 0.29656057182850489123) * r + 1.7848265399172913358) * r + 5.4637849111641143699) * r
                    + 6.6579046435011037772)
                / (((((((r * 2.04426310338993978564e-15 + 1.4215117583164458887e-7) * r + 1.8463183175100546818e-5) * r
                    + 7.868691311456132591e-4) * r + 0.0148753612908506148525) * r + 0.13692988092273580531) * r + 0.59983220655588793769) * r + 1.0);
        }

        return q < 0 ? -val : val;
    }
}
