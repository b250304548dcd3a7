using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Updating;

[Reference("Common practice, no source: bad input is refused at the public boundary with the field named")]
public class UpdatingValidationTests
{
    private static readonly InspectionMethod Ut = TestModels.Method(new CumulativeLognormalPod(0, 0.4));

    private static TestDegradationModel Model() => TestModels.LinearDepth(1, 0.3, 0.25, 0.08, 8);

    [Fact]
    public void A_negative_measured_size_is_refused_naming_the_finding()
    {
        var e = Assert.Throws<ArgumentException>(() => new ReliabilityUpdater().Estimate(Model(), [new SizedIndication(5, "W-bad", Ut, -1)], 10));
        Assert.Contains("W-bad", e.Message, StringComparison.Ordinal);
        Assert.Contains("MeasuredSizeMm", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_finding_at_a_negative_time_is_refused()
    {
        var e = Assert.Throws<ArgumentException>(() => new ReliabilityUpdater().Estimate(Model(), [new NoIndication(-1, "N-bad", Ut)], 10));
        Assert.Contains("TimeYears", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Out_of_range_options_are_refused_with_the_option_named()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => new ReliabilityUpdater(new UpdatingOptions { SamplesPerBatch = 10 }));
        Assert.Equal("SamplesPerBatch", e.ParamName);
        var f = Assert.Throws<ArgumentOutOfRangeException>(() => new ReliabilityUpdater(new UpdatingOptions { TargetCoefficientOfVariation = 0 }));
        Assert.Equal("TargetCoefficientOfVariation", f.ParamName);
    }

    [Fact]
    public void A_profile_grid_that_does_not_increase_is_refused()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => new ReliabilityUpdater().Profile(Model(), [], [1.0, 3.0, 2.0], "x"));
        Assert.Equal("timesYears", e.ParamName);
    }

    [Fact]
    public void A_shared_input_with_different_marginals_is_refused()
    {
        var other = TestModels.LinearDepth(1, 0.3, 0.30, 0.08, 8);
        var e = Assert.Throws<ArgumentException>(() => EvidenceModel.Build(new UpdatingCase(
            [new ComponentEvidence("A", Model(), []), new ComponentEvidence("B", other, [])], ["R_mmPerYear"])));
        Assert.Contains("R_mmPerYear", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_shared_input_that_a_repair_renews_is_refused()
    {
        var e = Assert.Throws<ArgumentException>(() => EvidenceModel.Build(new UpdatingCase(
            [new ComponentEvidence("A", Model(), []), new ComponentEvidence("B", Model(), [])], ["D0_mm"])));
        Assert.Contains("renews", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_post_repair_prior_for_an_input_that_is_not_renewed_is_refused()
    {
        var repair = new Repair(5, "R-x", new Dictionary<string, RandomVariable> { ["R_mmPerYear"] = new NormalVariable("r", 0.1, 0.01) });
        var e = Assert.Throws<ArgumentException>(() => new ReliabilityUpdater().Estimate(Model(), [repair], 10));
        Assert.Contains("R_mmPerYear", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_augmented_model_holds_one_auxiliary_variable_per_finding_and_renewed_copies_per_repair()
    {
        var evidence = new InspectionOutcome[]
        {
            new NoIndication(2, "N-1", Ut), new SizedIndication(4, "W-1", Ut, 2.0), new SurvivedInService(4, "S-1"),
            new Repair(4, "R-1", new Dictionary<string, RandomVariable>()), new IndicationNotSized(6, "D-1", Ut),
        };
        var m = EvidenceModel.Build(UpdatingCase.Single(Model(), evidence));
        // Inputs: D0, R, D0@repair1; auxiliaries: A_d (N-1), ε (W-1), A_d (D-1); survival has none.
        Assert.Equal(3, m.InputModel.PhysicalDimension);
        Assert.Equal(6, m.Model.PhysicalDimension);
        Assert.Equal(4, m.Events.Count);
        Assert.Equal(2, m.RenewalPeriods(UpdatingCase.SingleComponentId));
        // The finding dated at the repair describes the state before it; the later one the renewed state.
        Assert.Equal(0, m.Events.Single(e => e.Outcome.Reference == "W-1").Epoch);
        Assert.Equal(1, m.Events.Single(e => e.Outcome.Reference == "D-1").Epoch);
        Assert.Equal(EvidenceEventKind.Equality, m.Events.Single(e => e.Outcome.Reference == "W-1").Kind);
    }
}
