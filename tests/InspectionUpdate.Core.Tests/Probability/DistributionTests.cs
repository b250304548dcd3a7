using InspectionUpdate.Probability;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Probability;

public class DistributionTests
{
    public static TheoryData<string> Cases() => DistributionCases.Names();

    // ---------- Moments ----------

    [Theory]
    [MemberData(nameof(Cases))]
    [Reference("Independent computation in the test: E[X] = ∫ x dF and Var X by composite Gauss–Legendre (MathNet rule) over u, x = F⁻¹(Φ(u))")]
    public void Mean_and_standard_deviation_agree_with_integration_over_the_distribution(string name)
    {
        var v = DistributionCases.All[name]();
        // E[g(X)] = ∫ g(x(u)) φ(u) du: smooth in u for every family, so adaptive quadrature is reliable.
        double X(double u) => v.FromStandardNormal(u);
        var mean = Quadrature.OverStandardNormal(u => X(u));
        var variance = Quadrature.OverStandardNormal(u => (X(u) - mean) * (X(u) - mean));
        var tol = 1e-8 * Math.Max(1, Math.Abs(v.Mean));
        Assert.Equal(mean, v.Mean, tol);
        Assert.Equal(Math.Sqrt(variance), v.StandardDeviation, 1e-7 * v.StandardDeviation);
    }

    [Fact]
    [Reference("Gumbel max: mean u + γβ, sd πβ/√6 (Johnson, Kotz & Balakrishnan, vol. 2, ch. 22; from memory)")]
    public void Gumbel_from_mean_and_sd_recovers_them_through_the_closed_form()
    {
        var g = GumbelVariable.FromMeanStd("X", 150, 45);
        Assert.Equal(150, g.Location + 0.5772156649015329 * g.Scale, 1e-12);
        Assert.Equal(45, Math.PI * g.Scale / Math.Sqrt(6), 1e-12);
        Assert.Equal(150, g.Mean, 1e-12);
        Assert.Equal(45, g.StandardDeviation, 1e-12);
    }

    public static TheoryData<string, double, double> MeanStdRoundTrips() => new()
    {
        { "lognormal", 300, 30 },
        { "gumbel", 150, 45 },
        { "weibull", 7, 2 },
        { "weibull-high-cov", 7, 14 },
        { "weibull-low-cov", 7, 0.01 },
        { "gamma", 5, 2 },
        { "exponential", 3, 1 },
        { "uniform", 5, 1 },
        { "truncated-normal", 1.5, 0.9 },
        { "truncated-normal-two-sided", 1.5, 0.6 },
        { "truncated-normal-near-limit", 1.3, 1.0 },
        { "beta", 2.5, 0.5 },
        { "normal", -4, 0.5 },
    };

    [Theory]
    [MemberData(nameof(MeanStdRoundTrips))]
    [Reference("Definition: a variable built from mean and sd has that mean and sd (moments by closed forms of each family)")]
    public void A_variable_built_from_mean_and_sd_has_that_mean_and_sd(string family, double mean, double sd)
    {
        RandomVariable v = family switch
        {
            "lognormal" => LognormalVariable.FromMeanStd("X", mean, sd),
            "gumbel" => GumbelVariable.FromMeanStd("X", mean, sd),
            "weibull" or "weibull-high-cov" or "weibull-low-cov" => WeibullVariable.FromMeanStd("X", mean, sd),
            "gamma" => GammaVariable.FromMeanStd("X", mean, sd),
            "exponential" => ExponentialVariable.FromMeanStd("X", mean, sd),
            "uniform" => UniformVariable.FromMeanStd("X", mean, sd),
            "truncated-normal" => TruncatedNormalVariable.FromMeanStd("X", mean, sd, 0, double.PositiveInfinity),
            "truncated-normal-two-sided" => TruncatedNormalVariable.FromMeanStd("X", mean, sd, 0, 2.5),
            "truncated-normal-near-limit" => TruncatedNormalVariable.FromMeanStd("X", mean, sd, 0, double.PositiveInfinity),
            "beta" => BetaVariable.FromMeanStd("X", mean, sd, 1, 4),
            _ => new NormalVariable("X", mean, sd),
        };
        Assert.Equal(mean, v.Mean, 1e-9 * Math.Abs(mean));
        Assert.Equal(sd, v.StandardDeviation, 1e-9 * sd);
    }

