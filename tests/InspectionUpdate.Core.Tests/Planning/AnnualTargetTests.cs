using InspectionUpdate.Planning;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Planning;

public class AnnualTargetTests
{
    [Theory]
    [InlineData(double.NaN)]
    [InlineData(0.0)]
    [InlineData(-1e-4)]
    [InlineData(0.5)]
    [InlineData(double.PositiveInfinity)]
    public void Rejects_an_annual_pf_outside_zero_to_one_half_naming_the_field(double pf)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => AnnualTarget.FromAnnualPf(pf, AnnualMeasure.IntervalPf));
        Assert.Equal("annualPf", e.ParamName);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(0.0)]
    [InlineData(-3.7)]
    [InlineData(double.PositiveInfinity)]
    public void Rejects_a_non_positive_or_non_finite_beta_naming_the_field(double beta)
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => AnnualTarget.FromAnnualBeta(beta, AnnualMeasure.Hazard));
        Assert.Equal("annualBeta", e.ParamName);
    }

    [Fact]
    public void Rejects_an_undefined_measure_and_an_empty_source()
    {
        Assert.Equal("measure", Assert.Throws<ArgumentOutOfRangeException>(() => AnnualTarget.FromAnnualPf(1e-4, (AnnualMeasure)7)).ParamName);
        Assert.Equal("source", Assert.Throws<ArgumentException>(() => AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf, " ")).ParamName);
    }

    [Fact]
    [Reference("docs/references.md, normal distribution [derived]: β for Pf = 1e-4 is 3.719016")]
    public void Beta_and_pf_are_the_two_faces_of_one_target()
    {
        var fromPf = AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf);
        Assert.Equal(3.719016, fromPf.AnnualBeta, 1e-6);
        var fromBeta = AnnualTarget.FromAnnualBeta(3.719016, AnnualMeasure.IntervalPf);
        Assert.Equal(1e-4, fromBeta.AnnualPf, 1e-4 * 1e-5);
        Assert.Equal("user value", fromPf.Source);
        Assert.Contains("ΔPf", fromPf.Describe(), StringComparison.Ordinal);
        Assert.Contains("hazard", AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.Hazard).Describe(), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(3.8, 50.0)]
    [InlineData(4.7, 1.0)]
    [InlineData(3.1, 10.0)]
    [Reference("Φ(β_n) = Φ(β₁)ⁿ for independent years (JCSS Probabilistic Model Code Part 1, §7, via ISO 2394 practice): checked by raising the annual Φ(β₁) to the n-th power in the test")]
    public void Reference_period_beta_converts_to_an_annual_target(double beta, double years)
    {
        var t = AnnualTarget.FromReferencePeriodBeta(beta, years, AnnualMeasure.Hazard);
        var backToPeriod = Math.Pow(StandardNormal.Cdf(t.AnnualBeta), years);
        Assert.Equal(StandardNormal.Cdf(beta), backToPeriod, 1e-12);
        Assert.Contains("converted to one year", t.Source, StringComparison.Ordinal);
    }

    [Fact]
    public void Reference_period_shorter_than_a_year_is_rejected()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => AnnualTarget.FromReferencePeriodBeta(3.8, 0.5, AnnualMeasure.Hazard));
        Assert.Equal("referencePeriodYears", e.ParamName);
    }
}
