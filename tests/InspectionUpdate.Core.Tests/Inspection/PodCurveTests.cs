using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using MathNet.Numerics.Distributions;

namespace InspectionUpdate.Tests.Inspection;

public class PodCurveTests
{
    private static readonly double[] Sizes = [0.01, 0.1, 0.3, 0.5, 1.0, 1.7, 2.5, 4.0, 8.0, 20.0, 100.0];

    public static TheoryData<string> AllForms() => new() { "loglogistic", "lognormal", "exponential", "loglogistic-limit-sat", "lognormal-limit", "exponential-sat" };

    private static ParametricPod Make(string key) => key switch
    {
        "loglogistic" => LogLogisticPod.FromMedianAndShape(1.16, 0.9),
        "lognormal" => new CumulativeLognormalPod(Math.Log(2.0), 0.5),
        "exponential" => new ExponentialPod(0.95),
        "loglogistic-limit-sat" => LogLogisticPod.FromMedianAndShape(0.4, 1.43, lowerLimitMm: 0.2, maxPod: 0.95),
        "lognormal-limit" => new CumulativeLognormalPod(Math.Log(1.5), 0.4, lowerLimitMm: 0.5),
        "exponential-sat" => new ExponentialPod(1.2, maxPod: 0.9),
        _ => throw new ArgumentOutOfRangeException(nameof(key)),
    };

    [Theory]
    [InlineData(0.40, 1.43)]
    [InlineData(1.16, 0.90)]
    [Reference("Closed form PoD(a) = 1 − 1/(1 + (a/X₀)^b) written out in the test (common offshore form, from memory)")]
    public void Log_logistic_curve_equals_the_median_and_shape_form(double x0, double b)
    {
        var pod = LogLogisticPod.FromMedianAndShape(x0, b);
        foreach (var a in Sizes)
        {
            var expected = 1 - 1 / (1 + Math.Pow(a / x0, b));
            Assert.Equal(expected, pod.Evaluate(a), 1e-14);
        }
    }

    [Fact]
    [Reference("Closed form: logit PoD = β₀ + β₁ ln a (MIL-HDBK-1823A hit/miss model), inverted in the test")]
    public void Log_logistic_from_log_odds_has_linear_log_odds_in_ln_size()
    {
        var pod = LogLogisticPod.FromLogOdds(-1.5, 2.8);
        foreach (var a in Sizes.Where(a => a < 20))
        {
            var p = pod.Evaluate(a);
            Assert.Equal(-1.5 + 2.8 * Math.Log(a), Math.Log(p / (1 - p)), 1e-9);
        }
    }

    [Fact]
    [Reference("Independent computation in the test: MathNet LogNormal.CDF(μ, σ, a)")]
    public void Cumulative_lognormal_curve_equals_the_lognormal_cdf()
    {
        var pod = new CumulativeLognormalPod(Math.Log(2.0), 0.5);
        foreach (var a in Sizes)
        {
            Assert.Equal(LogNormal.CDF(Math.Log(2.0), 0.5, a), pod.Evaluate(a), 1e-13);
        }
    }

    [Fact]
    [Reference("Independent computation in the test: MathNet Exponential.CDF(1/λ, a)")]
    public void Exponential_curve_equals_one_minus_exp_of_minus_size_over_lambda()
    {
        var pod = new ExponentialPod(0.95);
        foreach (var a in Sizes)
        {
            Assert.Equal(Exponential.CDF(1 / 0.95, a), pod.Evaluate(a), 1e-14);
        }
    }

    [Fact]
    [Reference("Definition of the lower detection limit: PoD = 0 below it, the base curve above (common practice, no source)")]
    public void Lower_detection_limit_zeroes_the_curve_below_it_only()
    {
        var pod = new ExponentialPod(1.0, lowerLimitMm: 0.5);
        Assert.Equal(0, pod.Evaluate(0.499));
        Assert.Equal(1 - Math.Exp(-0.5), pod.Evaluate(0.5), 1e-15);
        Assert.Equal(1 - Math.Exp(-2.0), pod.Evaluate(2.0), 1e-15);
        Assert.Equal(1, pod.MissProbability(0.3));
    }

