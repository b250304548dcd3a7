using InspectionUpdate.Probability.Numerics;
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
/// Failure probabilities of a sample set under one set of weights: P(T_f ≤ τ | data) and P(τ₁ &lt; T_f ≤ τ₂ | data) per
/// renewal period, each with its delta-method standard error (self-normalized importance sampling, Owen 2013, Monte
/// Carlo theory, methods and examples, §9.2). Immutable.
/// </summary>
internal abstract class WeightedFailureTimes
{
    protected WeightedFailureTimes(double[] weights, double logScale)
    {
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
    }

    /// <summary>Whether the set resolves every whole year under these weights, once its set has checked (null before).</summary>
    internal bool? ResolvesEveryYear { get; set; }

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
    public abstract SampledProbability Cumulative(int period, double localYears);

    /// <summary>P(τ₁ &lt; T_f ≤ τ₂) in renewal period <paramref name="period"/>.</summary>
    public abstract SampledProbability Between(int period, double fromLocalYears, double toLocalYears);

    /// <summary>
    /// Sample i's share in "failed by τ" of a period: the indicator 1[Tᵢ ≤ τ], or its conditional probability given the
    /// sample's inputs where the set integrates part of the randomness exactly.
    /// </summary>
    public abstract double FailedShare(int period, double localYears, int sample);

    /// <summary>The estimate from per-sample shares hᵢ of an event: Σ wᵢhᵢ/Σ wᵢ with the delta-method standard error.</summary>
    protected SampledProbability FromShares(double sumWh, double sumW2h, double sumW2h2)
    {
        if (!(TotalWeight > 0)) return new SampledProbability(double.NaN, double.NaN, 0);
        var p = Math.Clamp(sumWh / TotalWeight, 0, 1);
        // Σ wᵢ²(hᵢ − p)² = Σ wᵢ²hᵢ² − 2p Σ wᵢ²hᵢ + p² Σ wᵢ².
        var variance = (sumW2h2 - 2 * p * sumW2h + p * p * TotalWeightSquared) / (TotalWeight * TotalWeight);
        var effective = sumW2h2 > 0 ? sumWh * sumWh / sumW2h2 : 0;
        return new SampledProbability(p, Math.Sqrt(Math.Max(0, variance)), effective);
    }
}

/// <summary>
/// The failure times of a sample set under one set of weights, sorted per renewal period with prefix sums of w and
/// w², so that P(T_f ≤ τ | data) and P(τ₁ &lt; T_f ≤ τ₂ | data) cost one binary search each. Immutable.
/// </summary>
/// <remarks>
/// With the indicator hᵢ = 1ᵢ the delta-method variance is [(1 − p̂)² A + p̂² (W₂ − A)] / W² where A = Σ_{1ᵢ=1} wᵢ²
/// and W₂ = Σ wᵢ². The same formula with the indicator of the interval gives ΔPf its own standard error, so a
/// difference is never estimated as two noisy numbers.
/// </remarks>
internal sealed class SortedFailureTimes : WeightedFailureTimes
{
    private readonly double[][] _times;
    private readonly double[][] _sortedTimes;
    private readonly double[][] _prefixW;
    private readonly double[][] _prefixW2;

