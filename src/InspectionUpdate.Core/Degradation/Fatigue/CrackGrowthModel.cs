using InspectionUpdate.Degradation.Numerics;
using InspectionUpdate.Probability;
using MathNet.Numerics;

namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>One-stage or two-stage (bilinear) Paris law.</summary>
public enum CrackGrowthLaw
{
    /// <summary>da/dN = C(ΔK)^m.</summary>
    OneStage,

    /// <summary>da/dN = C₁(ΔK)^m₁ below the transition ΔK_tr = (C₁/C₂)^(1/(m₂ − m₁)), C₂(ΔK)^m₂ above (BS 7910 two-stage law).</summary>
    TwoStage,
}

/// <summary>How the stress ranges are described.</summary>
public enum StressRangeModel
{
    /// <summary>One constant range stressRange_MPa.</summary>
    ConstantAmplitude,

    /// <summary>Long-term two-parameter Weibull ranges (weibullScale_MPa, weibullShape).</summary>
    Weibull,
}

/// <summary>Settings of a crack-growth model that are not random inputs.</summary>
public sealed record CrackGrowthSettings
{
    /// <summary>One- or two-stage law.</summary>
    public CrackGrowthLaw Law { get; init; } = CrackGrowthLaw.OneStage;

    /// <summary>Constant amplitude or Weibull ranges.</summary>
    public StressRangeModel StressRanges { get; init; } = StressRangeModel.Weibull;

    /// <summary>Shape of Y(a/T); the input geometryFactor multiplies it.</summary>
    public GeometryFunction Geometry { get; init; } = GeometryFunction.Constant;

    /// <summary>True to apply a threshold ΔK_th (input thresholdDeltaK_Nmm): ranges with ΔK below it cause no growth.</summary>
    public bool UseThreshold { get; init; }

    /// <summary>Relative tolerance of the adaptive ODE integration of a(N) (default 1e-10).</summary>
    public double IntegrationRelativeTolerance { get; init; } = 1e-10;
}

/// <summary>
/// Fatigue crack growth by Paris' law, ΔK = Y(a/T)·Δσ·√(πa), with constant or Weibull stress ranges; failure when the
/// depth reaches the critical depth (the wall thickness unless criticalDepth_mm is given). Units N and mm.
/// </summary>
/// <remarks>
/// <para>The limit state is written in cycles: g(x, t) = ln N_c(x) − ln N(t), with N_c the cycles to grow from a₀ to
/// a_c and N(t) = ν·t (at least one cycle). It is zero exactly where a(t) = a_c, finite everywhere, and nearly linear
/// in the logarithms of C, q, ν and Y, which keeps FORM iterations few.</para>
/// <para>With a constant Y, a one-stage law and no threshold N_c and a(N) have closed forms (<see cref="ParisLaw"/>)
/// and the gradient is analytic. Otherwise N_c = ∫ da / E[da/dN] is a fixed composite Gauss–Legendre quadrature in
/// ln a (smooth in the inputs, so finite-difference gradients are clean) and a(N) integrates da/dN by the adaptive
/// Dormand–Prince method. Weibull ranges enter through E[Δσ^m] = q^m Γ(1 + m/h), split by the incomplete gamma
/// functions at the transition and threshold ranges (JCSS Probabilistic Model Code, Part 3).</para>
/// <para>When a₀ ≥ a_c the margin is a large negative constant (failed at entry into service); when N_c is infinite
/// (a crack below a constant-amplitude threshold) it is +709.</para>
/// </remarks>
public sealed class CrackGrowthModel : IDegradationModel, IDegradationMarginGradient, IFailureTimeModel
{
    /// <summary>Input name: initial crack depth, mm.</summary>
    public const string InitialDepth = "initialDepth_mm";
    /// <summary>Input name: critical depth, mm (default: the thickness).</summary>
    public const string CriticalDepth = "criticalDepth_mm";
    /// <summary>Input name: wall or plate thickness T, mm.</summary>
    public const string Thickness = "thickness_mm";
    /// <summary>Input name: factor on the geometry function (Y itself when the shape is constant).</summary>
    public const string GeometryFactor = "geometryFactor";
    /// <summary>Input name: constant stress range, MPa.</summary>
    public const string StressRange = "stressRange_MPa";
    /// <summary>Input name: Weibull scale of the stress ranges, MPa.</summary>
    public const string WeibullScale = "weibullScale_MPa";
    /// <summary>Input name: Weibull shape of the stress ranges.</summary>
    public const string WeibullShape = "weibullShape";
    /// <summary>Input name: stress cycles per year.</summary>
    public const string CyclesPerYear = "cyclesPerYear";
    /// <summary>Input name: Paris coefficient C (one-stage), mm/cycle per (N·mm^−3/2)^m.</summary>
    public const string ParisC = "parisC";
    /// <summary>Input name: Paris exponent m (one-stage).</summary>
    public const string ParisM = "parisM";
    /// <summary>Input name: lower-stage coefficient C₁ (two-stage).</summary>
    public const string ParisC1 = "parisC1";
    /// <summary>Input name: lower-stage exponent m₁ (two-stage).</summary>
    public const string ParisM1 = "parisM1";
    /// <summary>Input name: upper-stage coefficient C₂ (two-stage).</summary>
    public const string ParisC2 = "parisC2";
    /// <summary>Input name: upper-stage exponent m₂ (two-stage).</summary>
    public const string ParisM2 = "parisM2";
    /// <summary>Input name: threshold ΔK_th, N·mm^−3/2.</summary>
    public const string ThresholdDeltaK = "thresholdDeltaK_Nmm";