    [Fact]
    [Reference("Definition of saturation: PoD(a) = PoD_max·F(a), so 1 − PoD → 1 − PoD_max for large a (common practice, no source)")]
    public void Saturation_caps_the_curve_and_keeps_the_miss_probability_exact()
    {
        var pod = new ExponentialPod(1.0, maxPod: 0.9);
        Assert.Equal(0.9 * (1 - Math.Exp(-3.0)), pod.Evaluate(3.0), 1e-15);
        Assert.Equal(0.1 + 0.9 * Math.Exp(-50.0), pod.MissProbability(50.0), 1e-16);
        Assert.Throws<ArgumentOutOfRangeException>("p", () => pod.SizeAtPod(0.95));
    }

    [Theory]
    [MemberData(nameof(AllForms))]
    [Reference("Definition: the detectable size has CDF equal to the PoD curve (JCSS PMC Part 1, Annex B)")]
    public void Detectable_size_cdf_equals_the_curve(string key)
    {
        var pod = Make(key);
        var ad = pod.DetectableSize("Ad");
        foreach (var a in Sizes)
        {
            Assert.Equal(pod.Evaluate(a), ad.Cdf(a), 1e-15);
            Assert.Equal(pod.MissProbability(a), ad.Ccdf(a), 1e-15);
            Assert.Equal(1.0, ad.Cdf(a) + ad.Ccdf(a), 1e-14);
        }
    }

    [Theory]
    [MemberData(nameof(AllForms))]
    [Reference("Closed form: x = F⁻¹(Φ(u)) inverts u = Φ⁻¹(F(x)) on the continuous part of the distribution")]
    public void Detectable_size_round_trips_through_standard_normal_space(string key)
    {
        var pod = Make(key);
        var ad = pod.DetectableSize("Ad");
        foreach (var u in new[] { -8.0, -5.0, -2.0, -0.5, 0.0, 0.7, 1.0, 3.0 })
        {
            var x = ad.FromStandardNormal(u);
            if (x <= pod.LowerLimitMm || x >= ParametricPod.NeverDetectedSizeMm)
            {
                continue; // an atom: many u map to the same size
            }

            Assert.Equal(u, ad.ToStandardNormal(x), 1e-8);
        }
    }

    [Fact]
    [Reference("Abramowitz & Stegun (1964) Table 26.1; Q(8) = 6.22096057427178e−16 in docs/references.md [derived]")]
    public void Cumulative_lognormal_detectable_size_is_accurate_in_both_tails()
    {
        var ad = new CumulativeLognormalPod(0, 1).DetectableSize("Ad");
        Assert.Equal(6.22096057427178e-16, ad.Ccdf(Math.Exp(8)), 1e-25);
        Assert.Equal(6.22096057427178e-16, ad.Cdf(Math.Exp(-8)), 1e-25);
        Assert.Equal(Math.Exp(8), ad.FromStandardNormal(8), 1e-9 * Math.Exp(8));
        Assert.Equal(-8, ad.ToStandardNormal(Math.Exp(-8)), 1e-10);
    }

    [Fact]
    [Reference("Closed form: Λ(−z) = e^−z/(1 + e^−z) for the log-logistic upper tail, z = (ln a − μ)/σ")]
    public void Log_logistic_detectable_size_is_accurate_in_both_tails()
    {
        var pod = new LogLogisticPod(0, 0.5);
        var ad = pod.DetectableSize("Ad");
        var z = 40.0;
        var expected = Math.Exp(-z) / (1 + Math.Exp(-z));
        Assert.Equal(expected, ad.Ccdf(Math.Exp(0.5 * z)), expected * 1e-12);
        Assert.Equal(expected, ad.Cdf(Math.Exp(-0.5 * z)), expected * 1e-12);
        // u = ±8: the quantiles must invert Φ(±8) without cancellation.
        var q = StandardNormal.Ccdf(8);
        var upper = Math.Exp(0.5 * Math.Log((1 - q) / q));
        Assert.Equal(upper, ad.FromStandardNormal(8), upper * 1e-10);
        Assert.Equal(1 / upper, ad.FromStandardNormal(-8), 1e-10 / upper);
    }

