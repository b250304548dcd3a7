using InspectionUpdate.Degradation;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Planning.Doubles;

/// <summary>Shared set-up of the planning tests (an invented component entering service on 2000-01-01).</summary>
internal static class PlanningCases
{
    public static readonly DateOnly InService = new(2000, 1, 1);

    public static PlanningRequest Request(IDegradationModel model, double targetPf, double endYears = 40,
        IReadOnlyList<InspectionOutcome>? evidence = null, double? start = null,
        AnnualMeasure measure = AnnualMeasure.IntervalPf, PlanningOptions? options = null) => new()
        {
            Model = model,
            Evidence = evidence ?? [],
            InServiceDate = InService,
            Target = AnnualTarget.FromAnnualPf(targetPf, measure),
            EndOfServiceYears = endYears,
            StartTimeYears = start,
            Options = options ?? PlanningOptions.Default,
        };

    /// <summary>The worked case's prior Pf(t), written out from its closed form (not taken from the double).</summary>
    public static double WorkedPriorPf(double t) =>
        StandardNormal.Cdf((Math.Log(0.5) + 0.10 * t - Math.Log(20)) / Math.Sqrt(0.25 + 0.0004 * t * t));

    /// <summary>Worked case prior ΔPf(t) = Pf(t) − Pf(t − 1); in the first year the window starts at entry into service with Pf = 0.</summary>
    public static double WorkedPriorIntervalPf(double t) => WorkedPriorPf(t) - (t <= 1 ? 0 : WorkedPriorPf(t - 1));
}
