using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Reliability;

public class FormSmokeTests
{
    // Cornell (1969): β = (μR − μS)/√(σR² + σS²) for the linear margin R − S of independent normals.
    [Fact]
    [Reference("Cornell (1969), closed form for a linear margin of independent normals")]
    public void Linear_normal_margin_matches_Cornell_closed_form()
    {
        var model = new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]);
        var problem = new ReliabilityProblem(model, new LimitState("R-S", x => x[0] - x[1]));
        var result = FormSolver.Solve(problem);
        var expected = (200.0 - 100.0) / Math.Sqrt(20 * 20 + 30 * 30);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(expected, result.Beta, 1e-9);
    }
}
