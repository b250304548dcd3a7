using System.Globalization;

namespace InspectionUpdate.Reliability.Systems;

/// <summary>
/// A first-order event in standard normal space, {αᵀU ≥ β}, the linearization
/// G(u) ≈ ‖∇G‖(β − αᵀu) of a limit state at a point (FORM convention: α = −∇G/‖∇G‖, failure G ≤ 0).
/// </summary>
/// <param name="Beta">Signed reliability index β of the event; P(event) = Φ(−β).</param>
/// <param name="Alpha">Unit direction α (length 1 within 1e-6; the constructor of the system checks it).</param>
public readonly record struct LinearizedEvent(double Beta, IReadOnlyList<double> Alpha)
{
    /// <summary>The event of a FORM result: β and α at its own design point.</summary>
    public static LinearizedEvent FromForm(FormResult form)
    {
        ArgumentNullException.ThrowIfNull(form);
        return new LinearizedEvent(form.Beta, form.Alpha);
    }

    internal void Validate(int index, int dimension)
    {
        if (!double.IsFinite(Beta))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"Event {index}: β = {Beta} is not finite."), "events");
        }

        if (Alpha is null || Alpha.Count != dimension)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"Event {index}: α has {Alpha?.Count ?? 0} entries; expected {dimension}."), "events");
        }

        var norm2 = 0.0;
        foreach (var a in Alpha) norm2 += a * a;
        if (!(Math.Abs(Math.Sqrt(norm2) - 1) <= 1e-6))
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"Event {index}: ‖α‖ = {Math.Sqrt(norm2):R}; α must be a unit vector."), "events");
        }
    }
}