    [Fact]
    [Reference("Closed form: exponential quantiles −λ ln(1 − p) and −λ ln q")]
    public void Exponential_detectable_size_is_accurate_in_both_tails()
    {
        var ad = new ExponentialPod(2.0).DetectableSize("Ad");
        var q = StandardNormal.Ccdf(8);
        Assert.Equal(-2.0 * Math.Log(q), ad.FromStandardNormal(8), 1e-12);
        Assert.Equal(2.0 * q, ad.FromStandardNormal(-8), 1e-27); // −λ ln(1 − q) ≈ λq for tiny q
        Assert.Equal(1e-20 / 2.0, ad.Cdf(1e-20), 1e-36);
    }

    [Fact]
    [Reference("Closed forms: lognormal mean e^(μ+σ²/2); log-logistic mean e^μ πσ/sin(πσ); exponential mean λ")]
    public void Detectable_size_moments_match_closed_forms()
    {
        var ln = new CumulativeLognormalPod(0.3, 0.4).DetectableSize("Ad");
        Assert.Equal(Math.Exp(0.3 + 0.08), ln.Mean, 1e-12);
        Assert.Equal(Math.Exp(0.38) * Math.Sqrt(Math.Exp(0.16) - 1), ln.StandardDeviation, 1e-12);
        var ll = new LogLogisticPod(0.2, 0.3).DetectableSize("Ad");
        Assert.Equal(Math.Exp(0.2) * Math.PI * 0.3 / Math.Sin(Math.PI * 0.3), ll.Mean, 1e-12);
        Assert.Equal(double.PositiveInfinity, new LogLogisticPod(0, 1.1).DetectableSize("Ad").Mean);
        Assert.Equal(double.PositiveInfinity, new LogLogisticPod(0, 0.7).DetectableSize("Ad").StandardDeviation);
    }

    [Fact]
    [Reference("Closed form: E[A_d] = a₀(1 − e^(−a₀/λ)) + e^(−a₀/λ)(a₀ + λ) for an exponential PoD clipped at a₀")]
    public void Detectable_size_mean_with_a_lower_limit_counts_the_atom_at_the_limit()
    {
        const double lambda = 1.3, a0 = 0.4;
        var ad = new ExponentialPod(lambda, lowerLimitMm: a0).DetectableSize("Ad");
        var expected = a0 * (1 - Math.Exp(-a0 / lambda)) + Math.Exp(-a0 / lambda) * (a0 + lambda);
        Assert.Equal(expected, ad.Mean, 1e-8);
        Assert.Equal(a0, ad.InverseCdf(0.1));
    }

    [Fact]
    [Reference("Definition in ParametricPod: the never-detected mass 1 − PoD_max sits at NeverDetectedSizeMm")]
    public void Saturating_curve_places_the_never_detected_mass_at_the_far_size()
    {
        var pod = new CumulativeLognormalPod(Math.Log(2.0), 0.5, maxPod: 0.9);
        var ad = pod.DetectableSize("Ad");
        Assert.Equal(ParametricPod.NeverDetectedSizeMm, ad.InverseCdf(0.95));
        Assert.Equal(ParametricPod.NeverDetectedSizeMm, ad.FromStandardNormal(3.0));
        Assert.Equal(1.0, ad.Cdf(ParametricPod.NeverDetectedSizeMm));
        Assert.Equal(0.9, ad.Cdf(1e5), 1e-15);
        var renormalized = pod.DetectableSizeWhenDetectable("Ad*");
        Assert.Equal(pod.Evaluate(3.0) / 0.9, renormalized.Cdf(3.0), 1e-15);
    }

