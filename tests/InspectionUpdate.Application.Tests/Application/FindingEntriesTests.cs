using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Application;

/// <summary>Finding entry from text fields: parsing and the register's validation together, per field; nothing written on any problem.</summary>
public sealed class FindingEntriesTests
{
    [Fact]
    [Reference("ISO 8601 calendar dates (yyyy-MM-dd) and invariant decimal numbers, as the register's CSV import reads them (docs/register.md)")]
    public void Text_that_is_not_a_date_a_kind_or_a_number_is_a_problem_of_its_own_field()
    {
        var (finding, problems) = FindingEntries.Parse(new FindingInput("INV-00001", "2025-13-01", "nothing-found", "INV-MFL", "1,5", "x"));
        Assert.Null(finding);
        Assert.Equal(["inspection_date", "kind", "measured_size_mm", "remaining_wall_mm"], problems.Select(p => p.Field));
        Assert.Contains("no-indication", problems[1].Message, StringComparison.Ordinal);
    }

    [Fact]
    [Reference("ISO 8601 calendar dates; the register's kind names (docs/register.md)")]
    public void Good_text_becomes_the_finding_it_spells()
    {
        var (finding, problems) = FindingEntries.Parse(new FindingInput("INV-00001", " 2024-05-02 ", "sized-indication", " INV-MFL ", "2.25", "", "joint 4", ""));
        Assert.Empty(problems);
        Assert.Equal(new NewFinding("INV-00001", new DateOnly(2024, 5, 2), FindingKind.SizedIndication, "INV-MFL", 2.25, null, "joint 4", null), finding);
    }

    [Fact]
    [Reference("docs/register.md, findings: not before the install date, a known method, a size within the nominal wall (12.7 mm for invented components)")]
    public void Every_problem_is_listed_and_nothing_is_written()
    {
        using var register = new PortfolioRegister(2);
        var component = register.Store.FindComponent("INV-00001")!;
        var before = register.Store.Findings(component.Id, includeWithdrawn: true).Count;
        var write = FindingEntries.Log(register.Store, new FindingInput("INV-00001", component.InstallDate.AddDays(-1).ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture),
            "sized-indication", "NO-SUCH", "13.5"), "tester");
        Assert.False(write.Succeeded);
        Assert.Equal(["inspection_date", "measured_size_mm", "method"], write.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
        Assert.Equal(before, register.Store.Findings(component.Id, includeWithdrawn: true).Count);
    }

    [Fact]
    [Reference("docs/register.md: a correction or withdrawal records who, when and why; the reason is required")]
    public void A_correction_or_withdrawal_without_a_reason_is_refused()
    {
        using var register = new PortfolioRegister(2);
        var component = register.Store.FindComponent("INV-00001")!;
        var target = register.Store.Findings(component.Id)[0];
        var corrected = FindingEntries.Correct(register.Store, target.FindingId, FindingInput.From(target), "tester", " ");
        var withdrawn = FindingEntries.Withdraw(register.Store, target.FindingId, "tester", null);
        Assert.Equal("reason", Assert.Single(corrected.Problems).Field);
        Assert.Equal("reason", Assert.Single(withdrawn.Problems).Field);
        Assert.Single(register.Store.FindingHistory(target.FindingId));

        var ok = FindingEntries.Correct(register.Store, target.FindingId, FindingInput.From(target) with { Note = "checked" }, "tester", "re-read the log");
        Assert.True(ok.Succeeded);
        Assert.Equal(2, ok.Stored!.Revision);
        Assert.Equal("tester", ok.Stored.Recorded.RecordedBy);
    }
}