    private const int PanelsPerUnitLog = 1;
    private const double FailedAtStartMargin = -745;
    private const double NeverFailsMargin = 709;
    private static readonly double[] GaussNodes;
    private static readonly double[] GaussWeights;

    private readonly InputSlot _a0, _ac, _thickness, _y, _stress, _q, _h, _nu, _c1, _m1, _c2, _m2, _dkTh;
    private readonly bool _closedForm;
    private readonly bool _criticalIsThickness;

    static CrackGrowthModel()
    {
        var rule = new MathNet.Numerics.Integration.GaussLegendreRule(-1, 1, 8);
        GaussNodes = rule.Abscissas;
        GaussWeights = rule.Weights;
    }

    /// <summary>Builds the model over <paramref name="inputs"/>, whose variable names must match <see cref="ExpectedInputs"/>.</summary>
    /// <exception cref="ArgumentException">A required input is missing or an input is unknown (all listed), or a setting is out of range.</exception>
    public CrackGrowthModel(StochasticModel inputs, CrackGrowthSettings? settings = null, string? name = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        settings ??= new CrackGrowthSettings();
        ArgumentNullException.ThrowIfNull(settings.Geometry, nameof(settings.Geometry));
        if (!(settings.IntegrationRelativeTolerance > 0 && settings.IntegrationRelativeTolerance < 1e-3))
        {
            throw new ArgumentOutOfRangeException(nameof(settings), settings.IntegrationRelativeTolerance, "IntegrationRelativeTolerance must lie in (0, 1e-3).");
        }

        Settings = settings;
        Inputs = inputs;
        Name = name ?? DefaultName(settings);
        var layout = InputLayout.Resolve(Name, inputs, ExpectedInputs(settings));
        _a0 = new InputSlot(layout, InitialDepth);
        _ac = new InputSlot(layout, CriticalDepth);
        _criticalIsThickness = !layout.Has(CriticalDepth);
        _thickness = new InputSlot(layout, Thickness);
        _y = new InputSlot(layout, GeometryFactor);
        _stress = new InputSlot(layout, StressRange);
        _q = new InputSlot(layout, WeibullScale);
        _h = new InputSlot(layout, WeibullShape);
        _nu = new InputSlot(layout, CyclesPerYear);
        var two = settings.Law == CrackGrowthLaw.TwoStage;
        _c1 = new InputSlot(layout, two ? ParisC1 : ParisC);
        _m1 = new InputSlot(layout, two ? ParisM1 : ParisM);
        _c2 = new InputSlot(layout, ParisC2);
        _m2 = new InputSlot(layout, ParisM2);
        _dkTh = new InputSlot(layout, ThresholdDeltaK);
        _closedForm = !two && settings.Geometry.IsConstant && !settings.UseThreshold;
        var t = inputs.Variables[layout.IndexOf(Thickness)];
        MaximumSizeMm = t.IsDeterministic ? t.Mean : double.PositiveInfinity;
    }

