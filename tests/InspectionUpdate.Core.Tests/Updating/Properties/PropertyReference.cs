using System.Globalization;
using InspectionUpdate.Reliability;
using MathNet.Numerics;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>Families of the random inputs of the property tests.</summary>
internal enum Family
{
    Normal,
    Lognormal,
    Gumbel,
    Uniform,
    Weibull,
}

/// <summary>
/// One random input, drawn by the test's own inverse transforms (not the engine's): normal μ + σz; lognormal
/// exp(λ + ζz) with ζ² = ln(1 + V²), λ = ln μ − ζ²/2; Gumbel (largest) u − β·ln(−ln p); uniform a + (b − a)p;
/// Weibull (two-parameter) λ·(−ln(1 − p))^(1/k). The same parameters are written into the model file in the form
/// the model reader accepts.
/// </summary>
/// <param name="A">Normal mean, lognormal mean, Gumbel location, uniform lower bound, Weibull shape.</param>
/// <param name="B">Normal sd, lognormal CoV, Gumbel scale, uniform upper bound, Weibull scale.</param>
internal sealed record Marginal(string Name, Family Family, double A, double B)
{
    /// <summary>True when the support lies in (0, ∞) (up to a Gumbel tail below 1e-12, see the generator).</summary>
    public bool Positive => Family != Family.Normal;

    /// <summary>ζ of a lognormal input.</summary>
    public double Zeta => Math.Sqrt(Math.Log(1 + B * B));

    /// <summary>The value for a standard normal z (normal, lognormal) or a probability p in (0, 1) (the rest).</summary>
    public double FromNormal(double z) => Family switch
    {
        Family.Normal => A + B * z,
        Family.Lognormal => Math.Exp(Math.Log(A) - 0.5 * Zeta * Zeta + Zeta * z),
        _ => FromProbability(IndependentDraws.Phi(z)),
    };

    /// <summary>The value at probability p ∈ (0, 1).</summary>
    public double FromProbability(double p) => Family switch
    {
        Family.Gumbel => A - B * Math.Log(-Math.Log(p)),
        Family.Uniform => A + (B - A) * p,
        Family.Weibull => B * Math.Pow(-Math.Log(1 - p), 1 / A),
        _ => FromNormal(IndependentDraws.InversePhiForTests(p)),
    };

    /// <summary>JSON text of the input for a component-model file.</summary>
    public string Json() => Family switch
    {
        Family.Normal => Invariant($"{{ \"family\": \"Normal\", \"mean\": {A:R}, \"sd\": {B:R} }}"),
        Family.Lognormal => Invariant($"{{ \"family\": \"Lognormal\", \"mean\": {A:R}, \"cov\": {B:R} }}"),
        Family.Gumbel => Invariant($"{{ \"family\": \"Gumbel\", \"location\": {A:R}, \"scale\": {B:R} }}"),
        Family.Uniform => Invariant($"{{ \"family\": \"Uniform\", \"lower\": {A:R}, \"upper\": {B:R} }}"),
        _ => Invariant($"{{ \"family\": \"Weibull\", \"shape\": {A:R}, \"scale\": {B:R} }}"),
    };

    public override string ToString() => Invariant($"{Name} {Family}({A:G6}, {B:G6})");

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}

/// <summary>
/// The test's own source of random numbers for the references: System.Random (seeded), standard normals by the polar
/// method (Marsaglia &amp; Bray 1964), Φ by MathNet's erfc. Nothing here calls the engine's samplers or transformations.
/// </summary>
internal sealed class IndependentDraws(int seed)
{
    private readonly Random _rng = new(seed);
    private double? _spare;

    /// <summary>Uniform on (0, 1).</summary>
    public double Uniform()
    {
        double u;
        do u = _rng.NextDouble();
        while (u <= 0);
        return u;
    }

    /// <summary>A standard normal draw.</summary>
    public double Normal()
    {
        if (_spare is { } s)
        {
            _spare = null;
            return s;
        }

        double v1, v2, r;
        do
        {
            v1 = 2 * _rng.NextDouble() - 1;
            v2 = 2 * _rng.NextDouble() - 1;
            r = v1 * v1 + v2 * v2;
        }
        while (r >= 1 || r == 0);
        var f = Math.Sqrt(-2 * Math.Log(r) / r);
        _spare = v2 * f;
        return v1 * f;
    }