    [Fact]
    [Reference("Closed form: a_p = exp(μ + σ Φ⁻¹(p)); Φ⁻¹(0.9) = 1.281551565544601 (docs/references.md, A&S Table 26.1 [derived])")]
    public void Size_at_pod_inverts_the_curve()
    {
        var pod = new CumulativeLognormalPod(Math.Log(2.0), 0.5);
        Assert.Equal(2.0 * Math.Exp(0.5 * 1.281551565544601), pod.SizeAtPod(0.9), 1e-12);
        var ll = LogLogisticPod.FromMedianAndShape(1.16, 0.9, maxPod: 0.95);
        Assert.Equal(0.6, ll.Evaluate(ll.SizeAtPod(0.6)), 1e-13);
    }

    [Fact]
    [Reference("Total probability: P(indication | a) = PoD(a) + (1 − PoD(a))·P_fc")]
    public void Indication_probability_adds_false_calls_to_misses()
    {
        var pod = new ExponentialPod(1.0, falseCallProbability: 0.05);
        var p = 1 - Math.Exp(-0.7);
        Assert.Equal(p + (1 - p) * 0.05, pod.IndicationProbability(0.7), 1e-15);
        Assert.Equal(0.05, pod.IndicationProbability(0), 1e-15);
    }

    [Fact]
    [Reference("Validation at the public boundary (STYLE.md): the exception names the parameter")]
    public void Invalid_parameters_are_refused_naming_the_parameter()
    {
        Assert.Throws<ArgumentOutOfRangeException>("sigmaLn", () => new LogLogisticPod(0, 0));
        Assert.Throws<ArgumentOutOfRangeException>("muLnMm", () => new CumulativeLognormalPod(double.NaN, 1));
        Assert.Throws<ArgumentOutOfRangeException>("lambdaMm", () => new ExponentialPod(-1));
        Assert.Throws<ArgumentOutOfRangeException>("maxPod", () => new ExponentialPod(1, maxPod: 1.2));
        Assert.Throws<ArgumentOutOfRangeException>("lowerLimitMm", () => new ExponentialPod(1, lowerLimitMm: -0.1));
        Assert.Throws<ArgumentOutOfRangeException>("falseCallProbability", () => new ExponentialPod(1, falseCallProbability: 1));
        Assert.Throws<ArgumentOutOfRangeException>("beta1", () => LogLogisticPod.FromLogOdds(1, -2));
    }
}

public class DetectableSizeInFormTests
{
    // With one input, FORM is exact: P(A_d ≤ a₀) = PoD(a₀), so β = −Φ⁻¹(PoD(a₀)) for the limit state g = A_d − a₀.
    [Theory]
    [InlineData(0.05)]
    [InlineData(1.16)]
    [InlineData(6.0)]
    [Reference("Closed form: one-variable FORM is exact, β = −Φ⁻¹(P_f); the detectable size has CDF PoD (JCSS PMC Part 1, Annex B)")]
    public void Form_on_the_detectable_size_reproduces_the_pod_in_both_tails(double sizeMm)
    {
        var pod = LogLogisticPod.FromMedianAndShape(1.16, 1.43);
        var model = new InspectionUpdate.Probability.StochasticModel([pod.DetectableSize("Ad")]);
        var problem = new InspectionUpdate.Reliability.ReliabilityProblem(model, new InspectionUpdate.Reliability.LimitState("Ad-a0", x => x[0] - sizeMm));
        var result = InspectionUpdate.Reliability.FormSolver.Solve(problem);
        Assert.True(result.Converged, result.Diagnostic);
        var expected = -InspectionUpdate.Probability.StandardNormal.InverseCdf(pod.Evaluate(sizeMm));
        Assert.Equal(expected, result.Beta, 1e-6);
    }
}
