using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Reliability.Form;

/// <summary>FORM on limit states whose β is known in closed form (FORM is exact on them).</summary>
public class FormSolverClosedFormTests
{
    // Cornell (1969): β = (μR − μS)/√(σR² + σS²) for the linear margin R − S of independent normals.
    [Fact]
    [Reference("Cornell (1969), closed form for a linear margin of independent normals")]
    public void Linear_normal_margin_matches_Cornell_closed_form()
    {
        var model = new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]);
        var problem = new ReliabilityProblem(model, new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);
        var expected = (200.0 - 100.0) / Math.Sqrt(20 * 20 + 30 * 30);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-9);
        Assert.Equal(MathNet.Numerics.Distributions.Normal.CDF(0, 1, -expected), result.FailureProbability, 1e-12);
        // α = −∇G/‖∇G‖ = (−σR, σS)/√(σR² + σS²): resistance low, load high at the design point.
        Assert.Equal(-20 / Math.Sqrt(1300), result.Alpha[0], 1e-9);
        Assert.Equal(30 / Math.Sqrt(1300), result.Alpha[1], 1e-9);
    }

    // ln R − ln S ~ N(λR − λS, √(ζR² + ζS²)), so P(R ≤ S) = Φ(−β) with β = (λR − λS)/√(ζR² + ζS²);
    // in u the surface λR + ζR·uR = λS + ζS·uS is a plane, so FORM is exact.
    [Theory]
    [Reference("Closed form: lognormal R and S, exact β in log space (e.g. Melchers 1999, §3.3; from memory)")]
    [InlineData(300.0, 0.1, 150.0, 0.3)]
    [InlineData(50.0, 0.25, 10.0, 0.6)]
    [InlineData(1.0, 0.05, 0.8, 0.05)]
    public void Lognormal_resistance_and_load_reproduce_the_exact_log_space_beta(double meanR, double covR, double meanS, double covS)
    {
        var r = LognormalVariable.FromMeanCov("R", meanR, covR);
        var s = LognormalVariable.FromMeanCov("S", meanS, covS);
        var problem = new ReliabilityProblem(new StochasticModel([r, s]), new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);
        var expected = (r.Lambda - s.Lambda) / Math.Sqrt(r.Zeta * r.Zeta + s.Zeta * s.Zeta);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-6);
        // At the design point R = S.
        Assert.Equal(result.DesignPointX[0], result.DesignPointX[1], 1e-6 * meanR);
    }

    // Origin in the failure domain: μR < μS, so G(0) < 0 and β = (μR − μS)/√(σR² + σS²) < 0, Pf = Φ(−β) > 0.5.
    [Fact]
    [Reference("Cornell (1969) closed form with μR < μS: negative β")]
    public void Median_point_in_the_failure_domain_gives_negative_beta_and_pf_above_one_half()
    {
        var model = new StochasticModel([new NormalVariable("R", 100, 20), new NormalVariable("S", 120, 15)]);
        var problem = new ReliabilityProblem(model, new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);
        var expected = (100.0 - 120.0) / Math.Sqrt(20 * 20 + 15 * 15); // −0.8
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-9);
        Assert.True(result.FailureProbability > 0.5);
        Assert.Equal(MathNet.Numerics.Distributions.Normal.CDF(0, 1, 0.8), result.FailureProbability, 1e-10);
        // u* = βα still holds with β < 0.
        for (var i = 0; i < 2; i++) Assert.Equal(result.Beta * result.Alpha[i], result.DesignPointU[i], 1e-8);
    }

    // Same with lognormals: β = (λR − λS)/√(ζR² + ζS²) < 0 when the median of R is below the median of S.
    [Fact]
    [Reference("Closed form: lognormal R and S, exact β in log space")]
    public void Lognormal_case_with_failing_median_point_matches_the_exact_negative_beta()
    {
        var r = LognormalVariable.FromMeanCov("R", 90, 0.2);
        var s = LognormalVariable.FromMeanCov("S", 100, 0.3);
        var problem = new ReliabilityProblem(new StochasticModel([r, s]), new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);
        var expected = (r.Lambda - s.Lambda) / Math.Sqrt(r.Zeta * r.Zeta + s.Zeta * s.Zeta);
        Assert.True(expected < 0);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-6);
        Assert.Equal(MathNet.Numerics.Distributions.Normal.CDF(0, 1, -expected), result.FailureProbability, 1e-6);
    }

    // ln R, ln S are jointly normal with corr(ln R, ln S) = ρ₀ = ln(1 + ρ·V_R·V_S)/(ζ_R·ζ_S) (the exact Nataf fictive
    // correlation of a lognormal pair), so β = (λR − λS)/√(ζR² + ζS² − 2ρ₀ζRζS) and FORM is exact (the surface is a plane).
    [Theory]
    [Reference("Liu & Der Kiureghian (1986), lognormal–lognormal fictive correlation (docs/references.md [memory, verified numerically]); exact β in log space")]
    [InlineData(0.5)]
    [InlineData(-0.4)]
    [InlineData(0.9)]
    public void Correlated_lognormal_pair_reproduces_the_exact_beta(double rho)
    {
        var r = LognormalVariable.FromMeanCov("R", 300, 0.15);
        var s = LognormalVariable.FromMeanCov("S", 150, 0.35);
        var corr = new CorrelationMatrix(new double[,] { { 1, rho }, { rho, 1 } });
        var problem = new ReliabilityProblem(new StochasticModel([r, s], corr), new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);

        var zr = Math.Sqrt(Math.Log(1 + 0.15 * 0.15));
        var zs = Math.Sqrt(Math.Log(1 + 0.35 * 0.35));
        var lr = Math.Log(300) - 0.5 * zr * zr;
        var ls = Math.Log(150) - 0.5 * zs * zs;
        var rho0 = Math.Log(1 + rho * 0.15 * 0.35) / (zr * zs);
        var expected = (lr - ls) / Math.Sqrt(zr * zr + zs * zs - 2 * rho0 * zr * zs);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-6);
        // In z = L₀u, ∇_z G ∝ (ζR, −ζS) at R = S, and γ ∝ L₀⁻ᵀα ∝ (−ζR, ζS): the importance vector ignores ρ.
        var norm = Math.Sqrt(zr * zr + zs * zs);
        Assert.Equal(-zr / norm, result.ImportanceVector![0], 1e-6);
        Assert.Equal(zs / norm, result.ImportanceVector![1], 1e-6);
    }

    // Correlated normals, g = a₀ + aᵀx: β = (a₀ + aᵀμ)/√(aᵀΣa) with Σ = DRD.
    [Fact]
    [Reference("Closed form: linear margin of correlated normals, β = E[g]/sd[g]")]
    public void Linear_margin_of_correlated_normals_matches_the_closed_form()
    {
        var corr = new CorrelationMatrix(new double[,] { { 1, 0.5, -0.2 }, { 0.5, 1, 0.3 }, { -0.2, 0.3, 1 } });
        var model = new StochasticModel(
            [new NormalVariable("A", 10, 2), new NormalVariable("B", 5, 1), new NormalVariable("C", 3, 1.5)], corr);
        double[] a = [1.0, -1.5, -0.8];
        const double a0 = 2.0;
        var problem = new ReliabilityProblem(model, new LimitState("linear", x => a0 + a[0] * x[0] + a[1] * x[1] + a[2] * x[2]));
        var result = FormSolver.Solve(problem);

        double[] mu = [10, 5, 3];
        double[] sd = [2, 1, 1.5];
        var mean = a0 + a[0] * mu[0] + a[1] * mu[1] + a[2] * mu[2];
        var variance = 0.0;
        for (var i = 0; i < 3; i++)
            for (var j = 0; j < 3; j++) variance += a[i] * a[j] * sd[i] * sd[j] * corr[i, j];
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(mean / Math.Sqrt(variance), result.Beta, 1e-8);
    }
}