    [Fact]
    [Reference("Weibull three-parameter: mean ε + λΓ(1 + 1/k), var λ²[Γ(1 + 2/k) − Γ²(1 + 1/k)] (closed form)")]
    public void Three_parameter_Weibull_from_mean_and_sd_keeps_its_location()
    {
        var w = WeibullVariable.FromMeanStd("X", 12, 3, location: 5);
        Assert.Equal(5, w.Location);
        var k = w.Shape;
        Assert.Equal(12, 5 + w.Scale * SpecialFunctions.Gamma(1 + 1 / k), 1e-10);
        var g1 = SpecialFunctions.Gamma(1 + 1 / k);
        Assert.Equal(3, w.Scale * Math.Sqrt(SpecialFunctions.Gamma(1 + 2 / k) - g1 * g1), 1e-9);
    }

    [Fact]
    [Reference("Exponential: mean 1/r, sd 1/r (closed form); a CoV of 1 means no shift")]
    public void Exponential_with_unit_coefficient_of_variation_is_unshifted()
    {
        var e = ExponentialVariable.FromMeanCov("X", 0.11, 1);
        Assert.Equal(0, e.Location, 1e-17);
        Assert.Equal(1 / 0.11, e.Rate, 1e-12);
    }

    // ---------- CDF and PDF against MathNet or closed forms ----------

    public static TheoryData<string, double> InteriorPoints()
    {
        var data = new TheoryData<string, double>();
        foreach (var name in DistributionCases.All.Keys)
        {
            foreach (var p in new[] { 0.01, 0.2, 0.5, 0.8, 0.99 }) data.Add(name, p);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(InteriorPoints))]
    [Reference("MathNet.Numerics 5.0.0 distributions (Normal, LogNormal, Weibull, Gamma, Exponential, ContinuousUniform, Beta) or the closed form written out in ReferenceCdf")]
    public void Cdf_and_pdf_agree_with_an_independent_implementation(string name, double probability)
    {
        var v = DistributionCases.All[name]();
        var x = v.InverseCdf(probability);
        var (cdf, pdf) = ReferenceCdfPdf(v, x);
        Assert.Equal(cdf, v.Cdf(x), 1e-12);
        Assert.Equal(1 - cdf, v.Ccdf(x), 1e-12);
        Assert.Equal(pdf, v.Pdf(x), 1e-10 * Math.Max(1, pdf));
        Assert.Equal(probability, v.Cdf(x), 1e-12);
    }

    [Theory]
    [MemberData(nameof(InteriorPoints))]
    [Reference("Independent computation in the test: f = dF/dx by a central difference of the CDF")]
    public void Pdf_is_the_derivative_of_the_cdf(string name, double probability)
    {
        var v = DistributionCases.All[name]();
        var x = v.InverseCdf(probability);
        // Step small against both the spread and the distance to a finite lower bound (densities may be singular there).
        var lowerBound = v.InverseCdf(0);
        var h = 1e-5 * (double.IsFinite(lowerBound) ? Math.Min(v.StandardDeviation, x - lowerBound) : v.StandardDeviation);
        var derivative = (v.Cdf(x + h) - v.Cdf(x - h)) / (2 * h);
        Assert.Equal(derivative, v.Pdf(x), 1e-6 * Math.Max(v.Pdf(x), 1 / v.StandardDeviation));
    }

