using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Application;

/// <summary>One component assessed for a front end and stored under its key; the overview reads it back.</summary>
public sealed class ComponentRefreshTests
{
    [Fact]
    [Reference("docs/register.md, Stored results: a result is filed under a key of the model revision, the component's findings and repairs, the options and the tool build; a new finding makes it stale")]
    public void A_refreshed_component_is_stored_read_by_the_overview_and_goes_stale_with_a_new_finding()
    {
        using var register = new PortfolioRegister(3);
        var options = PortfolioRegister.Options;
        var keyBefore = ComponentRefresh.Key(register.Store, "INV-00002", options);
        var result = ComponentRefresh.Run(register.Store, "INV-00002", options, schedule: false, _ => { });
        Assert.Equal(keyBefore, result.Key);

        var row = RegisterOverview.Read(register.Store, options).Rows.Single(r => r.Code == "INV-00002");
        Assert.Equal(result.Stored.AnnualPf, row.Result!.AnnualPf);
        Assert.Equal(result.Stored.NextDue, row.Result.NextDue);
        Assert.Null(row.Stale);
        Assert.Equal(row.Result.AnnualPf > options.Target.AnnualPf, row.AboveTarget);
        Assert.Null(RegisterOverview.Read(register.Store, options).Rows.Single(r => r.Code == "INV-00001").Result);

        var written = FindingEntries.Log(register.Store, new FindingInput("INV-00002", "2024-12-01", "no-indication", "INV-UT", Location: "joint 9"), "tester");
        Assert.True(written.Succeeded, string.Join("; ", written.Problems));
        Assert.NotEqual(keyBefore, ComponentRefresh.Key(register.Store, "INV-00002", options));
        Assert.NotNull(RegisterOverview.Read(register.Store, options).Rows.Single(r => r.Code == "INV-00002").Stale);
    }
}
