using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Probability;

public class NatafTransformationTests
{
    private const int Models = 24;

    // Both property tests use the same seeded models; build each transformation once (they are immutable).
    private static readonly System.Collections.Concurrent.ConcurrentDictionary<(int, bool), NatafTransformation> Built = new();

    private static NatafTransformation Build(int seed, bool correlated) => Built.GetOrAdd((seed, correlated), key =>
    {
        var rng = new Random(key.Item1);
        return new NatafTransformation(RandomModels.Model(rng, 2 + rng.Next(4), key.Item2));
    });

    public static TheoryData<int, bool> Seeds()
    {
        var data = new TheoryData<int, bool>();
        for (var s = 0; s < Models; s++) data.Add(1000 + s, s % 3 != 0);
        return data;
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    [Reference("Identity T(T⁻¹(u)) = u of a one-to-one transformation (definition); seeded random models over all families")]
    public void Standard_to_physical_and_back_returns_the_same_point(int seed, bool correlated)
    {
        var t = Build(seed, correlated);
        var rng = new Random(seed + 500);
        var u = new double[t.StandardDimension];
        var x = new double[t.PhysicalDimension];
        var back = new double[t.StandardDimension];
        for (var trial = 0; trial < 20; trial++)
        {
            for (var k = 0; k < u.Length; k++) u[k] = 3 * (2 * rng.NextDouble() - 1);
            t.ToPhysical(u, x);
            t.ToStandard(x, back);
            for (var k = 0; k < u.Length; k++) Assert.Equal(u[k], back[k], 1e-8);
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    [Reference("Independent computation in the test: ∂x/∂u by central finite differences of ToPhysical (step 1e-5, truncation O(h²))")]
    public void Jacobian_matches_central_finite_differences(int seed, bool correlated)
    {
        var t = Build(seed, correlated);
        var rng = new Random(seed + 900);
        int n = t.StandardDimension, m = t.PhysicalDimension;
        var u = new double[n];
        var jac = new double[m * n];
        var xp = new double[m];
        var xm = new double[m];
        for (var trial = 0; trial < 5; trial++)
        {
            for (var k = 0; k < n; k++) u[k] = 2.5 * (2 * rng.NextDouble() - 1);
            t.JacobianPhysicalByStandard(u, jac);
            const double h = 1e-5;
            for (var j = 0; j < n; j++)
            {
                var up = (double[])u.Clone();
                var um = (double[])u.Clone();
                up[j] += h;
                um[j] -= h;
                t.ToPhysical(up, xp);
                t.ToPhysical(um, xm);
                for (var i = 0; i < m; i++)
                {
                    var fd = (xp[i] - xm[i]) / (2 * h);
                    var scale = t.Model.Variables[i].StandardDeviation + Math.Abs(fd);
                    Assert.True(Math.Abs(fd - jac[i * n + j]) <= 1e-6 * scale + 1e-12,
                        $"seed {seed}: J[{i},{j}] = {jac[i * n + j]:R}, finite difference {fd:R}");
                }
            }
        }
    }

    [Fact]
    [Reference("Correlated normals: x = μ + diag(σ) L u with R = L Lᵀ, so J = diag(σ) L (closed form)")]
    public void Jacobian_of_correlated_normals_is_the_scaled_Cholesky_factor()
    {
        var r = new double[,] { { 1, 0.6, -0.2 }, { 0.6, 1, 0.3 }, { -0.2, 0.3, 1 } };
        var sd = new[] { 2.0, 0.5, 10.0 };
        var model = new StochasticModel(
            [new NormalVariable("A", 1, sd[0]), new NormalVariable("B", -3, sd[1]), new NormalVariable("C", 100, sd[2])],
            new CorrelationMatrix(r));
        var t = new NatafTransformation(model);

        // Cholesky written out for the 3×3 case.
        var l = new double[3, 3];
        l[0, 0] = 1;
        l[1, 0] = r[1, 0];
        l[1, 1] = Math.Sqrt(1 - l[1, 0] * l[1, 0]);
        l[2, 0] = r[2, 0];
        l[2, 1] = (r[2, 1] - l[2, 0] * l[1, 0]) / l[1, 1];
        l[2, 2] = Math.Sqrt(1 - l[2, 0] * l[2, 0] - l[2, 1] * l[2, 1]);

        var jac = new double[9];
        t.JacobianPhysicalByStandard([0.3, -1.2, 2.0], jac);
        for (var i = 0; i < 3; i++)
            for (var j = 0; j < 3; j++) Assert.Equal(sd[i] * l[i, j], jac[i * 3 + j], 1e-12);

        var x = new double[3];
        t.ToPhysical([0.3, -1.2, 2.0], x);
        Assert.Equal(-3 + 0.5 * (l[1, 0] * 0.3 + l[1, 1] * -1.2), x[1], 1e-12);
    }

    [Fact]
    [Reference("Independent inputs: u = Φ⁻¹(F(x)) componentwise (definition of the transformation)")]
    public void Independent_inputs_map_componentwise()
    {
        var g = GumbelVariable.FromMeanCov("G", 150, 0.3);
        var w = WeibullVariable.FromParameters("W", 2, 3);
        var t = new NatafTransformation(new StochasticModel([g, w]));
        var x = new double[2];
        t.ToPhysical([1.5, -2.0], x);
        Assert.Equal(g.InverseCcdf(StandardNormal.Ccdf(1.5)), x[0], 1e-12);
        Assert.Equal(w.InverseCdf(StandardNormal.Cdf(-2.0)), x[1], 1e-12);
    }

    [Fact]
    [Reference("Deterministic variables have no u coordinate and ignore correlation (design rule of the stochastic model)")]
    public void Deterministic_variables_keep_their_value_and_ignore_their_correlation()
    {
        var r = new double[,] { { 1, 0.5, 0.3 }, { 0.5, 1, 0.4 }, { 0.3, 0.4, 1 } };
        var model = new StochasticModel(
            [LognormalVariable.FromMeanCov("A", 10, 0.2), new DeterministicVariable("D", 7.5), GumbelVariable.FromMeanCov("C", 5, 0.3)],
            new CorrelationMatrix(r));
        var t = new NatafTransformation(model);
        Assert.Equal(2, t.StandardDimension);
        Assert.Equal(3, t.PhysicalDimension);
        Assert.Equal(2, t.FictiveCorrelation!.Dimension);
        var x = new double[3];
        t.ToPhysical([0.4, -0.9], x);
        Assert.Equal(7.5, x[1]);
        var jac = new double[6];
        t.JacobianPhysicalByStandard([0.4, -0.9], jac);
        Assert.Equal(0, jac[2]);
        Assert.Equal(0, jac[3]);
        var u = new double[2];
        t.ToStandard(x, u);
        Assert.Equal(0.4, u[0], 1e-10);
        Assert.Equal(-0.9, u[1], 1e-10);
    }

    [Fact]
    [Reference("Lognormal–lognormal closed form (Liu & Der Kiureghian 1986): V = 2, ρ = −0.15 gives ρ₀ = ln 0.4/ln 5 ≈ −0.569 < −1/2, so three such pairs are not positive definite")]
    public void A_fictive_matrix_that_is_not_positive_definite_is_rejected()
    {
        var r = new double[,] { { 1, -0.15, -0.15 }, { -0.15, 1, -0.15 }, { -0.15, -0.15, 1 } };
        var model = new StochasticModel(
            [LognormalVariable.FromMeanCov("A", 1, 2), LognormalVariable.FromMeanCov("B", 1, 2), LognormalVariable.FromMeanCov("C", 1, 2)],
            new CorrelationMatrix(r));
        var ex = Assert.Throws<DistributionParameterException>(() => new NatafTransformation(model));
        Assert.Equal("fictive correlation", ex.VariableName);
        Assert.Equal("matrix", ex.ParamName);
    }

    [Fact]
    [Reference("Exponential–exponential correlation ≥ 1 − π²/6 ≈ −0.645 (Fréchet bound for these marginals; from memory)")]
    public void An_unattainable_correlation_is_rejected_naming_the_entry()
    {
        var r = new double[,] { { 1, -0.7 }, { -0.7, 1 } };
        var model = new StochasticModel([ExponentialVariable.FromMean("A", 1), ExponentialVariable.FromMean("B", 2)], new CorrelationMatrix(r));
        var ex = Assert.Throws<DistributionParameterException>(() => new NatafTransformation(model));
        Assert.Equal("[1,0]", ex.ParamName);
        Assert.Contains("'B'", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("Allocation-free contract of IProbabilityTransformation.ToPhysical (interface documentation)")]
    public void To_physical_allocates_nothing_for_correlated_non_normal_inputs()
    {
        var r = new double[,] { { 1, 0.4, 0.2, 0.1 }, { 0.4, 1, 0.3, 0 }, { 0.2, 0.3, 1, 0.2 }, { 0.1, 0, 0.2, 1 } };
        var model = new StochasticModel(
            [
                GammaVariable.FromMeanCov("G", 3, 0.4),
                BetaVariable.FromParameters("B", 2, 5, 1, 3),
                TruncatedNormalVariable.FromParameters("T", 1, 1, 0, 4),
                WeibullVariable.FromMeanCov("W", 5, 0.3),
            ],
            new CorrelationMatrix(r));
        var t = new NatafTransformation(model);
        var u = new double[] { 0.5, -1.5, 2.5, -3.5 };
        var x = new double[4];
        t.ToPhysical(u, x); // warm-up (JIT, static rules)
        var before = GC.GetAllocatedBytesForCurrentThread();
        for (var i = 0; i < 200; i++)
        {
            u[0] = -4 + 0.04 * i;
            t.ToPhysical(u, x);
        }

        Assert.Equal(0, GC.GetAllocatedBytesForCurrentThread() - before);
    }

    [Fact]
    [Reference("Thread-safety contract of IProbabilityTransformation (interface documentation): parallel and sequential results agree")]
    public void Parallel_use_of_one_transformation_gives_the_sequential_results()
    {
        var t = new NatafTransformation(RandomModels.Model(new Random(77), 5, correlated: true));
        var points = Enumerable.Range(0, 400).Select(i =>
        {
            var rng = new Random(i);
            return Enumerable.Range(0, t.StandardDimension).Select(_ => 4 * rng.NextDouble() - 2).ToArray();
        }).ToArray();
        double[] Map(double[] u)
        {
            var x = new double[t.PhysicalDimension];
            t.ToPhysical(u, x);
            return x;
        }

        var sequential = points.Select(Map).ToArray();
        var parallel = new double[points.Length][];
        Parallel.For(0, points.Length, i => parallel[i] = Map(points[i]));
        for (var i = 0; i < points.Length; i++) Assert.Equal(sequential[i], parallel[i]);
    }
}
