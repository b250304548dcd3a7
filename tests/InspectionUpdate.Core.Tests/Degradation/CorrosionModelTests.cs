using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Probability;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Degradation;

public class CorrosionModelTests
{
    private static StochasticModel BurstInputs(bool b31g, bool powerLaw, bool lengthGrows)
    {
        var list = new List<RandomVariable>
        {
            N("wallThickness_mm", 12.7, 0.3),
            N("initiationTime_years", 3, 1),
            N("diameter_mm", 508, 1),
            Ln("defectLength_mm", 200, 0.3),
            b31g ? Ln("yieldStrength_MPa", 358, 0.05) : Ln("tensileStrength_MPa", 455, 0.05),
            Ln("modelFactor", 1.0, 0.1),
            N("pressure_MPa", 10, 0.5),
        };
        if (powerLaw)
        {
            list.Add(Ln("powerCoefficient_mm", 0.4, 0.3));
            list.Add(N("powerExponent", 0.8, 0.05));
        }
        else
        {
            list.Add(Ln("rate_mmPerYear", 0.25, 0.4));
        }

        if (lengthGrows) list.Add(Ln("lengthRate_mmPerYear", 5, 0.5));
        return new StochasticModel(list);
    }

    [Theory]
    [InlineData(false, false, false)]
    [InlineData(true, false, false)]
    [InlineData(false, true, true)]
    [InlineData(true, true, true)]
    public void Burst_margin_gradient_matches_central_differences(bool b31g, bool powerLaw, bool lengthGrows)
    {
        var model = new CorrosionModel(BurstInputs(b31g, powerLaw, lengthGrows), new CorrosionSettings
        {
            FailureMode = b31g ? CorrosionFailureMode.BurstModifiedB31G : CorrosionFailureMode.BurstDnvRpF101,
            GrowthLaw = powerLaw ? CorrosionGrowthLaw.PowerLaw : CorrosionGrowthLaw.Linear,
            LengthGrows = lengthGrows,
        });
        var x = Means(model.Inputs);
        foreach (var t in new[] { 10.0, 25.0 })
        {
            var g = new double[x.Length];
            var value = model.MarginWithGradient(x, t, g);
            Assert.Equal(model.Margin(x, t), value, 1e-12);
            AssertGradientMatches(g, NumericGradient(v => model.Margin(v, t), x), 1e-5);
        }
    }

    [Theory]
    [InlineData(false, false, false)]
    [InlineData(true, false, false)]
    [InlineData(false, true, false)]
    [InlineData(true, true, false)]
    [InlineData(false, false, true)]
    [InlineData(true, false, true)]
    [InlineData(false, true, true)]
    [InlineData(true, true, true)]
    [Reference("Closed-form burst failure time checked against an independent bisection of g(x, t) = 0 in t on the model's own margin (first passage; g falls with t)")]
    public void Burst_failure_time_is_the_root_of_the_margin(bool b31g, bool powerLaw, bool lengthGrows)
    {
        var model = new CorrosionModel(BurstInputs(b31g, powerLaw, lengthGrows), new CorrosionSettings
        {
            LengthGrows = lengthGrows,
            FailureMode = b31g ? CorrosionFailureMode.BurstModifiedB31G : CorrosionFailureMode.BurstDnvRpF101,
            GrowthLaw = powerLaw ? CorrosionGrowthLaw.PowerLaw : CorrosionGrowthLaw.Linear,
        });
        var t = new NatafTransformation(model.Inputs);
        var random = new Random(11);
        var u = new double[t.StandardDimension];
        var x = new double[t.PhysicalDimension];
        var closedForms = 0;
        for (var s = 0; s < 400; s++)
        {
            // Wide draws (u scaled by 2.5) reach the fast-corroding, high-pressure corners as well as the slow ones.
            for (var i = 0; i < u.Length; i++) u[i] = 2.5 * StandardNormal.InverseCdf(random.NextDouble());
            t.ToPhysical(u, x);
            var tf = model.FailureTimeYears(x);
            if (double.IsNaN(tf)) continue;
            closedForms++;
            Assert.True(model.Margin(x, 0) > 0, "a closed form is given only where the intact pipe holds");
            if (double.IsPositiveInfinity(tf))
            {
                Assert.True(model.Margin(x, 1e4) > 0);
                continue;
            }

            double lo = 0, hi = Math.Max(1, 2 * tf);
            Assert.True(model.Margin(x, hi) <= 0);
            while (hi - lo > 1e-10 * Math.Max(1, hi))
            {
                var mid = 0.5 * (lo + hi);
                if (model.Margin(x, mid) > 0) lo = mid;
                else hi = mid;
            }

            Assert.Equal(hi, tf, 1e-7 * Math.Max(1, tf));
        }

        Assert.True(closedForms > 300, $"closed form used for {closedForms} of 400 draws");
    }

