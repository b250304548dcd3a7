using System.Globalization;
using InspectionUpdate.Degradation;
using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;
using MathNet.Numerics;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>
/// A seeded random component: Paris-law crack growth with constant Y (one stage, constant-amplitude or Weibull
/// ranges) or linear corrosion with a leak limit state, with 0–5 findings of mixed kinds (no indication, indication
/// not sized, sized, in service, one repair) at non-integer times. The reference is written out here, independent of
/// the engine: the closed-form failure time and size of each model, the likelihood of each finding, and draws by the
/// test's own inverse transforms.
/// </summary>
internal sealed class RandomComponent
{
    private readonly bool _crack;
    private readonly double[] _p; // model constants (see Create)
    private readonly Marginal[] _random; // random inputs in draw order
    private readonly int _renewed; // index in _random of the input renewed on repair

    private RandomComponent(int caseNumber, bool crack, int horizon, double[] p, Marginal[] random, int renewed, IDegradationModel model,
        IReadOnlyList<InspectionOutcome> evidence, string text)
    {
        CaseNumber = caseNumber;
        _crack = crack;
        HorizonYears = horizon;
        _p = p;
        _random = random;
        _renewed = renewed;
        Model = model;
        Evidence = evidence;
        Text = text;
        RepairYears = evidence.OfType<Repair>().Select(r => r.TimeYears).ToArray();
    }

    public int CaseNumber { get; }

    public int HorizonYears { get; }

    public IDegradationModel Model { get; }

    public IReadOnlyList<InspectionOutcome> Evidence { get; }

    public string Text { get; }

    public double[] RepairYears { get; }

    /// <summary>Indices (0-based, yearly grid 1…H) of the first grid year of each renewal period after the first.</summary>
    public int[] PeriodStarts => RepairYears.Select(r => (int)Math.Floor(r)).ToArray();

    public override string ToString() => $"case {CaseNumber}: {Text}; findings: {string.Join("; ", Evidence.Select(Describe))}";

    private static string Describe(InspectionOutcome o) => o switch
    {
        NoIndication n => Invariant($"no indication at {n.TimeYears} y (PoD {Pod(n.Method)})"),
        IndicationNotSized d => Invariant($"indication not sized at {d.TimeYears} y (PoD {Pod(d.Method)})"),
        SizedIndication s => Invariant($"sized {s.MeasuredSizeMm:0.###} mm at {s.TimeYears} y (PoD {Pod(s.Method)}, {s.Method.Sizing.Kind} σ {s.Method.Sizing.StandardDeviation:0.###})"),
        SurvivedInService v => Invariant($"in service at {v.TimeYears} y"),
        Repair r => Invariant($"repair at {r.TimeYears} y"),
        _ => o.ToString(),
    };

