using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Multinormal;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Systems;

namespace InspectionUpdate.Tests.Reliability.Simulation;

public class SubsetSimulationTests
{
    /// <summary>G(u) = β − αᵀu with α = (1, …, 1)/√n: exact Pf = Φ(−β) (closed form for a linear limit state in u).</summary>
    private static Func<ReadOnlySpan<double>, double> Linear(double beta, int n)
    {
        var w = 1 / Math.Sqrt(n);
        return u =>
        {
            var s = 0.0;
            for (var i = 0; i < u.Length; i++) s += u[i];
            return beta - w * s;
        };
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: linear limit state in standard normal space, Pf = Φ(−β); within 3 estimated standard errors")]
    [InlineData(3.0, 1)]
    [InlineData(3.0, 2)]
    [InlineData(3.0, 3)]
    [InlineData(4.0, 1)]
    [InlineData(4.0, 2)]
    [InlineData(4.0, 3)]
    [InlineData(5.0, 1)]
    [InlineData(5.0, 2)]
    [InlineData(5.0, 3)]
    public void Linear_limit_state_estimate_lies_within_three_standard_errors_of_the_exact_value(double beta, int seed)
    {
        var result = SubsetSimulation.Run(Linear(beta, 10), 10, new SubsetSimulationOptions { SamplesPerLevel = 2000, Seed = seed });
        var sim = result.Simulation;
        var exact = StandardNormal.Cdf(-beta);
        Assert.True(sim.Converged, sim.Diagnostic);
        Assert.InRange(sim.FailureProbability, exact - 3 * sim.StandardError, exact + 3 * sim.StandardError);
        Assert.InRange(sim.CoefficientOfVariation, 0.05, 0.6);
        // One level per factor p0 = 0.1 of probability: ⌈−log10 Pf⌉ levels, give or take one.
        var expectedLevels = (int)Math.Ceiling(-Math.Log10(exact));
        Assert.InRange(result.Levels.Count, expectedLevels - 1, expectedLevels + 1);
        Assert.Equal(SubsetSimulation.MethodName, sim.Method);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: series system of two independent linear events, Pf = 1 − (1 − Φ(−3.5))²")]
    public void Series_system_of_independent_linear_events_matches_the_exact_union()
    {
        var model = new StochasticModel([new NormalVariable("A", 0, 1), new NormalVariable("B", 10, 2), new NormalVariable("C", 0, 1)]);
        var t = new NatafTransformation(model);
        var g1 = new LimitState("g1", x => 3.5 - x[0]);
        var g2 = new LimitState("g2", x => 3.5 - (x[1] - 10) / 2);
        var result = SubsetSimulation.RunSystem(t, [g1, g2], SystemKind.Series, new SubsetSimulationOptions { SamplesPerLevel = 2000, Seed = 11 });
        var q = StandardNormal.Cdf(-3.5);
        var exact = 1 - (1 - q) * (1 - q);
        var sim = result.Simulation;
        Assert.True(sim.Converged, sim.Diagnostic);
        Assert.InRange(sim.FailureProbability, exact - 3 * sim.StandardError, exact + 3 * sim.StandardError);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: parallel system of two linear events in u with ρ = αᵢᵀαⱼ = 0.5, Pf = Φ₂(−3, −3; 0.5)")]
    public void Parallel_system_of_correlated_linear_events_matches_the_bivariate_probability()
    {
        var a2 = new[] { 0.5, Math.Sqrt(0.75) };
        var events = (Func<ReadOnlySpan<double>, double>)(u => Math.Max(3 - u[0], 3 - (a2[0] * u[0] + a2[1] * u[1])));
        var result = SubsetSimulation.Run(events, 2, new SubsetSimulationOptions { SamplesPerLevel = 2000, Seed = 5 });
        var exact = BivariateNormal.Cdf(-3, -3, 0.5);
        var sim = result.Simulation;
        Assert.True(sim.Converged, sim.Diagnostic);
        Assert.InRange(sim.FailureProbability, exact - 3 * sim.StandardError, exact + 3 * sim.StandardError);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: linear limit state Pf = Φ(−4) in 200 dimensions (the conditional sampler must not degrade with dimension)")]
    public void Works_in_high_dimension()
    {
        var result = SubsetSimulation.Run(Linear(4, 200), 200, new SubsetSimulationOptions { SamplesPerLevel = 1000, Seed = 3 });
        var sim = result.Simulation;
        var exact = StandardNormal.Cdf(-4);
        Assert.True(sim.Converged, sim.Diagnostic);
        Assert.InRange(sim.FailureProbability, exact - 3 * sim.StandardError, exact + 3 * sim.StandardError);
        Assert.All(result.Levels.Skip(1), l => Assert.InRange(l.AcceptanceRate, 0.2, 0.7));
    }

    [Fact]
    public void Result_does_not_depend_on_the_thread_count()
    {
        var one = SubsetSimulation.Run(Linear(3.5, 5), 5, new SubsetSimulationOptions { Seed = 9, MaxDegreeOfParallelism = 1 });
        var many = SubsetSimulation.Run(Linear(3.5, 5), 5, new SubsetSimulationOptions { Seed = 9 });
        Assert.Equal(one.FailureProbability, many.FailureProbability);
        Assert.Equal(one.Simulation.LimitStateEvaluations, many.Simulation.LimitStateEvaluations);
    }

    [Fact]
    [Reference("Closed form: linear limit state; FORM-based reliability problem over a Nataf transformation")]
    public void Problem_overload_keeps_failure_samples_in_the_failure_domain()
    {
        var model = new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]);
        var problem = new ReliabilityProblem(model, new LimitState("R-S", x => x[0] - x[1]));
        var result = SubsetSimulation.Run(problem, new SubsetSimulationOptions { Seed = 4, KeepFailureSamples = true });
        Assert.True(result.Simulation.Converged);
        Assert.NotEmpty(result.FailureSamplesU);
        var t = problem.Transformation;
        var x = new double[2];
        foreach (var u in result.FailureSamplesU)
        {
            t.ToPhysical(u, x);
            Assert.True(x[0] - x[1] <= 0);
        }
    }

    [Fact]
    public void A_safe_domain_everywhere_is_reported_as_not_converged()
    {
        var result = SubsetSimulation.Run(u => 1 + u[0] * u[0], 2, new SubsetSimulationOptions { MaxLevels = 5, Seed = 2 });
        Assert.False(result.Simulation.Converged);
        Assert.NotNull(result.Simulation.Diagnostic);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.7)]
    public void Rejects_a_level_probability_outside_its_range(double p0)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => SubsetSimulation.Run(Linear(3, 2), 2, new SubsetSimulationOptions { LevelProbability = p0 }));
        Assert.Equal("LevelProbability", e.ParamName);
    }
}
