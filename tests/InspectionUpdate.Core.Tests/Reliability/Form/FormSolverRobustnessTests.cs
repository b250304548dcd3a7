using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Reliability.Form;

/// <summary>Warm start, gradient routes, evaluation counting, non-convergence and bad input.</summary>
public class FormSolverRobustnessTests
{
    private static ReliabilityProblem TwoNormals(LimitStateFunction g) =>
        new(new StochasticModel([new NormalVariable("A", 1, 1), new NormalVariable("B", 1, 1)]), new LimitState("g", g));

    public class Overflowing_direction
    {
        [Fact]
        [Reference("Common practice, no source: a FORM run that cannot take a step returns a non-converged result (the solver's contract), it does not throw")]
        public void Gives_a_non_converged_result_instead_of_an_exception()
        {
            // g = 1 − 1e-160·a with the exact gradient: ‖∇G‖² = 1e-320 is subnormal, so the HL-RF multiplier
            // −g/‖∇G‖² overflows, and ∞·0 puts NaN into the direction of b (a Gumbel input, whose transformation
            // refuses NaN). Before the fix the line search handed that point to the transformation, which threw.
            var problem = new ReliabilityProblem(
                new StochasticModel([new NormalVariable("a", 0, 1), GumbelVariable.FromParameters("b", 2, 0.3)]),
                new LimitState("g", x => 1 - 1e-160 * x[0] + 0 * x[1], (x, grad) =>
                {
                    grad[0] = -1e-160;
                    grad[1] = 0;
                    return 1 - 1e-160 * x[0];
                }));
            var result = FormSolver.Solve(problem, new FormOptions { Gradient = GradientMethod.Analytic });
            Assert.False(result.Converged);
            Assert.NotNull(result.Diagnostic);
        }
    }

    public class Warm_start
    {
        [Fact]
        [Reference("docs/references.md [derived]: g = X1·X2 − X3, β = 3.049073 (the same answer from any start)")]
        public void Gives_the_same_answer_with_fewer_evaluations()
        {
            var problem = FormTestModels.ProductOfNormals();
            var cold = FormSolver.Solve(problem);
            // A nearby start, as a time step passes to the next one: 5 % off the previous design point.
            var start = cold.DesignPointU.Select(v => 0.95 * v).ToArray();
            var warm = FormSolver.Solve(problem, new FormOptions { StartPoint = start, LimitStateScale = 1000 });
            Assert.True(warm.Converged, warm.Diagnostic);
            Assert.Equal(cold.Beta, warm.Beta, 1e-6);
            Assert.Equal(3.049073, warm.Beta, 5e-6);
            Assert.True(warm.LimitStateEvaluations < cold.LimitStateEvaluations,
                $"warm {warm.LimitStateEvaluations} vs cold {cold.LimitStateEvaluations} evaluations");
        }

