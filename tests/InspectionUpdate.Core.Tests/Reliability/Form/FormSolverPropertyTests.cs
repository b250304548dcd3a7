using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Form;

/// <summary>Properties of FORM over many seeded random cases.</summary>
public class FormSolverPropertyTests
{
    private const int Cases = 40;

    /// <summary>A random correlation matrix: normalized B·Bᵀ + I with B entries uniform in (−1, 1).</summary>
    internal static CorrelationMatrix RandomCorrelation(Random rng, int n)
    {
        var b = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) b[i, j] = 2 * rng.NextDouble() - 1;
        var c = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++)
            {
                var s = i == j ? 1.0 : 0.0;
                for (var k = 0; k < n; k++) s += b[i, k] * b[j, k];
                c[i, j] = s;
            }

        var r = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) r[i, j] = i == j ? 1 : c[i, j] / Math.Sqrt(c[i, i] * c[j, j]);
        return new CorrelationMatrix(r);
    }

    // g = a₀ + aᵀx, X ~ N(μ, Σ): exact Pf = Φ(−(a₀ + aᵀμ)/√(aᵀΣa)).
    [Fact]
    [Reference("Closed form: linear margin of (correlated) normals, Pf = Φ(−E[g]/sd[g])")]
    public void Pf_equals_the_exact_value_for_every_random_linear_limit_state_in_normal_variables()
    {
        var rng = new Random(20261202);
        for (var c = 0; c < Cases; c++)
        {
            var n = rng.Next(1, 9);
            var mu = new double[n];
            var sd = new double[n];
            var a = new double[n];
            var variables = new RandomVariable[n];
            for (var i = 0; i < n; i++)
            {
                mu[i] = 100 * (rng.NextDouble() - 0.5);
                sd[i] = 0.1 + 10 * rng.NextDouble();
                a[i] = 4 * (rng.NextDouble() - 0.5);
                variables[i] = new NormalVariable($"X{i}", mu[i], sd[i]);
            }

            var correlated = n > 1 && c % 2 == 1;
            var corr = correlated ? RandomCorrelation(rng, n) : null;
            var variance = 0.0;
            var mean = 0.0;
            for (var i = 0; i < n; i++)
            {
                mean += a[i] * mu[i];
                for (var j = 0; j < n; j++) variance += a[i] * a[j] * sd[i] * sd[j] * (corr?[i, j] ?? (i == j ? 1 : 0));
            }

            // Choose a₀ so the exact β lies in [−2, 5].
            var betaExact = -2 + 7 * rng.NextDouble();
            var a0 = betaExact * Math.Sqrt(variance) - mean;
            var problem = new ReliabilityProblem(new StochasticModel(variables, corr), new LimitState("linear", x =>
            {
                var g = a0;
                for (var i = 0; i < x.Length; i++) g += a[i] * x[i];
                return g;
            }));

            var result = FormSolver.Solve(problem);
            var label = $"case {c} (n = {n}, correlated = {correlated}, β = {betaExact})";
            Assert.True(result.Converged, $"{label}: {result.Diagnostic}");
            var exactPf = Normal.CDF(0, 1, -betaExact);
            Assert.True(Math.Abs(result.FailureProbability - exactPf) <= 1e-6 * exactPf, $"{label}: Pf {result.FailureProbability:R} vs {exactPf:R}");
            Assert.True(Math.Abs(result.Alpha.Sum(v => v * v) - 1) <= 1e-12, $"{label}: ‖α‖² = {result.Alpha.Sum(v => v * v):R}");
            Assert.True(Math.Abs(result.ImportanceFactors.Sum() - 1) <= 1e-12, label);
        }
    }

    [Fact]
    [Reference("Definition: β is a distance in u; reordering the variables rotates u-space and leaves it unchanged (DESIGN.md §3)")]
    public void Beta_alpha_norm_and_importance_factors_do_not_depend_on_the_order_of_variables()
    {
        var rng = new Random(7);
        for (var c = 0; c < Cases; c++)
        {
            var n = rng.Next(3, 7);
            var variables = new RandomVariable[n];
            // Two lognormal capacities, the rest loads of random families.
            variables[0] = LognormalVariable.FromMeanCov("C0", 20 + 10 * rng.NextDouble(), 0.05 + 0.15 * rng.NextDouble());
            variables[1] = LognormalVariable.FromMeanCov("C1", 20 + 10 * rng.NextDouble(), 0.05 + 0.15 * rng.NextDouble());
            for (var i = 2; i < n; i++)
            {
                var mean = 50 + 50 * rng.NextDouble();
                var cov = 0.1 + 0.3 * rng.NextDouble();
                variables[i] = rng.Next(5) switch
                {
                    0 => new NormalVariable($"L{i}", mean, cov * mean),
                    1 => LognormalVariable.FromMeanCov($"L{i}", mean, cov),
                    2 => GumbelVariable.FromMeanCov($"L{i}", mean, cov),
                    3 => WeibullVariable.FromMeanCov($"L{i}", mean, cov),
                    _ => GammaVariable.FromMeanCov($"L{i}", mean, cov),
                };
            }

            // g = C0·C1 − k·Σ loads, k such that the mean margin is positive but modest.
            var meanLoad = variables.Skip(2).Sum(v => v.Mean);
            var k = variables[0].Mean * variables[1].Mean / meanLoad / (1.5 + rng.NextDouble());
            double G(ReadOnlySpan<double> x, int[] at)
            {
                var load = 0.0;
                for (var i = 2; i < n; i++) load += x[at[i]];
                return x[at[0]] * x[at[1]] - k * load;
            }

            var identity = Enumerable.Range(0, n).ToArray();
            var perm = identity.OrderBy(_ => rng.Next()).ToArray(); // perm[p] = original index at position p
            var at = new int[n]; // at[original] = position
            for (var p = 0; p < n; p++) at[perm[p]] = p;

            var original = FormSolver.Solve(new ReliabilityProblem(new StochasticModel(variables), new LimitState("g", x => G(x, identity))));
            var shuffled = FormSolver.Solve(new ReliabilityProblem(
                new StochasticModel(perm.Select(i => variables[i]).ToArray()), new LimitState("g", x => G(x, at))));

            var label = $"case {c} (n = {n})";
            Assert.True(original.Converged, $"{label}: {original.Diagnostic}");
            Assert.True(shuffled.Converged, $"{label}: {shuffled.Diagnostic}");
            Assert.True(Math.Abs(original.Beta - shuffled.Beta) <= 1e-6, $"{label}: β {original.Beta:R} vs {shuffled.Beta:R}");
            Assert.True(Math.Abs(original.Alpha.Sum(v => v * v) - 1) <= 1e-12, label);
            for (var i = 0; i < n; i++)
            {
                Assert.True(Math.Abs(original.ImportanceFactors[i] - shuffled.ImportanceFactors[at[i]]) <= 1e-5, $"{label}: importance of {variables[i].Name}");
                Assert.Equal(original.VariableNames[i], shuffled.VariableNames[at[i]]);
            }
        }
    }

    [Fact]
    [Reference("Definition: β is invariant to the order of variables; for correlated inputs γ reorders with them (Der Kiureghian 2005, from memory)")]
    public void Correlated_non_normal_beta_does_not_depend_on_the_order_of_variables()
    {
        var rng = new Random(13);
        for (var c = 0; c < 10; c++)
        {
            RandomVariable[] variables =
            [
                LognormalVariable.FromMeanCov("R", 300, 0.08 + 0.1 * rng.NextDouble()),
                GumbelVariable.FromMeanCov("S1", 80, 0.2 + 0.2 * rng.NextDouble()),
                LognormalVariable.FromMeanCov("S2", 60, 0.2 + 0.2 * rng.NextDouble()),
                WeibullVariable.FromMeanCov("M", 1.0, 0.1 + 0.1 * rng.NextDouble()),
            ];
            var r12 = 0.6 * rng.NextDouble();
            var r23 = 0.6 * rng.NextDouble();
            var corr = new double[,] { { 1, 0, 0, 0.3 }, { 0, 1, r12, 0 }, { 0, r12, 1, r23 }, { 0.3, 0, r23, 1 } };
            double G(ReadOnlySpan<double> x, int[] at) => x[at[0]] * x[at[3]] - x[at[1]] - x[at[2]];
            int[] identity = [0, 1, 2, 3];
            var perm = identity.OrderBy(_ => rng.Next()).ToArray();
            var at = new int[4];
            for (var p = 0; p < 4; p++) at[perm[p]] = p;
            var permuted = new double[4, 4];
            for (var p = 0; p < 4; p++)
                for (var q = 0; q < 4; q++) permuted[p, q] = corr[perm[p], perm[q]];

            var original = FormSolver.Solve(new ReliabilityProblem(
                new StochasticModel(variables, new CorrelationMatrix(corr)), new LimitState("g", x => G(x, identity))));
            var shuffled = FormSolver.Solve(new ReliabilityProblem(
                new StochasticModel(perm.Select(i => variables[i]).ToArray(), new CorrelationMatrix(permuted)),
                new LimitState("g", x => G(x, at))));
            var label = $"case {c}";
            Assert.True(original.Converged, $"{label}: {original.Diagnostic}");
            Assert.True(shuffled.Converged, $"{label}: {shuffled.Diagnostic}");
            Assert.True(Math.Abs(original.Beta - shuffled.Beta) <= 1e-6, $"{label}: β {original.Beta:R} vs {shuffled.Beta:R}");
            for (var i = 0; i < 4; i++)
            {
                Assert.True(Math.Abs(original.ImportanceFactors[i] - shuffled.ImportanceFactors[at[i]]) <= 1e-4, $"{label}: γ² of {variables[i].Name}");
            }
        }
    }

    [Fact]
    [Reference("Definition: β is invariant to the order of variables; for correlated inputs γ reorders with them (Der Kiureghian 2005, from memory)")]
    public void Correlated_beta_and_importance_vector_do_not_depend_on_the_order_of_variables()
    {
        var rng = new Random(11);
        for (var c = 0; c < Cases; c++)
        {
            var n = rng.Next(2, 7);
            var variables = Enumerable.Range(0, n)
                .Select(i => (RandomVariable)new NormalVariable($"X{i}", 10 + 5 * rng.NextDouble(), 1 + rng.NextDouble())).ToArray();
            var corr = RandomCorrelation(rng, n);
            var w = Enumerable.Range(0, n).Select(_ => 0.5 + rng.NextDouble()).ToArray();
            // Nonlinear: g = Σ wᵢxᵢ − 0.02·(Σ xᵢ)² − t, threshold t for a modest β.
            var t = 0.5 * variables.Select((v, i) => w[i] * v.Mean).Sum();
            double G(ReadOnlySpan<double> x, int[] at)
            {
                double lin = 0, sum = 0;
                for (var i = 0; i < n; i++)
                {
                    lin += w[i] * x[at[i]];
                    sum += x[at[i]];
                }

                return lin - 0.02 * sum * sum / n - t;
            }

            var identity = Enumerable.Range(0, n).ToArray();
            var perm = identity.OrderBy(_ => rng.Next()).ToArray();
            var at = new int[n];
            for (var p = 0; p < n; p++) at[perm[p]] = p;
            var permutedCorr = new double[n, n];
            for (var p = 0; p < n; p++)
                for (var q = 0; q < n; q++) permutedCorr[p, q] = corr[perm[p], perm[q]];

            var original = FormSolver.Solve(new ReliabilityProblem(new StochasticModel(variables, corr), new LimitState("g", x => G(x, identity))));
            var shuffled = FormSolver.Solve(new ReliabilityProblem(
                new StochasticModel(perm.Select(i => variables[i]).ToArray(), new CorrelationMatrix(permutedCorr)),
                new LimitState("g", x => G(x, at))));
            var label = $"case {c} (n = {n})";
            Assert.True(original.Converged, $"{label}: {original.Diagnostic}");
            Assert.True(shuffled.Converged, $"{label}: {shuffled.Diagnostic}");
            Assert.True(Math.Abs(original.Beta - shuffled.Beta) <= 1e-6, $"{label}: β {original.Beta:R} vs {shuffled.Beta:R}");
            for (var i = 0; i < n; i++)
            {
                Assert.True(Math.Abs(original.ImportanceVector![i] - shuffled.ImportanceVector![at[i]]) <= 1e-5, $"{label}: γ of X{i}");
                Assert.True(Math.Abs(original.DesignPointX[i] - shuffled.DesignPointX[at[i]]) <= 1e-5 * Math.Abs(original.DesignPointX[i]), $"{label}: x* of X{i}");
            }
        }
    }
}
