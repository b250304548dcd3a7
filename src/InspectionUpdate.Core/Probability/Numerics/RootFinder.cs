namespace InspectionUpdate.Probability.Numerics;

/// <summary>
/// Bracketed root finding for monotone functions: Brent's method (Brent 1973, Algorithms for Minimization
/// without Derivatives, ch. 4, the "zeroin" algorithm) with an outward bracket search.
/// </summary>
/// <remarks>Generic over a struct function so that calls in the transformation's hot path do not allocate.</remarks>
internal static class RootFinder
{
    /// <summary>
    /// The root of an increasing function f on [lo, hi] with f(lo) ≤ 0 ≤ f(hi), to absolute tolerance
    /// <paramref name="tolerance"/> + 4ε|t|. Returns NaN if the bracket does not straddle a sign change.
    /// </summary>
    public static double Brent<TF>(ref TF f, double lo, double hi, double fLo, double fHi, double tolerance = 0, int maxIterations = 200)
        where TF : struct, IScalarFunction
    {
        if (double.IsNaN(fLo) || double.IsNaN(fHi)) return double.NaN;
        if (fLo == 0) return lo;
        if (fHi == 0) return hi;
        if (Math.Sign(fLo) == Math.Sign(fHi)) return double.NaN;

        double a = lo, b = hi, fa = fLo, fb = fHi;
        double c = a, fc = fa, d = b - a, e = d;
        for (var iteration = 0; iteration < maxIterations; iteration++)
        {
            if (Math.Sign(fb) == Math.Sign(fc))
            {
                c = a;
                fc = fa;
                d = b - a;
                e = d;
            }

            if (Math.Abs(fc) < Math.Abs(fb))
            {
                a = b;
                b = c;
                c = a;
                fa = fb;
                fb = fc;
                fc = fa;
            }

            var tol = 4 * double.Epsilon + 4 * 2.220446049250313e-16 * Math.Abs(b) + 0.5 * tolerance;
            var m = 0.5 * (c - b);
            if (Math.Abs(m) <= tol || fb == 0) return b;

            if (Math.Abs(e) < tol || Math.Abs(fa) <= Math.Abs(fb))
            {
                d = m;
                e = m;
            }
            else
            {
                // Secant or inverse quadratic interpolation.
                double p, q, r;
                var s = fb / fa;
                if (a == c)
                {
                    p = 2 * m * s;
                    q = 1 - s;
                }
                else
                {
                    q = fa / fc;
                    r = fb / fc;
                    p = s * (2 * m * q * (q - r) - (b - a) * (r - 1));
                    q = (q - 1) * (r - 1) * (s - 1);
                }

                if (p > 0) q = -q;
                else p = -p;

                if (2 * p < Math.Min(3 * m * q - Math.Abs(tol * q), Math.Abs(e * q)))
                {
                    e = d;
                    d = p / q;
                }
                else
                {
                    d = m;
                    e = m;
                }
            }

            a = b;
            fa = fb;
            b += Math.Abs(d) > tol ? d : (m > 0 ? tol : -tol);
            fb = f.Evaluate(b);
            if (double.IsNaN(fb)) return double.NaN;
        }

        return b;
    }

    /// <summary>
    /// The root of an increasing function f, starting from a guess and stepping outward (doubling steps) until the
    /// sign changes, never leaving [min, max]. Returns NaN when no sign change exists in [min, max].
    /// </summary>
    public static double SolveIncreasing<TF>(ref TF f, double guess, double initialStep, double min, double max, double tolerance = 0)
        where TF : struct, IScalarFunction
    {
        guess = Math.Clamp(guess, min, max);
        var fg = f.Evaluate(guess);
        if (double.IsNaN(fg)) return double.NaN;
        if (fg == 0) return guess;

        var step = initialStep;
        double lo, hi, fLo, fHi;
        if (fg < 0)
        {
            lo = guess;
            fLo = fg;
            hi = guess;
            fHi = fg;
            while (fHi < 0)
            {
                if (hi >= max) return double.NaN;
                lo = hi;
                fLo = fHi;
                hi = Math.Min(max, hi + step);
                step *= 2;
                fHi = f.Evaluate(hi);
                if (double.IsNaN(fHi)) return double.NaN;
            }
        }
        else
        {
            hi = guess;
            fHi = fg;
            lo = guess;
            fLo = fg;
            while (fLo > 0)
            {
                if (lo <= min) return double.NaN;
                hi = lo;
                fHi = fLo;
                lo = Math.Max(min, lo - step);
                step *= 2;
                fLo = f.Evaluate(lo);
                if (double.IsNaN(fLo)) return double.NaN;
            }
        }

        return Brent(ref f, lo, hi, fLo, fHi, tolerance);
    }
    /// <summary>
    /// The root of an increasing function f in [min, max] by Newton's method safeguarded with a bracket: a step that
    /// leaves the current bracket is replaced by bisection once both signs have been seen, or by a doubling search
    /// step before that. Converges quadratically from a fair guess; never leaves [min, max]. Returns NaN when no
    /// sign change is found.
    /// </summary>
    public static double NewtonIncreasing<TF>(ref TF f, double guess, double initialStep, double min, double max, double tolerance = 0)
        where TF : struct, IDifferentiableFunction
    {
        double lo = min, hi = max;
        bool haveLo = false, haveHi = false;
        var t = Math.Clamp(guess, min, max);
        var step = initialStep;
        for (var iteration = 0; iteration < 200; iteration++)
        {
            var value = f.Evaluate(t, out var slope);
            if (double.IsNaN(value)) return double.NaN;
            if (value == 0) return t;
            if (value < 0)
            {
                lo = t;
                haveLo = true;
            }
            else
            {
                hi = t;
                haveHi = true;
            }

            var next = t - value / slope;
            var newtonOk = double.IsFinite(next) && slope > 0 && next > lo && next < hi;
            if (!newtonOk)
            {
                if (haveLo && haveHi)
                {
                    next = 0.5 * (lo + hi);
                }
                else if (value < 0)
                {
                    if (t >= max) return double.NaN;
                    next = Math.Min(max, t + step);
                    step *= 2;
                }
                else
                {
                    if (t <= min) return double.NaN;
                    next = Math.Max(min, t - step);
                    step *= 2;
                }
            }

            var tol = tolerance + 4 * 2.220446049250313e-16 * Math.Abs(next);
            if (Math.Abs(next - t) <= tol || (haveLo && haveHi && hi - lo <= tol)) return next;

            // Newton converges quadratically: after a step of size d the error is about C·d² with C = f″/(2f′),
            // of order 1 for these log-tail functions, so a step below 1e−9 leaves an error below rounding.
            if (newtonOk && Math.Abs(next - t) <= 1e-9 * Math.Max(1, Math.Abs(next))) return next;
            t = next;
        }

        return t;
    }
}
