using InspectionUpdate.Probability;
using InspectionUpdate.TimeVariant;
using MathNet.Numerics.LinearAlgebra;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.TimeVariant;

/// <summary>
/// The corroding bar of Sudret (2008), Analytical derivation of the outcrossing rate in time-variant reliability
/// problems, Structure and Infrastructure Engineering 4(5), 353–362, section 5: g(t) = R − b·t − S(t), R ~ N(5, 0.3),
/// b = 0.01 per year, S(t) a stationary Gaussian process with mean 3, standard deviation 0.5 and autocorrelation
/// exp(−(τ/ℓ)²), ℓ = 10 years, over 0–50 years (the set-up as restated by the UQLab and OpenTURNS examples that cite
/// that section). The paper's closed form of the outcrossing rate (its Eq. 46):
/// ν⁺(t) = ω₀·Ψ(−b/(ω₀σ_S))·σ_S/√(σ_R² + σ_S²)·φ((μ_R − bt − μ_S)/√(σ_R² + σ_S²)), ω₀ = √2/ℓ, Ψ(x) = φ(x) − xΦ(−x).
/// </summary>
public class Phi2OutcrossingTests(ITestOutputHelper output)
{
    private const double MuR = 5, SigmaR = 0.3, MuS = 3, SigmaS = 0.5, B = 0.01, Ell = 10, T = 50;

    private static readonly StochasticModel Inputs = new([new NormalVariable("R", MuR, SigmaR)]);
    private static readonly GaussianProcessLoad Load = new("S", MuS, SigmaS, Ell);

    private static double Bar(ReadOnlySpan<double> x, double s, double t) => x[0] - B * t - s;

    private static double ClosedFormRate(double t)
    {
        var omega0 = Math.Sqrt(2) / Ell;
        var sigma = Math.Sqrt(SigmaR * SigmaR + SigmaS * SigmaS);
        var psi = StandardNormal.Pdf(-B / (omega0 * SigmaS)) + B / (omega0 * SigmaS) * StandardNormal.Ccdf(-B / (omega0 * SigmaS));
        return omega0 * psi * SigmaS / sigma * StandardNormal.Pdf((MuR - B * t - MuS) / sigma);
    }

