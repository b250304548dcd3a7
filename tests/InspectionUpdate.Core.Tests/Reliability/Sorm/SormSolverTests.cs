using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Sorm;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Sorm;

public class SormSolverTests
{
    /// <summary>
    /// Independent computation: failure uₙ ≥ β + (c/2)Σᵢ₌₁ⁿ⁻¹uᵢ² has Pf = ∫₀^∞ f_χ²(n−1)(t) Φ(−β − ct/2) dt,
    /// integrated with MathNet's double-exponential rule after t = s² (smooth at 0 for every n).
    /// </summary>
    internal static double ExactParaboloid(double beta, double c, int n)
    {
        var chi = new ChiSquared(n - 1);
        return Integrate.DoubleExponential(s => chi.Density(s * s) * 2 * s * StandardNormal.Cdf(-beta - c * s * s / 2), 0, 30, 1e-15);
    }

    private static ReliabilityProblem Paraboloid(double beta, double c, int n)
    {
        var model = new StochasticModel(Enumerable.Range(0, n).Select(i => (RandomVariable)new NormalVariable($"U{i}", 0, 1)).ToArray());
        return new ReliabilityProblem(model, new LimitState("paraboloid", u =>
        {
            var s = 0.0;
            for (var i = 0; i < n - 1; i++) s += u[i] * u[i];
            return beta - u[n - 1] + c / 2 * s;
        }));
    }

    [Theory]
    [Reference("Exact paraboloid probability by a 1-D χ² integral computed in the test; Breitung (1984) and Hohenbichler et al. (1987) closed forms written out; REFERENCES.md derived values")]
    [InlineData(3.0, 0.1, 2, 1.168962e-3, 1.183939e-3, 1.171254e-3, 0.02)]
    [InlineData(3.0, 0.2, 5, 4.730416e-4, 5.273039e-4, double.NaN, 0.02)]
    [InlineData(4.0, 0.05, 10, 1.310400e-5, double.NaN, double.NaN, 0.02)]
    [InlineData(1.0, 0.3, 3, double.NaN, double.NaN, double.NaN, 0.02)]
    [InlineData(3.0, -0.1, 3, double.NaN, double.NaN, double.NaN, 0.02)]
    [InlineData(2.0, -0.1, 4, double.NaN, double.NaN, double.NaN, 0.02)]
    // Strong curvature towards the origin at low β: the three-term form overshoots by about 9 % (measured here).
    [InlineData(2.0, -0.2, 4, double.NaN, double.NaN, double.NaN, 0.1)]
    public void Paraboloid_corrections_match_their_closed_forms_and_Tvedt_tracks_the_exact_value(
        double beta, double c, int n, double derivedExact, double derivedBreitung, double derivedHr, double tvedtTolerance)
    {
        var result = SormSolver.Solve(Paraboloid(beta, c, n));
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(beta, result.Form.Beta, 1e-8);
        Assert.Equal(n - 1, result.Curvatures.Count);
        // Breitung's sign convention: the paraboloid curves away from the origin for c > 0, so κ = −c.
        Assert.All(result.Curvatures, k => Assert.Equal(-c, k, 1e-5));

        var q = StandardNormal.Cdf(-beta);
        var breitung = q * Math.Pow(1 + beta * c, -(n - 1) / 2.0);
        var hr = q * Math.Pow(1 + c * StandardNormal.Pdf(beta) / q, -(n - 1) / 2.0);
        Assert.Equal(breitung, result.Breitung.FailureProbability, 1e-5 * breitung);
        Assert.Equal(hr, result.HohenbichlerRackwitz.FailureProbability, 1e-5 * hr);

        var exact = ExactParaboloid(beta, c, n);
        if (!double.IsNaN(derivedExact)) Assert.Equal(derivedExact, exact, 1e-6 * derivedExact);
        if (!double.IsNaN(derivedBreitung)) Assert.Equal(derivedBreitung, breitung, 1e-6 * derivedBreitung);
        if (!double.IsNaN(derivedHr)) Assert.Equal(derivedHr, hr, 1e-6 * derivedHr);

        // Tvedt (1990) reports his three-term formula close to exact for paraboloids (from memory); checked here.
        Assert.True(result.Tvedt.Valid, result.Tvedt.Note);
        var tvedtError = Math.Abs(result.Tvedt.FailureProbability - exact) / exact;
        var breitungError = Math.Abs(breitung - exact) / exact;
        Assert.True(tvedtError < tvedtTolerance, $"Tvedt relative error {tvedtError:G3}");
        if (tvedtTolerance <= 0.02) Assert.True(tvedtError <= breitungError, $"Tvedt {tvedtError:G3} vs Breitung {breitungError:G3}");
    }

