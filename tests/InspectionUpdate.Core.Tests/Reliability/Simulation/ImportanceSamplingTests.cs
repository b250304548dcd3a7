using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Tests.Reliability.Form;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Reliability.Simulation;

public class ImportanceSamplingTests
{
    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("docs/references.md [derived]: exact Pf = 1.083727e-2, recomputed by 1-D integration in the test; within 3 standard errors")]
    public void Lognormal_minus_Gumbel_estimate_lies_within_three_standard_errors_of_the_exact_value()
    {
        var problem = FormTestModels.LognormalMinusGumbel(out var r, out var s);
        var exact = FormTestModels.LognormalBelowGumbelExactPf(r.Lambda, r.Zeta, s);
        var form = FormSolver.Solve(problem);
        var result = ImportanceSampling.Run(problem, form, new SamplingOptions { Seed = 11, TargetCoefficientOfVariation = 0.01, BlockSize = 1024 });
        SimulationAssert.WithinStandardErrors(exact, result);
        Assert.Equal(ImportanceSampling.MethodName, result.Method);
        // Far fewer samples than crude Monte Carlo would need for the same CoV: (1 − p)/(p·0.01²) ≈ 9.1e5.
        Assert.True(result.Samples < 100_000, $"{result.Samples} samples");
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Invented case; exact Pf by 1-D integration in the test (X1·X2 lognormal); within 3 standard errors")]
    public void Product_of_lognormals_minus_Gumbel_estimate_lies_within_three_standard_errors_of_the_exact_value()
    {
        var problem = FormTestModels.LognormalProductMinusGumbel(out var x1, out var x2, out var s);
        var exact = FormTestModels.LognormalBelowGumbelExactPf(
            x1.Lambda + x2.Lambda, Math.Sqrt(x1.Zeta * x1.Zeta + x2.Zeta * x2.Zeta), s);
        var form = FormSolver.Solve(problem);
        var result = ImportanceSampling.Run(problem, form, new SamplingOptions { Seed = 12, TargetCoefficientOfVariation = 0.02, BlockSize = 1024 });
        SimulationAssert.WithinStandardErrors(exact, result);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Cornell (1969) closed form with μR < μS: Pf = Φ(0.8) > 0.5")]
    public void Failing_median_point_is_estimated_within_three_standard_errors()
    {
        var problem = new ReliabilityProblem(
            new StochasticModel([new NormalVariable("R", 100, 20), new NormalVariable("S", 120, 15)]),
            new LimitState("R-S", x => x[0] - x[1]));
        var form = FormSolver.Solve(problem);
        Assert.True(form.Beta < 0);
        var result = ImportanceSampling.Run(problem, form, new SamplingOptions { Seed = 13, TargetCoefficientOfVariation = 0.01, BlockSize = 1024 });
        SimulationAssert.WithinStandardErrors(Normal.CDF(0, 1, 0.8), result);
    }

    [Fact]
    [Reference("Identity: with the centre at the origin the weights are 1 and the estimator is crude Monte Carlo on the same stream")]
    public void Centre_at_the_origin_reproduces_crude_Monte_Carlo_exactly()
    {
        var problem = FormTestModels.LognormalMinusGumbel(out _, out _);
        var options = new SamplingOptions { Seed = 21, TargetCoefficientOfVariation = null, MaxSamples = 20_000, BlockSize = 4000 };
        var crude = CrudeMonteCarlo.Run(problem, options);
        var sampled = ImportanceSampling.Run(problem, [0.0, 0.0], options);
        Assert.Equal(crude.FailureProbability, sampled.FailureProbability);
        Assert.Equal(crude.CoefficientOfVariation, sampled.CoefficientOfVariation, 1e-12);
    }

    [Fact]
    public void Same_seed_gives_the_same_result_for_any_number_of_threads()
    {
        var problem = FormTestModels.ProductOfNormals();
        var form = FormSolver.Solve(problem);
        var options = new SamplingOptions { Seed = 5, TargetCoefficientOfVariation = 0.05, BlockSize = 200 };
        var one = ImportanceSampling.Run(problem, form, options with { MaxDegreeOfParallelism = 1 });
        var two = ImportanceSampling.Run(problem, form, options with { MaxDegreeOfParallelism = 2 });
        var many = ImportanceSampling.Run(problem, form, options with { MaxDegreeOfParallelism = 7 });
        Assert.Equal(one.FailureProbability, two.FailureProbability);
        Assert.Equal(one.FailureProbability, many.FailureProbability);
        Assert.Equal(one.Samples, many.Samples);
    }

    [Fact]
    public void Non_converged_FORM_centre_is_noted_but_still_used()
    {
        var problem = FormTestModels.ProductOfNormals();
        var form = FormSolver.Solve(problem, new FormOptions { MaxIterations = 1 });
        Assert.False(form.Converged);
        var result = ImportanceSampling.Run(problem, form, new SamplingOptions { TargetCoefficientOfVariation = 0.1 });
        Assert.Contains("did not converge", result.Diagnostic, StringComparison.Ordinal);
    }

    [Fact]
    public void Centre_of_the_wrong_length_or_not_finite_is_rejected()
    {
        var problem = FormTestModels.ProductOfNormals();
        var ex = Assert.Throws<ArgumentException>(() => ImportanceSampling.Run(problem, [1.0, 2.0]));
        Assert.Equal("centerU", ex.ParamName);
        ex = Assert.Throws<ArgumentException>(() => ImportanceSampling.Run(problem, [1.0, double.PositiveInfinity, 0.0]));
        Assert.Equal("centerU", ex.ParamName);
    }
}
