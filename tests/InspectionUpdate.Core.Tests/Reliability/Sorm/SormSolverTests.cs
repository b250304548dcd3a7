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
    [Reference("Exact paraboloid probability by a 1-D χ² integral computed in the test; Breitung (1984) and Hohenbichler et al. (1987) closed forms written out; docs/references.md derived values")]
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
    [Reference("docs/references.md derived case g = X1·X2 − X3 (β_FORM = 3.049073); exact Pf recomputed here by 2-D Gauss–Legendre integration of Φ((x1·x2 − 1000)/200) over the normal densities")]
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
    [Reference("OpenTURNS test suite, python/test/t_SORM_std.py with its expected output t_SORM_std.expout (github.com/openturns/openturns): event −F·L³/(3·E·I) < −1.5, E, F, L, I independent normal (50, 1, 10, 5; σ = 1), printed to 6 decimals")]
    public void Published_example_OpenTURNS_cantilever_deflection_matches_all_three_formulas_to_six_decimals()
    {
        // Failure when the tip deflection F·L³/(3·E·I) exceeds 1.5. Expected output as printed (%.6f) in
        // t_SORM_std.expout: Hasofer β = 0.115943; Breitung 0.451173 (β_g 0.122699), Hohenbichler 0.435230 (β_g 0.163074),
        // Tvedt 0.433548 (β_g 0.167348); sorted curvatures [−0.025678, −0.000273, 0.000000, 0.128951], where the 0 is
        // the normal direction (the test zeroes it) and the signs are the opposite of ours (OpenTURNS writes 1 + βκ);
        // design point u* = [−0.002385, 0.107665, 0.035650, −0.023966].
        // Tolerance 1e-6 absolute: half a unit of the sixth printed decimal (5e-7) plus our Hessian difference error,
        // which moves these numbers by less than 1e-8 between steps 1e-2 and 1e-4 (measured).
        var model = new StochasticModel([new NormalVariable("E", 50, 1), new NormalVariable("F", 1, 1), new NormalVariable("L", 10, 1), new NormalVariable("I", 5, 1)]);
        var problem = new ReliabilityProblem(model, new LimitState("1.5 − F·L³/(3·E·I)", x => 1.5 - x[1] * x[2] * x[2] * x[2] / (3 * x[0] * x[3])));
        // The OpenTURNS run stops its design-point search at 1e-10; our default alignment tolerance (1e-5) leaves u*
        // 1.4e-6 off in its third entry (β and the SORM values do not notice), so the search is tightened to match.
        var result = SormSolver.Solve(problem, new FormOptions { LimitStateTolerance = 1e-10, AlignmentTolerance = 1e-9 });
        Assert.True(result.Converged, result.Diagnostic);
        const double tol = 1e-6;
        Assert.Equal(0.115943, result.Form.Beta, tol);
        double[] u = [-0.002385, 0.107665, 0.035650, -0.023966];
        for (var i = 0; i < 4; i++) Assert.Equal(u[i], result.Form.DesignPointU[i], tol);

        // Ours ascending in Breitung's sign convention = minus theirs: [−0.128951, 0.000273, 0.025678].
        Assert.Equal(3, result.Curvatures.Count);
        Assert.Equal(-0.128951, result.Curvatures[0], tol);
        Assert.Equal(0.000273, result.Curvatures[1], tol);
        Assert.Equal(0.025678, result.Curvatures[2], tol);

        Assert.Equal(0.451173, result.Breitung.FailureProbability, tol);
        Assert.Equal(0.122699, result.Breitung.GeneralizedBeta, tol);
        Assert.Equal(0.435230, result.HohenbichlerRackwitz.FailureProbability, tol);
        Assert.Equal(0.163074, result.HohenbichlerRackwitz.GeneralizedBeta, tol);
        Assert.Equal(0.433548, result.Tvedt.FailureProbability, tol);
        Assert.Equal(0.167348, result.Tvedt.GeneralizedBeta, tol);
    }

    [Fact]
    [Reference("PySTRA documentation, notebook docs/source/notebooks/ex_intro.ipynb, \"Comparing FORM, SORM and simulation\" (github.com/pystra/pystra, PySTRA 2.0): g = 1 − X2/(1000·X3) − (X1/(200·X3))², X1 lognormal (500, 100), X2 normal (2000, 400), X3 uniform (5, 0.5), ρ12 = 0.3, ρ13 = ρ23 = 0.2, Nataf; curve-fitting SORM output printed to 6 significant figures")]
    public void Published_example_PySTRA_correlated_non_normal_case_matches_within_its_stated_convergence_tolerance()
    {
        // Printed output: FORM β 1.75398, Pf 0.0397173, design point x* = [631.504, 2310.35, 4.51737];
        // SORM (curve fit) "Pf, breitung" 0.0322193 and "Pf, modified breitung" (Hohenbichler–Rackwitz) 0.031148.
        // PySTRA's defaults, stated in its FORMOptions/SORMOptions documentation, stop FORM at 1e-3 on |g|/|g0| and on
        // ‖u − (α·u)α‖, with forward-difference gradients (step σ/1000) and a Hessian step of 1e-3: its printed design
        // point sits 5e-4 from ours in u, so its SORM numbers carry errors of order 1e-3 relative, not 1e-6. Ours
        // (converged to 1e-10, curvatures stable to 1e-5 between Hessian steps 1e-2 and 1e-4) are 0.0322110 and 0.0311389,
        // 2.6e-4 and 2.9e-4 below; at PySTRA's printed design point our Hessian gives 0.0322126, so most of the gap is
        // in its α and Hessian differences, not in the transformation (our Nataf R0 reproduces the closed forms
        // 0.3·δ/√ln(1+δ²) = 0.302966 for lognormal–normal and 0.2·√(π/3) = 0.204665 for uniform–normal).
        // Tolerance: 1e-3 relative on the probabilities and the design point, half a unit of the fifth decimal on β.
        var correlation = new CorrelationMatrix(new double[,] { { 1, 0.3, 0.2 }, { 0.3, 1, 0.2 }, { 0.2, 0.2, 1 } });
        var model = new StochasticModel(
            [LognormalVariable.FromMeanStd("X1", 500, 100), new NormalVariable("X2", 2000, 400), UniformVariable.FromMeanStd("X3", 5, 0.5)], correlation);
        var problem = new ReliabilityProblem(model, new LimitState("1 − X2/(1000·X3) − (X1/(200·X3))²",
            x => 1 - x[1] / (1000 * x[2]) - Math.Pow(x[0] / (200 * x[2]), 2)));
        var result = SormSolver.Solve(problem);
        Assert.True(result.Converged, result.Diagnostic);

        Assert.Equal(1.75398, result.Form.Beta, 5e-6);
        Assert.Equal(0.0397173, result.Form.FailureProbability, 1e-3 * 0.0397173);
        double[] x = [631.50413468, 2310.35249517, 4.51737361];
        for (var i = 0; i < 3; i++) Assert.Equal(x[i], result.Form.DesignPointX[i], 1e-3 * x[i]);

        Assert.All(result.Estimates, e => Assert.True(e.Valid, e.Note));
        Assert.Equal(0.0322193, result.Breitung.FailureProbability, 1e-3 * 0.0322193);
        Assert.Equal(0.031148, result.HohenbichlerRackwitz.FailureProbability, 1e-3 * 0.031148);
        // One curvature is strongly negative (away from the origin): SORM lowers Pf below FORM's, as PySTRA's does.
        Assert.True(result.Breitung.FailureProbability < result.Form.FailureProbability);
    }

    [Fact]
    [Reference("Der Kiureghian (2022), Structural and System Reliability, Cambridge Univ. Press, Examples 6.5 (p. 147) and 7.2 (p. 188), as quoted in the Fortuna.jl test suite (github.com/AkchurinDA/Fortuna.jl, test/TestFORM.jl and test/TestSORM.jl): β = 2.47, Pf1 = 0.00682, curvatures [−0.155, −0.0399, 0], SORM Pf 0.00960 and 0.00914 (three figures); the book itself was not read")]
    public void Quoted_textbook_example_column_with_Gumbel_and_Weibull_inputs_matches_to_the_quoted_figures()
    {
        // Column under biaxial bending and axial load: g = 1 − M1/(s1·Y) − M2/(s2·Y) − (P/(a·Y))², s1 = 0.030,
        // s2 = 0.015, a = 0.190; M1 normal (250, 75), M2 normal (125, 37.5), P Gumbel (2500, 500), Y Weibull (40000, 4000);
        // ρ(M1, M2) = 0.5, ρ(M1, P) = ρ(M2, P) = 0.3. The quoted curvatures have the opposite sign to ours; the quoted
        // pair 0.00960 / 0.00914 is Hohenbichler–Rackwitz / Breitung (ours 0.009615 / 0.009148).
        var correlation = new CorrelationMatrix(new double[,] { { 1, 0.5, 0.3, 0 }, { 0.5, 1, 0.3, 0 }, { 0.3, 0.3, 1, 0 }, { 0, 0, 0, 1 } });
        var model = new StochasticModel(
            [new NormalVariable("M1", 250, 75), new NormalVariable("M2", 125, 37.5), GumbelVariable.FromMeanStd("P", 2500, 500), WeibullVariable.FromMeanStd("Y", 40000, 4000)],
            correlation);
        var problem = new ReliabilityProblem(model, new LimitState("column",
            x => 1 - x[0] / (0.030 * x[3]) - x[1] / (0.015 * x[3]) - Math.Pow(x[2] / (0.190 * x[3]), 2)));
        var result = SormSolver.Solve(problem);
        Assert.True(result.Converged, result.Diagnostic);

        // Three figures: within half a unit of the last one.
        Assert.Equal(2.47, result.Form.Beta, 0.005);
        Assert.Equal(3, result.Curvatures.Count);
        Assert.Equal(0, result.Curvatures[0], 0.0005);
        Assert.Equal(0.0399, result.Curvatures[1], 0.00005);
        Assert.Equal(0.155, result.Curvatures[2], 0.0005);

        // The quoted Pf1 0.00682 is 0.16 % below Φ(−β) at our β (0.006831): a FORM-stage offset that three figures of
        // β cannot resolve, and that every quoted SORM value inherits. The SORM correction itself, Pf2/Pf1, is compared
        // on the quoted figures' ratio, whose rounding allows 0.5e-5/0.0091 + 0.5e-5/0.00682 = 1.3e-3 relative;
        // the probabilities themselves within 2.5e-3 relative (that offset plus rounding).
        const double ratioTolerance = 0.5e-5 / 0.00914 + 0.5e-5 / 0.00682;
        var pf1 = result.Form.FailureProbability;
        Assert.Equal(0.00914 / 0.00682, result.Breitung.FailureProbability / pf1, ratioTolerance * 0.00914 / 0.00682);
        Assert.Equal(0.00960 / 0.00682, result.HohenbichlerRackwitz.FailureProbability / pf1, ratioTolerance * 0.00960 / 0.00682);
        Assert.Equal(0.00682, pf1, 2.5e-3 * 0.00682);
        Assert.Equal(0.00914, result.Breitung.FailureProbability, 2.5e-3 * 0.00914);
        Assert.Equal(0.00960, result.HohenbichlerRackwitz.FailureProbability, 2.5e-3 * 0.00960);
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
