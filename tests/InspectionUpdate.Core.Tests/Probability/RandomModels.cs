using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Probability;

/// <summary>Seeded random stochastic models over all families, for property tests.</summary>
internal static class RandomModels
{
    public static RandomVariable Marginal(Random rng, string name)
    {
        var cov = 0.05 + 0.45 * rng.NextDouble();
        var mean = 1 + 99 * rng.NextDouble();
        return rng.Next(10) switch
        {
            0 => new NormalVariable(name, mean, cov * mean),
            1 => LognormalVariable.FromMeanCov(name, mean, cov),
            2 => GumbelVariable.FromMeanCov(name, mean, cov),
            3 => WeibullVariable.FromMeanCov(name, mean, cov, location: rng.NextDouble() < 0.5 ? 0 : -mean),
            4 => GammaVariable.FromMeanCov(name, mean, cov),
            5 => ExponentialVariable.FromMeanStd(name, mean, cov * mean),
            6 => UniformVariable.FromMeanCov(name, mean, cov),
            7 => TruncatedNormalVariable.FromParameters(name, mean, 2 * cov * mean, mean * (1 - cov), double.PositiveInfinity),
            8 => BetaVariable.FromParameters(name, 1.5 + 3 * rng.NextDouble(), 1.5 + 3 * rng.NextDouble(), mean, mean * (1 + 2 * cov)),
            _ => new DeterministicVariable(name, mean),
        };
    }

    /// <summary>A model of n variables; when correlated, a random positive definite matrix with |ρ| ≤ about 0.5.</summary>
    public static StochasticModel Model(Random rng, int n, bool correlated)
    {
        var variables = Enumerable.Range(0, n).Select(i => Marginal(rng, $"X{i}")).ToArray();
        if (!correlated) return new StochasticModel(variables);

        // R = D^{-1/2} (B Bᵀ + I) D^{-1/2} with small random B: positive definite with moderate correlations.
        var b = new double[n, 2];
        for (var i = 0; i < n; i++)
            for (var k = 0; k < 2; k++) b[i, k] = rng.NextDouble() * 1.2 - 0.6;
        var c = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++)
            {
                var s = i == j ? 1.0 : 0.0;
                for (var k = 0; k < 2; k++) s += b[i, k] * b[j, k];
                c[i, j] = s;
            }

        var r = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) r[i, j] = i == j ? 1 : c[i, j] / Math.Sqrt(c[i, i] * c[j, j]);
        return new StochasticModel(variables, new CorrelationMatrix(r));
    }
}
