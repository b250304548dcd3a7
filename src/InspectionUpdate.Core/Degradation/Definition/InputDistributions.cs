using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation.Definition;

/// <summary>
/// Creates the random inputs of a component-model definition from a family name and named parameters.
/// </summary>
/// <remarks>
/// Interim: supports Normal (mean, standardDeviation | cov), Lognormal (mean, standardDeviation | cov, or lambda,
/// zeta) and Deterministic (value) until the probability layer's variable factory is merged, after which every
/// family it knows is accepted here through it.
/// </remarks>
internal static class InputDistributions
{
    public static IReadOnlyList<string> Families { get; } = ["Normal", "Lognormal", "Deterministic"];

    /// <summary>Builds the variable; throws <see cref="ArgumentException"/> (or <see cref="DistributionParameterException"/>) naming the parameter.</summary>
    public static RandomVariable Create(string name, string family, IReadOnlyDictionary<string, double> p)
    {
        switch (family)
        {
            case "Deterministic":
                Only(family, p, "value");
                return new PointMass(name, Get(family, p, "value"));
            case "Normal":
                Only(family, p, "mean", "standardDeviation", "cov");
                var mean = Get(family, p, "mean");
                return new NormalVariable(name, mean, Spread(family, p, mean));
            case "Lognormal":
                if (p.ContainsKey("lambda") || p.ContainsKey("zeta"))
                {
                    Only(family, p, "lambda", "zeta");
                    return LognormalVariable.FromLogParameters(name, Get(family, p, "lambda"), Get(family, p, "zeta"));
                }

                Only(family, p, "mean", "standardDeviation", "cov");
                var m = Get(family, p, "mean");
                return LognormalVariable.FromMeanStd(name, m, Spread(family, p, m));
            default:
                throw new ArgumentException($"unknown family '{family}' (known: {string.Join(", ", Families)})", nameof(family));
        }
    }

    private static double Spread(string family, IReadOnlyDictionary<string, double> p, double mean)
    {
        var hasSd = p.TryGetValue("standardDeviation", out var sd);
        var hasCov = p.TryGetValue("cov", out var cov);
        if (hasSd == hasCov) throw new ArgumentException($"{family} needs exactly one of 'standardDeviation' or 'cov'", hasSd ? "cov" : "standardDeviation");
        return hasSd ? sd : cov * Math.Abs(mean);
    }

    private static double Get(string family, IReadOnlyDictionary<string, double> p, string key) =>
        p.TryGetValue(key, out var v) ? v : throw new ArgumentException($"{family} needs the parameter '{key}'", key);

    private static void Only(string family, IReadOnlyDictionary<string, double> p, params string[] allowed)
    {
        foreach (var k in p.Keys)
        {
            if (!allowed.Contains(k)) throw new ArgumentException($"{family} has no parameter '{k}' (allowed: {string.Join(", ", allowed)})", k);
        }
    }

    /// <summary>A point mass (deterministic input). Interim until the probability layer's deterministic variable is merged.</summary>
    private sealed class PointMass : RandomVariable
    {
        private readonly double _value;

        public PointMass(string name, double value) : base(name)
        {
            DistributionParameterException.RequireFinite(name, "value", value);
            _value = value;
        }

        public override string Family => "Deterministic";

        public override double Mean => _value;

        public override double StandardDeviation => 0;

        public override bool IsDeterministic => true;

        public override double Pdf(double x) => x == _value ? double.PositiveInfinity : 0;

        public override double Cdf(double x) => x >= _value ? 1 : 0;

        public override double InverseCdf(double p) => _value;
    }
}
