using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Degradation.Fatigue;

namespace InspectionUpdate.Tests.Degradation;

public class FatigueCalibrationTests
{
    private static string Sample(string file)
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "InspectionUpdate.sln"))) dir = dir.Parent;
        return File.ReadAllText(Path.Combine(dir!.FullName, "sample-data", "models", file));
    }

    [Fact]
    [Reference("Calibration target: the S–N model's own FORM β(t) (DNV-RP-C203 T curve, Miner sum LN(1, 0.3)); stated tolerance max |Δβ| ≤ 0.05 over 5–40 years")]
    public void Calibrated_crack_growth_reproduces_the_sn_reliability_curve()
    {
        var crack = ComponentModelDefinition.Parse(Sample("hollin-reef-brace-joint-crack-growth.json")).Definition!;
        var sn = ComponentModelDefinition.Parse(Sample("hollin-reef-brace-joint-sn-fatigue.json")).Definition!.Build();
        // Free the median and the scatter of the Paris coefficient (the preset fixes C; make it lognormal first).
        crack = crack.WithInput(new InputSpec("parisC", "Lognormal", new Dictionary<string, double> { ["mean"] = 5.21e-13, ["cov"] = 0.5 }));
        double[] times = [5, 10, 20, 30, 40];
        var result = FatigueCalibration.Calibrate(crack, sn,
            [new CalibrationParameter("parisC", "mean", 1e-14, 1e-11), new CalibrationParameter("parisC", "cov", 0.05, 3.0)], times, betaTolerance: 0.05);
        Assert.True(result.Converged, result.Diagnostic);
        Assert.True(result.MaxBetaDifference <= 0.05, $"max |Δβ| = {result.MaxBetaDifference}");
        // The calibrated definition really is the model that matches.
        var check = InspectionUpdate.TimeVariant.TimeVariantReliability.Profile(result.CalibratedDefinition!.Build(),
            InspectionUpdate.TimeVariant.TimeGrid.FromTimes(times));
        for (var i = 0; i < times.Length; i++) Assert.Equal(result.ReferenceBeta[i], check.Points[i].Beta, 0.05);
    }

    [Fact]
    public void Unknown_inputs_and_bad_bounds_are_refused()
    {
        var crack = ComponentModelDefinition.Parse(Sample("hollin-reef-brace-joint-crack-growth.json")).Definition!;
        var sn = ComponentModelDefinition.Parse(Sample("hollin-reef-brace-joint-sn-fatigue.json")).Definition!.Build();
        Assert.Throws<ArgumentException>(() => FatigueCalibration.Calibrate(crack, sn, [new CalibrationParameter("nope", "mean", 1, 2)], [10.0]));
        Assert.Throws<ArgumentException>(() => FatigueCalibration.Calibrate(crack, sn, [new CalibrationParameter("weibullScale_MPa", "mean", 2, 1)], [10.0]));
    }
}
