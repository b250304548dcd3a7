using InspectionUpdate.Probability;
using InspectionUpdate.Updating.FirstOrder;

namespace InspectionUpdate.Tests.Updating.FirstOrder;

public class EventFunctionGradientTests
{
    private static StochasticModel Independent() => new(
    [
        new NormalVariable("a", 2, 0.5),
        LognormalVariable.FromMeanCov("b", 1.5, 0.3),
        new DeterministicVariable("c", 4),
        GumbelVariable.FromMeanCov("d", 10, 0.2),
    ]);

    private static double H(ReadOnlySpan<double> x) => x[0] * x[0] + Math.Exp(0.3 * x[1]) * x[3] - x[2];

    [Fact]
    [Reference("Analytic gradient in u: ∇ᵤh = Jᵀ∇ₓh with the Nataf Jacobian dx/du = φ(u)/f(x) (Der Kiureghian & Liu 1986 for independent marginals), against the finite differences")]
    public void One_coordinate_steps_give_the_whole_vector_gradient_of_independent_inputs()
    {
        var model = Independent();
        var t = new NatafTransformation(model);
        var f = new EventFunction("h", false, H, t);
        var u = new[] { 0.4, -1.2, 0.7 };
        var forward = new double[3];
        var central = new double[3];
        var h = f.ValueAndForwardGradientAtU(u, forward);
        f.ValueAndGradientAtU(u, central);

        // The same differences with the whole vector transformed at every step (the path for correlated inputs).
        var x = new double[4];
        t.ToPhysical(u, x);
        Assert.Equal(H(x), h);
        for (var i = 0; i < 3; i++)
        {
            var w = (double[])u.Clone();
            w[i] += 1e-6;
            var xw = new double[4];
            t.ToPhysical(w, xw);
            Assert.Equal((H(xw) - h) / 1e-6, forward[i]);
        }

        // Against the analytic gradient Jᵀ∇ₓh.
        var jacobian = new double[4 * 3];
        t.JacobianPhysicalByStandard(u, jacobian);
        double[] gx = [2 * x[0], 0.3 * Math.Exp(0.3 * x[1]) * x[3], -1, Math.Exp(0.3 * x[1])];
        for (var k = 0; k < 3; k++)
        {
            var exact = 0.0;
            for (var i = 0; i < 4; i++) exact += jacobian[i * 3 + k] * gx[i];
            Assert.Equal(exact, central[k], 1e-6 * Math.Max(1, Math.Abs(exact)));
            Assert.Equal(exact, forward[k], 1e-4 * Math.Max(1, Math.Abs(exact)));
        }
    }

    [Fact]
    public void Correlated_inputs_do_not_take_the_one_coordinate_path()
    {
        var correlated = new StochasticModel([new NormalVariable("a", 0, 1), new NormalVariable("b", 0, 1)],
            new CorrelationMatrix(new[,] { { 1.0, 0.6 }, { 0.6, 1.0 } }));
        var x = new double[2];
        Assert.False(new NatafTransformation(correlated).TryMoveStandardCoordinate(0, 1.0, x));
        Assert.True(new NatafTransformation(Independent()).TryMoveStandardCoordinate(1, 0.0, new double[4]));
    }
}
