using InspectionUpdate.Degradation.Fatigue;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Degradation;

public class WeibullStressRangesTests
{
    // E[Δσ^m] by direct numerical integration of s^m·f(s) with MathNet's Weibull density, in z = (s/q)^h so the
    // integrand e^(−z)·(q z^(1/h))^m is smooth even for h < 1.
    private static double IntegratedMoment(double q, double h, double m, double lo = 0, double hi = double.PositiveInfinity)
    {
        var weibull = new Weibull(h, q);
        Assert.Equal(q, weibull.Scale);
        var zLo = lo <= 0 ? 0 : Math.Pow(lo / q, h);
        var zHi = double.IsPositiveInfinity(hi) ? 200 : Math.Pow(hi / q, h);
        return Integrate.DoubleExponential(z => Math.Exp(-z) * Math.Pow(q * Math.Pow(z, 1 / h), m), zLo, zHi, 1e-12);
    }

    [Theory]
    [InlineData(10.0, 0.8, 3.0)]
    [InlineData(12.5, 1.0, 3.0)]
    [InlineData(8.0, 1.1, 5.1)]
    [InlineData(20.0, 0.9, 2.88)]
    [Reference("JCSS PMC Part 3: E[Δσ^m] = q^m Γ(1 + m/h); checked against MathNet numerical integration of s^m f(s)")]
    public void Moment_identity_matches_numerical_integration(double q, double h, double m)
    {
        var expected = IntegratedMoment(q, h, m);
        Assert.Equal(expected, WeibullStressRanges.Moment(q, h, m), 1e-9 * expected);
        // And the density-based check in s, independently of the substitution.
        var w = new Weibull(h, q);
        var direct = Integrate.DoubleExponential(s => Math.Pow(s, m) * w.Density(s), 0, 60 * q, 1e-10);
        Assert.Equal(expected, direct, 1e-6 * expected);
    }

    [Theory]
    [InlineData(10.0, 0.8, 3.0, 25.0)]
    [InlineData(12.5, 1.0, 5.1, 5.0)]
    [Reference("Incomplete-gamma split q^m γ(1+m/h, z) + q^m Γ(1+m/h, z) = q^m Γ(1+m/h); each part against numerical integration")]
    public void Partial_moments_split_at_a_threshold_and_add_up(double q, double h, double m, double threshold)
    {
        var below = WeibullStressRanges.MomentBelow(q, h, m, threshold);
        var above = WeibullStressRanges.MomentAbove(q, h, m, threshold);
        Assert.Equal(IntegratedMoment(q, h, m, 0, threshold), below, 1e-8 * Math.Max(below, 1e-300) + 1e-12);
        Assert.Equal(IntegratedMoment(q, h, m, threshold), above, 1e-8 * above);
        var total = WeibullStressRanges.Moment(q, h, m);
        Assert.Equal(total, below + above, 1e-11 * total);
    }

    [Fact]
    [Reference("Weibull exceedance: P(Δσ > Δσ0) = exp(−(Δσ0/q)^h) = 1/n0 for q = Δσ0/(ln n0)^(1/h)")]
    public void Scale_from_a_reference_range_gives_one_exceedance_in_the_reference_cycles()
    {
        var q = WeibullStressRanges.ScaleFromReferenceRange(300, 1e8, 0.9);
        Assert.Equal(1e-8, Math.Exp(-Math.Pow(300 / q, 0.9)), 1e-20);
    }

    [Fact]
    public void Invalid_scale_is_refused_with_its_name()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => WeibullStressRanges.Moment(-1, 1, 3));
        Assert.Equal("scaleMPa", e.ParamName);
    }
}
