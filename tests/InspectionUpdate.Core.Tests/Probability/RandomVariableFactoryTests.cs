using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Probability;

[Reference("Contract of RandomVariableFactory.Create (its XML documentation lists the accepted families and parameter sets)")]
public class RandomVariableFactoryTests
{
    private static Dictionary<string, double> P(params (string Key, double Value)[] items) => items.ToDictionary(i => i.Key, i => i.Value);

    public static TheoryData<string, string, Dictionary<string, double>, double, double> MomentSets() => new()
    {
        // family, type expected, parameters, expected mean, expected sd (the definitions of the moment parameters)
        { "normal", nameof(NormalVariable), P(("mean", 10), ("sd", 2)), 10, 2 },
        { "Normal", nameof(NormalVariable), P(("mean", 10), ("cov", 0.2)), 10, 2 },
        { "LOGNORMAL", nameof(LognormalVariable), P(("Mean", 300), ("SD", 30)), 300, 30 },
        { "lognormal", nameof(LognormalVariable), P(("mean", 300), ("cov", 0.1)), 300, 30 },
        { "gumbel", nameof(GumbelVariable), P(("mean", 150), ("cov", 0.3)), 150, 45 },
        { "weibull", nameof(WeibullVariable), P(("mean", 7), ("sd", 2)), 7, 2 },
        { "weibull", nameof(WeibullVariable), P(("mean", 7), ("sd", 2), ("location", 3)), 7, 2 },
        { "gamma", nameof(GammaVariable), P(("mean", 5), ("cov", 0.4)), 5, 2 },
        { "exponential", nameof(ExponentialVariable), P(("mean", 0.11)), 0.11, 0.11 },
        { "exponential", nameof(ExponentialVariable), P(("mean", 3), ("sd", 1)), 3, 1 },
        { "uniform", nameof(UniformVariable), P(("mean", 5), ("sd", 1)), 5, 1 },
        { "truncated-normal", nameof(TruncatedNormalVariable), P(("mean", 1.5), ("sd", 0.9), ("lower", 0)), 1.5, 0.9 },
        { "truncated_normal", nameof(TruncatedNormalVariable), P(("mean", 1.5), ("sd", 0.6), ("lower", 0), ("upper", 2.5)), 1.5, 0.6 },
        { "beta", nameof(BetaVariable), P(("mean", 2.5), ("sd", 0.5), ("lower", 1), ("upper", 4)), 2.5, 0.5 },
        { "deterministic", nameof(DeterministicVariable), P(("value", 4.2)), 4.2, 0 },
    };

    [Theory]
    [MemberData(nameof(MomentSets))]
    [Reference("Definition of the moment parameters: mean, sd, cov = sd/|mean|")]
    public void Moment_parameters_build_a_variable_with_those_moments(string family, string type, Dictionary<string, double> parameters, double mean, double sd)
    {
        var v = RandomVariableFactory.Create("X", family, parameters);
        Assert.Equal(type, v.GetType().Name);
        Assert.Equal("X", v.Name);
        Assert.Equal(mean, v.Mean, 1e-9 * Math.Abs(mean));
        Assert.Equal(sd, v.StandardDeviation, 1e-9 * Math.Max(sd, 1));
    }

    [Fact]
    [Reference("Native parameters passed through unchanged (definition of each family's parameters)")]
    public void Native_parameters_reach_the_distribution_unchanged()
    {
        var l = (LognormalVariable)RandomVariableFactory.Create("L", "lognormal", P(("lambda", 1.2), ("zeta", 0.3)));
        Assert.Equal((1.2, 0.3), (l.Lambda, l.Zeta));
        var g = (GumbelVariable)RandomVariableFactory.Create("G", "gumbel", P(("location", 5), ("scale", 2)));
        Assert.Equal((5.0, 2.0), (g.Location, g.Scale));
        var w = (WeibullVariable)RandomVariableFactory.Create("W", "weibull", P(("shape", 2), ("scale", 3), ("location", 1)));
        Assert.Equal((2.0, 3.0, 1.0), (w.Shape, w.Scale, w.Location));
        var ga = (GammaVariable)RandomVariableFactory.Create("Ga", "gamma", P(("shape", 2), ("scale", 4)));
        Assert.Equal((2.0, 0.25), (ga.Shape, ga.Rate));
        var e = (ExponentialVariable)RandomVariableFactory.Create("E", "exponential", P(("rate", 2), ("location", 1)));
        Assert.Equal((2.0, 1.0), (e.Rate, e.Location));
        var u = (UniformVariable)RandomVariableFactory.Create("U", "uniform", P(("lower", -1), ("upper", 3)));
        Assert.Equal((-1.0, 3.0), (u.Lower, u.Upper));
        var t = (TruncatedNormalVariable)RandomVariableFactory.Create("T", "truncated-normal", P(("mu", 1), ("sigma", 2), ("upper", 3)));
        Assert.Equal((1.0, 2.0, double.NegativeInfinity, 3.0), (t.Mu, t.Sigma, t.Lower, t.Upper));
        var b = (BetaVariable)RandomVariableFactory.Create("B", "beta", P(("shape1", 2), ("shape2", 3)));
        Assert.Equal((2.0, 3.0, 0.0, 1.0), (b.Shape1, b.Shape2, b.Lower, b.Upper));
    }

    [Fact]
    public void An_unknown_family_is_rejected_listing_the_accepted_ones()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("X", "frechet", P(("mean", 1), ("sd", 1))));
        Assert.Equal("family", ex.ParamName);
        Assert.Contains("'frechet'", ex.Message, StringComparison.Ordinal);
        foreach (var f in RandomVariableFactory.Families) Assert.Contains(f, ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_unknown_parameter_is_rejected_naming_it_and_the_accepted_sets()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("X", "gumbel", P(("mean", 1), ("stdev", 1))));
        Assert.Equal("stdev", ex.ParamName);
        Assert.Contains("{location, scale}", ex.Message, StringComparison.Ordinal);
        Assert.Contains("{mean, sd}", ex.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("normal", "mean")]
    [InlineData("gamma", "shape")]
    [InlineData("uniform", "lower")]
    public void An_incomplete_parameter_set_is_rejected(string family, string only)
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("X", family, P((only, 1))));
        Assert.Equal("parameters", ex.ParamName);
        Assert.Contains("accepted sets", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Mixing_sd_and_cov_is_rejected()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("X", "normal", P(("mean", 1), ("sd", 1), ("cov", 0.2))));
        Assert.Equal("parameters", ex.ParamName);
    }

    [Fact]
    public void A_parameter_given_twice_in_different_case_is_rejected()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("X", "normal", P(("mean", 1), ("Mean", 2), ("sd", 1))));
        Assert.Contains("twice", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_invalid_value_reaches_the_user_with_the_parameter_name()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => RandomVariableFactory.Create("wall", "lognormal", P(("mean", -3), ("cov", 0.1))));
        Assert.Equal("mean", ex.ParamName);
        Assert.Contains("'wall'", ex.Message, StringComparison.Ordinal);
    }
}
