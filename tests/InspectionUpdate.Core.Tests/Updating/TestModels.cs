using InspectionUpdate.Degradation;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Updating;

/// <summary>Size and margin functions of a test-local degradation model.</summary>
internal delegate double SizeFunction(ReadOnlySpan<double> x, double t);

/// <summary>A small test-local degradation model built from delegates (the real models come from the degradation layer).</summary>
internal sealed class TestDegradationModel(
    string name, StochasticModel inputs, SizeFunction size, SizeFunction margin, IReadOnlyList<string>? renewed = null) : IDegradationModel
{
    public string Name { get; } = name;

    public StochasticModel Inputs { get; } = inputs;

    public string SizeQuantity => "depth_mm";

    public double Size(ReadOnlySpan<double> x, double timeYears) => size(x, timeYears);

    public double Margin(ReadOnlySpan<double> x, double timeYears) => margin(x, timeYears);

    public IReadOnlyList<string> RenewedOnRepair { get; } = renewed ?? [];

    public string? AnnualMaximumInput => null;

    public double MaximumSizeMm => double.PositiveInfinity;
}

internal static class TestModels
{
    /// <summary>depth = D0 + R·t (mm), failure when depth ≥ the critical depth; D0 renewed on repair, R shared.</summary>
    public static TestDegradationModel LinearDepth(double d0Mean, double d0Sd, double rMean, double rSd, double criticalMm) =>
        new("linear depth (test)",
            new StochasticModel([new NormalVariable("D0_mm", d0Mean, d0Sd), new NormalVariable("R_mmPerYear", rMean, rSd)]),
            (x, t) => x[0] + x[1] * t,
            (x, t) => criticalMm - (x[0] + x[1] * t),
            ["D0_mm"]);

    /// <summary>ln a(t) = X1 + X2·t, failure when a ≥ a_c (the worked updating case).</summary>
    public static TestDegradationModel LogLinearCrack(double criticalMm = 20) =>
        new("log-linear crack (test)",
            new StochasticModel([new NormalVariable("X1", Math.Log(0.5), 0.5), new NormalVariable("X2", 0.10, 0.02)]),
            (x, t) => Math.Exp(x[0] + x[1] * t),
            (x, t) => criticalMm - Math.Exp(x[0] + x[1] * t),
            ["X1"]);

    /// <summary>
    /// Paris-law-like crack growth with constant geometry factor, m = 3: a(t) = [a0^(−1/2) − ½·C·Y³π^(3/2)Δσ³·ν·t]^(−2)
    /// (closed form of da/dN = C(ΔK)^m, m ≠ 2); a0 lognormal, ln C normal, Δσ lognormal; failure at a ≥ 25 mm.
    /// The bracket is floored so that a crack past instability counts as infinitely deep.
    /// </summary>
    public static TestDegradationModel ParisCrack()
    {
        const double y = 1.12, cyclesPerYear = 1e6, critical = 25;
        var inputs = new StochasticModel([
            LognormalVariable.FromMeanCov("a0_mm", 0.5, 0.4),
            new NormalVariable("lnC", Math.Log(2.0e-13), 0.25),
            LognormalVariable.FromMeanCov("dS_MPa", 30, 0.15),
        ]);
        double Size(ReadOnlySpan<double> x, double t)
        {
            var k = 0.5 * Math.Exp(x[1]) * y * y * y * Math.Pow(Math.PI, 1.5) * Math.Pow(x[2], 3) * cyclesPerYear * t;
            var bracket = 1 / Math.Sqrt(x[0]) - k;
            return bracket <= 1e-6 ? 1e12 : 1 / (bracket * bracket);
        }

        return new TestDegradationModel("Paris crack (test)", inputs, Size, (x, t) => critical - Size(x, t), ["a0_mm"]);
    }

    public static InspectionMethod Method(ProbabilityOfDetection pod, SizingErrorKind kind = SizingErrorKind.AdditiveNormal, double bias = 0, double sd = 0.2) =>
        new("test method", pod, new SizingError(kind, bias, sd));

    /// <summary>
    /// Φ₂(h, k; ρ) by Plackett's integral Φ(h)Φ(k) + (1/2π)∫₀^ρ (1 − r²)^(−1/2) exp(−(h² − 2rhk + k²)/(2(1 − r²))) dr
    /// (Drezner &amp; Wesolowsky 1990), integrated with MathNet's adaptive Gauss–Kronrod rule: independent of the
    /// production integrator, which conditions on one variable instead.
    /// </summary>
    public static double Bivariate(double h, double k, double rho)
    {
        var integral = GaussKronrodRule.Integrate(
            r => Math.Exp(-(h * h - 2 * r * h * k + k * k) / (2 * (1 - r * r))) / Math.Sqrt(1 - r * r),
            0, rho, out _, out _, 1e-14, 20, 61);
        return StandardNormal.Cdf(h) * StandardNormal.Cdf(k) + integral / (2 * Math.PI);
    }
}
