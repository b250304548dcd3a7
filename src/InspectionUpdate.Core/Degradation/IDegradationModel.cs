using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation;

/// <summary>
/// A degradation mechanism of one component: uncertain inputs, the degradation size over time, and the limit state
/// over time. Time is in years since the component entered service (or since its last renewal).
/// </summary>
/// <remarks>
/// Implementations are immutable and thread-safe. <see cref="Size"/> is what inspections observe (crack depth,
/// wall loss), so the updating layer builds inspection events from it.
/// </remarks>
public interface IDegradationModel
{
    /// <summary>Name shown in results, e.g. "External corrosion, linear rate".</summary>
    string Name { get; }

    /// <summary>The random inputs x, named with units (e.g. "rate_mmPerYear").</summary>
    StochasticModel Inputs { get; }

    /// <summary>What <see cref="Size"/> measures, with its unit, e.g. "depth_mm".</summary>
    string SizeQuantity { get; }

    /// <summary>Degradation size at time t (years), in mm: the quantity an inspection detects or measures.</summary>
    double Size(ReadOnlySpan<double> x, double timeYears);

    /// <summary>Limit state g(x, t): failure when ≤ 0.</summary>
    double Margin(ReadOnlySpan<double> x, double timeYears);

    /// <summary>
    /// Names of inputs that describe the component's own degradation state and restart after a repair
    /// (e.g. initial crack depth, coating life). The others are shared parameters (e.g. the corrosion rate of the
    /// environment, the stress range) that survive a repair and keep what earlier findings taught about them.
    /// </summary>
    IReadOnlyList<string> RenewedOnRepair { get; }

    /// <summary>
    /// Name of an input that is an annual maximum renewed independently each year (e.g. the annual maximum
    /// operating pressure), or null when every input is time-invariant. With an annual maximum the cumulative
    /// failure probability is the series system of the yearly events.
    /// </summary>
    string? AnnualMaximumInput { get; }

    /// <summary>The largest physically possible size in mm (e.g. the wall thickness), used to refuse impossible findings; +∞ when unbounded.</summary>
    double MaximumSizeMm { get; }
}
