using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>Finding outcomes in words.</summary>
public static class FindingWords
{
    /// <summary>An outcome in words for reports.</summary>
    public static string Of(FindingKind kind) => kind switch
    {
        FindingKind.NoIndication => "no indication",
        FindingKind.IndicationNotSized => "indication, not sized",
        FindingKind.SizedIndication => "sized indication",
        FindingKind.WallThickness => "remaining-wall reading",
        FindingKind.InService => "in service, not failed",
        _ => kind.ToString(),
    };
}
