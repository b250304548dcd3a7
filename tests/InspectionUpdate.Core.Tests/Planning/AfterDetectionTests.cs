using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Tests.Updating;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

/// <summary>
/// The branch a plan assumes after a detection, on depth = D0 + R·t with normal D0, R (D0 renewed by a repair, R kept)
/// and two sized readings: every event is linear in Gaussians, so first order is exact and the references are closed
/// forms written out here (Gaussian conditioning of the conjugate model, LinearGaussianUpdatingTests.ExactPosterior).
/// </summary>
public class AfterDetectionTests
{
    private const double CriticalMm = 8.0, Target = 1e-4, RepairD0Mean = 0.5, RepairD0Sd = 0.1;
    private static readonly (double T, double Mm)[] Readings = [(5, 2.6), (10, 4.1)];
    private static readonly InspectionMethod Ut = TestModels.Method(new CumulativeLognormalPod(0, 0.4), SizingErrorKind.AdditiveNormal, 0, 0.25);

    private static ReliabilityUpdater FirstOrder() => new(new UpdatingOptions { Route = UpdatingRoute.FirstOrder });

    private static PlanningRequest Sized(AfterDetection? branch, double endYears = 40, double repairD0Mean = RepairD0Mean)
    {
        var request = Request(TestModels.LinearDepth(1.0, 0.3, 0.25, 0.08, CriticalMm), Target, endYears,
            evidence: Readings.Select((r, i) => (InspectionOutcome)new SizedIndication(r.T, $"W-{i + 1}", Ut, r.Mm)).ToList());
        return branch is null ? request : request with
        {
            AfterDetection = branch.Value,
            AssumedRepairInputs = new Dictionary<string, RandomVariable> { ["D0_mm"] = new NormalVariable("D0_mm", repairD0Mean, RepairD0Sd) },
            AssumedRepairSource = "of the test",
        };
    }

    private static double Phi(double x) => StandardNormal.Cdf(x);

    /// <summary>
    /// Pf s years after the assumed repair at 10 y: D0' ~ N(0.5, 0.1) (the post-repair prior) and R with its
    /// posterior marginal given both readings (D0' is independent of the readings):
    /// Pf = Φ(−(d_c − μ_D0' − μ_R·s)/√(σ_D0'² + s²·σ_R²)).
    /// </summary>
    private static double RepairedPf(double s, double d0Mean = RepairD0Mean)
    {
        if (s <= 0) return 0;
        var (mean, cov) = LinearGaussianUpdatingTests.ExactPosterior(Readings);
        return Phi(-(CriticalMm - d0Mean - mean[1] * s) / Math.Sqrt(RepairD0Sd * RepairD0Sd + s * s * cov[1, 1]));
    }

    /// <summary>Monitored: Pf(t) of the joint posterior of (D0, R), the defect left in service.</summary>
    private static double MonitoredPf(double t)
    {
        var (mean, cov) = LinearGaussianUpdatingTests.ExactPosterior(Readings);
        return Phi(-LinearGaussianUpdatingTests.ExactBeta(mean, cov, t));
    }

