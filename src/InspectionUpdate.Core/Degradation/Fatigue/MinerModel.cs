using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>Settings of an S–N fatigue model that are not random inputs.</summary>
public sealed record MinerSettings
{
    /// <summary>The S–N curve.</summary>
    public SnCurve Curve { get; init; } = SnCurve.DnvD;

    /// <summary>Constant amplitude or Weibull ranges.</summary>
    public StressRangeModel StressRanges { get; init; } = StressRangeModel.Weibull;
}

/// <summary>
/// S–N fatigue with Miner's rule: damage D(t) = ν·t·E[1/N(Δσ)], failure when D reaches an uncertain Miner sum Δ
/// (JCSS Probabilistic Model Code, Part 3: Δ ~ LN(1.0, 0.3)). For Weibull ranges and a bilinear curve
/// D(t) = ν·t·[q^m₁/ā₁·Γ(1 + m₁/h, z) + q^m₂/ā₂·γ(1 + m₂/h, z)], z = (Δσ_tr/q)^h (DNV-RP-C203 closed form for
/// Weibull ranges, from memory), with q scaled by the thickness correction.
/// </summary>
/// <remarks>
/// The limit state is g = ln Δ − ln D(t) (at least one cycle). An S–N model has no size an inspection sees:
/// <see cref="Size"/> returns the Miner damage D(t) (dimensionless, <see cref="SizeQuantity"/> = "damage_dimensionless"),
/// so it cannot be updated with sized findings.
/// </remarks>
public sealed class MinerModel : IDegradationModel, IDegradationMarginGradient
{
    /// <summary>Input name: Miner sum at failure Δ.</summary>
    public const string MinerSum = "minerSum";
    /// <summary>Input name: shift of log₁₀N of the curve (0 = the design curve; +2σ_logN ≈ the mean curve).</summary>
    public const string LogLifeOffset = "log10LifeOffset";

    private readonly InputSlot _delta, _offset, _t, _stress, _q, _h, _nu;

    /// <summary>Builds the model over <paramref name="inputs"/>, whose variable names must match <see cref="ExpectedInputs"/>.</summary>
    /// <exception cref="ArgumentException">Missing or unknown inputs, or an invalid curve (all listed).</exception>
    public MinerModel(StochasticModel inputs, MinerSettings? settings = null, string? name = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        settings ??= new MinerSettings();
        ArgumentNullException.ThrowIfNull(settings.Curve, nameof(settings.Curve));
        var problems = settings.Curve.Problems();
        if (problems.Count > 0) throw new ArgumentException($"S–N curve '{settings.Curve.Name}': {string.Join("; ", problems)}.", nameof(settings));
        Settings = settings;
        Inputs = inputs;
        Name = name ?? $"S–N fatigue, {settings.Curve.Name}, Miner's rule";
        var layout = InputLayout.Resolve(Name, inputs, ExpectedInputs(settings));
        _delta = new InputSlot(layout, MinerSum);
        _offset = new InputSlot(layout, LogLifeOffset);
        _t = new InputSlot(layout, CrackGrowthModel.Thickness);
        _stress = new InputSlot(layout, CrackGrowthModel.StressRange);
        _q = new InputSlot(layout, CrackGrowthModel.WeibullScale);
        _h = new InputSlot(layout, CrackGrowthModel.WeibullShape);
        _nu = new InputSlot(layout, CrackGrowthModel.CyclesPerYear);
    }

