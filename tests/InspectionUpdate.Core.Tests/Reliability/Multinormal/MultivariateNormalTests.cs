using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Multinormal;
using MathNet.Numerics;

namespace InspectionUpdate.Tests.Reliability.Multinormal;

public class MultivariateNormalTests
{
    /// <summary>
    /// Independent computation: for a one-factor correlation ρᵢⱼ = λᵢλⱼ, Xᵢ = λᵢZ + √(1 − λᵢ²)εᵢ, so
    /// P(a ≤ X ≤ b) = ∫ φ(z) ∏ [Φ((bᵢ − λᵢz)/sᵢ) − Φ((aᵢ − λᵢz)/sᵢ)] dz (Dunnett &amp; Sobel 1955 for equal λ;
    /// the representation Steck uses, from memory), integrated with MathNet's double-exponential rule.
    /// </summary>
    internal static double OneFactorProbability(double[] loadings, double[] lower, double[] upper)
    {
        double F(double z)
        {
            var p = StandardNormal.Pdf(z);
            for (var i = 0; i < loadings.Length; i++)
            {
                var s = Math.Sqrt(1 - loadings[i] * loadings[i]);
                var hi = upper[i] == double.PositiveInfinity ? 1 : StandardNormal.Cdf((upper[i] - loadings[i] * z) / s);
                var lo = lower[i] == double.NegativeInfinity ? 0 : StandardNormal.Cdf((lower[i] - loadings[i] * z) / s);
                p *= hi - lo;
            }

            return p;
        }

        return Integrate.DoubleExponential(F, -12, 12, 1e-16);
    }

    /// <summary>
    /// The one-factor integral of <see cref="OneFactorProbability"/> (lower bounds −∞) by 20-point Gauss–Legendre on
    /// 4800 panels of width 0.005 over [−12, 12]: loadings near ±1 make the integrand steep (width √(1 − λ²)), which an
    /// adaptive rule started on the whole line can step over.
    /// </summary>
    internal static double OneFactorProbabilityPanels(double[] loadings, double[] upper)
    {
        var rule = new MathNet.Numerics.Integration.GaussLegendreRule(-1, 1, 20);
        const int panels = 4800;
        const double width = 24.0 / panels;
        var sum = 0.0;
        for (var k = 0; k < panels; k++)
        {
            var mid = -12 + (k + 0.5) * width;
            for (var j = 0; j < 20; j++)
            {
                var z = mid + 0.5 * width * rule.Abscissas[j];
                var p = StandardNormal.Pdf(z);
                for (var i = 0; i < loadings.Length; i++)
                {
                    p *= StandardNormal.Cdf((upper[i] - loadings[i] * z) / Math.Sqrt(1 - loadings[i] * loadings[i]));
                }

                sum += 0.5 * width * rule.Weights[j] * p;
            }
        }

        return sum;
    }

