namespace InspectionUpdate.Degradation;

/// <summary>
/// A degradation model that knows, for one realization x of its inputs, when its limit state is first reached:
/// T_f(x) = inf{t ≥ 0 : g(x, t) ≤ 0}. The sampling route reads every Pf(t) of a profile off the distribution of T_f,
/// so a closed form here saves a root search per sample.
/// </summary>
public interface IFailureTimeModel
{
    /// <summary>
    /// T_f(x) in years (local time since entry into service or the last renewal): 0 when g(x, 0) ≤ 0, +∞ when g never
    /// reaches 0, NaN when this model has no closed form for this x (the caller then searches g(x, t) in t).
    /// </summary>
    double FailureTimeYears(ReadOnlySpan<double> x);

    /// <summary>True when g(x, t) never increases with t for this x, so one bracketed root finds the first passage.</summary>
    bool MarginNeverIncreases(ReadOnlySpan<double> x);
}