        [Fact]
        [Reference("Closed form: Cornell (1969) β for R − S; a start at the design point meets both criteria at once")]
        public void At_the_design_point_converges_without_iterating()
        {
            var problem = new ReliabilityProblem(
                new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]),
                new LimitState("R-S", x => x[0] - x[1]));
            var cold = FormSolver.Solve(problem);
            var warm = FormSolver.Solve(problem, new FormOptions { StartPoint = cold.DesignPointU });
            Assert.True(warm.Converged, warm.Diagnostic);
            Assert.Equal(0, warm.Iterations);
            Assert.Equal(100 / Math.Sqrt(1300), warm.Beta, 1e-9);
        }

        [Fact]
        public void Start_point_of_the_wrong_length_is_rejected_naming_the_option()
        {
            var problem = FormTestModels.ProductOfNormals();
            var ex = Assert.Throws<ArgumentException>(() => FormSolver.Solve(problem, new FormOptions { StartPoint = [0.0, 1.0] }));
            Assert.Equal("StartPoint", ex.ParamName);
            Assert.Contains("3 random variables", ex.Message, StringComparison.Ordinal);
        }

        [Fact]
        public void Start_point_with_a_non_finite_entry_is_rejected()
        {
            var problem = FormTestModels.ProductOfNormals();
            var ex = Assert.Throws<ArgumentException>(() => FormSolver.Solve(problem, new FormOptions { StartPoint = [0.0, double.NaN, 0.0] }));
            Assert.Equal("StartPoint", ex.ParamName);
            Assert.Contains("StartPoint[1]", ex.Message, StringComparison.Ordinal);
        }
    }

    public class Gradients
    {
        [Theory]
        [Reference("docs/references.md [derived]: g = X1·X2 − X3, β = 3.049073")]
        [InlineData(GradientMethod.Automatic, true)]
        [InlineData(GradientMethod.Analytic, true)]
        [InlineData(GradientMethod.ForwardDifference, false)]
        [InlineData(GradientMethod.CentralDifference, false)]
        public void Every_route_reaches_the_same_design_point(GradientMethod method, bool analytic)
        {
            var result = FormSolver.Solve(FormTestModels.ProductOfNormals(analytic), new FormOptions { Gradient = method });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(3.049073, result.Beta, 5e-6);
            var expected = method == GradientMethod.Automatic ? GradientMethod.Analytic : method;
            Assert.Equal(expected, result.GradientMethod);
        }

        [Fact]
        public void Analytic_route_without_a_gradient_is_rejected()
        {
            var ex = Assert.Throws<ArgumentException>(() =>
                FormSolver.Solve(FormTestModels.ProductOfNormals(), new FormOptions { Gradient = GradientMethod.Analytic }));
            Assert.Equal("options", ex.ParamName);
        }

        [Theory]
        [InlineData(GradientMethod.Analytic, true)]
        [InlineData(GradientMethod.ForwardDifference, false)]
        [InlineData(GradientMethod.CentralDifference, false)]
        [InlineData(GradientMethod.ForwardDifference, true)]
        public void Reported_evaluations_equal_the_calls_of_the_limit_state(GradientMethod method, bool analytic)
        {
            var inner = FormTestModels.ProductOfNormals(analytic);
            var counting = new CountingLimitState(inner.LimitState);
            var problem = new ReliabilityProblem(inner.Transformation, counting);
            var result = FormSolver.Solve(problem, new FormOptions { Gradient = method });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(counting.Calls, result.LimitStateEvaluations);
        }

        [Fact]
        public void Warm_start_counts_the_extra_evaluation_at_the_origin()
        {
            var inner = FormTestModels.ProductOfNormals();
            var counting = new CountingLimitState(inner.LimitState);
            var problem = new ReliabilityProblem(inner.Transformation, counting);
            var result = FormSolver.Solve(problem, new FormOptions { StartPoint = [-1.0, -0.5, 1.0] });
            Assert.Equal(counting.Calls, result.LimitStateEvaluations);
        }

        [Fact]
        [Reference("Closed form: Cornell (1969), β = 100/√1300, s* = 100 + 30·(30/√1300)·β = 169.2308")]
        public void Forward_step_outside_the_domain_is_retried_backwards()
        {
            // g = R − S, but undefined (NaN) a hair above the design value of S: the forward difference in S at the
            // design point (step 1e-6·169 ≈ 1.7e-4) leaves the domain, so only the backward retry gives a gradient.
            var sStar = 100 + 30 * (30 / Math.Sqrt(1300)) * (100 / Math.Sqrt(1300));
            var cut = sStar + 1e-5;
            var problem = new ReliabilityProblem(
                new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]),
                new LimitState("R-S", x => x[1] > cut ? double.NaN : x[0] - x[1]));
            var result = FormSolver.Solve(problem);
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(100 / Math.Sqrt(1300), result.Beta, 1e-7);
        }
    }

    public class Non_convergence
    {
        [Fact]
        [Reference("Closed form: g = 1 + x1² + x2² ≥ 1 never reaches zero")]
        public void Limit_state_that_never_crosses_zero_is_reported_not_converged()
        {
            var result = FormSolver.Solve(TwoNormals(x => 1 + x[0] * x[0] + x[1] * x[1]));
            Assert.False(result.Converged);
            Assert.NotNull(result.Diagnostic);
            Assert.Contains("never reach zero", result.Diagnostic, StringComparison.Ordinal);
        }

        [Fact]
        [Reference("Closed form: g = 11 − A of normals A, B (mean 1, sd 1) is zero at u₁ = 10 for any u₂, so a search stopped at (10, 3) stands on it, misaligned")]
        public void A_search_stopped_on_the_limit_state_far_out_is_not_said_to_never_reach_zero()
        {
            var result = FormSolver.Solve(
                TwoNormals(x => 11 - x[0]),
                new FormOptions { StartPoint = [10.0, 3.0], MaxIterations = 0 });
            Assert.False(result.Converged);
            Assert.True(Math.Abs(result.LimitStateValue) < 1e-2, result.Diagnostic);
            Assert.DoesNotContain("never reach zero", result.Diagnostic, StringComparison.Ordinal);
            Assert.Contains("ended on the limit state", result.Diagnostic, StringComparison.Ordinal);
        }

        [Fact]
        [Reference("Closed form: g = exp(x) > 0 decays towards zero without crossing it")]
        public void Limit_state_that_only_decays_towards_zero_is_not_reported_converged()
        {
            // |G|/|G(0)| falls below 1e-6 after about 14 HL-RF steps, but the point is a unit distance from the
            // linearized surface at every step: the surface-distance guard must keep the run from claiming a design point.
            var result = FormSolver.Solve(TwoNormals(x => Math.Exp(x[0])));
            Assert.False(result.Converged);
            Assert.NotNull(result.Diagnostic);
        }

        [Fact]
        public void Non_finite_limit_state_at_the_start_is_reported()
        {
            var result = FormSolver.Solve(TwoNormals(_ => double.NaN));
            Assert.False(result.Converged);
            Assert.Contains("NaN", result.Diagnostic, StringComparison.Ordinal);
            Assert.Equal(1, result.LimitStateEvaluations);
        }

        [Fact]
        public void Exact_zero_gradient_is_reported()
        {
            // A step function of x: the finite differences see no slope at the start.
            var result = FormSolver.Solve(TwoNormals(x => x[0] < -3 ? -1 : 1));
            Assert.False(result.Converged);
            Assert.Contains("gradient vanished", result.Diagnostic, StringComparison.Ordinal);
        }

        [Fact]
        [Reference("docs/references.md [derived]: g = X1·X2 − X3 needs several iHL-RF steps")]
        public void Iteration_cap_is_reported_with_the_residuals()
        {
            var result = FormSolver.Solve(FormTestModels.ProductOfNormals(), new FormOptions { MaxIterations = 1 });
            Assert.False(result.Converged);
            Assert.Equal(1, result.Iterations);
            Assert.Contains("No convergence within 1 iterations", result.Diagnostic, StringComparison.Ordinal);
            Assert.False(FormSolver.TrySolve(FormTestModels.ProductOfNormals(), new FormOptions { MaxIterations = 1 }, out var again));
            Assert.False(again.Converged);
        }

        [Fact]
        [Reference("Closed form: g = √(x1 + 6) − 0.5 with x1 ~ N(1, 1) fails for x1 ≤ −5.75, so β = 6.75")]
        public void Non_finite_region_is_avoided_by_the_line_search()
        {
            // NaN for x1 < −6; the full HL-RF step from the origin lands at x1 ≈ −10.3, so the line search must back off.
            var nanCalls = 0;
            var result = FormSolver.Solve(TwoNormals(x =>
            {
                var g = Math.Sqrt(x[0] + 6) - 0.5;
                if (double.IsNaN(g)) Interlocked.Increment(ref nanCalls);
                return g;
            }));
            Assert.True(nanCalls > 0, "the scenario must visit the undefined region");
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(6.75, result.Beta, 1e-6);
        }
    }

    public class Transformation_routes
    {
        [Fact]
        [Reference("Identity: the solver's Nataf Jacobian from the known x equals the transformation's own Jacobian")]
        public void Nataf_fast_Jacobian_gives_the_same_run_as_the_interface_Jacobian()
        {
            RandomVariable[] variables =
            [
                LognormalVariable.FromMeanCov("R", 300, 0.1),
                GumbelVariable.FromMeanCov("S1", 80, 0.3),
                WeibullVariable.FromMeanCov("S2", 60, 0.25),
            ];
            var corr = new CorrelationMatrix(new double[,] { { 1, 0.2, 0 }, { 0.2, 1, 0.5 }, { 0, 0.5, 1 } });
            var nataf = new NatafTransformation(new StochasticModel(variables, corr));
            var g = new LimitState("g", x => x[0] - x[1] - x[2] - 0.002 * x[1] * x[2]);
            var fast = FormSolver.Solve(new ReliabilityProblem(nataf, g));
            var general = FormSolver.Solve(new ReliabilityProblem(new OpaqueTransformation(nataf), g));
            Assert.True(fast.Converged, fast.Diagnostic);
            Assert.Equal(general.Iterations, fast.Iterations);
            Assert.Equal(general.LimitStateEvaluations, fast.LimitStateEvaluations);
            Assert.Equal(general.Beta, fast.Beta, 1e-12);
            for (var i = 0; i < 3; i++) Assert.Equal(general.Alpha[i], fast.Alpha[i], 1e-12);
        }
    }

    public class Scale_invariance
    {
        [Theory]
        [Reference("docs/references.md [derived]: g = X1·X2 − X3, β = 3.049073; k·g has the same failure domain")]
        [InlineData(1e-6)]
        [InlineData(1e6)]
        public void Rescaling_the_limit_state_changes_neither_beta_nor_the_path(double k)
        {
            var baseProblem = FormTestModels.ProductOfNormals();
            var scaled = new ReliabilityProblem(baseProblem.Transformation, new LimitState("k·g", x => k * (x[0] * x[1] - x[2])));
            var a = FormSolver.Solve(baseProblem);
            var b = FormSolver.Solve(scaled);
            Assert.True(b.Converged, b.Diagnostic);
            Assert.Equal(a.Beta, b.Beta, 1e-7);
            Assert.Equal(a.Iterations, b.Iterations);
        }
    }

    public class Options
    {
        public static TheoryData<FormOptions, string> BadOptions => new()
        {
            { new FormOptions { MaxIterations = -1 }, "MaxIterations" },
            { new FormOptions { LimitStateTolerance = 0 }, "LimitStateTolerance" },
            { new FormOptions { LimitStateTolerance = double.NaN }, "LimitStateTolerance" },
            { new FormOptions { AlignmentTolerance = -1e-3 }, "AlignmentTolerance" },
            { new FormOptions { RelativeStep = 0 }, "RelativeStep" },
            { new FormOptions { RelativeStep = 0.5 }, "RelativeStep" },
            { new FormOptions { LimitStateScale = 0 }, "LimitStateScale" },
            { new FormOptions { LimitStateScale = double.PositiveInfinity }, "LimitStateScale" },
            { new FormOptions { Gradient = (GradientMethod)42 }, "Gradient" },
        };

        [Theory]
        [MemberData(nameof(BadOptions))]
        public void Each_bad_setting_is_rejected_naming_it(FormOptions options, string name)
        {
            var ex = Assert.Throws<ArgumentOutOfRangeException>(() => FormSolver.Solve(FormTestModels.ProductOfNormals(), options));
            Assert.Equal(name, ex.ParamName);
        }

        [Fact]
        public void Problem_without_random_variables_is_rejected()
        {
            var model = new StochasticModel([new DeterministicVariable("a", 2.0)]);
            var ex = Assert.Throws<ArgumentException>(() => FormSolver.Solve(new ReliabilityProblem(model, new LimitState("g", x => x[0]))));
            Assert.Equal("problem", ex.ParamName);
        }

        [Fact]
        [Reference("Cornell (1969) with a deterministic offset: β = (μR − μS − d)/√(σR² + σS²)")]
        public void Deterministic_inputs_take_part_in_x_but_not_in_u()
        {
            var model = new StochasticModel([new NormalVariable("R", 200, 20), new DeterministicVariable("d", 10), new NormalVariable("S", 100, 30)]);
            var result = FormSolver.Solve(new ReliabilityProblem(model, new LimitState("R-d-S", x => x[0] - x[1] - x[2])));
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(90 / Math.Sqrt(1300), result.Beta, 1e-9);
            Assert.Equal(2, result.DesignPointU.Count);
            Assert.Equal(3, result.DesignPointX.Count);
            Assert.Equal(10, result.DesignPointX[1]);
            Assert.Equal(["R", "S"], result.VariableNames);
        }

        [Fact]
        [Reference("Closed form: Cornell (1969)")]
        public void Zero_iterations_reports_the_linearization_at_the_start_point()
        {
            var problem = new ReliabilityProblem(
                new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]),
                new LimitState("R-S", x => x[0] - x[1]));
            var result = FormSolver.Solve(problem, new FormOptions { MaxIterations = 0 });
            Assert.False(result.Converged);
            Assert.Equal(0, result.Iterations);
            // α is exact for a linear margin from any point.
            Assert.Equal(-20 / Math.Sqrt(1300), result.Alpha[0], 1e-9);
        }
    }
}