    /// <summary>Φ(z) = erfc(−z/√2)/2.</summary>
    public static double Phi(double z) => 0.5 * SpecialFunctions.Erfc(-z / Math.Sqrt(2));

    /// <summary>Φ⁻¹(p) = −√2·erfc⁻¹(2p) (MathNet).</summary>
    public static double InversePhiForTests(double p) => -Math.Sqrt(2) * SpecialFunctions.ErfcInv(2 * p);
}

/// <summary>
/// Weighted histogram of first failure over a yearly grid: bin k holds the samples whose failure is first seen at grid
/// year k + 1. Pf(t) = Σ_{k ≤ t} S₁ₖ / Σw (the ratio estimator; all weights 1 for crude Monte Carlo) and ΔPf(t) = S₁ₜ/Σw,
/// each with the delta-method standard error √(Σ wᵢ²(1ᵢ − p)²)/Σw (Owen 2013, Monte Carlo theory, §9.2, ratio
/// estimators; from memory). Cumulative sums restart at <paramref name="periodStarts"/> (renewal after a repair).
/// </summary>
internal sealed class FailureHistogram(int years, IReadOnlyList<int>? periodStarts = null)
{
    private readonly double[] _s1 = new double[years];
    private readonly double[] _s2 = new double[years];
    private readonly HashSet<int> _starts = [.. periodStarts ?? []];

    public double TotalWeight { get; private set; }

    public double TotalSquares { get; private set; }

    public long Samples { get; private set; }

    /// <summary>Effective sample size (Σw)²/Σw² (Kish).</summary>
    public double EffectiveSampleSize => TotalSquares > 0 ? TotalWeight * TotalWeight / TotalSquares : 0;

    public void AddSample(double w)
    {
        Samples++;
        TotalWeight += w;
        TotalSquares += w * w;
    }

    /// <summary>Counts a sample of weight w as first failed at grid year index k (0-based: year k + 1).</summary>
    public void AddFailure(int k, double w)
    {
        _s1[k] += w;
        _s2[k] += w * w;
    }

    /// <summary>(estimate, standard error) of the cumulative Pf and of ΔPf at each grid year.</summary>
    public (Estimate[] Cumulative, Estimate[] Interval) Estimates()
    {
        var cumulative = new Estimate[years];
        var interval = new Estimate[years];
        double c1 = 0, c2 = 0;
        for (var k = 0; k < years; k++)
        {
            if (_starts.Contains(k))
            {
                c1 = 0;
                c2 = 0;
            }

            c1 += _s1[k];
            c2 += _s2[k];
            cumulative[k] = Ratio(c1, c2);
            interval[k] = Ratio(_s1[k], _s2[k]);
        }

        return (cumulative, interval);
    }

    private Estimate Ratio(double hit1, double hit2)
    {
        var p = hit1 / TotalWeight;
        var v = (1 - p) * (1 - p) * hit2 + p * p * (TotalSquares - hit2);
        return new Estimate(p, Math.Sqrt(Math.Max(0, v)) / TotalWeight, EffectiveSampleSize);
    }
}

/// <summary>A reference value with its standard error (0 for a closed form) and the effective sample size behind it (∞ for a closed form).</summary>
internal readonly record struct Estimate(double Value, double StandardError, double EffectiveSamples)
{
    public static Estimate Exact(double value) => new(value, 0, double.PositiveInfinity);

    /// <summary>
    /// The reference's standard error for the comparison with an engine value q: the larger of its own estimate and
    /// √(q(1 − q)/ESS), the error it would have if q were the truth. With few failures the sample estimate of the
    /// error is itself unreliable (zero failures give zero); the second term keeps the check honest then.
    /// </summary>
    public double ErrorAgainst(double q) => double.IsPositiveInfinity(EffectiveSamples)
        ? StandardError
        : Math.Max(StandardError, Math.Sqrt(Math.Clamp(Math.Max(q, Value), 0, 1) * (1 - Math.Clamp(Math.Min(q, Value), 0, 1)) / EffectiveSamples));

    /// <summary>Relative standard error of the reference (∞ at 0).</summary>
    public double RelativeError => Value > 0 ? StandardError / Value : double.PositiveInfinity;
}

