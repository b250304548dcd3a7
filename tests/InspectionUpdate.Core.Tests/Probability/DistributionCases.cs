using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Probability;

/// <summary>A representative instance of every distribution family, by case name, for table-driven tests.</summary>
internal static class DistributionCases
{
    public static readonly IReadOnlyDictionary<string, Func<RandomVariable>> All = new Dictionary<string, Func<RandomVariable>>
    {
        ["normal"] = () => new NormalVariable("X", 10, 2),
        ["lognormal"] = () => LognormalVariable.FromMeanCov("X", 300, 0.1),
        ["lognormal-wide"] = () => LognormalVariable.FromMeanCov("X", 1, 1.5),
        ["gumbel"] = () => GumbelVariable.FromMeanCov("X", 150, 0.3),
        ["weibull-2p"] = () => WeibullVariable.FromParameters("X", 2.5, 4.0),
        ["weibull-2p-small-shape"] = () => WeibullVariable.FromParameters("X", 0.8, 4.0),
        ["weibull-3p"] = () => WeibullVariable.FromParameters("X", 1.7, 3.0, 5.0),
        ["gamma"] = () => GammaVariable.FromShapeRate("X", 3.5, 2.0),
        ["gamma-small-shape"] = () => GammaVariable.FromShapeRate("X", 0.4, 1.5),
        ["gamma-large-shape"] = () => GammaVariable.FromMeanCov("X", 20, 0.05),
        ["exponential"] = () => ExponentialVariable.FromMean("X", 0.11),
        ["exponential-shifted"] = () => ExponentialVariable.FromParameters("X", 2.0, 1.0),
        ["uniform"] = () => UniformVariable.FromBounds("X", 2, 5),
        ["truncated-normal-lower"] = () => TruncatedNormalVariable.FromParameters("X", 1, 2, 0, double.PositiveInfinity),
        ["truncated-normal-upper"] = () => TruncatedNormalVariable.FromParameters("X", 1, 2, double.NegativeInfinity, 3),
        ["truncated-normal-both"] = () => TruncatedNormalVariable.FromParameters("X", 1, 2, -0.5, 2.5),
        ["truncated-normal-tail"] = () => TruncatedNormalVariable.FromParameters("X", 0, 1, 4, 6),
        ["beta"] = () => BetaVariable.FromParameters("X", 2, 3, 1, 4),
        ["beta-u-shaped"] = () => BetaVariable.FromParameters("X", 0.5, 0.7),
        ["beta-large-shapes"] = () => BetaVariable.FromParameters("X", 40, 25, -2, 2),
    };

    public static TheoryData<string> Names()
    {
        var data = new TheoryData<string>();
        foreach (var k in All.Keys) data.Add(k);
        return data;
    }
}
