using InspectionUpdate.Degradation.Fatigue;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Degradation;

public class MinerModelTests
{
    public static TheoryData<string> PresetKeys => new(SnCurve.Presets.Keys);

    [Theory]
    [MemberData(nameof(PresetKeys))]
    [Reference("DNV-RP-C203 air curves (from memory): both segments must give the same range at 10^7 cycles")]
    public void Preset_curves_are_internally_consistent(string key)
    {
        var c = SnCurve.Presets[key];
        Assert.Empty(c.Problems());
        var s1 = Math.Pow(10, (c.Log10A1 - 7) / c.M1);
        var s2 = Math.Pow(10, (c.Log10A2 - 7) / c.M2);
        Assert.Equal(s1, s2, 2e-3 * s1);
    }

    [Fact]
    [Reference("DNV-RP-C203 D curve (from memory, docs/references.md): 52.63 MPa at 10^7 cycles")]
    public void Curve_d_gives_its_fatigue_limit_at_ten_million_cycles()
    {
        // The rounded constants put the two segments 0.02 MPa apart at 10^7 (52.64 and 52.62).
        Assert.Equal(52.63, SnCurve.DnvD.TransitionRangeMPa, 0.02);
    }

    [Theory]
    [InlineData(100.0, 25.0)]
    [InlineData(30.0, 25.0)]
    [InlineData(100.0, 40.0)]
    [Reference("S–N equation log N = log ā − m log(Δσ (t/t_ref)^k) written out (DNV-RP-C203 form)")]
    public void Constant_amplitude_life_follows_the_curve_equation(double range, double thickness)
    {
        var c = SnCurve.DnvD;
        var s = range * (thickness > 25 ? Math.Pow(thickness / 25, 0.20) : 1);
        var n = s >= 52.63 ? Math.Pow(10, 12.164 - 3 * Math.Log10(s)) : Math.Pow(10, 15.606 - 5 * Math.Log10(s));
        Assert.Equal(n, c.CyclesToFailure(range, thickness), 2e-3 * n);
        var model = new MinerModel(Model(Ln("minerSum", 1.0, 0.3), D("thickness_mm", thickness), D("cyclesPerYear", 1e5), D("stressRange_MPa", range)),
            new MinerSettings { StressRanges = StressRangeModel.ConstantAmplitude });
        var x = new[] { 1.0, thickness, 1e5, range };
        var exact = c.CyclesToFailure(range, thickness) / 1e5;
        Assert.Equal(exact, model.LifeYears(x), 1e-9 * exact);
        Assert.Equal(0, model.Margin(x, exact), 1e-10);
    }

    [Fact]
    [Reference("Miner damage per cycle E[1/N(Δσ)] with Weibull ranges: DNV-RP-C203 incomplete-gamma closed form against MathNet integration of f(s)/N(s)")]
    public void Weibull_damage_matches_numerical_integration_over_the_density()
    {
        const double q = 9, h = 0.85, t = 32;
        var model = new MinerModel(Model(Ln("minerSum", 1.0, 0.3), D("thickness_mm", t), D("cyclesPerYear", 4e6), D("weibullScale_MPa", q), D("weibullShape", h)));
        var c = SnCurve.DnvD;
        var w = new Weibull(h, q);
        // Split at the slope change (in terms of the nominal range, before the thickness correction).
        var split = c.TransitionRangeMPa / c.ThicknessFactor(t);
        var expected = Integrate.DoubleExponential(s => w.Density(s) / c.CyclesToFailure(s, t), 1e-9, split, 1e-13)
            + Integrate.DoubleExponential(s => w.Density(s) / c.CyclesToFailure(s, t), split, 60 * q, 1e-13);
        var actual = model.DamagePerCycle([1, t, 4e6, q, h]);
        Assert.Equal(expected, actual, 1e-6 * expected);
    }

    [Fact]
    public void Margin_gradient_matches_central_differences()
    {
        var model = new MinerModel(Model(Ln("minerSum", 1.0, 0.3), N("log10LifeOffset", 0.2, 0.2), D("thickness_mm", 32), Ln("cyclesPerYear", 4e6, 0.1),
            Ln("weibullScale_MPa", 9, 0.2), N("weibullShape", 0.85, 0.05)));
        var x = Means(model.Inputs);
        var g = new double[x.Length];
        var v = model.MarginWithGradient(x, 20, g);
        Assert.Equal(model.Margin(x, 20), v, 1e-12);
        AssertGradientMatches(g, NumericGradient(y => model.Margin(y, 20), x), 1e-5);
    }

    [Fact]
    public void Inconsistent_custom_curve_is_refused_with_both_ranges()
    {
        var bad = SnCurve.DnvD with { Log10A2 = 16.0 };
        var e = Assert.Throws<ArgumentException>(() => new MinerModel(Model(Ln("minerSum", 1, 0.3), D("cyclesPerYear", 1), D("weibullScale_MPa", 9), D("weibullShape", 1)),
            new MinerSettings { Curve = bad }));
        Assert.Contains("do not meet", e.Message);
    }
}
