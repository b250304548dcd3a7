using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Degradation;

internal static class TestInputs
{
    public static StochasticModel Model(params RandomVariable[] variables) => new(variables);

    public static LognormalVariable Ln(string name, double mean, double cov) => LognormalVariable.FromMeanCov(name, mean, cov);

    public static NormalVariable N(string name, double mean, double sd) => new(name, mean, sd);

    public static DeterministicVariable D(string name, double value) => new(name, value);

    /// <summary>x at the means (deterministic values included).</summary>
    public static double[] Means(StochasticModel model) => model.Variables.Select(v => v.Mean).ToArray();

    /// <summary>Central-difference gradient with relative step h, for checking analytic gradients.</summary>
    public static double[] NumericGradient(Func<double[], double> f, double[] x, double h = 1e-6)
    {
        var g = new double[x.Length];
        for (var i = 0; i < x.Length; i++)
        {
            var step = h * Math.Max(Math.Abs(x[i]), 1e-12);
            var xp = (double[])x.Clone();
            var xm = (double[])x.Clone();
            xp[i] += step;
            xm[i] -= step;
            g[i] = (f(xp) - f(xm)) / (2 * step);
        }

        return g;
    }

    public static void AssertGradientMatches(double[] analytic, double[] numeric, double relativeTolerance, double absoluteFloor = 1e-12)
    {
        Assert.Equal(numeric.Length, analytic.Length);
        var scale = numeric.Select(Math.Abs).Append(absoluteFloor).Max();
        for (var i = 0; i < analytic.Length; i++)
        {
            Assert.True(Math.Abs(analytic[i] - numeric[i]) <= relativeTolerance * Math.Max(Math.Abs(numeric[i]), scale * 1e-6) + absoluteFloor,
                FormattableString.Invariant($"gradient[{i}]: analytic {analytic[i]:G10}, numeric {numeric[i]:G10}"));
        }
    }
}
