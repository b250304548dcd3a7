namespace InspectionUpdate.Degradation.Numerics;

/// <summary>Outcome of an adaptive ODE integration.</summary>
/// <param name="Y">State at the end (or where the stop condition fired).</param>
/// <param name="X">Independent variable at the end.</param>
/// <param name="Steps">Accepted steps.</param>
/// <param name="Rejected">Rejected steps.</param>
/// <param name="Converged">False when the step budget ran out or the step size underflowed.</param>
/// <param name="Stopped">True when the stop condition ended the integration early.</param>
public readonly record struct OdeResult(double Y, double X, int Steps, int Rejected, bool Converged, bool Stopped);

/// <summary>
/// Adaptive explicit Runge–Kutta integration of a scalar ODE y' = f(x, y) with the Dormand–Prince 5(4) pair
/// (Dormand &amp; Prince 1980, J. Comput. Appl. Math. 6:19–26) and local error control on the fifth-order solution
/// (local extrapolation), step-size control as in Hairer, Nørsett &amp; Wanner, Solving ODEs I, §II.4.
/// </summary>
/// <remarks>MathNet.Numerics 5 offers only fixed-step Runge–Kutta and Adams–Bashforth solvers, hence this one.</remarks>
public static class DormandPrince
{
    // Butcher tableau of Dormand & Prince (1980).
    private const double C2 = 1.0 / 5, C3 = 3.0 / 10, C4 = 4.0 / 5, C5 = 8.0 / 9;
    private const double A21 = 1.0 / 5;
    private const double A31 = 3.0 / 40, A32 = 9.0 / 40;
    private const double A41 = 44.0 / 45, A42 = -56.0 / 15, A43 = 32.0 / 9;
    private const double A51 = 19372.0 / 6561, A52 = -25360.0 / 2187, A53 = 64448.0 / 6561, A54 = -212.0 / 729;
    private const double A61 = 9017.0 / 3168, A62 = -355.0 / 33, A63 = 46732.0 / 5247, A64 = 49.0 / 176, A65 = -5103.0 / 18656;
    private const double B1 = 35.0 / 384, B3 = 500.0 / 1113, B4 = 125.0 / 192, B5 = -2187.0 / 6784, B6 = 11.0 / 84;
    // Error coefficients: fifth-order minus fourth-order weights.
    private const double E1 = 71.0 / 57600, E3 = -71.0 / 16695, E4 = 71.0 / 1920, E5 = -17253.0 / 339200, E6 = 22.0 / 525, E7 = -1.0 / 40;

    /// <summary>Integrates y' = f(x, y) from (x0, y0) to x1 (x1 &gt; x0).</summary>
    /// <param name="f">Right-hand side.</param>
    /// <param name="x0">Start of the interval.</param>
    /// <param name="y0">Initial state.</param>
    /// <param name="x1">End of the interval.</param>
    /// <param name="relativeTolerance">Relative local error tolerance (default 1e-10).</param>
    /// <param name="absoluteTolerance">Absolute local error tolerance (default 1e-12).</param>
    /// <param name="stopWhenAbove">Ends the integration early once y exceeds this value (e.g. the wall thickness); +∞ for none.</param>
    /// <param name="maxSteps">Step budget.</param>
    public static OdeResult Integrate(Func<double, double, double> f, double x0, double y0, double x1,
        double relativeTolerance = 1e-10, double absoluteTolerance = 1e-12, double stopWhenAbove = double.PositiveInfinity,
        int maxSteps = 100_000)
    {
        ArgumentNullException.ThrowIfNull(f);
        if (!(x1 >= x0)) throw new ArgumentOutOfRangeException(nameof(x1), x1, "The end must not precede the start.");
        if (!(relativeTolerance > 0) || !(absoluteTolerance > 0)) throw new ArgumentOutOfRangeException(nameof(relativeTolerance), relativeTolerance, "Tolerances must be > 0.");
        if (x1 == x0) return new OdeResult(y0, x0, 0, 0, true, false);

        var x = x0;
        var y = y0;
        var k1 = f(x, y);
        // Starting step h₀ = 0.01·‖y₀‖/‖f₀‖ (Hairer et al., §II.4), with ‖y₀‖ at least 1 so y₀ = 0 still moves.
        var h = Math.Abs(k1) > 0 ? 0.01 * Math.Max(Math.Abs(y), 1) / Math.Abs(k1) : x1 - x0;
        h = Math.Clamp(h, (x1 - x0) * 1e-12, x1 - x0);
        int steps = 0, rejected = 0;
        while (x < x1)
        {
            if (steps + rejected >= maxSteps) return new OdeResult(y, x, steps, rejected, false, false);
            if (x + h > x1) h = x1 - x;
            var k2 = f(x + C2 * h, y + h * A21 * k1);
            var k3 = f(x + C3 * h, y + h * (A31 * k1 + A32 * k2));
            var k4 = f(x + C4 * h, y + h * (A41 * k1 + A42 * k2 + A43 * k3));
            var k5 = f(x + C5 * h, y + h * (A51 * k1 + A52 * k2 + A53 * k3 + A54 * k4));
            var k6 = f(x + h, y + h * (A61 * k1 + A62 * k2 + A63 * k3 + A64 * k4 + A65 * k5));
            var yNew = y + h * (B1 * k1 + B3 * k3 + B4 * k4 + B5 * k5 + B6 * k6);
            var k7 = f(x + h, yNew);
            var err = h * (E1 * k1 + E3 * k3 + E4 * k4 + E5 * k5 + E6 * k6 + E7 * k7);
            var sc = absoluteTolerance + relativeTolerance * Math.Max(Math.Abs(y), Math.Abs(yNew));
            var ratio = Math.Abs(err) / sc;
            if (!double.IsFinite(ratio))
            {
                h *= 0.1;
                rejected++;
                if (h < 1e-14 * Math.Max(1, Math.Abs(x))) return new OdeResult(y, x, steps, rejected, false, false);
                continue;
            }

            if (ratio <= 1)
            {
                x = h >= x1 - x ? x1 : x + h;
                y = yNew;
                k1 = k7; // first-same-as-last
                steps++;
                if (y > stopWhenAbove) return new OdeResult(y, x, steps, rejected, true, true);
            }
            else
            {
                rejected++;
            }

            // Safety 0.9, growth limited to [0.2, 5]; exponent 1/5 for the fourth-order error estimate.
            var factor = ratio == 0 ? 5 : Math.Clamp(0.9 * Math.Pow(ratio, -0.2), 0.2, 5);
            h *= factor;
            if (h < 1e-14 * Math.Max(1, Math.Abs(x))) return new OdeResult(y, x, steps, rejected, false, false);
        }

        return new OdeResult(y, x, steps, rejected, true, false);
    }
}
