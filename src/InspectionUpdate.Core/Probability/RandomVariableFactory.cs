namespace InspectionUpdate.Probability;

/// <summary>
/// Builds random variables from a family name and a set of named parameters, as model-definition files give them.
/// Family and parameter names are matched case-insensitively.
/// </summary>
/// <remarks>
/// <para>Accepted families and parameter sets (square brackets mark optional parameters; "sd" is the standard
/// deviation, "cov" the coefficient of variation σ/|μ|; all in the units of the variable unless said otherwise):</para>
/// <list type="bullet">
/// <item><c>normal</c>: {mean, sd} or {mean, cov}.</item>
/// <item><c>lognormal</c>: {mean, sd}, {mean, cov}, or native {lambda, zeta} = mean and standard deviation of ln X.</item>
/// <item><c>gumbel</c> (largest values): {mean, sd}, {mean, cov}, or native {location, scale} (mode u and scale β).</item>
/// <item><c>weibull</c>: {mean, sd [, location]}, {mean, cov [, location]}, or native {shape, scale [, location]};
/// location ε is the lower bound of the three-parameter form (default 0).</item>
/// <item><c>gamma</c>: {mean, sd}, {mean, cov}, or native {shape, rate} (rate in 1/units) or {shape, scale}.</item>
/// <item><c>exponential</c>: {mean} (unshifted), {mean, sd} or {mean, cov} (shifted so both hold), or native
/// {rate [, location]} (rate in 1/units, location = shift x₀, default 0).</item>
/// <item><c>uniform</c>: {mean, sd}, {mean, cov}, or native {lower, upper}.</item>
/// <item><c>truncated-normal</c>: {mean, sd [, lower] [, upper]} or {mean, cov [, lower] [, upper]} (moments of the
/// truncated variable), or native {mu, sigma [, lower] [, upper]} (the parent normal); at least one bound.</item>
/// <item><c>beta</c>: {mean, sd [, lower, upper]}, {mean, cov [, lower, upper]}, or native
/// {shape1, shape2 [, lower, upper]}; bounds default to [0, 1].</item>
/// <item><c>deterministic</c>: {value} or {mean}.</item>
/// </list>
/// </remarks>
public static class RandomVariableFactory
{
    private static readonly Dictionary<string, FamilySpec> Specs = BuildSpecs();

    /// <summary>The accepted family names, in canonical spelling.</summary>
    public static IReadOnlyList<string> Families { get; } = Specs.Keys.ToArray();

    /// <summary>Creates the variable <paramref name="name"/> of <paramref name="family"/> from <paramref name="parameters"/>.</summary>
    /// <exception cref="DistributionParameterException">
    /// Unknown family (ParamName "family"), an unknown parameter name (ParamName is that name), a parameter set that
    /// matches no accepted set (ParamName "parameters"), or an invalid value (ParamName is the parameter). The message
    /// names the variable and lists what is accepted.
    /// </exception>
    public static RandomVariable Create(string name, string family, IReadOnlyDictionary<string, double> parameters)
    {
        ArgumentNullException.ThrowIfNull(family);
        ArgumentNullException.ThrowIfNull(parameters);
        if (string.IsNullOrWhiteSpace(name))
        {
            throw new ArgumentException("A random variable needs a non-empty name.", nameof(name));
        }

        var key = family.Trim().Replace('_', '-').ToLowerInvariant();
        if (!Specs.TryGetValue(key, out var spec))
        {
            throw new DistributionParameterException(name, nameof(family),
                $"'{family}' is not a known distribution family; accepted: {string.Join(", ", Families)}");
        }

        var given = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        foreach (var (k, v) in parameters)
        {
            if (!given.TryAdd(k.Trim(), v))
            {
                throw new DistributionParameterException(name, k, $"it is given twice (names are case-insensitive) for family '{key}'");
            }
        }

        foreach (var k in given.Keys)
        {
            if (!spec.Sets.Any(s => s.Required.Contains(k, StringComparer.OrdinalIgnoreCase) || s.Optional.Contains(k, StringComparer.OrdinalIgnoreCase)))
            {
                throw new DistributionParameterException(name, k,
                    $"'{k}' is not a parameter of family '{key}'; accepted sets: {spec.Describe()}");
            }
        }

        foreach (var set in spec.Sets)
        {
            if (set.Matches(given)) return set.Build(name, new Parameters(given));
        }

        throw new DistributionParameterException(name, nameof(parameters),
            $"the set {{{string.Join(", ", given.Keys)}}} matches no accepted set for family '{key}'; accepted sets: {spec.Describe()}");
    }

