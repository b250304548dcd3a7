using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Probability;

/// <summary>Every kind of invalid parameter gets a DistributionParameterException naming the variable, the parameter and the value.</summary>
[Reference("Validation rules of each family's parameter domain (definitions: σ > 0, shapes > 0, bounds ordered, finite values)")]
public class DistributionParameterTests
{
    public static TheoryData<string, string, Func<RandomVariable>> BadParameters() => new()
    {
        { "normal sd zero", "standardDeviation", () => new NormalVariable("V", 1, 0) },
        { "normal sd negative", "standardDeviation", () => new NormalVariable("V", 1, -2) },
        { "normal mean NaN", "mean", () => new NormalVariable("V", double.NaN, 1) },
        { "normal cov zero", "coefficientOfVariation", () => NormalVariable.FromMeanCov("V", 1, 0) },
        { "lognormal mean zero", "mean", () => LognormalVariable.FromMeanStd("V", 0, 1) },
        { "lognormal mean negative", "mean", () => LognormalVariable.FromMeanCov("V", -1, 0.2) },
        { "lognormal zeta zero", "zeta", () => LognormalVariable.FromLogParameters("V", 0, 0) },
        { "lognormal lambda infinite", "lambda", () => LognormalVariable.FromLogParameters("V", double.PositiveInfinity, 1) },
        { "gumbel scale zero", "scale", () => GumbelVariable.FromParameters("V", 1, 0) },
        { "gumbel sd NaN", "standardDeviation", () => GumbelVariable.FromMeanStd("V", 1, double.NaN) },
        { "weibull shape zero", "shape", () => WeibullVariable.FromParameters("V", 0, 1) },
        { "weibull scale negative", "scale", () => WeibullVariable.FromParameters("V", 2, -1) },
        { "weibull location above mean", "mean", () => WeibullVariable.FromMeanStd("V", 3, 1, location: 5) },
        { "weibull cov unattainable", "standardDeviation", () => WeibullVariable.FromMeanStd("V", 1, 1e-9) },
        { "gamma shape negative", "shape", () => GammaVariable.FromShapeRate("V", -1, 1) },
        { "gamma rate zero", "rate", () => GammaVariable.FromShapeRate("V", 1, 0) },
        { "gamma mean negative", "mean", () => GammaVariable.FromMeanStd("V", -2, 1) },
        { "exponential rate zero", "rate", () => ExponentialVariable.FromParameters("V", 0) },
        { "exponential mean zero", "mean", () => ExponentialVariable.FromMean("V", 0) },
        { "uniform bounds reversed", "upper", () => UniformVariable.FromBounds("V", 3, 1) },
        { "uniform bounds equal", "upper", () => UniformVariable.FromBounds("V", 1, 1) },
        { "uniform lower infinite", "lower", () => UniformVariable.FromBounds("V", double.NegativeInfinity, 1) },
        { "truncated sigma zero", "sigma", () => TruncatedNormalVariable.FromParameters("V", 0, 0, -1, 1) },
        { "truncated bounds reversed", "upper", () => TruncatedNormalVariable.FromParameters("V", 0, 1, 2, 1) },
        { "truncated no finite bound", "upper", () => TruncatedNormalVariable.FromParameters("V", 0, 1, double.NegativeInfinity, double.PositiveInfinity) },
        { "truncated lower NaN", "lower", () => TruncatedNormalVariable.FromParameters("V", 0, 1, double.NaN, 1) },
        { "truncated mean outside bounds", "mean", () => TruncatedNormalVariable.FromMeanStd("V", -1, 1, 0, double.PositiveInfinity) },
        { "truncated sd unattainable", "standardDeviation", () => TruncatedNormalVariable.FromMeanStd("V", 1, 1.2, 0, double.PositiveInfinity) },
        { "truncated interval without mass", "mu", () => TruncatedNormalVariable.FromParameters("V", 0, 1, 50, 51) },
        { "beta shape zero", "shape1", () => BetaVariable.FromParameters("V", 0, 1) },
        { "beta bounds reversed", "upper", () => BetaVariable.FromParameters("V", 1, 1, 2, 1) },
        { "beta mean outside", "mean", () => BetaVariable.FromMeanStd("V", 2, 0.1, 0, 1) },
        { "beta sd too large", "standardDeviation", () => BetaVariable.FromMeanStd("V", 0.5, 0.6, 0, 1) },
        { "deterministic NaN", "value", () => new DeterministicVariable("V", double.NaN) },
    };

    [Theory]
    [MemberData(nameof(BadParameters))]
    public void Invalid_parameter_is_rejected_naming_variable_parameter_and_value(string description, string parameter, Func<RandomVariable> create)
    {
        var ex = Assert.Throws<DistributionParameterException>(create);
        Assert.Equal(parameter, ex.ParamName);
        Assert.Equal("V", ex.VariableName);
        Assert.Contains("'V'", ex.Message, StringComparison.Ordinal);
        Assert.Contains($"'{parameter}'", ex.Message, StringComparison.Ordinal);
        Assert.False(string.IsNullOrEmpty(description));
    }

    [Fact]
    public void The_message_carries_the_offending_value()
    {
        var ex = Assert.Throws<DistributionParameterException>(() => GammaVariable.FromShapeRate("wallLoss_mm", -0.25, 1));
        Assert.Contains("-0.25", ex.Message, StringComparison.Ordinal);
        Assert.Contains("wallLoss_mm", ex.Message, StringComparison.Ordinal);
        Assert.Equal(-0.25, ex.Value);
    }

    [Theory]
    [InlineData(new[] { 1.0, 1.5, 1.5, 1.0 })]
    [InlineData(new[] { 1.0, 0.5, 0.4, 1.0 })]
    [InlineData(new[] { 0.9, 0.5, 0.5, 1.0 })]
    public void A_correlation_matrix_out_of_range_asymmetric_or_without_unit_diagonal_is_rejected(double[] entries)
    {
        var m = new double[,] { { entries[0], entries[1] }, { entries[2], entries[3] } };
        var ex = Assert.Throws<DistributionParameterException>(() => new CorrelationMatrix(m));
        Assert.Equal("correlation", ex.VariableName);
    }

    [Fact]
    public void A_correlation_matrix_that_is_not_positive_definite_is_rejected()
    {
        var m = new double[,] { { 1, 0.9, -0.9 }, { 0.9, 1, 0.9 }, { -0.9, 0.9, 1 } };
        var ex = Assert.Throws<DistributionParameterException>(() => new CorrelationMatrix(m));
        Assert.Equal("matrix", ex.ParamName);
        Assert.Contains("positive definite", ex.Message, StringComparison.Ordinal);
    }
}
