using InspectionUpdate.Reliability;

namespace InspectionUpdate.Planning;

/// <summary>
/// The annual failure probability at one time, given the evidence in force then: both annual measures, the
/// cumulative Pf and how it was computed.
/// </summary>
public sealed record AnnualValue
{
    /// <summary>Time in years since entry into service (end of the year the annual numbers refer to).</summary>
    public required double TimeYears { get; init; }

    /// <summary>Calendar date of <see cref="TimeYears"/>, to the nearest day.</summary>
    public required DateOnly Date { get; init; }

    /// <summary>Start of the look-back window: t − 1, or the entry into service or last repair when later.</summary>
    public required double WindowStartYears { get; init; }

    /// <summary>ΔPf = Pf(t) − Pf(window start).</summary>
    public required double IntervalPf { get; init; }

    /// <summary>Hazard ΔPf / (1 − Pf(window start)).</summary>
    public required double Hazard { get; init; }

    /// <summary>Which of the two the target applies to.</summary>
    public required AnnualMeasure Measure { get; init; }

    /// <summary>The measure the target applies to (<see cref="IntervalPf"/> or <see cref="Hazard"/>).</summary>
    public double Value => Measure == AnnualMeasure.Hazard ? Hazard : IntervalPf;

    /// <summary>Annual reliability index −Φ⁻¹(<see cref="Value"/>); +∞ when the value is 0 or negative (e.g. simulation noise).</summary>
    public double AnnualBeta => Value > 0 ? Probability.StandardNormal.InverseCcdf(Math.Min(Value, 1)) : double.PositiveInfinity;

    /// <summary>Updated cumulative Pf(t).</summary>
    public required double CumulativePf { get; init; }

    /// <summary>Updated cumulative reliability index β(t) as given by the updater.</summary>
    public required double CumulativeBeta { get; init; }

    /// <summary>Route of the estimate at t.</summary>
    public required ComputationRoute Route { get; init; }

    /// <summary>False when either estimate behind this value did not converge.</summary>
    public required bool Converged { get; init; }

    /// <summary>Coefficient of variation of the simulated Pf(t), null for first-order or exact routes.</summary>
    public double? CoefficientOfVariation { get; init; }

    /// <summary>
    /// Coefficient of variation of <see cref="IntervalPf"/> when either Pf is simulated, treating the two estimates
    /// as independent: √((V_t·Pf(t))² + (V_s·Pf(s))²)/|ΔPf|. A difference of two simulated probabilities can be far
    /// less precise than either; above about 0.3 the annual number, and a date found from it, is noise-dominated.
    /// Null when neither estimate is simulated.
    /// </summary>
    public double? IntervalPfCoefficientOfVariation { get; init; }
}