    /// <summary>The settings this model was built with.</summary>
    public CrackGrowthSettings Settings { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public StochasticModel Inputs { get; }

    /// <inheritdoc />
    public string SizeQuantity => "depth_mm";

    /// <inheritdoc />
    /// <remarks>The initial crack depth restarts after a repair (a new weld or ground-out defect); material, stress and geometry inputs are shared.</remarks>
    public IReadOnlyList<string> RenewedOnRepair => [InitialDepth];

    /// <inheritdoc />
    public string? AnnualMaximumInput => null;

    /// <inheritdoc />
    /// <remarks>The thickness when deterministic, else +∞. <see cref="Size"/> is capped at the thickness (through-wall).</remarks>
    public double MaximumSizeMm { get; }

    /// <summary>True when N_c and a(N) have closed forms and the gradient is analytic.</summary>
    public bool HasClosedForm => _closedForm;

    /// <inheritdoc />
    public bool HasMarginGradient => _closedForm;

    /// <summary>The inputs the mechanism reads for the given settings, with units and defaults.</summary>
    public static IReadOnlyList<ModelInput> ExpectedInputs(CrackGrowthSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var list = new List<ModelInput>
        {
            new(InitialDepth, "mm", "initial crack depth a₀"),
            new(CriticalDepth, "mm", "critical depth a_c (the thickness when absent)", double.NaN),
            new(Thickness, "mm", "wall or plate thickness T"),
            new(GeometryFactor, "-", settings.Geometry.IsConstant ? "geometry function Y (constant)" : "factor on the tabulated Y(a/T)", settings.Geometry.IsConstant ? null : 1.0),
            new(CyclesPerYear, "cycles/year", "stress cycles per year ν"),
        };
        if (settings.StressRanges == StressRangeModel.ConstantAmplitude)
        {
            list.Add(new(StressRange, "MPa", "constant stress range Δσ"));
        }
        else
        {
            list.Add(new(WeibullScale, "MPa", "Weibull scale q of the long-term stress ranges"));
            list.Add(new(WeibullShape, "-", "Weibull shape h of the long-term stress ranges"));
        }

        if (settings.Law == CrackGrowthLaw.OneStage)
        {
            list.Add(new(ParisC, "mm/cycle/(N·mm^-3/2)^m", "Paris coefficient C"));
            list.Add(new(ParisM, "-", "Paris exponent m"));
        }
        else
        {
            list.Add(new(ParisC1, "mm/cycle/(N·mm^-3/2)^m1", "lower-stage coefficient C₁"));
            list.Add(new(ParisM1, "-", "lower-stage exponent m₁"));
            list.Add(new(ParisC2, "mm/cycle/(N·mm^-3/2)^m2", "upper-stage coefficient C₂"));
            list.Add(new(ParisM2, "-", "upper-stage exponent m₂"));
        }

        if (settings.UseThreshold) list.Add(new(ThresholdDeltaK, "N·mm^-3/2", "threshold stress-intensity range ΔK_th"));
        return list;
    }

    /// <inheritdoc />
    /// <remarks>The depth after ν·t cycles, capped at the thickness.</remarks>
    public double Size(ReadOnlySpan<double> x, double timeYears)
    {
        var p = Read(x);
        var cycles = Math.Max(0, p.Nu * timeYears);
        var a = _closedForm ? ClosedFormDepth(p, cycles) : IntegratedDepth(p, cycles);
        return Math.Min(a, p.T);
    }

    /// <summary>Depth after <paramref name="cycles"/> (not capped), by the closed form where it exists, else by ODE integration.</summary>
    public double DepthAfterCycles(ReadOnlySpan<double> x, double cycles)
    {
        var p = Read(x);
        return _closedForm ? ClosedFormDepth(p, cycles) : IntegratedDepth(p, cycles, double.PositiveInfinity);
    }

    /// <summary>Depth after <paramref name="cycles"/> by adaptive Dormand–Prince integration of da/dN, whatever the law (for checks).</summary>
    public double DepthAfterCyclesByIntegration(ReadOnlySpan<double> x, double cycles) => IntegratedDepth(Read(x), cycles, double.PositiveInfinity);

    /// <summary>Cycles to grow from a₀ to a_c (closed form or quadrature); +∞ when growth stops below a threshold.</summary>
    public double CyclesToCritical(ReadOnlySpan<double> x)
    {
        var p = Read(x);
        return _closedForm ? ClosedFormCycles(p) : QuadratureCycles(p, p.A0, p.Ac);
    }

    /// <summary>Expected growth rate E[da/dN] (mm/cycle) at depth a (mm) over the stress-range distribution.</summary>
    public double ExpectedGrowthRate(ReadOnlySpan<double> x, double depthMm) => Rate(Read(x), depthMm);

    /// <inheritdoc />
    public double Margin(ReadOnlySpan<double> x, double timeYears)
    {
        var p = Read(x);
        var nc = _closedForm ? ClosedFormCycles(p) : QuadratureCycles(p, p.A0, p.Ac);
        return MarginFromCycles(nc, p.Nu * timeYears);
    }

    /// <inheritdoc />
    public double MarginWithGradient(ReadOnlySpan<double> x, double timeYears, Span<double> gradient)
    {
        if (!_closedForm) throw new InvalidOperationException($"{Name}: no analytic gradient without a closed form.");
        gradient.Clear();
        var p = Read(x);
        var n = p.Nu * timeYears;
        if (!(p.A0 < p.Ac)) return FailedAtStartMargin;

        // ln N_c = ln ψ − ln C − m ln Y − (m/2) ln π − ln S, S = E[Δσ^m].
        var m = p.M1;
        var psi = ParisLaw.DepthIntegral(p.A0, p.Ac, m);
        double lnS, dLnSdM;
        if (Settings.StressRanges == StressRangeModel.ConstantAmplitude)
        {
            lnS = m * Math.Log(p.S);
            dLnSdM = Math.Log(p.S);
            _stress.Add(gradient, -m / p.S);
        }
        else
        {
            var arg = 1 + m / p.H;
            lnS = m * Math.Log(p.Q) + SpecialFunctions.GammaLn(arg);
            var dig = SpecialFunctions.DiGamma(arg);
            dLnSdM = Math.Log(p.Q) + dig / p.H;
            _q.Add(gradient, -m / p.Q);
            _h.Add(gradient, dig * m / (p.H * p.H));
        }

        var lnNc = Math.Log(psi) - Math.Log(p.C1) - m * Math.Log(p.Y) - 0.5 * m * Math.Log(Math.PI) - lnS;
        _a0.Add(gradient, -Math.Pow(p.A0, -0.5 * m) / psi);
        var dAc = Math.Pow(p.Ac, -0.5 * m) / psi;
        if (_criticalIsThickness) _thickness.Add(gradient, dAc);
        else _ac.Add(gradient, dAc);
        _c1.Add(gradient, -1 / p.C1);
        _y.Add(gradient, -m / p.Y);
        _m1.Add(gradient, DLnPsiDm(p.A0, p.Ac, m, psi) - Math.Log(p.Y) - 0.5 * Math.Log(Math.PI) - dLnSdM);
        if (n > 1)
        {
            _nu.Add(gradient, -1 / p.Nu);
            return lnNc - Math.Log(n);
        }

        return lnNc;
    }

    /// <inheritdoc />
    /// <remarks>
    /// g = ln N_c − ln max(ν t, 1) (see <see cref="Margin"/>): failure at t = N_c/ν once N_c exceeds one cycle, at
    /// t = 0 when N_c ≤ 1 or the initial depth is already critical, never when growth stops below a threshold.
    /// </remarks>
    public double FailureTimeYears(ReadOnlySpan<double> x)
    {
        var p = Read(x);
        var nc = _closedForm ? ClosedFormCycles(p) : QuadratureCycles(p, p.A0, p.Ac);
        if (double.IsNaN(nc)) return double.NaN;
        if (!(nc > 1)) return 0;
        if (double.IsPositiveInfinity(nc) || !(p.Nu > 0)) return double.PositiveInfinity;
        return nc / p.Nu;
    }

    /// <inheritdoc />
    public bool MarginNeverIncreases(ReadOnlySpan<double> x) => Read(x).Nu >= 0;

    private static double MarginFromCycles(double nc, double cycles)
    {
        if (!(nc > 0)) return FailedAtStartMargin;
        if (double.IsPositiveInfinity(nc)) return NeverFailsMargin;
        return Math.Log(nc) - Math.Log(Math.Max(cycles, 1));
    }

    /// <summary>∂ln ψ/∂m with ψ = ∫ a^(−m/2) da: −½ ∫ ln a · a^(−m/2) da / ψ.</summary>
    private static double DLnPsiDm(double a0, double a1, double m, double psi)
    {
        var p = 1 - 0.5 * m;
        double j;
        if (Math.Abs(p) < 1e-6)
        {
            var l1 = Math.Log(a1);
            var l0 = Math.Log(a0);
            j = 0.5 * (l1 * l1 - l0 * l0);
        }
        else
        {
            j = (Math.Pow(a1, p) * Math.Log(a1) - Math.Pow(a0, p) * Math.Log(a0)) / p - psi / p;
        }

        return -0.5 * j / psi;
    }

    private double ClosedFormCycles(in Parameters p)
    {
        if (!(p.A0 < p.Ac)) return p.A0 == p.Ac ? 0 : -1;
        return ParisLaw.CyclesToGrowForMoment(p.A0, p.Ac, p.C1, p.M1, p.Y, Moment(p, p.M1));
    }

    private double ClosedFormDepth(in Parameters p, double cycles) =>
        ParisLaw.DepthAfterCyclesForMoment(p.A0, p.C1, p.M1, p.Y, Moment(p, p.M1), cycles);

    private double Moment(in Parameters p, double m) =>
        Settings.StressRanges == StressRangeModel.ConstantAmplitude
            ? (m == 3 ? p.S * p.S * p.S : Math.Pow(p.S, m))
            : Math.Exp(m * Math.Log(p.Q) + _gammaLn.Of(1 + m / p.H));

    // Γ and ln Γ at the same arguments on every evaluation when the Weibull shape and the exponents are fixed inputs.
    private readonly LastValue _gammaLn = new(SpecialFunctions.GammaLn);
    private readonly LastValue _gamma1 = new(SpecialFunctions.Gamma);
    private readonly LastValue _gamma2 = new(SpecialFunctions.Gamma);

    /// <summary>A function of one argument that remembers its last argument and value (safe under concurrent use: one immutable pair).</summary>
    private sealed class LastValue(Func<double, double> f)
    {
        private Tuple<double, double> _last = Tuple.Create(double.NaN, double.NaN);

        public double Of(double x)
        {
            var last = _last;
            if (last.Item1 == x) return last.Item2;
            var value = f(x);
            _last = Tuple.Create(x, value);
            return value;
        }
    }

    /// <summary>E[da/dN] at depth a: the law integrated over the stress ranges, split at the transition and threshold.</summary>
    private double Rate(in Parameters p, double a)
    {
        if (!(a > 0)) return 0;
        var k = p.Y * Settings.Geometry.Evaluate(a / p.T) * Math.Sqrt(Math.PI * a); // ΔK per MPa of range
        var two = Settings.Law == CrackGrowthLaw.TwoStage;
        if (Settings.StressRanges == StressRangeModel.ConstantAmplitude)
        {
            var dk = k * p.S;
            if (dk < p.DkTh) return 0;
            return two && dk >= p.DkTr ? p.C2 * Math.Pow(dk, p.M2) : p.C1 * Math.Pow(dk, p.M1);
        }

        // Weibull ranges: E[C(kΔσ)^m; Δσ in a band] = C k^m q^m [γ or Γ](1 + m/h, (s/q)^h), with the complete
        // gamma functions precomputed per evaluation (they do not depend on a).
        var sTh = p.DkTh > 0 ? p.DkTh / k : 0;
        var zTh = sTh > 0 ? Math.Pow(sTh / p.Q, p.H) : 0;
        if (!two)
        {
            var upper = zTh > 0 ? SpecialFunctions.GammaUpperRegularized(p.A1, zTh) * p.Gamma1 : p.Gamma1;
            return p.C1 * Math.Pow(k * p.Q, p.M1) * upper;
        }

        var sTr = p.DkTr / k;
        var zTr = Math.Pow(sTr / p.Q, p.H);
        var rate = 0.0;
        if (zTr > zTh)
        {
            var band = SpecialFunctions.GammaLowerRegularized(p.A1, zTr) - (zTh > 0 ? SpecialFunctions.GammaLowerRegularized(p.A1, zTh) : 0);
            rate += p.C1 * Math.Pow(k * p.Q, p.M1) * Math.Max(band, 0) * p.Gamma1;
        }

        var zHigh = Math.Max(zTr, zTh);
        rate += p.C2 * Math.Pow(k * p.Q, p.M2) * (zHigh > 0 ? SpecialFunctions.GammaUpperRegularized(p.A2, zHigh) : 1) * p.Gamma2;
        return rate;
    }

    /// <summary>N = ∫ da/E[da/dN] from a₀ to a₁ by composite 8-point Gauss–Legendre in s = ln a.</summary>
    private double QuadratureCycles(in Parameters p, double a0, double a1)
    {
        if (a0 == a1) return 0;
        if (a0 > a1) return -QuadratureCycles(p, a1, a0);
        var s0 = Math.Log(a0);
        var s1 = Math.Log(a1);
        var breaks = new List<double> { s0, s1 };
        if (!Settings.Geometry.IsConstant)
        {
            foreach (var r in Settings.Geometry.Ratios)
            {
                var s = Math.Log(r * p.T);
                if (r > 0 && s > s0 && s < s1) breaks.Add(s);
            }
        }

        breaks.Sort();
        var constantAmplitudeKinks = Settings.StressRanges == StressRangeModel.ConstantAmplitude
            && (Settings.Law == CrackGrowthLaw.TwoStage || Settings.UseThreshold);
        var total = 0.0;
        for (var b = 0; b + 1 < breaks.Count; b++)
        {
            var lo = breaks[b];
            var hi = breaks[b + 1];
            if (hi <= lo) continue;
            var panels = Math.Max(1, (int)Math.Ceiling((hi - lo) * PanelsPerUnitLog));
            var w = (hi - lo) / panels;
            for (var k = 0; k < panels; k++)
            {
                var pl = lo + k * w;
                var ph = pl + w;
                if (constantAmplitudeKinks)
                {
                    // A kink of the integrand (stage change, threshold) inside the panel: split there.
                    var kink = FindKink(p, pl, ph);
                    if (kink is { } sk)
                    {
                        total += Panel(p, pl, sk) + Panel(p, sk, ph);
                        continue;
                    }
                }

                total += Panel(p, pl, ph);
                if (double.IsPositiveInfinity(total)) return total;
            }
        }

        return total;
    }

    private double Panel(in Parameters p, double sLo, double sHi)
    {
        var half = 0.5 * (sHi - sLo);
        var mid = 0.5 * (sHi + sLo);
        var sum = 0.0;
        for (var i = 0; i < GaussNodes.Length; i++)
        {
            var a = Math.Exp(mid + half * GaussNodes[i]);
            var rate = Rate(p, a);
            if (!(rate > 0)) return double.PositiveInfinity;
            sum += GaussWeights[i] * a / rate;
        }

        return sum * half;
    }

    private double? FindKink(in Parameters p, double sLo, double sHi)
    {
        foreach (var level in new[] { p.DkTr, p.DkTh })
        {
            if (!(level > 0) || !double.IsFinite(level)) continue;
            var fLo = DeltaK(p, Math.Exp(sLo)) - level;
            var fHi = DeltaK(p, Math.Exp(sHi)) - level;
            if (fLo * fHi >= 0) continue;
            double lo = sLo, hi = sHi;
            for (var it = 0; it < 60; it++)
            {
                var mid = 0.5 * (lo + hi);
                var fm = DeltaK(p, Math.Exp(mid)) - level;
                if (fm * fLo > 0)
                {
                    lo = mid;
                    fLo = fm;
                }
                else
                {
                    hi = mid;
                }
            }

            return 0.5 * (lo + hi);
        }

        return null;
    }

    private double DeltaK(in Parameters p, double a) => p.Y * Settings.Geometry.Evaluate(a / p.T) * Math.Sqrt(Math.PI * a) * p.S;

    private double IntegratedDepth(Parameters p, double cycles, double cap = double.NaN)
    {
        if (!(cycles > 0)) return p.A0;
        var stopAt = double.IsNaN(cap) ? Math.Log(p.T) : Math.Log(cap);
        // y = ln a keeps the state O(1) while a grows by orders of magnitude.
        var result = DormandPrince.Integrate((_, y) =>
        {
            var a = Math.Exp(y);
            return Rate(p, a) / a;
        }, 0, Math.Log(p.A0), cycles, Settings.IntegrationRelativeTolerance, Settings.IntegrationRelativeTolerance * 1e-2, stopAt);
        if (result.Stopped) return double.IsNaN(cap) ? p.T : double.PositiveInfinity;
        return Math.Exp(result.Y);
    }

    private Parameters Read(ReadOnlySpan<double> x)
    {
        var t = _thickness.Read(x);
        var p = new Parameters
        {
            A0 = _a0.Read(x),
            T = t,
            Ac = _criticalIsThickness ? t : _ac.Read(x),
            Y = _y.Read(x),
            S = Settings.StressRanges == StressRangeModel.ConstantAmplitude ? _stress.Read(x) : double.NaN,
            Q = Settings.StressRanges == StressRangeModel.Weibull ? _q.Read(x) : double.NaN,
            H = Settings.StressRanges == StressRangeModel.Weibull ? _h.Read(x) : double.NaN,
            Nu = _nu.Read(x),
            C1 = _c1.Read(x),
            M1 = _m1.Read(x),
            C2 = Settings.Law == CrackGrowthLaw.TwoStage ? _c2.Read(x) : double.NaN,
            M2 = Settings.Law == CrackGrowthLaw.TwoStage ? _m2.Read(x) : double.NaN,
            DkTh = Settings.UseThreshold ? _dkTh.Read(x) : 0,
        };
        p.DkTr = Settings.Law == CrackGrowthLaw.TwoStage ? Math.Pow(p.C1 / p.C2, 1 / (p.M2 - p.M1)) : double.PositiveInfinity;
        if (Settings.StressRanges == StressRangeModel.Weibull)
        {
            p.A1 = 1 + p.M1 / p.H;
            p.Gamma1 = _gamma1.Of(p.A1);
            if (Settings.Law == CrackGrowthLaw.TwoStage)
            {
                p.A2 = 1 + p.M2 / p.H;
                p.Gamma2 = _gamma2.Of(p.A2);
            }
        }

        return p;
    }

    private static string DefaultName(CrackGrowthSettings s)
    {
        var law = s.Law == CrackGrowthLaw.OneStage ? "one-stage Paris law" : "two-stage Paris law";
        var stress = s.StressRanges == StressRangeModel.Weibull ? "Weibull stress ranges" : "constant-amplitude stress";
        return $"Fatigue crack growth, {law}, {stress}";
    }

    private struct Parameters
    {
        public double A0, Ac, T, Y, S, Q, H, Nu, C1, M1, C2, M2, DkTh, DkTr, A1, A2, Gamma1, Gamma2;
    }
}
