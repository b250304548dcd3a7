namespace InspectionUpdate.Updating.Sampling;

/// <summary>A sampled probability with its standard error and the effective number of samples behind it.</summary>
/// <param name="Value">The self-normalized estimate Σ wᵢ 1ᵢ / Σ wᵢ, in [0, 1].</param>
/// <param name="StandardError">Delta-method standard error of the ratio estimator.</param>
/// <param name="EffectiveEvents">(Σ_{1ᵢ=1} wᵢ)² / Σ_{1ᵢ=1} wᵢ²: the effective number of samples in the event.</param>
public readonly record struct SampledProbability(double Value, double StandardError, double EffectiveEvents)
{
    /// <summary>StandardError / Value; +∞ when the value is 0.</summary>
    public double CoefficientOfVariation => Value > 0 ? StandardError / Value : double.PositiveInfinity;
}

/// <summary>
/// The failure times of a sample set under one set of weights, sorted per renewal period with prefix sums of w and
/// w², so that P(T_f ≤ τ | data) and P(τ₁ &lt; T_f ≤ τ₂ | data) cost one binary search each. Immutable.
/// </summary>
/// <remarks>
/// Self-normalized importance sampling: p̂ = Σ wᵢ1ᵢ / Σ wᵢ, with the delta-method variance
/// Σ wᵢ²(1ᵢ − p̂)² / (Σ wᵢ)² = [(1 − p̂)² A + p̂² (W₂ − A)] / W² where A = Σ_{1ᵢ=1} wᵢ² and W₂ = Σ wᵢ²
/// (Owen 2013, Monte Carlo theory, methods and examples, §9.2). The same formula with the indicator of the interval
/// gives ΔPf its own standard error, so a difference is never estimated as two noisy numbers.
/// </remarks>
internal sealed class WeightedFailureTimes
{
    private readonly double[][] _sortedTimes;
    private readonly double[][] _prefixW;
    private readonly double[][] _prefixW2;

    /// <param name="times">Per period, each sample's local failure time (+∞ when none).</param>
    /// <param name="order">Per period, the sample indices sorted by failure time.</param>
    /// <param name="weights">Weights (any positive scale, 0 allowed).</param>
    /// <param name="logScale">ln of the weights' scale: the true weights are weights·e^logScale.</param>
    public WeightedFailureTimes(double[][] times, int[][] order, double[] weights, double logScale)
    {
        var periods = times.Length;
        _sortedTimes = new double[periods][];
        _prefixW = new double[periods][];
        _prefixW2 = new double[periods][];
        double total = 0, total2 = 0;
        foreach (var w in weights)
        {
            total += w;
            total2 += w * w;
        }

        Weights = weights;
        TotalWeight = total;
        TotalWeightSquared = total2;
        Count = weights.Length;
        LogMeanWeight = total > 0 ? Math.Log(total / weights.Length) + logScale : double.NegativeInfinity;
        for (var e = 0; e < periods; e++)
        {
            var n = order[e].Length;
            var t = new double[n];
            var p = new double[n + 1];
            var p2 = new double[n + 1];
            for (var k = 0; k < n; k++)
            {
                var i = order[e][k];
                t[k] = times[e][i];
                p[k + 1] = p[k] + weights[i];
                p2[k + 1] = p2[k] + weights[i] * weights[i];
            }

            _sortedTimes[e] = t;
            _prefixW[e] = p;
            _prefixW2[e] = p2;
        }
    }

    /// <summary>The weights, in sample order (scaled; see the constructor).</summary>
    public double[] Weights { get; }

    /// <summary>Number of samples.</summary>
    public int Count { get; }

    /// <summary>Σ wᵢ.</summary>
    public double TotalWeight { get; }

    /// <summary>Σ wᵢ².</summary>
    public double TotalWeightSquared { get; }

    /// <summary>Kish's effective sample size (Σ w)²/Σ w².</summary>
    public double EffectiveSampleSize => TotalWeightSquared > 0 ? TotalWeight * TotalWeight / TotalWeightSquared : 0;

    /// <summary>ln of the mean true weight: ln P(data) (a density for equalities), −∞ when every weight is 0.</summary>
    public double LogMeanWeight { get; }

    /// <summary>P(T_f ≤ τ) in renewal period <paramref name="period"/>, τ local time.</summary>
    public SampledProbability Cumulative(int period, double localYears) => Between(period, double.NegativeInfinity, localYears);

    /// <summary>P(τ₁ &lt; T_f ≤ τ₂) in renewal period <paramref name="period"/>.</summary>
    public SampledProbability Between(int period, double fromLocalYears, double toLocalYears)
    {
        if (!(TotalWeight > 0)) return new SampledProbability(double.NaN, double.NaN, 0);
        var k1 = double.IsNegativeInfinity(fromLocalYears) ? 0 : UpperBound(_sortedTimes[period], fromLocalYears);
        var k2 = UpperBound(_sortedTimes[period], toLocalYears);
        if (k2 < k1) k2 = k1;
        var sw = _prefixW[period][k2] - _prefixW[period][k1];
        var a = _prefixW2[period][k2] - _prefixW2[period][k1];
        var p = Math.Clamp(sw / TotalWeight, 0, 1);
        var variance = ((1 - p) * (1 - p) * a + p * p * Math.Max(0, TotalWeightSquared - a)) / (TotalWeight * TotalWeight);
        var effective = a > 0 ? sw * sw / a : 0;
        return new SampledProbability(p, Math.Sqrt(Math.Max(0, variance)), effective);
    }

    /// <summary>Number of sorted entries ≤ value.</summary>
    private static int UpperBound(double[] sorted, double value)
    {
        int lo = 0, hi = sorted.Length;
        while (lo < hi)
        {
            var mid = (lo + hi) >>> 1;
            if (sorted[mid] <= value) lo = mid + 1;
            else hi = mid;
        }

        return lo;
    }
}
