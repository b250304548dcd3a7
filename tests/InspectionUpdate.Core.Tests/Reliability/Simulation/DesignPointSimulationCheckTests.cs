using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Verification;

namespace InspectionUpdate.Tests.Reliability.Simulation;

public class DesignPointSimulationCheckTests
{
    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("closed form: for a linear margin in standard normal space FORM is exact, Pf = Φ(−5) (RP107 of the reliability problem repository)")]
    public void A_linear_margin_is_confirmed_and_an_estimate_ten_percent_off_is_flagged()
    {
        var problem = BenchmarkProblems.Find("RP107")!.Problem;
        var form = FormSolver.Solve(problem);
        var check = DesignPointSimulationCheck.Run(problem, form);

        Assert.True(check.Conclusive);
        // Target CoV 0.01 reached: the estimate lies within 4 of its standard errors of the exact value.
        Assert.InRange(check.Simulation.FailureProbability, StandardNormal.Ccdf(5) - 4 * check.Simulation.StandardError, StandardNormal.Ccdf(5) + 4 * check.Simulation.StandardError);
        Assert.Null(check.Flag(StandardNormal.Ccdf(5)));
        Assert.Null(check.Flag(form.FailureProbability));
        var flag = check.Flag(1.10 * StandardNormal.Ccdf(5));
        Assert.NotNull(flag);
        Assert.StartsWith(DesignPointSimulationCheckResult.FlagPrefix + ": disagrees with simulation", flag, StringComparison.Ordinal);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("RP14 reference Pf 7.7285e-4 (otbenchmark benchmark table, confirmed by crude Monte Carlo: data/benchmarks/README.md); FORM at its design point is about 9 % low")]
    public void Rp14_form_estimate_that_every_other_check_passes_is_flagged()
    {
        var benchmark = BenchmarkProblems.Find("RP14")!;
        var form = MultiStartFormSolver.Solve(benchmark.Problem);
        Assert.True(form.Converged);
        Assert.Null(form.Warning);
        Assert.True((benchmark.ReferencePf - form.Best.FailureProbability) / benchmark.ReferencePf > 0.05);

        var check = DesignPointSimulationCheck.Run(benchmark.Problem, form.Best);

        Assert.True(check.Conclusive);
        var combined = Math.Sqrt(Math.Pow(check.Simulation.StandardError, 2) + Math.Pow(benchmark.ReferenceRelativeUncertainty * benchmark.ReferencePf, 2));
        Assert.InRange(check.Simulation.FailureProbability, benchmark.ReferencePf - 3 * combined, benchmark.ReferencePf + 3 * combined);
        Assert.NotNull(check.Flag(form.Best.FailureProbability));
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("RP57 reference Pf 2.82405e-2 by quadrature (data/benchmarks); the converged design point (β = 3√2 − 2, the circle branch) misses the larger parallel-system region")]
    public void Rp57_design_point_of_the_wrong_branch_is_not_confirmed()
    {
        var benchmark = BenchmarkProblems.Find("RP57")!;
        var form = MultiStartFormSolver.Solve(benchmark.Problem);
        Assert.True(form.Converged);
        Assert.Equal(3 * Math.Sqrt(2) - 2, form.Best.Beta, 1e-6);

        var check = DesignPointSimulationCheck.Run(benchmark.Problem, form.Best);

        Assert.False(check.Conclusive);
        Assert.StartsWith(DesignPointSimulationCheckResult.FlagPrefix + ": not confirmed", check.Flag(form.Best.FailureProbability), StringComparison.Ordinal);
    }

    [Fact]
    public void Bad_settings_name_the_setting_and_the_value()
    {
        var problem = BenchmarkProblems.Find("RP107")!.Problem;
        var form = FormSolver.Solve(problem);
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => DesignPointSimulationCheck.Run(problem, form, new DesignPointSimulationCheckOptions { Margin = -0.1 }));
        Assert.Contains("Margin", e.Message, StringComparison.Ordinal);
        Assert.Contains("-0.1", e.Message, StringComparison.Ordinal);
        var f = Assert.Throws<ArgumentOutOfRangeException>(() => DesignPointSimulationCheck.Run(problem, form,
            new DesignPointSimulationCheckOptions { Sampling = new SamplingOptions { TargetCoefficientOfVariation = null } }));
        Assert.Contains("TargetCoefficientOfVariation", f.Message, StringComparison.Ordinal);
    }
}
