using InspectionUpdate.Degradation.Corrosion;

namespace InspectionUpdate.Tests.Degradation;

public class CorrodedPipeCapacityTests
{
    // docs/references.md check case (derived): D = 508, t = 12.7, SMYS 358, SMTS 455 MPa, d = 5.08, L = 200 mm.
    private const double D = 508, T = 12.7, Smys = 358, Smts = 455, Depth = 5.08, L = 200;

    [Fact]
    [Reference("DNV-RP-F101 single-defect equation (from memory, docs/references.md); check value 18.2768 MPa (derived), formula recomputed here")]
    public void Dnv_rp_f101_matches_the_check_value_and_the_formula_written_out()
    {
        var q = Math.Sqrt(1 + 0.31 * Math.Pow(L / Math.Sqrt(D * T), 2));
        var hand = 2 * T * Smts / (D - T) * (1 - Depth / T) / (1 - Depth / T / q);
        var p = CorrodedPipeCapacity.DnvRpF101(D, T, Smts, Depth, L);
        Assert.Equal(hand, p, 1e-12 * hand);
        Assert.Equal(18.2768, p, 5e-5);
        Assert.Equal(1.05 * p, CorrodedPipeCapacity.DnvRpF101(D, T, Smts, Depth, L, 1.05), 1e-12);
    }

    [Fact]
    [Reference("Modified B31G, Bai (2001) Pipelines and Risers ch. 14 (read); check value 16.690 MPa (derived), formula recomputed here")]
    public void Modified_b31g_matches_the_check_value_and_the_formula_written_out()
    {
        var z = L * L / (D * T);
        var m = Math.Sqrt(1 + 0.6275 * z - 0.003375 * z * z);
        var flow = (Smys + 68.95) * (1 - 0.85 * Depth / T) / (1 - 0.85 * Depth / T / m);
        var hand = 2 * T * flow / D;
        var p = CorrodedPipeCapacity.ModifiedB31G(D, T, Smys, Depth, L);
        Assert.Equal(hand, p, 1e-12 * hand);
        Assert.Equal(16.690, p, 5e-4);
    }

    [Fact]
    [Reference("Modified B31G long-defect branch M = 0.032z + 3.3 for z > 50 (Bai 2001, ch. 14)")]
    public void Modified_b31g_uses_the_long_defect_folias_factor_beyond_z_fifty()
    {
        const double length = 800; // z = 99.2
        var z = length * length / (D * T);
        Assert.True(z > 50);
        var m = 0.032 * z + 3.3;
        var hand = 2 * T * (Smys + 68.95) * (1 - 0.85 * 0.4) / (1 - 0.85 * 0.4 / m) / D;
        Assert.Equal(hand, CorrodedPipeCapacity.ModifiedB31G(D, T, Smys, Depth, length), 1e-10);
    }

    [Theory]
    [InlineData(5.08, 200)]
    [InlineData(1.0, 50)]
    [InlineData(11.0, 900)]
    [InlineData(13.5, 300)] // beyond the wall: linear continuation
    public void Analytic_partial_derivatives_match_central_differences(double depth, double length)
    {
        foreach (var b31g in new[] { false, true })
        {
            double F(double d, double t, double s, double dep, double l) => b31g
                ? CorrodedPipeCapacity.ModifiedB31GWithGradient(d, t, s, dep, l).PressureMPa
                : CorrodedPipeCapacity.DnvRpF101WithGradient(d, t, s, dep, l).PressureMPa;
            var s0 = b31g ? Smys : Smts;
            var c = b31g
                ? CorrodedPipeCapacity.ModifiedB31GWithGradient(D, T, s0, depth, length)
                : CorrodedPipeCapacity.DnvRpF101WithGradient(D, T, s0, depth, length);
            const double h = 1e-6;
            Assert.Equal((F(D, T + h, s0, depth, length) - F(D, T - h, s0, depth, length)) / (2 * h), c.DWallThickness, 1e-5);
            Assert.Equal((F(D + h, T, s0, depth, length) - F(D - h, T, s0, depth, length)) / (2 * h), c.DDiameter, 1e-5);
            Assert.Equal((F(D, T, s0 + h, depth, length) - F(D, T, s0 - h, depth, length)) / (2 * h), c.DStrength, 1e-5);
            Assert.Equal((F(D, T, s0, depth + h, length) - F(D, T, s0, depth - h, length)) / (2 * h), c.DDepth, 1e-5);
            Assert.Equal((F(D, T, s0, depth, length + h) - F(D, T, s0, depth, length - h)) / (2 * h), c.DLength, 1e-5);
        }
    }

    [Fact]
    public void Capacity_is_continuous_and_decreasing_through_the_full_wall()
    {
        var below = CorrodedPipeCapacity.DnvRpF101(D, T, Smts, T * (1 - 1e-9), L);
        var above = CorrodedPipeCapacity.DnvRpF101(D, T, Smts, T * (1 + 1e-9), L);
        Assert.Equal(below, above, 1e-6);
        Assert.True(CorrodedPipeCapacity.DnvRpF101(D, T, Smts, 1.2 * T, L) < above);
        var b1 = CorrodedPipeCapacity.ModifiedB31G(D, T, Smys, T * (1 - 1e-9), L);
        var b2 = CorrodedPipeCapacity.ModifiedB31G(D, T, Smys, T * (1 + 1e-9), L);
        Assert.Equal(b1, b2, 1e-6);
    }

    [Fact]
    public void Invalid_inputs_name_the_parameter()
    {
        Assert.Equal("wallThicknessMm", Assert.Throws<ArgumentOutOfRangeException>(() => CorrodedPipeCapacity.DnvRpF101(D, -1, Smts, 1, L)).ParamName);
        Assert.Equal("depthMm", Assert.Throws<ArgumentOutOfRangeException>(() => CorrodedPipeCapacity.ModifiedB31G(D, T, Smys, double.NaN, L)).ParamName);
        Assert.Equal("yieldStrengthMPa", Assert.Throws<ArgumentOutOfRangeException>(() => CorrodedPipeCapacity.ModifiedB31G(D, T, 0, 1, L)).ParamName);
    }
}