/// <summary>
/// The checks shared by both property tests, applied to every point of one profile against its reference; each
/// problem is written as one line naming the case, the time and both numbers.
/// </summary>
internal sealed class ConvergedNumberChecks(string caseText)
{
    /// <summary>Allowed distance of a converged number from its reference, in combined standard errors.</summary>
    public const double StandardErrors = 4;

    /// <summary>Allowed relative distance of a first-order number the route kept (plus four reference standard errors).</summary>
    public const double FirstOrderTolerance = 0.10;

    private int _index;
    private string _kind = "";

    /// <summary>Every problem: the general ones (range, monotonicity, hazard) and the failed comparisons.</summary>
    public IEnumerable<string> Failures => General.Concat(Keyed.Select(k => k.Text));

    /// <summary>The level below which the route keeps first-order values (SampleSetOptions.NegligibleProbability's default).</summary>
    public const double NegligibleProbability = 1e-9;

    /// <summary>Problems of a known defect of the sample-set route (listed in the test output; the strict tests fail on them).</summary>
    public List<string> Known { get; } = [];

    /// <summary>Problems that do not depend on the reference.</summary>
    public List<string> General { get; } = [];

    /// <summary>Failed comparisons with the reference, each with (point index, "Pf" or "ΔPf").</summary>
    public List<((int Index, string Kind) Key, string Text)> Keyed { get; } = [];

    /// <summary>Keys of the failed comparisons.</summary>
    public HashSet<(int Index, string Kind)> FailedKeys => Keyed.Select(k => k.Key).ToHashSet();

    public int ComparedSampled { get; private set; }

    public int ComparedFirstOrder { get; private set; }

    public int ComparedBounds { get; private set; }

    /// <summary>Points whose Pf is NaN with a note that the findings have zero likelihood under the model.</summary>
    public int Undefined { get; private set; }

    /// <summary>Relative reference error below which a first-order number is compared with the 10 % tolerance.</summary>
    public double FirstOrderResolution { get; init; } = 0.025;

    /// <param name="profile">The route's profile on yearly times 1…n.</param>
    /// <param name="cumulative">Reference Pf at each time.</param>
    /// <param name="interval">Reference ΔPf at each time (from the previous time or the renewal).</param>
    /// <param name="periodStarts">Indices of points that start a renewal period (cumulative Pf may fall there).</param>
    public void Check(ReliabilityProfile profile, Estimate[] cumulative, Estimate[] interval, IReadOnlyCollection<int>? periodStarts = null)
    {
        var prev = 0.0;
        var prevConverged = true;
        for (var i = 0; i < profile.Points.Count; i++)
        {
            var p = profile.Points[i];
            var at = $"{caseText}, t = {p.TimeYears:0.##}";
            var restart = i == 0 || (periodStarts?.Contains(i) ?? false);
            var undefined = double.IsNaN(p.CumulativePf) && !p.Converged && (p.Note?.Contains("zero likelihood", StringComparison.Ordinal) ?? false);
            if (undefined)
            {
                // Explicitly undefined: every sample contradicts the findings, said in the note, not converged.
                Undefined++;
                continue;
            }

            if (!(p.CumulativePf >= 0 && p.CumulativePf <= 1)) General.Add($"{at}: cumulative Pf {p.CumulativePf:R} outside [0, 1] ({p.Route}, converged {p.Converged})");
            if (!(p.IntervalPf >= 0 && p.IntervalPf <= 1)) General.Add($"{at}: ΔPf {p.IntervalPf:R} outside [0, 1] ({p.Route}, converged {p.Converged})");
            if (double.IsNaN(p.Hazard))
            {
                if (p.Note is null || !p.Note.Contains("hazard undefined", StringComparison.Ordinal)) General.Add($"{at}: hazard NaN without a note");
            }
            else if (!double.IsFinite(p.Hazard) || p.Hazard < 0)
            {
                General.Add($"{at}: hazard {p.Hazard:R}");
            }

            if (!restart && p.CumulativePf < prev)
            {
                var text = $"{at}: cumulative Pf falls from {prev:E4} to {p.CumulativePf:E4} ({p.Route}, converged {p.Converged}) [{p.Note}]";
                // Known defect: below the negligible level the route switches between first-order and sampled values
                // (or between first-order values) that do not respect the order in time.
                if (prev <= NegligibleProbability) Known.Add(text);
                else General.Add(text);
            }

            prev = p.CumulativePf;

            _index = i;
            _kind = "Pf";
            if (p.Converged) CheckCumulative(at, p, cumulative[i]);
            _kind = "ΔPf";
            if (p.Converged && (restart || prevConverged)) CheckInterval(at, p, interval[i]);
            prevConverged = p.Converged;
        }
    }