    /// <summary>The settings this model was built with.</summary>
    public MinerSettings Settings { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public StochasticModel Inputs { get; }

    /// <inheritdoc />
    public string SizeQuantity => "damage_dimensionless";

    /// <inheritdoc />
    public IReadOnlyList<string> RenewedOnRepair => [];

    /// <inheritdoc />
    public string? AnnualMaximumInput => null;

    /// <inheritdoc />
    public double MaximumSizeMm => double.PositiveInfinity;

    /// <inheritdoc />
    public bool HasMarginGradient => true;

    /// <summary>The inputs the mechanism reads for the given settings, with units and defaults.</summary>
    public static IReadOnlyList<ModelInput> ExpectedInputs(MinerSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var list = new List<ModelInput>
        {
            new(MinerSum, "-", "Miner sum at failure Δ"),
            new(LogLifeOffset, "-", "shift of log10 N of the S–N curve", 0.0),
            new(CrackGrowthModel.Thickness, "mm", "thickness for the thickness correction", settings.Curve.ReferenceThicknessMm),
            new(CrackGrowthModel.CyclesPerYear, "cycles/year", "stress cycles per year ν"),
        };
        if (settings.StressRanges == StressRangeModel.ConstantAmplitude)
        {
            list.Add(new(CrackGrowthModel.StressRange, "MPa", "constant stress range Δσ"));
        }
        else
        {
            list.Add(new(CrackGrowthModel.WeibullScale, "MPa", "Weibull scale q of the long-term stress ranges"));
            list.Add(new(CrackGrowthModel.WeibullShape, "-", "Weibull shape h of the long-term stress ranges"));
        }

        return list;
    }

    /// <summary>Miner damage per cycle E[1/N(Δσ)].</summary>
    public double DamagePerCycle(ReadOnlySpan<double> x) => Math.Exp(LogDamagePerCycle(x, default, false));

    /// <inheritdoc />
    /// <remarks>The Miner damage D(t), dimensionless.</remarks>
    public double Size(ReadOnlySpan<double> x, double timeYears) => DamagePerCycle(x) * Math.Max(0, _nu.Read(x) * timeYears);

    /// <summary>Fatigue life in years at which D reaches the Miner sum of <paramref name="x"/>.</summary>
    public double LifeYears(ReadOnlySpan<double> x) => _delta.Read(x) / (DamagePerCycle(x) * _nu.Read(x));

    /// <inheritdoc />
    public double Margin(ReadOnlySpan<double> x, double timeYears)
    {
        var n = Math.Max(_nu.Read(x) * timeYears, 1);
        return Math.Log(_delta.Read(x)) - LogDamagePerCycle(x, default, false) - Math.Log(n);
    }

    /// <inheritdoc />
    public double MarginWithGradient(ReadOnlySpan<double> x, double timeYears, Span<double> gradient)
    {
        gradient.Clear();
        var nu = _nu.Read(x);
        var n = nu * timeYears;
        var delta = _delta.Read(x);
        _delta.Add(gradient, 1 / delta);
        var lnD = LogDamagePerCycle(x, gradient, true);
        if (n > 1) _nu.Add(gradient, -1 / nu);
        return Math.Log(delta) - lnD - Math.Log(Math.Max(n, 1));
    }

    /// <summary>ln E[1/N]; with <paramref name="withGradient"/> subtracts ∂ln E[1/N]/∂x from the gradient (g contains −ln E[1/N]).</summary>
    private double LogDamagePerCycle(ReadOnlySpan<double> x, Span<double> gradient, bool withGradient)
    {
        var c = Settings.Curve;
        var offset = _offset.Read(x);
        var thickness = _t.Read(x);
        var tf = c.ThicknessFactor(thickness);
        var dLnTfDt = thickness > c.ReferenceThicknessMm ? c.ThicknessExponent / thickness : 0;
        var ln10 = Math.Log(10);
        var lnA1 = (c.Log10A1 + offset) * ln10;
        var lnA2 = (c.Log10A2 + offset) * ln10;
        if (Settings.StressRanges == StressRangeModel.ConstantAmplitude)
        {
            var s = _stress.Read(x) * tf;
            var upper = s >= c.TransitionRangeMPa;
            var m = upper ? c.M1 : c.M2;
            var lnDc = m * Math.Log(s) - (upper ? lnA1 : lnA2);
            if (withGradient)
            {
                _stress.Add(gradient, -m / _stress.Read(x));
                _t.Add(gradient, -m * dLnTfDt);
                _offset.Add(gradient, ln10);
            }

            return lnDc;
        }

        var q = _q.Read(x) * tf;
        var h = _h.Read(x);
        var str = c.TransitionRangeMPa;
        var z = Math.Pow(str / q, h);
        var g1 = WeibullStressRanges.UpperIncomplete(1 + c.M1 / h, z);
        var g2 = WeibullStressRanges.LowerIncomplete(1 + c.M2 / h, z);
        var t1 = Math.Exp(c.M1 * Math.Log(q) - lnA1) * g1;
        var t2 = Math.Exp(c.M2 * Math.Log(q) - lnA2) * g2;
        var d = t1 + t2;
        if (withGradient)
        {
            // dΓ(a, z)/dz = −z^(a−1)e^(−z), dγ(a, z)/dz = +z^(a−1)e^(−z); z = (s_tr/q)^h.
            var a1 = 1 + c.M1 / h;
            var a2 = 1 + c.M2 / h;
            var kern1 = z > 0 ? Math.Exp((a1 - 1) * Math.Log(z) - z) : 0;
            var kern2 = z > 0 ? Math.Exp((a2 - 1) * Math.Log(z) - z) : 0;
            var f1 = Math.Exp(c.M1 * Math.Log(q) - lnA1);
            var f2 = Math.Exp(c.M2 * Math.Log(q) - lnA2);
            var dzdq = -h * z / q;
            var dDdq = c.M1 / q * t1 + c.M2 / q * t2 + (-f1 * kern1 + f2 * kern2) * dzdq;
            var dlnDdlnq = dDdq * q / d;
            _q.Add(gradient, -dlnDdlnq / _q.Read(x));
            _t.Add(gradient, -dlnDdlnq * dLnTfDt);
            _offset.Add(gradient, ln10);
            // ∂/∂h by a central difference of the two incomplete gamma terms: the shape is usually fixed.
            if (_h.IsPresent)
            {
                var eps = 1e-6 * h;
                var dPlus = WeibullDamage(c, q, h + eps, lnA1, lnA2);
                var dMinus = WeibullDamage(c, q, h - eps, lnA1, lnA2);
                _h.Add(gradient, -(Math.Log(dPlus) - Math.Log(dMinus)) / (2 * eps));
            }
        }

        return Math.Log(d);
    }

    private static double WeibullDamage(SnCurve c, double q, double h, double lnA1, double lnA2)
    {
        var z = Math.Pow(c.TransitionRangeMPa / q, h);
        return Math.Exp(c.M1 * Math.Log(q) - lnA1) * WeibullStressRanges.UpperIncomplete(1 + c.M1 / h, z)
            + Math.Exp(c.M2 * Math.Log(q) - lnA2) * WeibullStressRanges.LowerIncomplete(1 + c.M2 / h, z);
    }
}
