using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

public sealed class OwnerRecordsTests
{
    [Fact]
    [Reference("docs/register.md: document control and consequence records are append-only; the latest is in force, the earlier ones are history (design rule, no source)")]
    public void Document_control_keeps_unchanged_fields_clears_empty_ones_and_keeps_every_earlier_record()
    {
        using var r = new TestRegister();
        Assert.Null(r.Store.DocumentControl());
        r.Store.SetDocumentControl(new DocumentControlChange(Title: "Line 101 report", Author: "A. Author", Checker: "C. Checker", Revision: "1",
            RevisionDate: new DateOnly(2026, 2, 1), TargetSource: "owner's standard ST-01 (invented)"), "tester", "first issue").Require();
        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.SetDocumentControl(new DocumentControlChange(Revision: "2", Checker: "", Approver: "P. Approver"), "tester", "second issue").Require();
        var now = r.Store.DocumentControl()!;
        Assert.Equal("Line 101 report", now.Title);
        Assert.Equal("A. Author", now.Author);
        Assert.Null(now.Checker);
        Assert.Equal("P. Approver", now.Approver);
        Assert.Equal("2", now.Revision);
        Assert.Equal(new DateOnly(2026, 2, 1), now.RevisionDate);
        var history = r.Store.DocumentControlHistory();
        Assert.Equal(["1", "2"], history.Select(h => h.Revision));
        Assert.Equal("C. Checker", history[0].Checker);
        Assert.Equal(["first issue", "second issue"], history.Select(h => h.Recorded.Reason));
    }

    [Fact]
    public void A_blank_reason_or_a_class_outside_1_to_5_is_refused_naming_the_field_and_nothing_is_written()
    {
        using var r = new TestRegister();
        var refused = r.Store.SetDocumentControl(new DocumentControlChange(Title: "x"), "tester", " ");
        Assert.False(refused.Succeeded);
        Assert.Contains(refused.Problems, p => p.Field == "reason");
        Assert.Empty(r.Store.DocumentControlHistory());
        var badClass = r.Store.SetComponentConsequence(TestRegister.Component, 6, -1, "tester", "survey");
        Assert.Contains(badClass.Problems, p => p.Field == "class" && p.Value == "6");
        Assert.Contains(badClass.Problems, p => p.Field == "cost_of_failure");
        Assert.Empty(r.Store.ComponentConsequences());
        var unknown = r.Store.SetConsequenceClass(0, "", null, "tester", "survey");
        Assert.Contains(unknown.Problems, p => p.Field == "class");
        Assert.Contains(unknown.Problems, p => p.Field == "meaning");
    }

    [Fact]
    public void Consequence_classes_and_component_classes_keep_their_history_and_the_latest_is_in_force()
    {
        using var r = new TestRegister();
        r.Store.SetConsequenceClass(3, "a leak reaches the plant drains (invented meaning)", "jcss-normal-moderate", "tester", "owner's scale").Require();
        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.SetConsequenceClass(3, "a leak reaches open water (invented meaning)", "jcss-normal-large", "tester", "revised scale").Require();
        var classes = r.Store.ConsequenceClasses();
        var three = Assert.Single(classes);
        Assert.Equal("jcss-normal-large", three.TargetPreset);
        Assert.Equal(2, r.Store.ConsequenceClassHistory().Count);

        var before = r.Clock.UtcNow;
        r.Store.SetComponentConsequence(TestRegister.Component, 2, null, "tester", "survey").Require();
        r.Clock.Advance(TimeSpan.FromHours(1));
        r.Store.SetComponentConsequence(TestRegister.Component, 4, 2.5e6, "tester", "new survey").Require();
        var current = Assert.Single(r.Store.ComponentConsequences());
        Assert.Equal(4, current.Class);
        Assert.Equal(2.5e6, current.CostOfFailure);
        Assert.Equal(2, Assert.Single(r.Store.ComponentConsequences(before.AddMinutes(1))).Class);
        Assert.Equal(2, r.Store.ComponentConsequenceHistory(TestRegister.Component).Count);
    }
}
