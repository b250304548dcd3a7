using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Probability;
using MathNet.Numerics;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Degradation;

public class CrackGrowthModelTests
{
    internal static StochasticModel SixInputWeibull() => Model(
        Ln("initialDepth_mm", 0.15, 0.66),   // JCSS PMC Part 3 initial depth (read)
        N("criticalDepth_mm", 20, 1),
        D("thickness_mm", 25),
        Ln("geometryFactor", 1.12, 0.1),
        Ln("weibullScale_MPa", 8, 0.2),
        D("weibullShape", 0.9),
        Ln("cyclesPerYear", 5e6, 0.1),
        Ln("parisC", 5.21e-13, 0.6),
        D("parisM", 3));

    [Fact]
    public void Closed_form_margin_gradient_matches_central_differences()
    {
        var model = new CrackGrowthModel(SixInputWeibull());
        Assert.True(model.HasClosedForm);
        var x = Means(model.Inputs);
        foreach (var t in new[] { 0.5, 5.0, 30.0 })
        {
            var g = new double[x.Length];
            var value = model.MarginWithGradient(x, t, g);
            Assert.Equal(model.Margin(x, t), value, 1e-12);
            AssertGradientMatches(g, NumericGradient(v => model.Margin(v, t), x), 1e-6);
        }
    }

    [Fact]
    public void Gradient_with_respect_to_the_exponent_and_shape_matches_central_differences()
    {
        var model = new CrackGrowthModel(Model(Ln("initialDepth_mm", 0.15, 0.66), D("thickness_mm", 25), D("geometryFactor", 1.12),
            Ln("weibullScale_MPa", 8, 0.2), N("weibullShape", 0.9, 0.05), D("cyclesPerYear", 5e6), Ln("parisC", 5.21e-13, 0.6), N("parisM", 3.1, 0.1)));
        var x = Means(model.Inputs);
        var g = new double[x.Length];
        model.MarginWithGradient(x, 10, g);
        AssertGradientMatches(g, NumericGradient(v => model.Margin(v, 10), x), 1e-6);
    }

    [Fact]
    [Reference("Failure ⇔ a(t) ≥ a_c: the log-cycle margin is zero exactly where the closed-form depth reaches a_c")]
    public void Margin_changes_sign_where_the_depth_reaches_the_critical_depth()
    {
        var model = new CrackGrowthModel(SixInputWeibull());
        var x = Means(model.Inputs);
        var nc = model.CyclesToCritical(x);
        var nu = x[model.Inputs.IndexOf("cyclesPerYear")];
        var tc = nc / nu;
        Assert.Equal(0, model.Margin(x, tc), 1e-10);
        Assert.Equal(x[model.Inputs.IndexOf("criticalDepth_mm")], model.DepthAfterCycles(x, nc), 1e-8);
        Assert.True(model.Margin(x, 0.99 * tc) > 0);
        Assert.True(model.Margin(x, 1.01 * tc) < 0);
        Assert.Equal(25.0, model.Size(x, 10 * tc)); // capped at the thickness
    }

    // Independent two-stage check: E[da/dN](a) by integrating the bilinear law over MathNet's Weibull density,
    // then N_c = ∫ da / E[da/dN] by MathNet's adaptive integration; no code shared with the model.
    private static double IndependentCycles(double a0, double ac, double y, double q, double h, double c1, double m1, double c2, double m2, double dkTh)
    {
        var dkTr = Math.Pow(c1 / c2, 1 / (m2 - m1));
        double Law(double dk) => dk < dkTh ? 0 : dk < dkTr ? c1 * Math.Pow(dk, m1) : c2 * Math.Pow(dk, m2);
        double Rate(double a)
        {
            var k = y * Math.Sqrt(Math.PI * a);
            // In z = (s/q)^h the Weibull expectation is ∫ e^(−z) law(k q z^(1/h)) dz; split at the kinks.
            var zTr = Math.Pow(dkTr / k / q, h);
            var zTh = dkTh > 0 ? Math.Pow(dkTh / k / q, h) : 0;
            double F(double z) => Math.Exp(-z) * Law(k * q * Math.Pow(z, 1 / h));
            var cuts = new[] { 0, zTh, zTr, 300 }.Where(z => z >= zTh).Distinct().OrderBy(z => z).ToArray();
            var sum = 0.0;
            for (var i = 0; i + 1 < cuts.Length; i++)
                if (cuts[i + 1] > cuts[i]) sum += Integrate.DoubleExponential(F, cuts[i], cuts[i + 1], 1e-12);
            return sum;
        }

        return Integrate.DoubleExponential(s => Math.Exp(s) / Rate(Math.Exp(s)), Math.Log(a0), Math.Log(ac), 1e-10);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(63.0)]
    [Reference("Two-stage law with the incomplete-gamma split (JCSS PMC Part 3) against independent MathNet integration over the Weibull density; JCSS mean constants A1 = 4.80e-18, m1 = 5.10, A2 = 5.86e-13, m2 = 2.88 (read); ΔK_th = 63 (BS 7910, from memory)")]
    public void Two_stage_cycles_match_independent_integration_over_the_weibull_density(double threshold)
    {
        var vars = new List<RandomVariable>
        {
            D("initialDepth_mm", 0.5), D("criticalDepth_mm", 20), D("thickness_mm", 25), D("geometryFactor", 1.12),
            D("weibullScale_MPa", 15), D("weibullShape", 0.9), D("cyclesPerYear", 1e6),
            D("parisC1", 4.80e-18), D("parisM1", 5.10), D("parisC2", 5.86e-13), D("parisM2", 2.88),
        };
        if (threshold > 0) vars.Add(D("thresholdDeltaK_Nmm", threshold));
        var model = new CrackGrowthModel(new StochasticModel(vars), new CrackGrowthSettings { Law = CrackGrowthLaw.TwoStage, UseThreshold = threshold > 0 });
        var expected = IndependentCycles(0.5, 20, 1.12, 15, 0.9, 4.80e-18, 5.10, 5.86e-13, 2.88, threshold);
        var actual = model.CyclesToCritical(Means(model.Inputs));
        Assert.Equal(expected, actual, 1e-6 * expected);
    }