    /// <param name="times">Per period, each sample's local failure time (+∞ when none).</param>
    /// <param name="order">Per period, the sample indices sorted by failure time.</param>
    /// <param name="weights">Weights (any positive scale, 0 allowed).</param>
    /// <param name="logScale">ln of the weights' scale: the true weights are weights·e^logScale.</param>
    public SortedFailureTimes(double[][] times, int[][] order, double[] weights, double logScale)
        : base(weights, logScale)
    {
        var periods = times.Length;
        _times = times;
        _sortedTimes = new double[periods][];
        _prefixW = new double[periods][];
        _prefixW2 = new double[periods][];
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

    /// <inheritdoc />
    public override SampledProbability Cumulative(int period, double localYears) => Between(period, double.NegativeInfinity, localYears);

    /// <inheritdoc />
    public override SampledProbability Between(int period, double fromLocalYears, double toLocalYears)
    {
        var k1 = double.IsNegativeInfinity(fromLocalYears) ? 0 : UpperBound(_sortedTimes[period], fromLocalYears);
        var k2 = UpperBound(_sortedTimes[period], toLocalYears);
        if (k2 < k1) k2 = k1;
        var sw = _prefixW[period][k2] - _prefixW[period][k1];
        var a = _prefixW2[period][k2] - _prefixW2[period][k1];
        return FromShares(sw, a, a);
    }

    /// <inheritdoc />
    public override double FailedShare(int period, double localYears, int sample) => _times[period][sample] <= localYears ? 1 : 0;

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

/// <summary>
/// The failure probabilities of a sample set whose component has an annual-maximum input: each sample carries, per
/// renewal period, its conditional survival probability through each whole year given its inputs,
/// Sᵢ(k) = Π_{j≤k} F_P(p*ᵢⱼ) (the yearly maxima integrated exactly: conditional Monte Carlo, e.g. Rubinstein &amp;
/// Kroese 2017, Simulation and the Monte Carlo Method, §5.4), so that load maxima far in the tail count with their
/// true, tiny probability instead of being missed by the draws. P(T_f ≤ τ | data) = Σ wᵢ(1 − Sᵢ(k(τ)))/Σ wᵢ. Immutable.
/// </summary>
internal sealed class YearlySurvivalCurves : WeightedFailureTimes
{
    private readonly double[][] _logSurvival;
    private readonly int[] _years;
    private readonly double[] _periodStart;
    private readonly SampledProbability[][] _cumulative;

    /// <param name="logSurvival">Per period, ln Sᵢ(k) for sample i and whole year k = 1…Yₑ of the period, at [i·Yₑ + k − 1].</param>
    /// <param name="years">Per period, the number Yₑ of whole years of service that end in it.</param>
    /// <param name="periodStart">Per period, its start in years since entry into service.</param>
    /// <param name="weights">Weights (any positive scale, 0 allowed).</param>
    /// <param name="logScale">ln of the weights' scale.</param>
    public YearlySurvivalCurves(double[][] logSurvival, int[] years, double[] periodStart, double[] weights, double logScale)
        : base(weights, logScale)
    {
        _logSurvival = logSurvival;
        _years = years;
        _periodStart = periodStart;
        _cumulative = new SampledProbability[years.Length][];
        for (var e = 0; e < years.Length; e++)
        {
            _cumulative[e] = new SampledProbability[years[e] + 1];
            for (var k = 0; k <= years[e]; k++) _cumulative[e][k] = k == 0 ? new SampledProbability(0, 0, 0) : Sum(e, 0, k);
        }
    }

    /// <inheritdoc />
    public override SampledProbability Cumulative(int period, double localYears) => _cumulative[period][YearsBy(period, localYears)];

    /// <inheritdoc />
    public override SampledProbability Between(int period, double fromLocalYears, double toLocalYears)
    {
        var k0 = double.IsNegativeInfinity(fromLocalYears) ? 0 : YearsBy(period, fromLocalYears);
        var k1 = YearsBy(period, toLocalYears);
        return k1 <= k0 ? new SampledProbability(0, 0, 0) : k0 == 0 ? _cumulative[period][k1] : Sum(period, k0, k1);
    }

    /// <inheritdoc />
    public override double FailedShare(int period, double localYears, int sample)
    {
        var k = YearsBy(period, localYears);
        return k == 0 ? 0 : -ElementaryFunctions.Expm1(_logSurvival[period][sample * _years[period] + k - 1]);
    }

    /// <summary>Number of whole years of service ended by local time τ of the period.</summary>
    private int YearsBy(int period, double localYears)
    {
        if (double.IsPositiveInfinity(localYears)) return _years[period];
        return Math.Min(ServiceYears.EndedBy(_periodStart[period], localYears), _years[period]);
    }

    /// <summary>hᵢ = Sᵢ(k0) − Sᵢ(k1) = Sᵢ(k0)·(1 − Sᵢ(k1)/Sᵢ(k0)), summed with the weights (accurate for tiny differences).</summary>
    private SampledProbability Sum(int period, int k0, int k1)
    {
        var y = _years[period];
        var log = _logSurvival[period];
        double sumWh = 0, sumW2h = 0, sumW2h2 = 0;
        for (var i = 0; i < Count; i++)
        {
            var w = Weights[i];
            if (w == 0) continue;
            var l1 = log[i * y + k1 - 1];
            var l0 = k0 == 0 ? 0 : log[i * y + k0 - 1];
            var h = Math.Exp(l0) * -ElementaryFunctions.Expm1(l1 - l0);
            if (!(h > 0)) continue;
            sumWh += w * h;
            sumW2h += w * w * h;
            sumW2h2 += w * w * h * h;
        }

        return FromShares(sumWh, sumW2h, sumW2h2);
    }
}

/// <summary>Whole years of service (ending at whole years since entry into service) counted within a renewal period.</summary>
internal static class ServiceYears
{
    /// <summary>Number of whole years of service that end in (periodStart, periodStart + localYears], at least 0.</summary>
    public static int EndedBy(double periodStart, double localYears) =>
        Math.Max(0, (int)Math.Floor(periodStart + localYears + 1e-9) - (int)Math.Floor(periodStart + 1e-9));

    /// <summary>The first whole year of service that ends after the period's start.</summary>
    public static int First(double periodStart) => (int)Math.Floor(periodStart + 1e-9) + 1;
}