    private void CheckCumulative(string at, ProfilePoint p, Estimate r)
    {
        var q = p.CumulativePf;
        if (p.UpperBound is { } bound)
        {
            ComparedBounds++;
            var rse = r.ErrorAgainst(bound);
            if (bound < r.Value - StandardErrors * rse) Fail($"{at}: upper bound {bound:E4} below the reference {r.Value:E4} ± {rse:E2}");
            return;
        }

        if (p.Route is ComputationRoute.ImportanceSampling or ComputationRoute.MonteCarlo or ComputationRoute.SubsetSimulation)
        {
            ComparedSampled++;
            var se = (p.CoefficientOfVariation ?? 0) * q;
            var rse = r.ErrorAgainst(q);
            var combined = Math.Sqrt(se * se + rse * rse);
            if (Math.Abs(q - r.Value) > StandardErrors * combined + 1e-12 * r.Value)
            {
                Fail($"{at}: converged Pf {q:E4} ± {se:E2} ({p.Route}) against the reference {r.Value:E4} ± {rse:E2}: {Math.Abs(q - r.Value) / combined:F1} combined standard errors [{p.Note}]");
            }

            return;
        }

        CheckFirstOrder(at, "Pf", q, p, r);
    }

    private void CheckInterval(string at, ProfilePoint p, Estimate r)
    {
        var d = p.IntervalPf;
        if (p.UpperBound is not null) return;
        if (p.IntervalCoefficientOfVariation is { } icov)
        {
            ComparedSampled++;
            var se = icov * d;
            var rse = r.ErrorAgainst(d);
            var combined = Math.Sqrt(se * se + rse * rse);
            if (Math.Abs(d - r.Value) > StandardErrors * combined + 1e-12 * r.Value)
            {
                Fail($"{at}: converged ΔPf {d:E4} ± {se:E2} against the reference {r.Value:E4} ± {rse:E2}: {Math.Abs(d - r.Value) / combined:F1} combined standard errors [{p.Note}]");
            }

            return;
        }

        if (p.Route is ComputationRoute.ImportanceSampling && d == 0 && p.CumulativePf == 0)
        {
            // "Exactly 0" before an in-service record: the reference must be 0 too (within its noise).
            ComparedSampled++;
            var rse = r.ErrorAgainst(0);
            if (r.Value > StandardErrors * rse) Fail($"{at}: ΔPf exactly 0 against the reference {r.Value:E4} ± {rse:E2}");
            return;
        }

        CheckFirstOrder(at, "ΔPf", d, p, r);
    }

    /// <summary>
    /// A number the route kept from first order (or a difference involving one): within 10 % of the reference plus
    /// four of its standard errors where the reference resolves it; where it does not, not above the reference by more
    /// than four standard errors (a crude reference cannot see below about 1/N).
    /// </summary>
    private void CheckFirstOrder(string at, string what, double q, ProfilePoint p, Estimate r)
    {
        var rse = r.ErrorAgainst(q);
        if (r.RelativeError <= FirstOrderResolution || r.StandardError == 0 && r.Value > 0)
        {
            ComparedFirstOrder++;
            if (Math.Abs(q - r.Value) > FirstOrderTolerance * r.Value + StandardErrors * rse)
            {
                Fail($"{at}: converged {what} {q:E4} ({p.Route}) against the reference {r.Value:E4} ± {rse:E2}: more than 10 % off [{p.Note}]");
            }
        }
        else if (q > r.Value + StandardErrors * rse)
        {
            ComparedFirstOrder++;
            Fail($"{at}: converged {what} {q:E4} ({p.Route}) above the unresolved reference {r.Value:E4} ± {rse:E2} [{p.Note}]");
        }
    }

    private void Fail(string text)
    {
        Keyed.Add(((_index, _kind), text));
    }
}