    [Fact]
    [Reference("Closed form: the post-repair prior's own Pf, shifted to the repair time, with R's conjugate posterior (computed in the test)")]
    public void On_the_repair_branch_the_annual_pf_after_the_assumed_repair_is_the_post_repair_profile_shifted_to_the_repair()
    {
        var request = Sized(AfterDetection.Repair);
        var planner = new InspectionPlanner(FirstOrder());
        var next = planner.NextInspection(request);

        // ΔPf(t) after the repair at 10 y: the window starts at the repair (Pf = 0 there), as the planner defines it.
        double Annual(double t) => RepairedPf(t - 10) - RepairedPf(t - 11);
        var root = IndependentGaussian.FirstRoot(t => Annual(t) - Target, 10.5, 40, 0.05);

        Assert.Equal(NextInspectionStatus.Due, next.Status);
        Assert.InRange(next.TimeYears, root - 3e-3, root + 1e-3);
        Assert.Equal(Annual(next.TimeYears), next.At.Value, Annual(next.TimeYears) * 1e-4);
        Assert.Equal(RepairedPf(next.TimeYears - 10), next.At.CumulativePf, RepairedPf(next.TimeYears - 10) * 1e-4);
        Assert.Contains(next.Assumptions, a => a.Contains("repair on detection", StringComparison.Ordinal) && a.Contains("D0_mm", StringComparison.Ordinal));

        // Remaining life without inspection on the same branch: the same root.
        var life = planner.RemainingLife(request);
        Assert.InRange(life.UntilAnnualTarget.TimeYears, root - 3e-3, root + 1e-3);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Closed form: the post-repair prior's own Pf shifted to the repair time, with R's conjugate posterior; the sampled value within 4 of its own standard errors")]
    public void On_the_sampling_route_the_repaired_components_pf_agrees_with_the_closed_form_within_its_standard_error()
    {
        // The simulation route alone (no first order below its resolution), seeded: the planner reads Pf from the
        // one weighted sample set of the evidence with the assumed repair.
        var updater = new SampleSetUpdater(SampleSetOptions.Default with { HorizonYears = 40, FirstOrderBelowResolution = false, Seed = 11 });
        var request = Sized(AfterDetection.Repair) with { Target = AnnualTarget.FromAnnualPf(1e-2, AnnualMeasure.IntervalPf) };
        var next = new InspectionPlanner(updater).NextInspection(request);

        Assert.Equal(NextInspectionStatus.Due, next.Status);
        Assert.True(next.At.Converged);
        var cov = Assert.IsType<double>(next.At.CoefficientOfVariation);
        var exact = RepairedPf(next.TimeYears - 10);
        Assert.InRange(next.At.CumulativePf, exact * (1 - 4 * cov), exact * (1 + 4 * cov));
        // The monitored defect (4.1 mm at 10 y, critical 8 mm) would be far likelier to fail by then.
        Assert.True(MonitoredPf(next.TimeYears) > 10 * exact);
    }

    [Fact]
    [Reference("Closed form: Pf of the joint conjugate posterior of (D0, R), the defect left in service (computed in the test)")]
    public void On_the_monitored_branch_the_plan_is_todays_and_equals_the_closed_form()
    {
        var planner = new InspectionPlanner(FirstOrder());
        var monitored = planner.NextInspection(Sized(AfterDetection.Monitor));
        var unset = planner.NextInspection(Sized(null));

        var root = IndependentGaussian.FirstRoot(t => MonitoredPf(t) - MonitoredPf(t - 1) - Target, 10.5, 40, 0.05);
        Assert.InRange(monitored.TimeYears, root - 3e-3, root + 1e-3);
        // Unchanged from the planner without the option: the same numbers, and the branch stated.
        Assert.Equal(unset.TimeYears, monitored.TimeYears);
        Assert.Equal(unset.At.Value, monitored.At.Value);
        Assert.Contains(monitored.Assumptions, a => a.Contains("monitor — the known defect is left in service", StringComparison.Ordinal));
        // Repairing the defect buys time: the repaired component's due date is later.
        Assert.True(planner.NextInspection(Sized(AfterDetection.Repair)).TimeYears > monitored.TimeYears + 1);
    }

    [Fact]
    public void Without_a_detection_since_the_last_repair_the_branch_changes_nothing()
    {
        var model = TestModels.LinearDepth(1.0, 0.3, 0.25, 0.08, CriticalMm);
        IReadOnlyList<InspectionOutcome> evidence =
        [
            new SizedIndication(5, "W-1", Ut, 2.6),
            new Repair(5, "R-1", new Dictionary<string, RandomVariable>()),
            new NoIndication(8, "N-1", Ut),
        ];
        var monitor = Request(model, Target, evidence: evidence);
        var repair = monitor with { AfterDetection = AfterDetection.Repair };

        Assert.Null(DetectionBranch.OpenDetection(evidence));
        Assert.Same(evidence, DetectionBranch.PlanningEvidence(repair));
        Assert.Null(DetectionBranch.Statement(repair, InService));
    }

    [Fact]
    public void An_assumed_post_repair_prior_for_an_input_the_model_does_not_renew_is_refused_naming_it()
    {
        var request = Sized(AfterDetection.Repair) with
        {
            AssumedRepairInputs = new Dictionary<string, RandomVariable> { ["R_mmPerYear"] = new NormalVariable("R_mmPerYear", 0.1, 0.01) },
        };
        Assert.Contains(request.Problems(), p => p.Contains("R_mmPerYear", StringComparison.Ordinal) && p.Contains("does not renew", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData(AfterDetection.Monitor)]
    [InlineData(AfterDetection.Repair)]
    [Reference("Common practice, no source: a plan above its target anywhere must say so; the premise (the target is reached before the end of service) from the closed forms above")]
    public void A_schedule_that_cannot_keep_the_target_says_so_on_either_branch(AfterDetection branch)
    {
        // A method that all but never detects (median detectable size 50 mm, wall loss critical at 8 mm): finding
        // nothing with it teaches nothing, so no schedule with it keeps the target once the measure reaches it.
        var blind = TestModels.Method(new CumulativeLognormalPod(Math.Log(50), 0.2), SizingErrorKind.AdditiveNormal, 0, 0.25);
        var request = Sized(branch, endYears: 30, repairD0Mean: 3.0);
        double Annual(double t) => branch == AfterDetection.Monitor
            ? MonitoredPf(t) - MonitoredPf(t - 1)
            : RepairedPf(t - 10, 3.0) - RepairedPf(t - 11, 3.0);
        Assert.True(Annual(29) > Target, "premise: the target is reached before the end of service");

        var schedule = new InspectionPlanner(FirstOrder()).Schedule(request, blind);

        Assert.False(schedule.Status == ScheduleStatus.Complete && schedule.Verification.WithinTarget);
        Assert.Matches("do NOT keep|only up to", schedule.Message);
        Assert.DoesNotMatch(@"(?<!NOT )keep the annual ΔPf under the target [^ ]+ \(largest ratio to the target", schedule.Message);
    }
}