    private static Dictionary<string, FamilySpec> BuildSpecs()
    {
        string[] none = [];
        string[] loc = ["location"];
        string[] bounds = ["lower", "upper"];
        var specs = new FamilySpec[]
        {
            new("normal",
            [
                new(["mean", "sd"], none, (n, p) => new NormalVariable(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => NormalVariable.FromMeanCov(n, p["mean"], p["cov"])),
            ]),
            new("lognormal",
            [
                new(["mean", "sd"], none, (n, p) => LognormalVariable.FromMeanStd(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => LognormalVariable.FromMeanCov(n, p["mean"], p["cov"])),
                new(["lambda", "zeta"], none, (n, p) => LognormalVariable.FromLogParameters(n, p["lambda"], p["zeta"])),
            ]),
            new("gumbel",
            [
                new(["mean", "sd"], none, (n, p) => GumbelVariable.FromMeanStd(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => GumbelVariable.FromMeanCov(n, p["mean"], p["cov"])),
                new(["location", "scale"], none, (n, p) => GumbelVariable.FromParameters(n, p["location"], p["scale"])),
            ]),
            new("weibull",
            [
                new(["mean", "sd"], loc, (n, p) => WeibullVariable.FromMeanStd(n, p["mean"], p["sd"], p.Or("location", 0))),
                new(["mean", "cov"], loc, (n, p) => WeibullVariable.FromMeanCov(n, p["mean"], p["cov"], p.Or("location", 0))),
                new(["shape", "scale"], loc, (n, p) => WeibullVariable.FromParameters(n, p["shape"], p["scale"], p.Or("location", 0))),
            ]),
            new("gamma",
            [
                new(["mean", "sd"], none, (n, p) => GammaVariable.FromMeanStd(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => GammaVariable.FromMeanCov(n, p["mean"], p["cov"])),
                new(["shape", "rate"], none, (n, p) => GammaVariable.FromShapeRate(n, p["shape"], p["rate"])),
                new(["shape", "scale"], none, (n, p) => GammaVariable.FromShapeScale(n, p["shape"], p["scale"])),
            ]),
            new("exponential",
            [
                new(["mean"], none, (n, p) => ExponentialVariable.FromMean(n, p["mean"])),
                new(["mean", "sd"], none, (n, p) => ExponentialVariable.FromMeanStd(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => ExponentialVariable.FromMeanCov(n, p["mean"], p["cov"])),
                new(["rate"], loc, (n, p) => ExponentialVariable.FromParameters(n, p["rate"], p.Or("location", 0))),
            ]),
            new("uniform",
            [
                new(["mean", "sd"], none, (n, p) => UniformVariable.FromMeanStd(n, p["mean"], p["sd"])),
                new(["mean", "cov"], none, (n, p) => UniformVariable.FromMeanCov(n, p["mean"], p["cov"])),
                new(["lower", "upper"], none, (n, p) => UniformVariable.FromBounds(n, p["lower"], p["upper"])),
            ]),
            new("truncated-normal",
            [
                new(["mean", "sd"], bounds, (n, p) => TruncatedNormalVariable.FromMeanStd(n, p["mean"], p["sd"],
                    p.Or("lower", double.NegativeInfinity), p.Or("upper", double.PositiveInfinity))),
                new(["mean", "cov"], bounds, (n, p) => TruncatedNormalVariable.FromMeanCov(n, p["mean"], p["cov"],
                    p.Or("lower", double.NegativeInfinity), p.Or("upper", double.PositiveInfinity))),
                new(["mu", "sigma"], bounds, (n, p) => TruncatedNormalVariable.FromParameters(n, p["mu"], p["sigma"],
                    p.Or("lower", double.NegativeInfinity), p.Or("upper", double.PositiveInfinity))),
            ]),
            new("beta",
            [
                new(["mean", "sd"], bounds, (n, p) => BetaVariable.FromMeanStd(n, p["mean"], p["sd"], p.Or("lower", 0), p.Or("upper", 1))),
                new(["mean", "cov"], bounds, (n, p) => BetaVariable.FromMeanCov(n, p["mean"], p["cov"], p.Or("lower", 0), p.Or("upper", 1))),
                new(["shape1", "shape2"], bounds, (n, p) => BetaVariable.FromParameters(n, p["shape1"], p["shape2"], p.Or("lower", 0), p.Or("upper", 1))),
            ]),
            new("deterministic",
            [
                new(["value"], none, (n, p) => new DeterministicVariable(n, p["value"])),
                new(["mean"], none, (n, p) => new DeterministicVariable(n, p["mean"])),
            ]),
        };
        return specs.ToDictionary(s => s.Name, StringComparer.Ordinal);
    }

    private sealed record FamilySpec(string Name, ParameterSet[] Sets)
    {
        public string Describe() => string.Join(" or ", Sets.Select(s => s.Describe()));
    }

    private sealed record ParameterSet(string[] Required, string[] Optional, Func<string, Parameters, RandomVariable> Build)
    {
        public bool Matches(Dictionary<string, double> given) =>
            Required.All(given.ContainsKey) &&
            given.Keys.All(k => Required.Contains(k, StringComparer.OrdinalIgnoreCase) || Optional.Contains(k, StringComparer.OrdinalIgnoreCase));

        public string Describe() =>
            "{" + string.Join(", ", Required.Concat(Optional.Select(o => "[" + o + "]"))) + "}";
    }

    private readonly struct Parameters(Dictionary<string, double> values)
    {
        public double this[string key] => values[key];

        public double Or(string key, double fallback) => values.TryGetValue(key, out var v) ? v : fallback;
    }
}