    private static (double Cdf, double Pdf) ReferenceCdfPdf(RandomVariable v, double x) => v switch
    {
        NormalVariable n => (Normal.CDF(n.Mean, n.StandardDeviation, x), Normal.PDF(n.Mean, n.StandardDeviation, x)),
        LognormalVariable l => (LogNormal.CDF(l.Lambda, l.Zeta, x), LogNormal.PDF(l.Lambda, l.Zeta, x)),
        // Gumbel max: F = exp(−e^{−y}), f = e^{−y − e^{−y}}/β with y = (x − u)/β (closed form; MathNet has no Gumbel).
        GumbelVariable g => (Math.Exp(-Math.Exp(-(x - g.Location) / g.Scale)),
            Math.Exp(-(x - g.Location) / g.Scale - Math.Exp(-(x - g.Location) / g.Scale)) / g.Scale),
        WeibullVariable w => (Weibull.CDF(w.Shape, w.Scale, x - w.Location), Weibull.PDF(w.Shape, w.Scale, x - w.Location)),
        GammaVariable g => (Gamma.CDF(g.Shape, g.Rate, x), Gamma.PDF(g.Shape, g.Rate, x)),
        ExponentialVariable e => (Exponential.CDF(e.Rate, x - e.Location), Exponential.PDF(e.Rate, x - e.Location)),
        UniformVariable u => (ContinuousUniform.CDF(u.Lower, u.Upper, x), ContinuousUniform.PDF(u.Lower, u.Upper, x)),
        // Truncated normal: F = [Φ(ξ) − Φ(α)]/[Φ(β) − Φ(α)], f = φ(ξ)/(σZ) (closed form with MathNet's Normal),
        // written with upper tails Q(·) = Φ(−·) when the interval lies above the parent mean, to avoid cancellation.
        TruncatedNormalVariable t when t.Lower >= t.Mu => (
            (Q(t, t.Lower) - Q(t, x)) / (Q(t, t.Lower) - Q(t, t.Upper)),
            Normal.PDF(t.Mu, t.Sigma, x) / (Q(t, t.Lower) - Q(t, t.Upper))),
        TruncatedNormalVariable t => (
            (Normal.CDF(t.Mu, t.Sigma, x) - Normal.CDF(t.Mu, t.Sigma, t.Lower)) / (Normal.CDF(t.Mu, t.Sigma, t.Upper) - Normal.CDF(t.Mu, t.Sigma, t.Lower)),
            Normal.PDF(t.Mu, t.Sigma, x) / (Normal.CDF(t.Mu, t.Sigma, t.Upper) - Normal.CDF(t.Mu, t.Sigma, t.Lower))),
        BetaVariable b => (BetaScaled.CDF(b.Shape1, b.Shape2, b.Lower, b.Upper - b.Lower, x), BetaScaled.PDF(b.Shape1, b.Shape2, b.Lower, b.Upper - b.Lower, x)),
        _ => throw new InvalidOperationException(v.Family),
    };

    private static double Q(TruncatedNormalVariable t, double x) => Normal.CDF(-t.Mu, t.Sigma, -x);

    // ---------- Tails ----------

    public static TheoryData<string, double> TailProbabilities()
    {
        var data = new TheoryData<string, double>();
        foreach (var name in DistributionCases.All.Keys)
        {
            foreach (var p in new[] { 1e-15, 1e-10, 1e-5 }) data.Add(name, p);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(TailProbabilities))]
    [Reference("Identities F(F⁻¹(p)) = p and Q(Q⁻¹(q)) = q; tolerance 1e-9 relative covers the condition number |x f/F|·ε of each family")]
    public void Inverse_round_trips_in_both_tails_with_relative_accuracy(string name, double p)
    {
        var v = DistributionCases.All[name]();
        var lower = v.InverseCdf(p);
        Assert.Equal(p, v.Cdf(lower), Tolerance(v, lower, p));
        var upper = v.InverseCcdf(p);
        Assert.Equal(p, v.Ccdf(upper), Tolerance(v, upper, p));

        // At 1 − p the inverse CDF switches to the upper tail: 1 − (1 − p) is the exact complement it sees.
        var complement = 1 - (1 - p);
        var nearOne = v.InverseCdf(1 - p);
        Assert.Equal(complement, v.Ccdf(nearOne), Tolerance(v, nearOne, complement));
        Assert.Equal(1 - p, v.Cdf(nearOne), 1e-15 + Tolerance(v, nearOne, complement));
        var nearZero = v.InverseCcdf(1 - p);
        Assert.Equal(complement, v.Cdf(nearZero), Tolerance(v, nearZero, complement));
    }

    /// <summary>
    /// 1e−9 relative, plus what rounding x to a double costs: ε|x|·f(x). Near a bound away from 0 (a uniform on
    /// [2, 5] at F = 1e−15) the double x itself cannot resolve the tail probability better than that.
    /// </summary>
    private static double Tolerance(RandomVariable v, double x, double probability)
    {
        var f = v.Pdf(x);
        return 1e-9 * probability + 4 * 2.220446049250313e-16 * Math.Abs(x) * (double.IsFinite(f) ? f : double.MaxValue);
    }

