using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Tests.Reliability.Form;

/// <summary>The importance vector γ for correlated inputs and α² for independent ones.</summary>
public class ImportanceFactorsTests
{
    private static readonly double[] Sd = [2, 1, 1.5];
    private static readonly double[] A = [1.0, -1.5, -0.8];

    private static ReliabilityProblem CorrelatedLinear(out CorrelationMatrix corr)
    {
        corr = new CorrelationMatrix(new double[,] { { 1, 0.6, -0.3 }, { 0.6, 1, 0.4 }, { -0.3, 0.4, 1 } });
        var model = new StochasticModel(
            [new NormalVariable("A", 10, Sd[0]), new NormalVariable("B", 5, Sd[1]), new NormalVariable("C", 3, Sd[2])], corr);
        return new ReliabilityProblem(model, new LimitState("linear", x => 4 + A[0] * x[0] + A[1] * x[1] + A[2] * x[2]));
    }

    // For g = a₀ + aᵀx in normals, J_{x,u} = D·L₀ and D̂ = D, so γ ∝ αᵀL₀⁻¹ with α ∝ −L₀ᵀDa: γᵢ = −aᵢσᵢ/‖Da‖.
    // Each variable's share of the margin's scale, ignoring correlation: the point of γ.
    [Fact]
    [Reference("Der Kiureghian (2005), Engineering Design Reliability Handbook ch. 14, importance vector γ (from memory); closed form for linear normal margins derived in the test comment")]
    public void Linear_correlated_normal_margin_gives_gamma_proportional_to_minus_coefficient_times_sd()
    {
        var problem = CorrelatedLinear(out _);
        var result = FormSolver.Solve(problem);
        Assert.True(result.Converged, result.Diagnostic);
        var scale = Math.Sqrt(Enumerable.Range(0, 3).Sum(i => A[i] * A[i] * Sd[i] * Sd[i]));
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(-A[i] * Sd[i] / scale, result.ImportanceVector![i], 1e-7);
            Assert.Equal(A[i] * A[i] * Sd[i] * Sd[i] / (scale * scale), result.ImportanceFactors[i], 1e-7);
        }

        // With correlation γ differs from α.
        Assert.True(Math.Abs(result.Alpha[0] - result.ImportanceVector![0]) > 1e-2);
        Assert.Equal(1, result.ImportanceFactors.Sum(), 1e-12);
    }

    [Fact]
    [Reference("Der Kiureghian (2005), γ = αᵀJ_{u,x}D̂/‖αᵀJ_{u,x}D̂‖ (from memory): the Nataf shortcut L₀⁻ᵀα must equal the general formula")]
    public void Nataf_shortcut_equals_the_general_Jacobian_formula()
    {
        var problem = CorrelatedLinear(out _);
        var result = FormSolver.Solve(problem);
        var u = result.DesignPointU.ToArray();
        var alpha = result.Alpha.ToArray();
        var nataf = ImportanceFactors.ImportanceVector(problem.Transformation, u, alpha);
        var general = ImportanceFactors.ImportanceVector(new OpaqueTransformation(problem.Transformation), u, alpha);
        for (var i = 0; i < 3; i++) Assert.Equal(nataf[i], general[i], 1e-12);
    }

    [Fact]
    [Reference("Definition: γ = α for independent inputs (J_{x,u} diagonal)")]
    public void Independent_inputs_give_gamma_equal_to_alpha()
    {
        var problem = FormTestModels.LognormalProductMinusGumbel(out _, out _, out _);
        var result = FormSolver.Solve(problem);
        var general = ImportanceFactors.ImportanceVector(new OpaqueTransformation(problem.Transformation), result.DesignPointU.ToArray(), result.Alpha.ToArray());
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(result.Alpha[i], result.ImportanceVector![i], 1e-15);
            Assert.Equal(result.Alpha[i], general[i], 1e-12);
        }
    }

    [Fact]
    public void Mismatched_lengths_are_rejected()
    {
        var problem = CorrelatedLinear(out _);
        var ex = Assert.Throws<ArgumentException>(() => ImportanceFactors.Compute(problem.Transformation, new double[2], new double[3]));
        Assert.Equal("u", ex.ParamName);
        ex = Assert.Throws<ArgumentException>(() => ImportanceFactors.Compute(problem.Transformation, new double[3], new double[4]));
        Assert.Equal("alpha", ex.ParamName);
    }
}
