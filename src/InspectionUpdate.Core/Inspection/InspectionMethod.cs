namespace InspectionUpdate.Inspection;

/// <summary>
/// An inspection technique: its probability-of-detection curve and its sizing-error model. Immutable.
/// </summary>
/// <param name="Name">Identifier, e.g. "UT-phased-array-2024".</param>
/// <param name="Detection">PoD as a function of size in mm.</param>
/// <param name="Sizing">Error of a sized indication.</param>
public sealed record InspectionMethod(string Name, ProbabilityOfDetection Detection, SizingError Sizing);