    [Theory]
    [MemberData(nameof(TailProbabilities))]
    [Reference("Identity u = Φ⁻¹(F(x(u))); tolerance from the conditioning: rounding x by ε|x| moves u by ε|x|·f(x)/φ(u)")]
    public void Standard_normal_mapping_round_trips_in_both_tails(string name, double p)
    {
        var v = DistributionCases.All[name]();
        foreach (var u in new[] { StandardNormal.InverseCdf(p), StandardNormal.InverseCcdf(p) })
        {
            var x = v.FromStandardNormal(u);
            var resolution = 4 * 2.220446049250313e-16 * Math.Abs(x) * v.Pdf(x);
            if (v.Cdf(x) == 0 || v.Ccdf(x) == 0)
            {
                // x rounded onto a bound of the support: only acceptable where a double cannot resolve p there.
                Assert.True(p < resolution, $"x = {x:R} sits on a bound although p = {p:R} exceeds the resolution {resolution:G3}");
                continue;
            }

            var tolerance = 1e-12 * Math.Abs(u) + resolution / StandardNormal.Pdf(u);
            Assert.Equal(u, v.ToStandardNormal(x), tolerance);
        }
    }

    [Fact]
    [Reference("Weibull lower tail: F ≈ (x/λ)^k for small x (series of 1 − e^{−z}); closed form")]
    public void Weibull_lower_tail_keeps_relative_precision_where_one_minus_exp_would_cancel()
    {
        var w = WeibullVariable.FromParameters("X", 2, 3);
        var x = 3e-9;
        Assert.Equal(1e-18, w.Cdf(x), 1e-30);
    }

    [Fact]
    [Reference("Gamma with shape 2, rate 1: Q(2, y) = (1 + y)e^{−y} (closed form of the upper incomplete gamma for integer shape)")]
    public void Gamma_upper_tail_inverse_matches_the_integer_shape_closed_form()
    {
        var g = GammaVariable.FromShapeRate("X", 2, 1);
        var y = g.InverseCcdf(1e-15);
        Assert.Equal(1e-15, (1 + y) * Math.Exp(-y), 1e-15 * 1e-12);
    }

    [Fact]
    [Reference("Truncated normal at its lower bound a: F(a + d) ≈ φ(α)d/(σZ) for small d (first-order Taylor term)")]
    public void Truncated_normal_cdf_is_accurate_just_above_a_bound_in_the_body_of_the_parent()
    {
        var t = TruncatedNormalVariable.FromParameters("X", 1, 2, 0, double.PositiveInfinity);
        var d = 1e-12;
        var alpha = -0.5;
        var expected = StandardNormal.Pdf(alpha) * d / 2 / t.ParentProbability;
        Assert.Equal(expected, t.Cdf(d), expected * 1e-9);
        Assert.Equal(d, t.InverseCdf(expected), d * 1e-9);
    }

    [Fact]
    [Reference("Deterministic variable: point mass (definition)")]
    public void Deterministic_variable_is_a_point_mass_without_spread()
    {
        var d = new DeterministicVariable("D", 4.2);
        Assert.True(d.IsDeterministic);
        Assert.Equal(4.2, d.Mean);
        Assert.Equal(0, d.StandardDeviation);
        Assert.Equal(0, d.Cdf(4.1));
        Assert.Equal(1, d.Cdf(4.2));
        Assert.Equal(4.2, d.InverseCdf(1e-15));
        Assert.Equal(4.2, d.InverseCcdf(0.3));
    }

    [Theory]
    [MemberData(nameof(Cases))]
    [Reference("Domain of a probability: [0, 1] (definition)")]
    public void Inverse_rejects_a_probability_outside_the_unit_interval(string name)
    {
        var v = DistributionCases.All[name]();
        Assert.Equal("p", Assert.Throws<ArgumentOutOfRangeException>(() => v.InverseCdf(1.5)).ParamName);
        Assert.Equal("p", Assert.Throws<ArgumentOutOfRangeException>(() => v.InverseCdf(double.NaN)).ParamName);
        Assert.Throws<ArgumentOutOfRangeException>(() => v.InverseCcdf(-0.5));
    }
}
