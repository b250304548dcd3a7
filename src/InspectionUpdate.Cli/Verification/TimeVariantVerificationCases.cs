using InspectionUpdate.Probability;
using InspectionUpdate.TimeVariant;

namespace InspectionUpdate.Cli.Verification;

/// <summary>
/// The corroding bar under a stationary Gaussian load process of Sudret (2008), Structure and Infrastructure
/// Engineering 4(5), 353–362, section 5: g(t) = R − b·t − S(t), R ~ N(5, 0.3), b = 0.01 per year, S(t) with mean 3,
/// standard deviation 0.5 and autocorrelation exp(−(τ/10 y)²), over 0–50 years. The engine's PHI2 outcrossing rate
/// (two FORM analyses per time) is compared with the paper's closed form (Eq. 46), and the PHI2 upper bound of the
/// cumulative Pf with the same bound integrated from the closed form (Simpson's rule on 2,000 steps).
/// </summary>
/// <remarks>A crude Monte Carlo of the cumulative Pf (1.6e-2) is in the core's tests (Phi2OutcrossingTests); it is too slow for verify.</remarks>
internal static class TimeVariantVerificationCases
{
    private const double MuR = 5, SigmaR = 0.3, MuS = 3, SigmaS = 0.5, B = 0.01, Ell = 10, T = 50;
    private const string Source = "Sudret (2008), Struct. Infrastruct. Eng. 4(5), section 5, Eq. 46 (closed form)";
    private const string Name = "corroding bar R − b·t − S(t), Gaussian load process";

    /// <summary>The rows: ν⁺ at 0, 25 and 50 years and the cumulative upper bound over 0–50 years.</summary>
    public static IReadOnlyList<VerificationTableRow> Run()
    {
        var load = new GaussianProcessLoad("S", MuS, SigmaS, Ell);
        var phi2 = Phi2Outcrossing.Compute(new StochasticModel([new NormalVariable("R", MuR, SigmaR)]), load, (x, s, t) => x[0] - B * t - s, 0, T, intervals: 50);
        var rows = new List<VerificationTableRow>();
        foreach (var t in new[] { 0.0, 25.0, 50.0 })
        {
            var point = phi2.Points.Single(p => Math.Abs(p.TimeYears - t) < 1e-9);
            rows.Add(new(Name, Source, FormattableString.Invariant($"outcrossing rate ν⁺({t:0} y), per year"), Rate(t), point.Converged ? point.OutcrossingRatePerYear : double.NaN, 1e-4,
                "PHI2 (FORM at t and t ± h)", point.Converged ? null : "FORM did not converge"));
        }

        var sigma = Math.Sqrt(SigmaR * SigmaR + SigmaS * SigmaS);
        var bound = StandardNormal.Ccdf((MuR - MuS) / sigma) + Simpson(Rate, 0, T, 2000);
        // The engine integrates its 51 rates with the trapezoidal rule: for this smooth, convex ν⁺ that is within 0.1 %.
        rows.Add(new(Name, Source + " integrated", "Pf(0, 50 y) upper bound P_f,i(0) + ∫ν⁺dt", bound, phi2.Converged ? phi2.UpperBoundPf : double.NaN, 2e-3,
            "PHI2, trapezoidal rule on 1-year steps", FormattableString.Invariant($"Poisson form {phi2.PoissonPf:0.0000e0}; crude Monte Carlo in the tests 1.6e-2")));
        return rows;
    }

    private static double Rate(double t)
    {
        var omega0 = Math.Sqrt(2) / Ell;
        var sigma = Math.Sqrt(SigmaR * SigmaR + SigmaS * SigmaS);
        return omega0 * Phi2Outcrossing.Psi(-B / (omega0 * SigmaS)) * SigmaS / sigma * StandardNormal.Pdf((MuR - B * t - MuS) / sigma);
    }

    private static double Simpson(Func<double, double> f, double a, double b, int n)
    {
        var h = (b - a) / n;
        var sum = f(a) + f(b);
        for (var i = 1; i < n; i++) sum += f(a + i * h) * (i % 2 == 1 ? 4 : 2);
        return sum * h / 3;
    }
}