    [Fact]
    [Reference("Leak margin g = f·t − r·max(0, t − T0) written out; default f = 0.8 (common practice, no source)")]
    public void Leak_margin_is_the_leak_fraction_of_the_wall_minus_the_linear_wall_loss()
    {
        var model = new CorrosionModel(Model(D("wallThickness_mm", 10), D("initiationTime_years", 5), Ln("rate_mmPerYear", 0.2, 0.5)));
        var x = new[] { 10.0, 5.0, 0.3 };
        Assert.Equal(0.8 * 10 - 0.3 * 15, model.Margin(x, 20), 1e-12);
        Assert.Equal(8.0, model.Margin(x, 4), 1e-12); // before initiation no wall loss
        Assert.Equal(4.5, model.Size(x, 20), 1e-12);
        Assert.Equal(10.0, model.Size(x, 100), 1e-12); // capped at the wall
        Assert.Equal(10.0, model.MaximumSizeMm);
        Assert.Equal(["initiationTime_years"], model.RenewedOnRepair);
        var g = new double[3];
        model.MarginWithGradient(x, 20, g);
        AssertGradientMatches(g, NumericGradient(v => model.Margin(v, 20), x), 1e-6);
    }

    [Fact]
    [Reference("Power law d = k·(t − T0)^n (Velázquez et al. 2009), written out")]
    public void Power_law_depth_follows_the_formula()
    {
        var model = new CorrosionModel(Model(D("wallThickness_mm", 10), Ln("powerCoefficient_mm", 0.5, 0.2), D("powerExponent", 0.7)),
            new CorrosionSettings { GrowthLaw = CorrosionGrowthLaw.PowerLaw });
        Assert.Equal(0.5 * Math.Pow(12, 0.7), model.DepthMm([10, 0.5, 0.7], 12), 1e-12);
    }

    [Fact]
    public void Missing_and_unknown_inputs_are_all_listed()
    {
        var e = Assert.Throws<ArgumentException>(() => new CorrosionModel(Model(D("wallThickness_mm", 10), D("rate_mmperyear", 0.1)),
            new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101 }));
        Assert.Contains("'rate_mmPerYear'", e.Message);
        Assert.Contains("'diameter_mm'", e.Message);
        Assert.Contains("'pressure_MPa'", e.Message);
        Assert.Contains("'rate_mmperyear' is not used", e.Message);
    }

    [Fact]
    public void Annual_maximum_pressure_is_reported_and_refused_for_leak()
    {
        var model = new CorrosionModel(BurstInputs(false, false, false), new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101, PressureIsAnnualMaximum = true });
        Assert.Equal("pressure_MPa", model.AnnualMaximumInput);
        Assert.Throws<ArgumentException>(() => new CorrosionModel(Model(D("wallThickness_mm", 10), D("rate_mmPerYear", 0.1)), new CorrosionSettings { PressureIsAnnualMaximum = true }));
        Assert.Throws<ArgumentOutOfRangeException>(() => new CorrosionModel(Model(D("wallThickness_mm", 10), D("rate_mmPerYear", 0.1)), new CorrosionSettings { LeakFraction = 1.5 }));
    }

    [Fact]
    [Reference("Burst margin g = X_m·p_DNV(d(t), L) − p with the capacity from the published equation")]
    public void Burst_margin_uses_the_capacity_with_the_model_factor()
    {
        var model = new CorrosionModel(BurstInputs(false, false, false), new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101 });
        var x = Means(model.Inputs);
        var idx = (string n) => model.Inputs.IndexOf(n);
        var depth = x[idx("rate_mmPerYear")] * (20 - x[idx("initiationTime_years")]);
        var cap = CorrodedPipeCapacity.DnvRpF101(x[idx("diameter_mm")], x[idx("wallThickness_mm")], x[idx("tensileStrength_MPa")], depth, x[idx("defectLength_mm")]);
        Assert.Equal(x[idx("modelFactor")] * cap - x[idx("pressure_MPa")], model.Margin(x, 20), 1e-10);
    }
}
