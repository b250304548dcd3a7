using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Probability;

/// <summary>Independent quadrature for the tests (MathNet's Gauss–Legendre rule, composite).</summary>
internal static class Quadrature
{
    private static readonly GaussLegendreRule Rule = new(-1, 1, 16);

    /// <summary>E[g(U)] for U standard normal: composite 16-point Gauss–Legendre on [−12, 12] with 96 panels.</summary>
    public static double OverStandardNormal(Func<double, double> g) =>
        Composite(u => g(u) * Math.Exp(-0.5 * u * u) / Math.Sqrt(2 * Math.PI), -12, 12, 96);

    /// <summary>∫ f over [a, b] by composite 16-point Gauss–Legendre with <paramref name="panels"/> panels.</summary>
    public static double Composite(Func<double, double> f, double a, double b, int panels)
    {
        var h = (b - a) / panels;
        var sum = 0.0;
        for (var k = 0; k < panels; k++)
        {
            var mid = a + (k + 0.5) * h;
            for (var i = 0; i < Rule.Order; i++) sum += Rule.Weights[i] * f(mid + 0.5 * h * Rule.Abscissas[i]);
        }

        return 0.5 * h * sum;
    }
}