    internal static double[,] OneFactorCorrelation(double[] loadings)
    {
        var n = loadings.Length;
        var r = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) r[i, j] = i == j ? 1 : loadings[i] * loadings[j];
        return r;
    }

    private static double[] Filled(int n, double value)
    {
        var v = new double[n];
        Array.Fill(v, value);
        return v;
    }

    public class Exact_shortcuts
    {
        [Theory]
        [Reference("Trivariate orthant closed form (Sheppard 1899 extended): 1/8 + (asin ρ12 + asin ρ13 + asin ρ23)/(4π)")]
        [InlineData(0.5, 0.5, 0.5)]
        [InlineData(0.9, 0.8, 0.75)]
        [InlineData(-0.3, 0.4, 0.2)]
        [InlineData(0.95, -0.9, -0.9)]
        [InlineData(0.0, 0.0, 0.7)]
        public void Trivariate_orthant_matches_closed_form(double r12, double r13, double r23)
        {
            double[,] r = { { 1, r12, r13 }, { r12, 1, r23 }, { r13, r23, 1 } };
            var result = MultivariateNormal.Orthant(r);
            var expected = 0.125 + (Math.Asin(r12) + Math.Asin(r13) + Math.Asin(r23)) / (4 * Math.PI);
            Assert.Equal(expected, result.Value, 1e-13);
            Assert.StartsWith("trivariate", result.Method, StringComparison.Ordinal);
            Assert.True(result.Converged);
        }

        [Theory]
        [Reference("Independent computation in the test: one-factor 1-D integral with MathNet double-exponential quadrature")]
        [InlineData(0.9, 0.7, -0.5, -3.0, -2.5, -1.0)]
        [InlineData(0.3, 0.6, 0.8, 1.0, -4.0, 0.5)]
        [InlineData(0.99, 0.99, 0.99, -4.0, -4.0, -4.0)]
        public void Trivariate_matches_an_independent_one_factor_integral(double l1, double l2, double l3, double b1, double b2, double b3)
        {
            double[] l = [l1, l2, l3];
            double[] b = [b1, b2, b3];
            var expected = OneFactorProbability(l, Filled(3, double.NegativeInfinity), b);
            var result = MultivariateNormal.Cdf(b, OneFactorCorrelation(l));
            Assert.Equal(expected, result.Value, Math.Max(1e-14, 1e-11 * expected));
        }

        // The first row is a matrix met in updating a crack with two no-indication findings (the failure event is
        // almost the complement of one finding): before the bounded quadrature this single call ran for minutes.
        [Theory]
        [Reference("Independent computation in the test: one-factor 1-D integral with MathNet double-exponential quadrature")]
        [InlineData(0.99940, -0.79580, -0.99300, -2.4734, 1.8170, 2.1378)]
        [InlineData(0.9999, -0.8, -0.9999, -1.0, 0.5, 1.2)]
        [InlineData(0.999, 0.999, -0.5, -3.5, -3.4, 0.3)]
        public void Nearly_singular_trivariate_matrices_stay_accurate(double l1, double l2, double l3, double b1, double b2, double b3)
        {
            double[] l = [l1, l2, l3];
            double[] b = [b1, b2, b3];
            var expected = OneFactorProbabilityPanels(l, b);
            var result = MultivariateNormal.Cdf(b, OneFactorCorrelation(l), new MultinormalOptions { RelativeTolerance = 1e-4, AbsoluteTolerance = 1e-15 });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(expected, result.Value, Math.Max(1e-13, 3e-4 * expected));
        }

        [Fact]
        [Reference("Closed forms: n = 1 is Φ(b); an unconstrained variable (+∞) drops out; a bound at −∞ gives 0")]
        public void Low_dimensions_and_infinite_bounds_reduce_exactly()
        {
            double[,] r = { { 1, 0.3, 0.2 }, { 0.3, 1, 0.1 }, { 0.2, 0.1, 1 } };
            var one = MultivariateNormal.Cdf([-1.5, double.PositiveInfinity, double.PositiveInfinity], r);
            Assert.Equal(StandardNormal.Cdf(-1.5), one.Value, 1e-16);
            var two = MultivariateNormal.Cdf([-1.5, 0.4, double.PositiveInfinity], r);
            Assert.Equal(BivariateNormal.Cdf(-1.5, 0.4, 0.3), two.Value, 1e-16);
            Assert.Equal(0, MultivariateNormal.Cdf([-1.5, double.NegativeInfinity, 2], r).Value);
            Assert.Equal(1, MultivariateNormal.Cdf(Filled(3, double.PositiveInfinity), r).Value);
        }
    }

    public class Quasi_Monte_Carlo
    {
        [Theory]
        [Trait("Category", "Statistical")]
        [Reference("Dunnett & Sobel (1955) / Steck one-dimensional representation of equicorrelated probabilities (from memory), computed in the test with MathNet")]
        [InlineData(5, 0.5, 0.0, 2e-5)]
        [InlineData(10, 0.5, 0.0, 5e-5)]
        [InlineData(10, 0.5, 0.0, 1e-5)]
        [InlineData(10, 0.5, -1.0, 1e-5)]
        [InlineData(20, 0.5, 0.0, 1e-4)]
        [InlineData(10, 0.9, -1.0, 2e-5)]
        [InlineData(20, 0.2, 1.0, 1e-4)]
        [InlineData(50, 0.5, 1.5, 2e-4)]
        public void Equicorrelated_probabilities_match_the_one_dimensional_integral(int n, double rho, double bound, double tolerance)
        {
            var loadings = Filled(n, Math.Sqrt(rho));
            var expected = OneFactorProbability(loadings, Filled(n, double.NegativeInfinity), Filled(n, bound));
            var options = new MultinormalOptions { AbsoluteTolerance = tolerance, RelativeTolerance = 0 };
            var result = MultivariateNormal.Cdf(Filled(n, bound), OneFactorCorrelation(loadings), options);
            Assert.True(result.Converged, result.Diagnostic);
            Assert.True(result.ErrorEstimate <= tolerance);
            // Four standard errors of the shift-to-shift spread.
            Assert.InRange(result.Value, expected - 4 * result.StandardError - 1e-12, expected + 4 * result.StandardError + 1e-12);
        }

        [Theory]
        [Trait("Category", "Statistical")]
        [Reference("Independent computation in the test: one-factor 1-D integral with MathNet double-exponential quadrature")]
        [InlineData(0.0)]
        [InlineData(-2.5)]
        public void Mixed_sign_correlations_and_rectangles_match_a_one_factor_integral(double shift)
        {
            double[] l = [0.8, -0.6, 0.5, 0.9, -0.3, 0.7];
            double[] a = [double.NegativeInfinity, -1.0 + shift, double.NegativeInfinity, -3.0 + shift, double.NegativeInfinity, -0.5 + shift];
            double[] b = [0.5 + shift, 2.0, 1.0 + shift, 1.5, 0.2 + shift, double.PositiveInfinity];
            var expected = OneFactorProbability(l, a, b);
            var options = new MultinormalOptions { AbsoluteTolerance = 1e-9, RelativeTolerance = 1e-4 };
            var result = MultivariateNormal.Probability(a, b, OneFactorCorrelation(l), options);
            Assert.True(result.Converged, result.Diagnostic);
            Assert.InRange(result.Value, expected - 4 * result.StandardError - 1e-14, expected + 4 * result.StandardError + 1e-14);
        }

        [Theory]
        [Reference("Independent computation in the test: one-factor 1-D integral with MathNet double-exponential quadrature; both vector widths")]
        [InlineData(0.0)]
        [InlineData(-2.5)]
        public void Four_and_eight_lane_integrands_give_the_same_numbers(double shift)
        {
            // Eight lanes are taken where the processor has 512-bit registers, four otherwise: the same generic code per
            // lane and the same summation order, so the widths may differ only in rounding. Without the hardware the
            // wide form runs in software, slowly but with the same results.
            double[] l = [0.8, -0.6, 0.5, 0.9, -0.3, 0.7, 0.6, -0.8];
            double[] a = [double.NegativeInfinity, -1.0 + shift, double.NegativeInfinity, -3.0 + shift, double.NegativeInfinity, -0.5 + shift, -4.0, double.NegativeInfinity];
            double[] b = [0.5 + shift, 2.0, 1.0 + shift, 1.5, 0.2 + shift, double.PositiveInfinity, 4.0 + shift, 1.0];
            var correlation = OneFactorCorrelation(l);
            var options = new MultinormalOptions { AbsoluteTolerance = 1e-9, RelativeTolerance = 1e-4 };
            var four = SeparationOfVariables.Integrate<System.Runtime.Intrinsics.Vector256<double>, Lanes256>(a, b, correlation, options);
            var eight = SeparationOfVariables.Integrate<System.Runtime.Intrinsics.Vector512<double>, Lanes512>(a, b, correlation, options);
            Assert.Equal(four.Evaluations, eight.Evaluations);
            Assert.Equal(four.Value, eight.Value, 1e-15 * four.Value);
            Assert.Equal(four.StandardError, eight.StandardError, 1e-9 * four.StandardError);
            var expected = OneFactorProbability(l, a, b);
            Assert.InRange(eight.Value, expected - 4 * eight.StandardError - 1e-14, expected + 4 * eight.StandardError + 1e-14);
        }

        [Fact]
        [Trait("Category", "Statistical")]
        [Reference("Independent computation in the test: one-factor 1-D integral; relative accuracy in the far tail")]
        public void Small_intersection_probabilities_keep_relative_accuracy()
        {
            // Ten events with β between 3 and 4.5, the size of the ones an inspection update intersects.
            double[] l = [0.9, 0.85, 0.8, 0.75, 0.7, 0.9, 0.6, 0.95, 0.5, 0.8];
            double[] b = [-3, -3.5, -4, -4.5, -3.2, -3.7, -3.1, -4.2, -3.3, -3.9];
            var expected = OneFactorProbability(l, Filled(10, double.NegativeInfinity), b);
            var result = MultivariateNormal.Cdf(b, OneFactorCorrelation(l), new MultinormalOptions { RelativeTolerance = 3e-3, AbsoluteTolerance = 1e-15 });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.InRange(expected, 1e-9, 1e-5);
            Assert.InRange(result.Value, expected - 4 * result.StandardError, expected + 4 * result.StandardError);
            Assert.True(result.StandardError < 1e-3 * expected);
            Assert.Equal(10, result.Rank);
        }

        [Fact]
        [Trait("Category", "Statistical")]
        [Reference("Dunnett & Sobel (1955) one-dimensional representation, computed in the test with MathNet; t distribution with 9 degrees of freedom: P(|t| > 3) ≈ 1.5 %")]
        public void The_error_estimate_covers_the_actual_error_over_seeds()
        {
            // n = 10, ρ = 0.5, b = −1 to 1e-5: if the reported standard error were too small, the actual errors would
            // exceed three of them far more often than the t distribution allows (expected 0.3 of 20; 4 or more has
            // probability below 1e-4 for an honest estimate).
            var loadings = Filled(10, Math.Sqrt(0.5));
            var expected = OneFactorProbability(loadings, Filled(10, double.NegativeInfinity), Filled(10, -1.0));
            var r = OneFactorCorrelation(loadings);
            var outside = 0;
            for (var seed = 1; seed <= 20; seed++)
            {
                var result = MultivariateNormal.Cdf(Filled(10, -1.0), r, new MultinormalOptions { AbsoluteTolerance = 1e-5, RelativeTolerance = 0, Seed = seed });
                Assert.True(result.Converged, result.Diagnostic);
                if (Math.Abs(result.Value - expected) > 3 * result.StandardError) outside++;
            }

            Assert.True(outside <= 3, $"{outside} of 20 errors exceed three standard errors");
        }

        [Fact]
        [Trait("Category", "Statistical")]
        [Reference("Independent computation in the test: one-factor 1-D integral with MathNet double-exponential quadrature")]
        public void Beyond_one_pass_through_the_lattice_the_estimate_stays_consistent()
        {
            // A tolerance no rule can meet, so the run uses its whole budget: 2^17 points per shift, i.e. a second
            // pass through the 2^16-point lattice with fresh shifts.
            double[] l = [0.7, -0.4, 0.6, 0.5, 0.8];
            double[] b = [0.3, -0.2, 1.1, -0.6, 0.4];
            var expected = OneFactorProbability(l, Filled(5, double.NegativeInfinity), b);
            var options = new MultinormalOptions { AbsoluteTolerance = 1e-16, RelativeTolerance = 0, MaxEvaluations = 10L << 17 };
            var result = MultivariateNormal.Cdf(b, OneFactorCorrelation(l), options);
            Assert.False(result.Converged);
            Assert.Equal(10L << 17, result.Evaluations);
            Assert.InRange(result.Value, expected - 4 * result.StandardError - 1e-13, expected + 4 * result.StandardError + 1e-13);
            Assert.True(result.StandardError < 1e-7, $"{result.StandardError:G3}");
        }

        [Fact]
        [Reference("Determinism by construction: each shift's sum runs over the points in a fixed order whatever thread computes it")]
        public void Concurrent_calls_give_the_same_value_as_a_lone_call()
        {
            var r = OneFactorCorrelation(Filled(10, 0.7));
            var options = new MultinormalOptions { AbsoluteTolerance = 1e-5, RelativeTolerance = 0, Seed = 3 };
            var alone = MultivariateNormal.Cdf(Filled(10, -0.5), r, options);
            var together = new MultinormalResult[6];
            Parallel.For(0, together.Length, i => together[i] = MultivariateNormal.Cdf(Filled(10, -0.5), r, options));
            foreach (var result in together)
            {
                Assert.Equal(alone.Value, result.Value);
                Assert.Equal(alone.Evaluations, result.Evaluations);
            }
        }

        [Fact]
        public void Same_seed_gives_the_same_value()
        {
            var r = OneFactorCorrelation(Filled(8, 0.6));
            var first = MultivariateNormal.Cdf(Filled(8, -1), r, new MultinormalOptions { Seed = 7, AbsoluteTolerance = 1e-4 });
            var second = MultivariateNormal.Cdf(Filled(8, -1), r, new MultinormalOptions { Seed = 7, AbsoluteTolerance = 1e-4 });
            Assert.Equal(first.Value, second.Value);
            Assert.Equal(first.Evaluations, second.Evaluations);
        }

        [Fact]
        public void A_budget_too_small_for_the_tolerance_is_flagged_as_not_converged()
        {
            var r = OneFactorCorrelation([0.9, -0.2, 0.5, 0.7, 0.1, 0.6, 0.3]);
            var options = new MultinormalOptions { AbsoluteTolerance = 1e-13, RelativeTolerance = 0, MaxEvaluations = 2000 };
            var result = MultivariateNormal.Cdf(Filled(7, 0.3), r, options);
            Assert.False(result.Converged);
            Assert.NotNull(result.Diagnostic);
            Assert.True(result.Evaluations <= 2000);
        }
    }

    public class Singular_correlation
    {
        [Fact]
        [Reference("Closed form: X1 = X0 a.s., so {X0 ≤ b0, X1 ≤ b1} = {X0 ≤ min(b0, b1)}; the remaining 3-variate value by the exact trivariate route")]
        public void Identical_rows_fold_into_the_tighter_bound()
        {
            double[,] r =
            {
                { 1, 1, 0.4, 0.3 },
                { 1, 1, 0.4, 0.3 },
                { 0.4, 0.4, 1, 0.5 },
                { 0.3, 0.3, 0.5, 1 },
            };
            double[,] reduced = { { 1, 0.4, 0.3 }, { 0.4, 1, 0.5 }, { 0.3, 0.5, 1 } };
            var expected = MultivariateNormal.Cdf([-1.2, 0.3, -0.4], reduced).Value;
            var result = MultivariateNormal.Cdf([-0.8, -1.2, 0.3, -0.4], r, new MultinormalOptions { AbsoluteTolerance = 1e-5, RelativeTolerance = 0 });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(3, result.Rank);
            Assert.NotNull(result.Diagnostic);
            Assert.InRange(result.Value, expected - 4 * result.StandardError - 1e-12, expected + 4 * result.StandardError + 1e-12);
        }

        [Fact]
        [Reference("Closed form: X1 = −X0 a.s. turns X1 ≤ b1 into X0 ≥ −b1; the rectangle probability by the one-factor integral")]
        public void Opposite_rows_become_a_lower_bound()
        {
            // One-factor model (λ = 0.6, −0.6, 0.5) plus a fourth variable equal to −X0.
            double[] l = [0.6, -0.6, 0.5];
            var r3 = OneFactorCorrelation(l);
            var r = new double[4, 4];
            for (var i = 0; i < 3; i++)
                for (var j = 0; j < 3; j++) r[i, j] = r3[i, j];
            r[3, 3] = 1;
            for (var i = 0; i < 3; i++) r[3, i] = r[i, 3] = -r3[0, i];
            var expected = OneFactorProbability(l, [-0.7, double.NegativeInfinity, double.NegativeInfinity], [1.1, 0.2, -0.3]);
            var result = MultivariateNormal.Cdf([1.1, 0.2, -0.3, 0.7], r, new MultinormalOptions { AbsoluteTolerance = 1e-5, RelativeTolerance = 0 });
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(3, result.Rank);
            Assert.InRange(result.Value, expected - 4 * result.StandardError - 1e-12, expected + 4 * result.StandardError + 1e-12);
        }

        [Fact]
        [Reference("Closed form: all variables identical gives Φ(min b)")]
        public void Fully_dependent_variables_are_exact()
        {
            var r = OneFactorCorrelation(Filled(6, 1.0));
            double[] b = [0.5, -0.2, 1.0, -1.7, 3.0, 0.0];
            var result = MultivariateNormal.Cdf(b, r);
            Assert.Equal(1, result.Rank);
            Assert.Equal(StandardNormal.Cdf(-1.7), result.Value, 1e-15);
        }

        [Fact]
        [Reference("Closed form: rows that differ by 1e-9 lie within about 1e-6 of the identical-row limit")]
        public void Nearly_identical_rows_do_not_crash()
        {
            double[] l = [0.7, 0.7 + 1e-9, 0.3, 0.5];
            var r = OneFactorCorrelation(l);
            r[0, 1] = r[1, 0] = 1 - 1e-12;
            var result = MultivariateNormal.Cdf([-1.0, -1.0, 0.5, 0.2], r, new MultinormalOptions { AbsoluteTolerance = 1e-5, RelativeTolerance = 0 });
            var limit = OneFactorProbability([0.7, 0.3, 0.5], Filled(3, double.NegativeInfinity), [-1.0, 0.5, 0.2]);
            Assert.True(result.Converged, result.Diagnostic);
            Assert.Equal(limit, result.Value, 4 * result.StandardError + 2e-6);
        }
    }

    public class Validation
    {
        [Fact]
        public void Rejects_a_NaN_bound_naming_the_argument()
        {
            var e = Assert.Throws<ArgumentException>(() => MultivariateNormal.Cdf([0.0, double.NaN], new double[,] { { 1, 0 }, { 0, 1 } }));
            Assert.Equal("upper", e.ParamName);
        }

        [Fact]
        public void Rejects_an_asymmetric_matrix_naming_the_entry()
        {
            var e = Assert.Throws<ArgumentException>(() => MultivariateNormal.Cdf([0.0, 0.0], new double[,] { { 1, 0.5 }, { 0.4, 1 } }));
            Assert.Equal("correlation", e.ParamName);
            Assert.Contains("[1,0]", e.Message, StringComparison.Ordinal);
        }

        [Fact]
        public void Rejects_a_matrix_of_the_wrong_size()
        {
            var e = Assert.Throws<ArgumentException>(() => MultivariateNormal.Cdf([0.0, 0.0, 0.0], new double[,] { { 1, 0.5 }, { 0.5, 1 } }));
            Assert.Equal("correlation", e.ParamName);
        }

        [Fact]
        public void Rejects_a_matrix_that_is_not_positive_semi_definite()
        {
            double[,] r = { { 1, 0.9, -0.9, 0.1 }, { 0.9, 1, 0.9, 0.1 }, { -0.9, 0.9, 1, 0.1 }, { 0.1, 0.1, 0.1, 1 } };
            var e = Assert.Throws<ArgumentException>(() => MultivariateNormal.Cdf([0.0, 0.0, 0.0, 0.0], r));
            Assert.Equal("correlation", e.ParamName);
        }
    }
}
