using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>Every revision of one finding, oldest first.</summary>
/// <param name="FindingId">Finding id.</param>
/// <param name="Revisions">Revisions, oldest first; the last is current.</param>
public sealed record FindingRecord(long FindingId, IReadOnlyList<FindingRevision> Revisions)
{
    /// <summary>The current revision.</summary>
    public FindingRevision Current => Revisions[^1];
}

/// <summary>Every revision of one repair, oldest first.</summary>
public sealed record RepairRecord(long RepairId, IReadOnlyList<RepairRevision> Revisions)
{
    /// <summary>The current revision.</summary>
    public RepairRevision Current => Revisions[^1];
}

/// <summary>What the register holds about one component now: identity, site, model revision, findings and repairs with every revision.</summary>
public sealed record ComponentRecords(Component Component, Site? Site, IReadOnlyList<FindingRecord> Findings, IReadOnlyList<RepairRecord> Repairs,
    IReadOnlyList<string> Methods, bool Retired);

/// <summary>Reads a component's records for display (the register as recorded now).</summary>
public static class ComponentRecordsReader
{
    /// <summary>The component's records, or bad input naming the code.</summary>
    public static ComponentRecords Read(IRegister store, string code)
    {
        ArgumentNullException.ThrowIfNull(store);
        var component = Registers.Component(store, code);
        var findings = store.Findings(component.Id, includeWithdrawn: true)
            .Select(f => new FindingRecord(f.FindingId, store.FindingHistory(f.FindingId).OrderBy(r => r.Revision).ToArray()))
            .OrderBy(f => f.Current.InspectionDate).ThenBy(f => f.FindingId).ToArray();
        var repairs = store.Repairs(component.Id, includeWithdrawn: true)
            .Select(r => new RepairRecord(r.RepairId, store.RepairHistory(r.RepairId).OrderBy(x => x.Revision).ToArray()))
            .OrderBy(r => r.Current.RepairDate).ToArray();
        var site = store.Sites().FirstOrDefault(s => s.Id == component.SiteId);
        return new ComponentRecords(component, site, findings, repairs, store.Methods().Select(m => m.Name).Order(StringComparer.Ordinal).ToArray(), store.IsRetired(component.Id));
    }

    /// <summary>The finding's current revision, or null when the register has no finding with that id.</summary>
    public static FindingRevision? Finding(IRegister store, long findingId)
    {
        ArgumentNullException.ThrowIfNull(store);
        return store.GetFinding(findingId);
    }

    /// <summary>The method names known to the register.</summary>
    public static IReadOnlyList<string> MethodNames(IRegister store)
    {
        ArgumentNullException.ThrowIfNull(store);
        return store.Methods().Select(m => m.Name).Order(StringComparer.Ordinal).ToArray();
    }
}
