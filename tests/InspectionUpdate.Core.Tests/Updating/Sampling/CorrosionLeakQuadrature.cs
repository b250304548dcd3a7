using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;
using MathNet.Numerics.Integration;

namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// An independent reference for linear wall-loss corrosion with a leak limit state: g = f·w − r·max(0, t − T₀) with
/// w fixed, T₀ and r lognormal. Failure by t ⇔ T₀ &lt; t and r ≥ f·w/(t − T₀), so
/// P(F(t) ∩ data) = ∫ φ(v) ∫_{u*(v)}^{∞} L(r(u), T₀(v)) φ(u) du dv with u*(v) = Φ⁻¹(F_r(f·w/(t − T₀(v)))), and
/// P(data) the same integral over all u, both by MathNet's Gauss–Legendre rules (not the production code): 256 points
/// inside, 128 points on each piece of the outer integral, split at the kinks T₀ = tₖ of the findings' sizes and at T₀ = t.
/// </summary>
internal sealed class CorrosionLeakQuadrature
{
    public const double Wall = 10, LeakFraction = 0.8;
    public static readonly LognormalVariable Initiation = LognormalVariable.FromMeanCov(CorrosionModel.InitiationTime, 6, 0.4);
    public static readonly LognormalVariable Rate = LognormalVariable.FromMeanCov(CorrosionModel.Rate, 0.22, 0.35);

    private readonly (double TimeYears, Func<double, double> Likelihood)[] _findings;

    /// <param name="findings">Each finding's time and its likelihood as a function of the depth at that time.</param>
    public CorrosionLeakQuadrature(IEnumerable<(double TimeYears, Func<double, double> Likelihood)> findings) => _findings = findings.ToArray();

    public static CorrosionModel Model() => new(
        new StochasticModel([new DeterministicVariable(CorrosionModel.WallThickness, Wall), Initiation, Rate]),
        new CorrosionSettings { GrowthLaw = CorrosionGrowthLaw.Linear, FailureMode = CorrosionFailureMode.Leak, LeakFraction = LeakFraction });

    /// <summary>Likelihood of no indication: 1 − PoD(a).</summary>
    public static Func<double, double> NoIndication(ProbabilityOfDetection pod) => a => 1 - pod.Evaluate(a);

    /// <summary>Likelihood of a depth measured as a_m with additive normal error N(0, σ²) (up to a constant).</summary>
    public static Func<double, double> Sized(double measuredMm, double sd) => a => Math.Exp(-0.5 * Math.Pow((measuredMm - a) / sd, 2));

    /// <summary>P(F(t) | data), cumulative.</summary>
    public double Conditional(double t) => Joint(t) / (_evidence ??= Joint(double.PositiveInfinity));

    private double? _evidence;

    /// <summary>P(F(t) ∩ data); t = +∞ gives P(data).</summary>
    public double Joint(double t)
    {
        const double lo = -8, hi = 8;
        var cuts = new List<double> { lo, hi };
        foreach (var tk in _findings.Select(f => f.TimeYears).Append(t))
        {
            if (double.IsFinite(tk)) cuts.Add(StandardNormal.InverseCdf(Initiation.Cdf(tk)));
        }

        var points = cuts.Where(c => c >= lo && c <= hi).Distinct().Order().ToArray();
        var total = 0.0;
        for (var k = 0; k + 1 < points.Length; k++)
        {
            total += GaussLegendreRule.Integrate(v => StandardNormal.Pdf(v) * Inner(t, Initiation.InverseCdf(StandardNormal.Cdf(v))),
                points[k], points[k + 1], 128);
        }

        return total;
    }

    private double Inner(double t, double t0)
    {
        double from;
        if (double.IsPositiveInfinity(t))
        {
            from = -8;
        }
        else
        {
            if (t0 >= t) return 0;
            from = StandardNormal.InverseCdf(Rate.Cdf(LeakFraction * Wall / (t - t0)));
            if (from >= 8) return 0;
            from = Math.Max(from, -8);
        }

        return GaussLegendreRule.Integrate(u =>
        {
            var r = Rate.InverseCdf(StandardNormal.Cdf(u));
            var l = StandardNormal.Pdf(u);
            foreach (var (tk, likelihood) in _findings) l *= likelihood(Math.Min(Wall, r * Math.Max(0, tk - t0)));
            return l;
        }, from, 8, 256);
    }
}
