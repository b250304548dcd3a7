using InspectionUpdate.Degradation.Fatigue;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Degradation;

public class ParisLawTests
{
    private const double C = 5.21e-13, M = 3, Y = 1.12, S = 100;

    // Closed form written out for m = 3: N = (a0^(-1/2) − a1^(-1/2)) / ((1/2)·C·Y³·π^(3/2)·Δσ³).
    private static double HandCycles(double a0, double a1) =>
        (1 / Math.Sqrt(a0) - 1 / Math.Sqrt(a1)) / (0.5 * C * Math.Pow(Y, 3) * Math.Pow(Math.PI, 1.5) * Math.Pow(S, 3));

    [Fact]
    [Reference("docs/references.md Paris check value (derived): N(0.5 → 20 mm) = 5.842272e5 cycles; closed form recomputed in the test")]
    public void Cycles_from_half_a_millimetre_to_twenty_match_the_check_value_and_the_hand_closed_form()
    {
        var n = ParisLaw.CyclesToGrow(0.5, 20, C, M, Y, S);
        Assert.Equal(HandCycles(0.5, 20), n, 1e-9 * n);
        Assert.Equal(5.842272e5, n, 0.5); // printed to 7 significant figures
    }

    [Fact]
    [Reference("docs/references.md Paris check value (derived): a(1e5) = 0.682538 mm; closed form recomputed in the test")]
    public void Depth_after_one_hundred_thousand_cycles_matches_the_check_value_and_the_hand_closed_form()
    {
        var a = ParisLaw.DepthAfterCycles(0.5, C, M, Y, S, 1e5);
        // a = (a0^(-1/2) − (1/2)·K·N)^(-2), K = C·Y³·π^(3/2)·Δσ³.
        var k = C * Math.Pow(Y, 3) * Math.Pow(Math.PI, 1.5) * Math.Pow(S, 3);
        var hand = Math.Pow(1 / Math.Sqrt(0.5) - 0.5 * k * 1e5, -2);
        Assert.Equal(hand, a, 1e-12);
        Assert.Equal(0.682538, a, 5e-7);
    }

    [Fact]
    [Reference("Closed form for m = 2: a(N) = a0·exp(C·Y²·π·Δσ²·N) (JCSS PMC Part 1, Annex B form)")]
    public void Exponent_two_uses_the_exponential_closed_form()
    {
        var a = ParisLaw.DepthAfterCycles(0.5, 1e-9, 2, 1.0, 50, 1e5);
        Assert.Equal(0.5 * Math.Exp(1e-9 * Math.PI * 2500 * 1e5), a, 1e-12);
    }

    [Fact]
    public void Unstable_growth_beyond_the_bracket_returns_infinity()
    {
        var nInfinite = 2 / Math.Sqrt(0.5) / (C * Math.Pow(Y, 3) * Math.Pow(Math.PI, 1.5) * 1e6); // bracket reaches zero
        Assert.True(double.IsPositiveInfinity(ParisLaw.DepthAfterCycles(0.5, C, M, Y, S, 1.01 * nInfinite)));
    }

    [Theory]
    [InlineData(1e4)]
    [InlineData(1e5)]
    [InlineData(4e5)]
    [InlineData(5.8e5)]
    [Reference("Closed form of Paris' law (docs/references.md) against the adaptive Dormand–Prince integration of da/dN")]
    public void Ode_integration_reproduces_the_closed_form(double cycles)
    {
        var model = new CrackGrowthModel(Model(D("initialDepth_mm", 0.5), D("thickness_mm", 1000), D("geometryFactor", Y),
            D("stressRange_MPa", S), D("cyclesPerYear", 1), D("parisC", C), D("parisM", M)),
            new CrackGrowthSettings { StressRanges = StressRangeModel.ConstantAmplitude });
        var x = Means(model.Inputs);
        var closed = ParisLaw.DepthAfterCycles(0.5, C, M, Y, S, cycles);
        var ode = model.DepthAfterCyclesByIntegration(x, cycles);
        Assert.Equal(closed, ode, 1e-8 * closed);
    }

    [Fact]
    [Reference("A table with the same Y everywhere must give the constant-Y closed form N(0.5 → 20 mm) (docs/references.md check value)")]
    public void Quadrature_with_a_flat_geometry_table_reproduces_the_closed_form_cycles()
    {
        var flat = GeometryFunction.Tabulated([0.0, 0.3, 1.0], [Y, Y, Y]);
        var model = new CrackGrowthModel(Model(D("initialDepth_mm", 0.5), D("criticalDepth_mm", 20), D("thickness_mm", 40),
            D("stressRange_MPa", S), D("cyclesPerYear", 1), D("parisC", C), D("parisM", M)),
            new CrackGrowthSettings { StressRanges = StressRangeModel.ConstantAmplitude, Geometry = flat });
        Assert.False(model.HasClosedForm);
        Assert.Equal(HandCycles(0.5, 20), model.CyclesToCritical(Means(model.Inputs)), 1e-9 * 5.842272e5);
    }

    [Theory]
    [InlineData(0.2, 3e5)]
    [InlineData(0.5, 1e5)]
    [InlineData(1.0, 1e4)]
    [Reference("Continuity of the closed form in m (the general power formula at m = 3 ± 1e-9 against the square-root form used at m = 3)")]
    public void The_square_root_form_at_m_three_joins_the_general_formula_on_both_sides(double a0, double cycles)
    {
        var at = ParisLaw.DepthAfterCycles(a0, C, 3, Y, S, cycles);
        foreach (var m in new[] { 3 - 1e-9, 3 + 1e-9 })
        {
            var near = ParisLaw.DepthAfterCycles(a0, C, m, Y, S, cycles);
            Assert.Equal(near, at, 1e-6 * near);
            var n = ParisLaw.CyclesToGrow(a0, 20, C, m, Y, S);
            Assert.Equal(n, ParisLaw.CyclesToGrow(a0, 20, C, 3, Y, S), 1e-6 * n);
        }
    }
}