    [Fact]
    [Reference("Closed form: the sphere ‖u‖ = r has all principal curvatures 1/r at any point, so βκ = 1 and Breitung's factor is singular")]
    public void Sphere_curvatures_are_flagged_as_invalid_for_the_formulas()
    {
        var model = new StochasticModel([new NormalVariable("U1", 0, 1), new NormalVariable("U2", 0, 1), new NormalVariable("U3", 0, 1)]);
        var problem = new ReliabilityProblem(model, new LimitState("sphere", u => 3 - Math.Sqrt(u[0] * u[0] + u[1] * u[1] + u[2] * u[2])));
        var result = SormSolver.Solve(problem, new FormOptions { StartPoint = [0.3, 0.2, 1.0] });
        Assert.Equal(3.0, result.Form.Beta, 1e-6);
        Assert.All(result.Curvatures, k => Assert.Equal(1.0 / 3, k, 1e-4));
        Assert.False(result.Breitung.Valid);
        Assert.True(double.IsNaN(result.Breitung.FailureProbability));
        Assert.False(result.HohenbichlerRackwitz.Valid);
        Assert.NotNull(result.Diagnostic);
    }

    [Fact]
    [Reference("REFERENCES.md derived case g = X1·X2 − X3 (β_FORM = 3.049073); exact Pf recomputed here by 2-D Gauss–Legendre integration of Φ((x1·x2 − 1000)/200) over the normal densities")]
    public void Nonlinear_product_limit_state_is_corrected_towards_the_exact_probability()
    {
        var model = new StochasticModel([new NormalVariable("X1", 40, 5), new NormalVariable("X2", 50, 2.5), new NormalVariable("X3", 1000, 200)]);
        var problem = new ReliabilityProblem(model, new LimitState("X1X2-X3", x => x[0] * x[1] - x[2]));
        var exact = Integrate.OnRectangle(
            (a, b) => StandardNormal.Pdf(a) * StandardNormal.Pdf(b) * StandardNormal.Ccdf(((40 + 5 * a) * (50 + 2.5 * b) - 1000) / 200),
            -9, 9, -9, 9, 128);
        Assert.Equal(1.176882e-3, exact, 1e-6 * exact);

        var result = SormSolver.Solve(problem);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(3.049073, result.Form.Beta, 1e-5);
        var formError = Math.Abs(result.Form.FailureProbability - exact);
        foreach (var estimate in result.Estimates)
        {
            Assert.True(estimate.Valid, estimate.Note);
            Assert.True(Math.Abs(estimate.FailureProbability - exact) < formError, $"{estimate.Method}: {estimate.FailureProbability:G6} vs exact {exact:G6}");
        }
    }

    [Fact]
    [Reference("Closed form: a linear limit state has zero curvature, so every correction returns Φ(−β)")]
    public void Linear_limit_state_has_no_correction()
    {
        var model = new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]);
        var result = SormSolver.Solve(new ReliabilityProblem(model, new LimitState("R-S", x => x[0] - x[1])));
        var q = result.Form.FailureProbability;
        Assert.All(result.Curvatures, k => Assert.Equal(0, k, 1e-6));
        Assert.All(result.Estimates, e => Assert.Equal(q, e.FailureProbability, 1e-6 * q));
    }

    [Fact]
    [Reference("Closed form: the rotation is orthogonal with α as its last row")]
    public void Rotation_is_orthogonal_with_alpha_last()
    {
        double[] alpha = [0.2, -0.5, 0.1, Math.Sqrt(1 - 0.04 - 0.25 - 0.01)];
        var r = SormSolver.Rotation(alpha);
        for (var i = 0; i < 4; i++)
        {
            Assert.Equal(alpha[i], r[3, i], 1e-15);
            for (var j = 0; j < 4; j++)
            {
                var d = 0.0;
                for (var k = 0; k < 4; k++) d += r[i, k] * r[j, k];
                Assert.Equal(i == j ? 1 : 0, d, 1e-14);
            }
        }
    }

    [Fact]
    public void Rejects_a_finite_difference_step_out_of_range()
    {
        var model = new StochasticModel([new NormalVariable("R", 200, 20)]);
        var problem = new ReliabilityProblem(model, new LimitState("R", x => x[0] - 100));
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => SormSolver.Solve(problem, FormSolver.Solve(problem), 0.5));
        Assert.Equal("finiteDifferenceStep", e.ParamName);
    }
}
