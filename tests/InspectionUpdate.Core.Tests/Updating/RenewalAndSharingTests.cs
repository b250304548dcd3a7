using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Updating;

/// <summary>Repairs (renewal of D0, the rate R persists) and a rate shared by sister components, on depth = D0 + R·t.</summary>
[Reference("Closed form: Gaussian conditioning of the conjugate linear-Gaussian model, computed in the test")]
public class RenewalAndSharingTests
{
    private const double D0Mean = 1.0, D0Sd = 0.3, RMean = 0.25, RSd = 0.08, CriticalMm = 8.0;
    private static readonly InspectionMethod Ut = TestModels.Method(new CumulativeLognormalPod(0, 0.4), SizingErrorKind.AdditiveNormal, 0, 0.25);
    private static readonly (double T, double Mm)[] Readings = [(5, 2.6), (10, 4.1)];

    private static TestDegradationModel Model() => TestModels.LinearDepth(D0Mean, D0Sd, RMean, RSd, CriticalMm);

    private static double Beta(double mean, double variance) => (CriticalMm - mean) / Math.Sqrt(variance);

    [Fact]
    public void A_repair_without_earlier_findings_restarts_the_profile_as_a_new_component()
    {
        var repair = new Repair(10, "R-1", new Dictionary<string, RandomVariable> { ["D0_mm"] = new NormalVariable("D0 after repair", 0.5, 0.1) });
        var profile = new ReliabilityUpdater().Profile(Model(), [repair], [8.0, 10.0, 12.0, 20.0], "with repair");
        // Before and at the repair: the prior. After: D0' ~ N(0.5, 0.1) and R at local time t − 10 (Cornell 1969).
        Assert.Equal(Beta(D0Mean + RMean * 8, D0Sd * D0Sd + 64 * RSd * RSd), profile.Points[0].Beta, 7);
        Assert.Equal(Beta(D0Mean + RMean * 10, D0Sd * D0Sd + 100 * RSd * RSd), profile.Points[1].Beta, 7);
        Assert.Equal(Beta(0.5 + RMean * 2, 0.01 + 4 * RSd * RSd), profile.Points[2].Beta, 7);
        Assert.Equal(Beta(0.5 + RMean * 10, 0.01 + 100 * RSd * RSd), profile.Points[3].Beta, 7);
        // The step across the repair counts from the renewal.
        Assert.Equal(profile.Points[2].CumulativePf, profile.Points[2].IntervalPf, 15);
        Assert.Contains("renewed by a repair", profile.Points[2].Note, StringComparison.Ordinal);
        Assert.True(profile.Points[2].CumulativePf < profile.Points[1].CumulativePf);
    }

    [Fact]
    public void Readings_before_a_repair_keep_informing_the_shared_rate_only()
    {
        var (mean, cov) = LinearGaussianUpdatingTests.ExactPosterior(Readings);
        var evidence = new List<InspectionOutcome>
        {
            new SizedIndication(5, "W-1", Ut, 2.6),
            new SizedIndication(10, "W-2", Ut, 4.1),
            new Repair(10, "R-1", new Dictionary<string, RandomVariable>()),
        };
        var t = 25.0;
        var result = new ReliabilityUpdater().Estimate(Model(), evidence, t);
        // After the repair D0' has its original prior, independent of the readings; R has its posterior marginal.
        var s = t - 10;
        var expected = Beta(D0Mean + mean[1] * s, D0Sd * D0Sd + s * s * cov[1, 1]);
        Assert.True(result.Converged, result.Note);
        Assert.Equal(expected, result.Beta, 6);
    }

    [Fact]
    public void A_sister_component_without_findings_learns_the_shared_rate()
    {
        var (mean, cov) = LinearGaussianUpdatingTests.ExactPosterior(Readings);
        var inspected = new ComponentEvidence("C-1", Model(), [new SizedIndication(5, "W-1", Ut, 2.6), new SizedIndication(10, "W-2", Ut, 4.1)]);
        var sister = new ComponentEvidence("C-2", Model(), []);
        var updater = new ReliabilityUpdater();
        var t = 20.0;
        var shared = updater.Prepare(new UpdatingCase([inspected, sister], ["R_mmPerYear"])).Estimate("C-2", t);
        // C-2 has its own D0 (prior) and the shared R (posterior from C-1's readings).
        Assert.Equal(Beta(D0Mean + mean[1] * t, D0Sd * D0Sd + t * t * cov[1, 1]), shared.Beta, 6);
        // C-1 in the same case is updated exactly as alone.
        var own = updater.Prepare(new UpdatingCase([inspected, sister], ["R_mmPerYear"])).Estimate("C-1", t);
        Assert.Equal(LinearGaussianUpdatingTests.ExactBeta(mean, cov, t), own.Beta, 6);
        // Without the shared group the sister keeps its prior.
        var separate = updater.Prepare(new UpdatingCase([inspected, sister])).Estimate("C-2", t);
        Assert.Equal(Beta(D0Mean + RMean * t, D0Sd * D0Sd + t * t * RSd * RSd), separate.Beta, 6);
    }
}