    [Fact]
    [Reference("BS 7910 two-stage transition for R ≥ 0.5 in air, ΔK ≈ 196 N·mm^-3/2 (from memory), from the intersection (A1/A2)^(1/(m2−m1)) of the JCSS mean laws")]
    public void Two_stage_transition_is_the_intersection_of_the_two_lines()
    {
        var tr = Math.Pow(4.80e-18 / 5.86e-13, 1 / (2.88 - 5.10));
        Assert.Equal(196, tr, 1.0);
        var model = new CrackGrowthModel(Model(D("initialDepth_mm", 0.5), D("thickness_mm", 25), D("geometryFactor", 1.0),
            D("stressRange_MPa", 100), D("cyclesPerYear", 1), D("parisC1", 4.80e-18), D("parisM1", 5.10), D("parisC2", 5.86e-13), D("parisM2", 2.88)),
            new CrackGrowthSettings { Law = CrackGrowthLaw.TwoStage, StressRanges = StressRangeModel.ConstantAmplitude });
        var x = Means(model.Inputs);
        foreach (var a in new[] { 0.5, 1.0, 5.0, 20.0 })
        {
            var dk = 100 * Math.Sqrt(Math.PI * a);
            var expected = dk < tr ? 4.80e-18 * Math.Pow(dk, 5.10) : 5.86e-13 * Math.Pow(dk, 2.88);
            Assert.Equal(expected, model.ExpectedGrowthRate(x, a), 1e-12 * expected);
        }
    }

    [Fact]
    [Reference("Tabulated Y(a/T): N = ∫ da/(C(Y(a/T)Δσ√(πa))^m) by MathNet adaptive integration with the same linear interpolation written out")]
    public void Tabulated_geometry_cycles_and_integrated_depth_agree_with_independent_integration()
    {
        double[] r = [0, 0.2, 0.5, 0.8];
        double[] yv = [1.12, 1.0, 0.9, 1.3];
        var model = new CrackGrowthModel(Model(D("initialDepth_mm", 0.5), D("thickness_mm", 20), D("stressRange_MPa", 100),
            D("cyclesPerYear", 1e5), D("parisC", 5.21e-13), D("parisM", 3)),
            new CrackGrowthSettings { StressRanges = StressRangeModel.ConstantAmplitude, Geometry = GeometryFunction.Tabulated(r, yv) });
        double Y(double ratio)
        {
            if (ratio >= 0.8) return 1.3;
            var j = ratio < 0.2 ? 1 : ratio < 0.5 ? 2 : 3;
            return yv[j - 1] + (ratio - r[j - 1]) / (r[j] - r[j - 1]) * (yv[j] - yv[j - 1]);
        }

        var expected = 0.0;
        double[] cuts = [0.5, 4, 10, 16, 20];
        for (var i = 0; i + 1 < cuts.Length; i++)
            expected += Integrate.DoubleExponential(a => 1 / (5.21e-13 * Math.Pow(Y(a / 20) * 100 * Math.Sqrt(Math.PI * a), 3)), cuts[i], cuts[i + 1], 1e-12);
        var x = Means(model.Inputs);
        var nc = model.CyclesToCritical(x);
        Assert.Equal(expected, nc, 1e-7 * expected);
        // The ODE integration reaches the critical depth (= thickness here) after N_c cycles.
        Assert.Equal(20.0, model.DepthAfterCycles(x, nc), 1e-5);
        Assert.Equal(0, model.Margin(x, nc / 1e5), 1e-7);
    }

    [Fact]
    public void Missing_inputs_for_the_two_stage_law_are_listed()
    {
        var e = Assert.Throws<ArgumentException>(() => new CrackGrowthModel(SixInputWeibull(), new CrackGrowthSettings { Law = CrackGrowthLaw.TwoStage }));
        Assert.Contains("'parisC1'", e.Message);
        Assert.Contains("'parisM2'", e.Message);
        Assert.Contains("'parisC' is not used", e.Message);
    }

    [Fact]
    public void Bad_geometry_tables_name_the_point()
    {
        var e = Assert.Throws<ArgumentException>(() => GeometryFunction.Tabulated([0, 0.5, 0.4], [1, 1, 1]));
        Assert.Contains("point 2", e.Message);
        Assert.Throws<ArgumentException>(() => GeometryFunction.Tabulated([0, 0.5], [1, -1]));
    }
}
