using InspectionUpdate.Inspection;

namespace InspectionUpdate.Updating;

/// <summary>
/// What one inspection (or one service record) of a component tells, in the core's terms: time in years since the
/// component entered service. The register and the CLI map findings (dated, revised, audited) to these.
/// </summary>
/// <param name="TimeYears">Time of the finding in years since the component entered service.</param>
/// <param name="Reference">Identifier of the source record (finding id and revision), carried into results.</param>
public abstract record InspectionOutcome(double TimeYears, string Reference);

/// <summary>Nothing found with the method: event a(X, t) − A_d ≤ 0 (inequality).</summary>
public sealed record NoIndication(double TimeYears, string Reference, InspectionMethod Method)
    : InspectionOutcome(TimeYears, Reference);

/// <summary>Something found but not sized: event A_d − a(X, t) ≤ 0 (inequality).</summary>
public sealed record IndicationNotSized(double TimeYears, string Reference, InspectionMethod Method)
    : InspectionOutcome(TimeYears, Reference);

/// <summary>A sized indication a_m (mm) with the method's sizing error: a(X, t) ⊕ ε − a_m = 0 (equality).</summary>
public sealed record SizedIndication(double TimeYears, string Reference, InspectionMethod Method, double MeasuredSizeMm)
    : InspectionOutcome(TimeYears, Reference);

/// <summary>The component was in service and had not failed: −g(X, t) &lt; 0 (inequality, survival).</summary>
public sealed record SurvivedInService(double TimeYears, string Reference)
    : InspectionOutcome(TimeYears, Reference);

/// <summary>
/// A repair: the component's own degradation state restarts at <see cref="InspectionOutcome.TimeYears"/> from the
/// post-repair prior. Inputs named in <see cref="PostRepairInputs"/> replace the model's distribution for the
/// renewed state; the model's <c>RenewedOnRepair</c> inputs not listed restart with their original prior.
/// </summary>
public sealed record Repair(double TimeYears, string Reference, IReadOnlyDictionary<string, Probability.RandomVariable> PostRepairInputs)
    : InspectionOutcome(TimeYears, Reference);
