using InspectionUpdate.Application;
using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Application;

public sealed class ConsequenceTargetTests
{
    private static ComponentContext Context(ComponentConsequence? consequence)
    {
        var inputs = new StochasticModel(
        [
            new NormalVariable(CorrosionModel.WallThickness, 10, 0.2),
            LognormalVariable.FromMeanCov(CorrosionModel.Rate, 0.2, 0.4),
        ]);
        var model = new CorrosionModel(inputs);
        return new ComponentContext
        {
            Id = "T-1",
            Name = "test line",
            Site = "T",
            InServiceDate = new DateOnly(2010, 1, 1),
            Model = model,
            ModelDescription = model.Name,
            InputSource = "test",
            Evidence = [],
            Fingerprint = "test-fingerprint",
            Source = "test",
            Consequence = consequence,
        };
    }

    [Fact]
    [Reference("JCSS Probabilistic Model Code Part 1 (2001), §7, Table 1, as TargetPresets.Jcss states it (checked against the table in TargetPresetsTests)")]
    public void A_component_whose_class_chooses_a_preset_is_planned_against_that_preset_and_others_against_the_runs_target()
    {
        var preset = TargetPresetKeys.Resolve("jcss-normal-large");
        Assert.Equal(TargetPresets.Jcss(RelativeCostOfSafetyMeasure.Normal, ConsequenceClass.Large).AnnualPf, preset.AnnualPf);
        var run = AnnualTarget.FromAnnualPf(1e-3, AnnualMeasure.IntervalPf);
        var options = new ReportRunOptions(new DateOnly(2020, 1, 1), run, false, UpdatingRoute.FirstOrder, 30);
        var runs = ReportRun.Run([() => Context(new ComponentConsequence(4, "large", preset, 1e6)), () => Context(new ComponentConsequence(2, "small", null, null)), () => Context(null)],
            ["A", "B", "C"], options, _ => { }, parallelism: 1);
        Assert.Equal(preset.AnnualPf, runs[0].Plan!.Next.Target.AnnualPf);
        Assert.Equal(1e-3, runs[1].Plan!.Next.Target.AnnualPf);
        Assert.Equal(1e-3, runs[2].Plan!.Next.Target.AnnualPf);
        Assert.NotEqual(1e-3, preset.AnnualPf);
    }

    [Fact]
    public void An_unknown_preset_is_refused_naming_it()
    {
        var e = Assert.Throws<ApplicationFailureException>(() => TargetPresetKeys.Resolve("jcss-cheap-huge"));
        Assert.Contains("jcss-cheap-huge", e.FullText, StringComparison.Ordinal);
    }
}
