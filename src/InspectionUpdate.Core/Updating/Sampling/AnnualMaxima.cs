using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The annual-maximum input of a component (an annual maximum pressure, say) on the sample-set route. Its yearly maxima
/// Pⱼ are independent of each other and of the other inputs, so given a sample's other inputs x the years' failure
/// events are independent and P(no failure in years 1…k | x) = Π_{j≤k} F_P(p*(x, j)), where p*(x, j) is the load at
/// which g(x, P, j) = 0 (g must not increase with the load). The set integrates the maxima exactly per sample
/// (conditional Monte Carlo) rather than drawing them: a draw would miss the load's far tail, which can dominate the
/// small early-year probabilities. Failure is read at the end of each year, as the yearly series system of the
/// first-order route defines it. The sampling density leaves this coordinate at the prior.
/// </summary>
internal sealed class AnnualMaxima
{
    private readonly RandomVariable _variable;
    private readonly int _localIndex;

    private readonly double _low;
    private readonly double _high;

    private AnnualMaxima(RandomVariable variable, int localIndex, int standardIndex)
    {
        _variable = variable;
        _localIndex = localIndex;
        StandardIndex = standardIndex;
        // The loads searched: the yearly maximum's quantiles 1e-15 and 1 − 1e-15.
        _low = variable.InverseCdf(1e-15);
        _high = variable.InverseCcdf(1e-15);
    }

    /// <summary>Index of the input in the standard normal vector of the augmented model.</summary>
    public int StandardIndex { get; }

    /// <summary>The annual maximum of a component, or null when its inputs are all time-invariant.</summary>
    /// <exception cref="NotSupportedException">The annual maximum is correlated with another input.</exception>
    public static AnnualMaxima? Of(EvidenceModel model, IDegradationModel component, IProbabilityTransformation transformation)
    {
        if (component.AnnualMaximumInput is not { } name) return null;
        var local = component.Inputs.IndexOf(name);
        if (local < 0) throw new ArgumentException($"The annual-maximum input '{name}' is not among the inputs of model '{component.Name}'.", nameof(component));
        if (component.Inputs.Correlation is { } r)
        {
            for (var j = 0; j < r.Dimension; j++)
            {
                if (j != local && r[local, j] != 0)
                {
                    throw new NotSupportedException(
                        $"Model '{component.Name}': the annual-maximum input '{name}' is correlated with '{component.Inputs.Variables[j].Name}'; the yearly maxima are drawn independently of the other inputs.");
                }
            }
        }

        var augmented = model.IndexOfInput(UpdatingCase.SingleComponentId, name, 0);
        var standard = model.InputModel.RandomIndices.ToList().IndexOf(augmented);
        if (standard < 0 || transformation.StandardDimension != model.InputModel.RandomIndices.Count)
        {
            throw new ArgumentException($"The annual-maximum input '{name}' of model '{component.Name}' must be a random input.", nameof(component));
        }

        return new AnnualMaxima(component.Inputs.Variables[local], local, standard);
    }

    /// <summary>
    /// ln P(no failure in whole years 1…k of the period | x) for k = 1…<paramref name="logSurvival"/>.Length, the
    /// years being those of service that end in the period (the first ends at ⌊start⌋ + 1).
    /// </summary>
    /// <exception cref="NotSupportedException">The margin increases with the load.</exception>
    public void LogSurvival(IDegradationModel component, Span<double> local, double periodStart, Span<double> logSurvival, out int evaluations)
    {
        evaluations = 0;
        var first = ServiceYears.First(periodStart);
        var total = 0.0;
        for (var k = 0; k < logSurvival.Length; k++)
        {
            var localTime = first + k - periodStart;
            total += LogNonExceedance(component, local, localTime, ref evaluations);
            logSurvival[k] = total;
        }
    }

    /// <summary>ln F_P(p*): the log probability that the year's maximum stays below the load that fails the component.</summary>
    private double LogNonExceedance(IDegradationModel component, Span<double> local, double localTime, ref int evaluations)
    {
        var lo = _low;
        var hi = _high;
        var gLo = Margin(component, local, lo, localTime, ref evaluations);
        var gHi = Margin(component, local, hi, localTime, ref evaluations);
        if (double.IsNaN(gLo) || double.IsNaN(gHi)) return double.NaN;
        if (gLo <= 0 && gHi > 0)
        {
            throw new NotSupportedException(
                $"Model '{component.Name}': the margin increases with the annual maximum '{component.AnnualMaximumInput}'; the sample-set route needs a load that does not help the component.");
        }

        // Fails even under the lowest yearly maximum considered, or survives the highest: the tails beyond are below 1e-15 a year.
        if (gLo <= 0) return Math.Log(_variable.Cdf(lo));
        if (gHi > 0) return ElementaryFunctions.Log1p(-_variable.Ccdf(hi));

        // Illinois variant of regula falsi on [lo, hi]: exact in one step for a margin linear in the load.
        var scale = Math.Abs(gLo) + Math.Abs(gHi);
        var side = 0;
        var root = lo;
        for (var iteration = 0; iteration < 100; iteration++)
        {
            root = (lo * gHi - hi * gLo) / (gHi - gLo);
            var g = Margin(component, local, root, localTime, ref evaluations);
            if (Math.Abs(g) <= 1e-13 * scale || hi - lo <= 1e-12 * Math.Max(1, Math.Abs(root))) break;
            if (g > 0)
            {
                lo = root;
                gLo = g;
                if (side == 1) gHi *= 0.5;
                side = 1;
            }
            else
            {
                hi = root;
                gHi = g;
                if (side == -1) gLo *= 0.5;
                side = -1;
            }
        }

        var cdf = _variable.Cdf(root);
        return cdf < 0.5 ? Math.Log(cdf) : ElementaryFunctions.Log1p(-_variable.Ccdf(root));
    }

    private double Margin(IDegradationModel component, Span<double> local, double load, double localTime, ref int evaluations)
    {
        local[_localIndex] = load;
        evaluations++;
        return component.Margin(local, localTime);
    }
}