    private static string Pod(InspectionMethod m) => m.Detection is CumulativeLognormalPod c ? Invariant($"median {Math.Exp(c.MuLnMm):0.###} mm, σ_ln {c.SigmaLn:0.###}") : m.Detection.ToString() ?? "";

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);

    public static RandomComponent Create(int seed, int caseNumber)
    {
        var rng = new Random(unchecked(seed * 1_000_003 + caseNumber * 7919));
        var horizon = rng.Next(10, 21);
        var crack = rng.NextDouble() < 0.5;
        double[] p;
        Marginal[] random;
        RandomVariable[] variables;
        string text;
        IDegradationModel model;
        var draws = new IndependentDraws(unchecked(caseNumber * 13 + 5));
        var medianLife = horizon * (0.7 + 2.3 * rng.NextDouble());
        if (crack)
        {
            // p: thickness, Y, m, ν, Weibull shape (0 for constant amplitude), C mean, C CoV.
            var thickness = Math.Round(16 + 24 * rng.NextDouble(), 1);
            var y = Math.Round(1.0 + 0.3 * rng.NextDouble(), 3);
            var m = Math.Round(2.8 + 0.5 * rng.NextDouble(), 2);
            var nu = Math.Round(100 + 4900 * rng.NextDouble()) * 1000;
            var weibull = rng.NextDouble() < 0.5;
            var shape = weibull ? Math.Round(0.8 + 0.3 * rng.NextDouble(), 2) : 0;
            var a0 = new Marginal(CrackGrowthModel.InitialDepth, Family.Lognormal, Math.Round(0.1 + 0.5 * rng.NextDouble(), 3), Math.Round(0.3 + 0.4 * rng.NextDouble(), 2));
            var stress = weibull
                ? new Marginal(CrackGrowthModel.WeibullScale, Family.Lognormal, Math.Round(8 + 12 * rng.NextDouble(), 2), Math.Round(0.1 + 0.1 * rng.NextDouble(), 3))
                : new Marginal(CrackGrowthModel.StressRange, Family.Lognormal, Math.Round(20 + 40 * rng.NextDouble(), 2), Math.Round(0.1 + 0.2 * rng.NextDouble(), 3));
            var cCov = Math.Round(0.3 + 0.5 * rng.NextDouble(), 2);
            p = [thickness, y, m, nu, shape, 1.0, cCov];
            var unit = new Marginal(CrackGrowthModel.ParisC, Family.Lognormal, 1.0, cCov);
            var pilot = new RandomComponent(caseNumber, true, horizon, p, [a0, unit, stress], 0, null!, [], "");
            // T_f ∝ 1/C: scale the mean of C so that the median life is the chosen one.
            var lives = Enumerable.Range(0, 4000).Select(_ => pilot.FailureTime(pilot.Draw(draws))).Order().ToArray();
            var cMean = lives[lives.Length / 2] / medianLife;
            cMean = double.Parse(cMean.ToString("G4", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
            p[5] = cMean;
            var c = new Marginal(CrackGrowthModel.ParisC, Family.Lognormal, cMean, cCov);
            random = [a0, c, stress];
            variables =
            [
                LognormalVariable.FromMeanCov(a0.Name, a0.A, a0.B),
                LognormalVariable.FromMeanCov(c.Name, c.A, c.B),
                LognormalVariable.FromMeanCov(stress.Name, stress.A, stress.B),
                new DeterministicVariable(CrackGrowthModel.Thickness, thickness),
                new DeterministicVariable(CrackGrowthModel.GeometryFactor, y),
                new DeterministicVariable(CrackGrowthModel.ParisM, m),
                new DeterministicVariable(CrackGrowthModel.CyclesPerYear, nu),
                .. weibull ? new RandomVariable[] { new DeterministicVariable(CrackGrowthModel.WeibullShape, shape) } : [],
            ];
            model = new CrackGrowthModel(new StochasticModel(variables),
                new CrackGrowthSettings { StressRanges = weibull ? StressRangeModel.Weibull : StressRangeModel.ConstantAmplitude });
            text = Invariant($"crack, T {thickness} mm, Y {y}, m {m}, ν {nu:G4}/y, {(weibull ? $"Weibull h {shape}" : "constant amplitude")}, {a0}, {c}, {stress}, {horizon} y");
        }
        else
        {
            // p: wall, leak fraction.
            var wall = Math.Round(6 + 14 * rng.NextDouble(), 1);
            var fraction = 0.8;
            var t0 = new Marginal(CorrosionModel.InitiationTime, Family.Lognormal, Math.Round(2 + 8 * rng.NextDouble(), 2), Math.Round(0.2 + 0.4 * rng.NextDouble(), 2));
            var rCov = Math.Round(0.2 + 0.4 * rng.NextDouble(), 2);
            // Median of T₀ + f·w/r near the chosen life: r's median from f·w/(life − median T₀), at least 2 years of growth.
            var growth = Math.Max(2, medianLife - t0.A);
            var rMean = Math.Round(fraction * wall / growth * Math.Sqrt(1 + rCov * rCov), 4);
            var r = new Marginal(CorrosionModel.Rate, Family.Lognormal, rMean, rCov);
            p = [wall, fraction];
            random = [t0, r];
            variables =
            [
                new DeterministicVariable(CorrosionModel.WallThickness, wall),
                LognormalVariable.FromMeanCov(t0.Name, t0.A, t0.B),
                LognormalVariable.FromMeanCov(r.Name, r.A, r.B),
            ];
            model = new CorrosionModel(new StochasticModel(variables), new CorrosionSettings { GrowthLaw = CorrosionGrowthLaw.Linear, FailureMode = CorrosionFailureMode.Leak, LeakFraction = fraction });
            text = Invariant($"linear corrosion, leak at {fraction} of wall {wall} mm, {t0}, {r}, {horizon} y");
        }

        var shell = new RandomComponent(caseNumber, crack, horizon, p, random, 0, model, [], text);
        var evidence = Findings(rng, shell, draws, horizon, crack);
        return new RandomComponent(caseNumber, crack, horizon, p, random, 0, model, evidence, text);
    }

    private static List<InspectionOutcome> Findings(Random rng, RandomComponent c, IndependentDraws draws, int horizon, bool crack)
    {
        var count = rng.Next(0, 6);
        var times = Enumerable.Range(0, count).Select(_ => Math.Round(1 + (0.8 * horizon - 1) * rng.NextDouble(), 2) + 0.005).Distinct().Order().ToArray();
        var list = new List<InspectionOutcome>();
        var repaired = false;
        var periodStart = 0.0;
        var maximum = crack ? c._p[0] : c._p[0];
        foreach (var t in times)
        {
            var a50 = crack ? 0.5 + 1.5 * rng.NextDouble() : 0.5 + 2.5 * rng.NextDouble();
            var pod = new CumulativeLognormalPod(Math.Round(Math.Log(a50), 4), Math.Round(0.3 + 0.5 * rng.NextDouble(), 3));
            var sizing = rng.NextDouble() < 0.8
                ? new SizingError(SizingErrorKind.AdditiveNormal, 0, Math.Round(0.2 + 0.6 * rng.NextDouble(), 3))
                : new SizingError(SizingErrorKind.MultiplicativeLognormal, 0, Math.Round(0.1 + 0.2 * rng.NextDouble(), 3));
            var method = new InspectionMethod("random method", pod, sizing);
            var reference = Invariant($"F-{list.Count + 1}");
            var roll = rng.NextDouble();
            if (roll < 0.3)
            {
                list.Add(new NoIndication(t, reference, method));
            }
            else if (roll < 0.45 && c.CanBeSeen(draws, t - periodStart))
            {
                list.Add(new IndicationNotSized(t, reference, method));
            }
            else if (roll < 0.7 && c.CanBeSeen(draws, t - periodStart))
            {
                // A plausible measurement: the size of a prior draw with a visible defect, plus the sizing error.
                var size = 0.0;
                for (var k = 0; k < 50 && size < 0.3; k++) size = c.Size(c.Draw(draws), t - periodStart);
                size = Math.Max(size, 0.3);
                var measured = sizing.Kind == SizingErrorKind.AdditiveNormal ? size + sizing.StandardDeviation * draws.Normal() : size * Math.Exp(sizing.StandardDeviation * draws.Normal());
                measured = Math.Round(Math.Clamp(measured, 0.1, 0.9 * maximum), 3);
                list.Add(new SizedIndication(t, reference, method, measured));
            }
            else if (roll < 0.45)
            {
                // An indication where the prior has (almost) no defect yet would contradict the model: none found.
                list.Add(new NoIndication(t, reference, method));
            }
            else if (roll < 0.85 || repaired)
            {
                list.Add(new SurvivedInService(t, reference));
            }
            else
            {
                list.Add(new Repair(t, reference, new Dictionary<string, RandomVariable>()));
                repaired = true;
                periodStart = t;
            }
        }

        return list;
    }

    /// <summary>True when at least 2 % of prior draws show a defect of 0.1 mm or more at local time t.</summary>
    private bool CanBeSeen(IndependentDraws draws, double local) => Enumerable.Range(0, 200).Count(_ => Size(Draw(draws), local) >= 0.1) >= 4;

    /// <summary>One draw of the random inputs (in <see cref="_random"/> order).</summary>
    private double[] Draw(IndependentDraws draws)
    {
        var x = new double[_random.Length];
        Draw(draws, x);
        return x;
    }

    private void Draw(IndependentDraws draws, double[] x)
    {
        for (var i = 0; i < x.Length; i++) x[i] = _random[i].FromNormal(draws.Normal());
    }

    /// <summary>
    /// Crack (constant Y, one stage, m ≠ 2): K = C·Y^m·π^(m/2)·E[Δσ^m], E[Δσ^m] = Δσ^m or q^m·Γ(1 + m/h);
    /// a(t)^(1 − m/2) = a₀^(1 − m/2) − (m/2 − 1)·K·ν·t (JCSS PMC Part 1, Annex B; from memory); T_f where a = T.
    /// Corrosion: d(t) = r·max(0, t − T₀), T_f = T₀ + f·w/r.
    /// </summary>
    private double FailureTime(double[] x)
    {
        if (!_crack) return x[0] + _p[1] * _p[0] / x[1];
        var (thickness, k, e) = CrackConstants(x);
        if (x[0] >= thickness) return 0;
        return (Math.Pow(x[0], e) - Math.Pow(thickness, e)) / (-e * k * _p[3]);
    }

    /// <summary>The size an inspection sees at local time t: min(a(t), T) or min(d(t), w).</summary>
    private double Size(double[] x, double t)
    {
        if (!_crack) return Math.Min(x[1] * Math.Max(0, t - x[0]), _p[0]);
        var (thickness, k, e) = CrackConstants(x);
        var bracket = Math.Pow(x[0], e) + e * k * _p[3] * t;
        return bracket <= 0 ? thickness : Math.Min(Math.Pow(bracket, 1 / e), thickness);
    }

    private (double Thickness, double K, double E) CrackConstants(double[] x)
    {
        var m = _p[2];
        var moment = _p[4] > 0 ? Math.Pow(x[2], m) * SpecialFunctions.Gamma(1 + m / _p[4]) : Math.Pow(x[2], m);
        var k = x[1] * Math.Pow(_p[1], m) * Math.Pow(Math.PI, m / 2) * moment;
        return (_p[0], k, 1 - m / 2);
    }

    /// <summary>Likelihood of one finding given the size (or failure time) of the state it sees.</summary>
    private static double Likelihood(InspectionOutcome o, double size, double failureTime, double local)
    {
        switch (o)
        {
            case NoIndication n:
                return 1 - Pod(n.Method, size);
            case IndicationNotSized d:
                return Pod(d.Method, size);
            case SizedIndication s:
                {
                    var e = s.Method.Sizing;
                    if (e.Kind == SizingErrorKind.AdditiveNormal)
                    {
                        var z = (s.MeasuredSizeMm - size - e.Bias) / e.StandardDeviation;
                        return Math.Exp(-0.5 * z * z) / e.StandardDeviation;
                    }

                    if (!(size > 0)) return 0;
                    var zl = (Math.Log(s.MeasuredSizeMm / size) - e.Bias) / e.StandardDeviation;
                    return Math.Exp(-0.5 * zl * zl) / (e.StandardDeviation * s.MeasuredSizeMm);
                }

            case SurvivedInService:
                return failureTime > local ? 1 : 0;
            default:
                return 1;
        }
    }

    /// <summary>PoD(a) = Φ((ln a − μ)/σ) of a cumulative lognormal curve, 0 at a ≤ 0.</summary>
    private static double Pod(InspectionMethod m, double size)
    {
        var c = (CumulativeLognormalPod)m.Detection;
        return size > 0 ? IndependentDraws.Phi((Math.Log(size) - c.MuLnMm) / c.SigmaLn) : 0;
    }

    /// <summary>
    /// Likelihood-weighted crude Monte Carlo over the prior: each sample draws the inputs and, per renewal period after
    /// a repair, a fresh renewed input (a₀ or T₀); its weight is the product of the findings' likelihoods, each
    /// evaluated on the state of its own period at local time; failure in period e by grid year y when
    /// T_f,e ≤ y − start_e. Pf and ΔPf by <see cref="FailureHistogram"/> (ratio estimator, delta-method error).
    /// </summary>
    public (Estimate[] Cumulative, Estimate[] Interval) Reference(int samples)
    {
        var starts = new[] { 0.0 }.Concat(RepairYears).ToArray();
        var histogram = new FailureHistogram(HorizonYears, PeriodStarts);
        var draws = new IndependentDraws(unchecked(CaseNumber * 101 + 3));
        var states = new double[starts.Length][];
        for (var e = 0; e < starts.Length; e++) states[e] = new double[_random.Length];
        var tf = new double[starts.Length];
        var periodOf = Evidence.Select(o => Math.Max(0, Array.FindLastIndex(starts, s => s < o.TimeYears))).ToArray();
        for (var s = 0; s < samples; s++)
        {
            Draw(draws, states[0]);
            for (var e = 1; e < starts.Length; e++)
            {
                states[0].CopyTo(states[e], 0);
                states[e][_renewed] = _random[_renewed].FromNormal(draws.Normal());
            }

            for (var e = 0; e < starts.Length; e++) tf[e] = FailureTime(states[e]);
            var w = 1.0;
            for (var k = 0; k < Evidence.Count && w > 0; k++)
            {
                var o = Evidence[k];
                if (o is Repair) continue;
                var e = periodOf[k];
                var local = o.TimeYears - starts[e];
                w *= Likelihood(o, Size(states[e], local), tf[e], local);
            }

            histogram.AddSample(w);
            if (w == 0) continue;
            for (var e = 0; e < starts.Length; e++)
            {
                var firstYear = e == 0 ? 1 : (int)Math.Floor(starts[e]) + 1;
                var lastYear = e + 1 < starts.Length ? (int)Math.Floor(starts[e + 1]) : HorizonYears;
                if (!(starts[e] + tf[e] <= lastYear)) continue;
                var year = Math.Max(firstYear, (int)Math.Ceiling(starts[e] + tf[e]));
                if (year <= lastYear) histogram.AddFailure(year - 1, w);
            }
        }

        return histogram.Estimates();
    }
}
