using System.Globalization;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;

namespace InspectionUpdate.Application;

/// <summary>What the owner records in the register for the reports: document control (with its history).</summary>
public static class OwnerRecords
{
    /// <summary>The register's document control in force, with its history; empty when none was recorded.</summary>
    public static ReportDocumentControl DocumentControl(RegisterStore store)
    {
        ArgumentNullException.ThrowIfNull(store);
        var d = store.DocumentControl();
        if (d is null) return new ReportDocumentControl();
        return new ReportDocumentControl(d.Title, d.Owner, d.Author, d.Checker, d.Approver, d.Revision, d.RevisionDate, d.TargetSource)
        {
            History = store.DocumentControlHistory().Select(h => string.Create(CultureInfo.InvariantCulture,
                $"{h.Recorded.RecordedUtc:yyyy-MM-dd} by {h.Recorded.RecordedBy}: revision {h.Revision ?? "not set"}{(h.RevisionDate is { } rd ? " of " + rd.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) : string.Empty)}; author {h.Author ?? "not set"}, checker {h.Checker ?? "not set"}, approver {h.Approver ?? "not set"} ({h.Recorded.Reason})")).ToArray(),
        };
    }
}
