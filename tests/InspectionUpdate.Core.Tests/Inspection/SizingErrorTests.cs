using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Inspection;

public class SizingErrorTests
{
    [Fact]
    [Reference("Definition: a_m = a + ε with ε ~ N(bias, σ) (DESIGN.md §3, sized indication)")]
    public void Additive_error_is_normal_with_the_bias_as_mean()
    {
        var e = SizingError.AdditiveNormal(0.2, 0.5);
        var v = Assert.IsType<NormalVariable>(e.ErrorVariable("eps"));
        Assert.Equal(0.2, v.Mean);
        Assert.Equal(0.5, v.StandardDeviation);
        Assert.Equal(3.0 + 0.4, e.Measured(3.0, 0.4), 1e-15);
    }

    [Fact]
    [Reference("Definition: a_m = a·ε with ln ε ~ N(ln-bias, σ_ln); median of ε is e^(ln-bias)")]
    public void Multiplicative_error_is_lognormal_with_median_exp_of_the_log_bias()
    {
        var e = SizingError.MultiplicativeLognormal(Math.Log(1.1), 0.2);
        var v = Assert.IsType<LognormalVariable>(e.ErrorVariable("eps"));
        Assert.Equal(1.1, v.InverseCdf(0.5), 1e-12);
        Assert.Equal(Math.Log(1.1), v.Lambda, 1e-15);
        Assert.Equal(0.2, v.Zeta);
        Assert.Equal(3.0 * 1.25, e.Measured(3.0, 1.25), 1e-15);
    }

    [Fact]
    [Reference("Validation at the public boundary (STYLE.md)")]
    public void Factories_refuse_bad_parameters_naming_them()
    {
        Assert.Throws<ArgumentOutOfRangeException>("standardDeviationMm", () => SizingError.AdditiveNormal(0, 0));
        Assert.Throws<ArgumentOutOfRangeException>("biasMm", () => SizingError.AdditiveNormal(double.NaN, 1));
        Assert.Throws<ArgumentOutOfRangeException>("lnStandardDeviation", () => SizingError.MultiplicativeLognormal(0, -0.1));
    }
}
