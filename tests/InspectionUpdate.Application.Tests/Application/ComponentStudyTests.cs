using InspectionUpdate.Application;
using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Reporting.Html;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Application;

/// <summary>
/// The application layer's orchestration of the engine on a hand-built leak model. The numbers come from the core; these tests
/// check that it carries them through to the outputs unchanged and consistently.
/// </summary>
public sealed class ComponentStudyTests
{
    private static readonly DateOnly InService = new(2010, 1, 1);

    private static ComponentContext Context(bool withFinding)
    {
        var inputs = new StochasticModel(
        [
            new NormalVariable(CorrosionModel.WallThickness, 10, 0.2),
            LognormalVariable.FromMeanCov(CorrosionModel.Rate, 0.2, 0.4),
        ]);
        var model = new CorrosionModel(inputs);
        var method = new InspectionMethod("UT-TEST", new LogLogisticPod(Math.Log(1.0), 0.4), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
        IReadOnlyList<InspectionOutcome> evidence = withFinding ? [new NoIndication(10, "finding 1 rev 1", method)] : [];
        return new ComponentContext
        {
            Id = "T-1",
            Name = "test line",
            Site = "T",
            InServiceDate = InService,
            Model = model,
            ModelDescription = model.Name,
            InputSource = "test",
            Evidence = evidence,
            Methods = [method],
            Fingerprint = "test-fingerprint",
            Source = "test",
        };
    }

    [Fact]
    public void Prior_only_assessment_has_no_updated_profile_and_reports_the_prior_as_current()
    {
        var c = Context(withFinding: false);
        var r = ComponentStudy.Request(c, new DateOnly(2020, 1, 1), 30, 1);
        var o = ComponentAssessment.Assess(r, _ => { });
        Assert.Null(o.Updated);
        Assert.Equal(30, o.Prior.Points.Count);
        var doc = ComponentStudy.AssessJson(c, r, o);
        Assert.Equal(0, doc.EvidenceCount);
        // The current state is the prior's point at the first grid time at or after 10.0 years (2020-01-01 is 9.9986 y).
        var expected = o.Prior.Points.First(p => p.TimeYears >= r.AsOfYears);
        Assert.Equal(expected.IntervalPf, doc.Current!.AnnualPf);
    }

    [Fact]
    public void No_indication_lowers_the_later_failure_probability_and_the_report_has_every_part()
    {
        var c = Context(withFinding: true);
        // First-order route and a 20-year service life keep the test fast; the route is carried, not checked, here.
        var r = ComponentStudy.Request(c, new DateOnly(2021, 1, 1), 20, 1, UpdatingRoute.FirstOrder);
        var o = ComponentAssessment.Assess(r, _ => { });
        Assert.NotNull(o.Updated);
        // A no-indication finding is evidence of a small depth: the updated Pf at 30 years is below the prior
        // (inequality updating, DESIGN §3; direction of the effect, not its size, is checked here).
        Assert.True(o.Updated!.Points[^1].CumulativePf < o.Prior.Points[^1].CumulativePf);
        Assert.All(o.Updated.Points, p => Assert.Equal(InspectionUpdate.Reliability.ComputationRoute.FirstOrder, p.Route));
        var plan = ComponentAssessment.Plan(r, AnnualTarget.FromAnnualPf(1e-4, AnnualMeasure.IntervalPf), c.DefaultPlanMethod, _ => { });
        var data = ComponentStudy.Report(c, r, o, plan, []);
        var html = HtmlReportWriter.Component(data);
        foreach (var id in HtmlReportWriter.ComponentSections) Assert.Contains("<section id=\"" + id + "\">", html, StringComparison.Ordinal);
        Assert.NotNull(data.Plan);
        Assert.Equal(plan.Next.Target.AnnualPf, data.Plan!.TargetAnnualPf);
        var json = ComponentStudy.PlanJson(c, r, plan);
        Assert.Equal(plan.Next.Date, json.NextDate);
        Assert.Equal("UT-TEST", json.ScheduleMethod);
    }
}