    [Fact]
    [Reference("Sudret (2008), Struct. Infrastruct. Eng. 4(5), 353–362, section 5, Eq. 46: closed-form outcrossing rate of the corroding bar (set-up as restated by the UQLab example citing it)")]
    public void Phi2_outcrossing_rate_matches_the_papers_closed_form_over_fifty_years()
    {
        var result = Phi2Outcrossing.Compute(Inputs, Load, Bar, 0, T, intervals: 10);
        Assert.True(result.Converged);
        foreach (var p in result.Points)
        {
            var exact = ClosedFormRate(p.TimeYears);
            output.WriteLine(FormattableString.Invariant($"t {p.TimeYears,4:F0}: nu PHI2 {p.OutcrossingRatePerYear:E5}, Eq. 46 {exact:E5}"));
            // Linear g: β(t) and α(t) are exact to the FORM tolerance; central differences of a linear β are exact.
            Assert.Equal(1, p.OutcrossingRatePerYear / exact, 1e-4);
        }
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Crude Monte Carlo of the corroding bar computed in this test (Karhunen–Loève paths of S on a 0.5-year grid, 100,000 paths, seed 2008) against the PHI2 bounds")]
    public void Cumulative_pf_over_fifty_years_lies_between_the_phi2_bounds_and_near_the_upper_one()
    {
        var phi2 = Phi2Outcrossing.Compute(Inputs, Load, Bar, 0, T, intervals: 50);
        var (pf, se) = MonteCarlo(100_000, 2008);
        output.WriteLine(FormattableString.Invariant(
            $"Monte Carlo Pf(0, 50 y) {pf:E4} ± {se:E2}; PHI2 upper bound {phi2.UpperBoundPf:E4}, Poisson {phi2.PoissonPf:E4}, lower bound {phi2.LowerBoundPf:E4}"));
        Assert.True(phi2.LowerBoundPf <= pf + 3 * se, "the cumulative Pf is never below the largest instantaneous Pf");
        Assert.True(pf <= phi2.UpperBoundPf + 3 * se, "P_f,i(0) + ∫ν⁺ is an upper bound");
        // Slowly varying load (ℓ = 10 years against 50): crossings are rare, so the bound is close (measured: 1.5 % above
        // a 200,000-path run); allowed 5 % above the Monte Carlo value plus three standard errors.
        Assert.True(phi2.UpperBoundPf <= 1.05 * (pf + 3 * se), $"upper bound {phi2.UpperBoundPf} against Monte Carlo {pf}");
    }

    [Theory]
    [InlineData(double.NaN, 0.5, 10, "mean")]
    [InlineData(3, 0, 10, "standardDeviation")]
    [InlineData(3, -0.5, 10, "standardDeviation")]
    [InlineData(3, 0.5, 0, "correlationLengthYears")]
    [InlineData(3, 0.5, double.PositiveInfinity, "correlationLengthYears")]
    [Reference("Validation at the public boundary (STYLE.md): the parameter is named")]
    public void A_load_process_with_a_bad_parameter_is_refused_naming_it(double mean, double sd, double lengthYears, string parameter) =>
        Assert.Throws<ArgumentOutOfRangeException>(parameter, () => new GaussianProcessLoad("S", mean, sd, lengthYears));

    [Fact]
    [Reference("Closed form: ρ(τ) = exp(−(τ/ℓ)²) and ω₀ = √(−ρ″(0)) = √2/ℓ for the squared-exponential correlation")]
    public void Correlation_and_cycle_rate_are_those_of_the_squared_exponential()
    {
        Assert.Equal(Math.Exp(-0.25), Load.Correlation(5), 15);
        Assert.Equal(Math.Sqrt(2) / 10, Load.CycleRatePerYear, 15);
        // −ρ″(0) by a central second difference of ρ itself.
        const double h = 1e-3;
        Assert.Equal(Load.CycleRatePerYear * Load.CycleRatePerYear, -(Load.Correlation(h) - 2 + Load.Correlation(-h)) / (h * h), 6);
    }

    /// <summary>Crude Monte Carlo: S on a grid from the eigen-decomposition of its covariance (modes above 1e-12 of the largest kept).</summary>
    private static (double Pf, double StandardError) MonteCarlo(int samples, int seed)
    {
        const int points = 101;
        var times = Enumerable.Range(0, points).Select(i => T * i / (points - 1)).ToArray();
        var covariance = Matrix<double>.Build.Dense(points, points, (i, j) => SigmaS * SigmaS * Load.Correlation(times[i] - times[j]));
        var evd = covariance.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
        var largest = evd.EigenValues.Max(v => v.Real);
        var modes = Enumerable.Range(0, points).Where(k => evd.EigenValues[k].Real > 1e-12 * largest).ToArray();
        var shape = new double[points, modes.Length];
        for (var j = 0; j < points; j++)
        {
            for (var m = 0; m < modes.Length; m++) shape[j, m] = evd.EigenVectors[j, modes[m]] * Math.Sqrt(evd.EigenValues[modes[m]].Real);
        }

        var rng = new Random(seed);
        double Normal() => StandardNormal.InverseCdf((rng.Next(1, int.MaxValue) + 0.5) / int.MaxValue);
        var xi = new double[modes.Length];
        var failures = 0;
        for (var n = 0; n < samples; n++)
        {
            var r = MuR + SigmaR * Normal();
            for (var m = 0; m < xi.Length; m++) xi[m] = Normal();
            for (var j = 0; j < points; j++)
            {
                var s = MuS;
                for (var m = 0; m < xi.Length; m++) s += shape[j, m] * xi[m];
                if (r - B * times[j] - s <= 0)
                {
                    failures++;
                    break;
                }
            }
        }

        var p = (double)failures / samples;
        return (p, Math.Sqrt(p * (1 - p) / samples));
    }
}
