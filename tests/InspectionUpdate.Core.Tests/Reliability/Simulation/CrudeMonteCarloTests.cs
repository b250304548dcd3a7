using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Tests.Reliability.Form;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Simulation;

public class CrudeMonteCarloTests
{
    private static ReliabilityProblem CornellCase() =>
        new(new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 150, 25)]),
            new LimitState("R-S", x => x[0] - x[1]));

    // Cornell (1969): β = 50/√(20² + 25²), Pf = Φ(−β) ≈ 0.0592.
    private static readonly double CornellPf = Normal.CDF(0, 1, -50 / Math.Sqrt(20 * 20 + 25 * 25));

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Cornell (1969) closed form for R − S of normals; the estimate lies within 3 estimated standard errors")]
    public void Estimate_of_a_linear_normal_margin_lies_within_three_standard_errors_of_the_exact_value()
    {
        var result = CrudeMonteCarlo.Run(CornellCase(), new SamplingOptions { Seed = 3, TargetCoefficientOfVariation = 0.03, BlockSize = 1024 });
        SimulationAssert.WithinStandardErrors(CornellPf, result);
        Assert.True(result.CoefficientOfVariation <= 0.03);
        Assert.Equal(CrudeMonteCarlo.MethodName, result.Method);
        // The CoV of a binomial proportion: √((1 − p)/(N p)), up to the N − 1 of the sample variance.
        var p = result.FailureProbability;
        Assert.Equal(Math.Sqrt((1 - p) / (result.Samples * p)), result.CoefficientOfVariation, 1e-4);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("docs/references.md [derived]: exact Pf = 1.083727e-2 for R ~ LN(300, 0.1) − S ~ Gumbel(150, 0.3), recomputed by integration in the test")]
    public void Non_normal_inputs_are_sampled_through_the_transformation()
    {
        var problem = FormTestModels.LognormalMinusGumbel(out var r, out var s);
        var exact = FormTestModels.LognormalBelowGumbelExactPf(r.Lambda, r.Zeta, s);
        var result = CrudeMonteCarlo.Run(problem, new SamplingOptions { Seed = 5, TargetCoefficientOfVariation = 0.05, BlockSize = 2048 });
        SimulationAssert.WithinStandardErrors(exact, result);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: X1 + X2 of correlated normals, sd = √(σ1² + σ2² + 2ρσ1σ2)")]
    public void Correlated_inputs_are_sampled_with_their_correlation()
    {
        var corr = new CorrelationMatrix(new double[,] { { 1, 0.7 }, { 0.7, 1 } });
        var problem = new ReliabilityProblem(
            new StochasticModel([new NormalVariable("A", 0, 1), new NormalVariable("B", 0, 2)], corr),
            new LimitState("t-A-B", x => 4 - x[0] - x[1]));
        var exact = Normal.CDF(0, 1, -4 / Math.Sqrt(1 + 4 + 2 * 0.7 * 2));
        var result = CrudeMonteCarlo.Run(problem, new SamplingOptions { Seed = 9, TargetCoefficientOfVariation = 0.04, BlockSize = 1024 });
        SimulationAssert.WithinStandardErrors(exact, result);
    }

    [Fact]
    public void Same_seed_gives_the_same_result_for_any_number_of_threads()
    {
        var baseOptions = new SamplingOptions { Seed = 42, TargetCoefficientOfVariation = 0.05, BlockSize = 500 };
        var results = new[] { 1, 2, 3, 8 }
            .Select(t => CrudeMonteCarlo.Run(CornellCase(), baseOptions with { MaxDegreeOfParallelism = t }))
            .ToArray();
        foreach (var r in results)
        {
            Assert.Equal(results[0].FailureProbability, r.FailureProbability);
            Assert.Equal(results[0].CoefficientOfVariation, r.CoefficientOfVariation);
            Assert.Equal(results[0].Samples, r.Samples);
            Assert.True(r.LimitStateEvaluations >= r.Samples);
        }

        var again = CrudeMonteCarlo.Run(CornellCase(), baseOptions);
        Assert.Equal(results[0].FailureProbability, again.FailureProbability);
        var otherSeed = CrudeMonteCarlo.Run(CornellCase(), baseOptions with { Seed = 43 });
        Assert.NotEqual(results[0].FailureProbability, otherSeed.FailureProbability);
    }

    [Fact]
    public void Stops_at_the_first_block_that_meets_the_target()
    {
        var options = new SamplingOptions { Seed = 1, TargetCoefficientOfVariation = 0.1, BlockSize = 256 };
        var result = CrudeMonteCarlo.Run(CornellCase(), options);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(0, result.Samples % 256);
        Assert.True(result.CoefficientOfVariation <= 0.1);
        // One block fewer would not have met the target: rerun with that as a fixed count.
        var shorter = CrudeMonteCarlo.Run(CornellCase(), options with { TargetCoefficientOfVariation = null, MaxSamples = result.Samples - 256 });
        Assert.True(shorter.CoefficientOfVariation > 0.1);
    }

    [Fact]
    public void Sample_cap_before_the_target_is_reported_not_converged()
    {
        var result = CrudeMonteCarlo.Run(CornellCase(), new SamplingOptions { TargetCoefficientOfVariation = 0.01, MaxSamples = 2000, BlockSize = 512 });
        Assert.False(result.Converged);
        Assert.Equal(2000, result.Samples);
        Assert.Contains("Sample cap 2000", result.Diagnostic, StringComparison.Ordinal);
        Assert.True(result.FailureProbability > 0);
    }

    [Fact]
    public void Fixed_sample_count_draws_exactly_the_cap_including_a_partial_block()
    {
        var result = CrudeMonteCarlo.Run(CornellCase(), new SamplingOptions { TargetCoefficientOfVariation = null, MaxSamples = 10_000, BlockSize = 3000 });
        Assert.Equal(10_000, result.Samples);
        Assert.Equal(10_000, result.LimitStateEvaluations);
        Assert.True(result.Converged, result.Diagnostic);
    }

    [Fact]
    public void No_failures_give_zero_with_infinite_cov_and_an_upper_bound()
    {
        var problem = new ReliabilityProblem(new StochasticModel([new NormalVariable("A", 0, 1)]), new LimitState("safe", _ => 1));
        var result = CrudeMonteCarlo.Run(problem, new SamplingOptions { MaxSamples = 3000, BlockSize = 1000 });
        Assert.False(result.Converged);
        Assert.Equal(0, result.FailureProbability);
        Assert.True(double.IsPositiveInfinity(result.CoefficientOfVariation));
        Assert.True(double.IsPositiveInfinity(result.GeneralizedBeta));
        Assert.Contains("No failure in 3000 samples", result.Diagnostic, StringComparison.Ordinal);
    }

    [Fact]
    public void Non_finite_limit_state_values_are_counted_and_reported()
    {
        var problem = new ReliabilityProblem(new StochasticModel([new NormalVariable("A", 0, 1)]),
            new LimitState("partly undefined", x => x[0] > 2 ? double.NaN : x[0] + 1));
        var result = CrudeMonteCarlo.Run(problem, new SamplingOptions { Seed = 2, TargetCoefficientOfVariation = 0.1 });
        Assert.False(result.Converged);
        Assert.Contains("non-finite", result.Diagnostic, StringComparison.Ordinal);
    }

    [Fact]
    public void Cancellation_stops_the_run()
    {
        using var cts = new CancellationTokenSource();
        cts.Cancel();
        Assert.ThrowsAny<OperationCanceledException>(() => CrudeMonteCarlo.Run(CornellCase(), null, cts.Token));
    }

    public static TheoryData<SamplingOptions, string> BadOptions => new()
    {
        { new SamplingOptions { TargetCoefficientOfVariation = 0 }, "TargetCoefficientOfVariation" },
        { new SamplingOptions { TargetCoefficientOfVariation = double.NaN }, "TargetCoefficientOfVariation" },
        { new SamplingOptions { MaxSamples = 0 }, "MaxSamples" },
        { new SamplingOptions { BlockSize = 0 }, "BlockSize" },
        { new SamplingOptions { BlockSize = 1 << 21 }, "BlockSize" },
        { new SamplingOptions { MaxDegreeOfParallelism = 0 }, "MaxDegreeOfParallelism" },
    };

    [Theory]
    [MemberData(nameof(BadOptions))]
    public void Each_bad_setting_is_rejected_naming_it(SamplingOptions options, string name)
    {
        var ex = Assert.Throws<ArgumentOutOfRangeException>(() => CrudeMonteCarlo.Run(CornellCase(), options));
        Assert.Equal(name, ex.ParamName);
    }
}
