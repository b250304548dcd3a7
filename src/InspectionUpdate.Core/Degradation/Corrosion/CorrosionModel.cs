using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation.Corrosion;

/// <summary>How the wall loss grows after initiation.</summary>
public enum CorrosionGrowthLaw
{
    /// <summary>d(t) = r·max(0, t − T₀).</summary>
    Linear,

    /// <summary>d(t) = k·max(0, t − T₀)ⁿ (Velázquez et al. 2009, Corrosion 65(5):332–342).</summary>
    PowerLaw,
}

/// <summary>Which failure the corrosion limit state describes.</summary>
public enum CorrosionFailureMode
{
    /// <summary>Leak: the depth reaches a fraction of the wall, g = f·t − d(t).</summary>
    Leak,

    /// <summary>Burst by the DNV-RP-F101 single-defect capacity, g = X_m·p_cap − p.</summary>
    BurstDnvRpF101,

    /// <summary>Burst by the modified B31G capacity, g = X_m·p_cap − p.</summary>
    BurstModifiedB31G,
}

/// <summary>Settings of a corrosion model that are not random inputs.</summary>
public sealed record CorrosionSettings
{
    /// <summary>
    /// Default leak fraction 0.8: assessment methods for corroded pipe (ASME B31G, DNV-RP-F101) are not used past
    /// about 80–85 % wall loss and such defects are repaired (common practice, no source).
    /// </summary>
    public const double DefaultLeakFraction = 0.8;

    /// <summary>Growth law of the depth.</summary>
    public CorrosionGrowthLaw GrowthLaw { get; init; } = CorrosionGrowthLaw.Linear;

    /// <summary>Failure mode of the limit state.</summary>
    public CorrosionFailureMode FailureMode { get; init; } = CorrosionFailureMode.Leak;

    /// <summary>Leak when the depth reaches this fraction of the wall, in (0, 1].</summary>
    public double LeakFraction { get; init; } = DefaultLeakFraction;

    /// <summary>True when the defect length grows: L(t) = L₀ + r_L·max(0, t − T₀) (input lengthRate_mmPerYear).</summary>
    public bool LengthGrows { get; init; }

    /// <summary>True when pressure_MPa is the annual maximum pressure, renewed independently each year.</summary>
    public bool PressureIsAnnualMaximum { get; init; }

    /// <summary>Factor in front of the DNV-RP-F101 equation (1.0; some editions print 1.05).</summary>
    public double CapacityFactor { get; init; } = 1.0;

    /// <summary>Added to SMYS for the modified B31G flow stress, MPa.</summary>
    public double FlowStressAdderMPa { get; init; } = CorrodedPipeCapacity.ModifiedB31GFlowStressAdderMPa;
}

/// <summary>
/// External or internal wall-loss corrosion of a pipe: depth growth after an initiation time, and a leak or burst
/// limit state. Inputs are looked up by name in the stochastic model (see <see cref="ExpectedInputs"/>).
/// </summary>
public sealed class CorrosionModel : IDegradationModel, IDegradationMarginGradient, IFailureTimeModel
{
    /// <summary>Input name: wall thickness, mm.</summary>
    public const string WallThickness = "wallThickness_mm";
    /// <summary>Input name: initiation time (e.g. coating life), years.</summary>
    public const string InitiationTime = "initiationTime_years";
    /// <summary>Input name: linear growth rate, mm/year.</summary>
    public const string Rate = "rate_mmPerYear";
    /// <summary>Input name: power-law coefficient k, mm/yearⁿ.</summary>
    public const string PowerCoefficient = "powerCoefficient_mm";
    /// <summary>Input name: power-law exponent n.</summary>
    public const string PowerExponent = "powerExponent";
    /// <summary>Input name: outside diameter, mm.</summary>
    public const string Diameter = "diameter_mm";
    /// <summary>Input name: defect length at initiation, mm.</summary>
    public const string DefectLength = "defectLength_mm";
    /// <summary>Input name: growth rate of the defect length, mm/year.</summary>
    public const string LengthRate = "lengthRate_mmPerYear";
    /// <summary>Input name: tensile strength (SMTS), MPa.</summary>
    public const string TensileStrength = "tensileStrength_MPa";
    /// <summary>Input name: yield strength (SMYS), MPa.</summary>
    public const string YieldStrength = "yieldStrength_MPa";
    /// <summary>Input name: multiplicative model-uncertainty factor on the capacity.</summary>
    public const string ModelFactor = "modelFactor";
    /// <summary>Input name: operating pressure (or its annual maximum), MPa.</summary>
    public const string Pressure = "pressure_MPa";

    private readonly InputSlot _wall, _t0, _rate, _k, _n, _diameter, _length, _lengthRate, _strength, _factor, _pressure;

    /// <summary>Builds the model over <paramref name="inputs"/>, whose variable names must match <see cref="ExpectedInputs"/>.</summary>
    /// <exception cref="ArgumentException">A required input is missing, an input is unknown, or a setting is out of range (all listed).</exception>
    public CorrosionModel(StochasticModel inputs, CorrosionSettings? settings = null, string? name = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        settings ??= new CorrosionSettings();
        if (!(settings.LeakFraction > 0 && settings.LeakFraction <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(settings), settings.LeakFraction, "LeakFraction must lie in (0, 1].");
        }

        if (!(settings.CapacityFactor > 0 && double.IsFinite(settings.CapacityFactor)))
        {
            throw new ArgumentOutOfRangeException(nameof(settings), settings.CapacityFactor, "CapacityFactor must be finite and > 0.");
        }

        if (!double.IsFinite(settings.FlowStressAdderMPa) || settings.FlowStressAdderMPa < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(settings), settings.FlowStressAdderMPa, "FlowStressAdderMPa must be finite and ≥ 0.");
        }

        if (settings.PressureIsAnnualMaximum && settings.FailureMode == CorrosionFailureMode.Leak)
        {
            throw new ArgumentException("An annual maximum pressure needs a burst failure mode; the leak limit state has no pressure.", nameof(settings));
        }

        Settings = settings;
        Name = name ?? DefaultName(settings);
        Inputs = inputs;
        var layout = InputLayout.Resolve(Name, inputs, ExpectedInputs(settings));
        _wall = new InputSlot(layout, WallThickness);
        _t0 = new InputSlot(layout, InitiationTime);
        _rate = new InputSlot(layout, Rate);
        _k = new InputSlot(layout, PowerCoefficient);
        _n = new InputSlot(layout, PowerExponent);
        _diameter = new InputSlot(layout, Diameter);
        _length = new InputSlot(layout, DefectLength);
        _lengthRate = new InputSlot(layout, LengthRate);
        _strength = new InputSlot(layout, settings.FailureMode == CorrosionFailureMode.BurstModifiedB31G ? YieldStrength : TensileStrength);
        _factor = new InputSlot(layout, ModelFactor);
        _pressure = new InputSlot(layout, Pressure);
        var wallVariable = inputs.Variables[layout.IndexOf(WallThickness)];
        MaximumSizeMm = wallVariable.IsDeterministic ? wallVariable.Mean : double.PositiveInfinity;
    }

    /// <summary>The settings this model was built with.</summary>
    public CorrosionSettings Settings { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public StochasticModel Inputs { get; }

    /// <inheritdoc />
    public string SizeQuantity => "depth_mm";

    /// <inheritdoc />
    /// <remarks>The initiation time and the defect length restart after a repair (new coating, new defect); rates, wall and strength are shared.</remarks>
    public IReadOnlyList<string> RenewedOnRepair =>
        new[] { InitiationTime, DefectLength }.Where(n => Inputs.IndexOf(n) >= 0).ToArray();

    /// <inheritdoc />
    public string? AnnualMaximumInput => Settings.PressureIsAnnualMaximum ? Pressure : null;

    /// <inheritdoc />
    /// <remarks>The wall thickness when it is deterministic, else +∞.</remarks>
    public double MaximumSizeMm { get; }

    /// <summary>The inputs the mechanism reads for the given settings, with units and defaults.</summary>
    public static IReadOnlyList<ModelInput> ExpectedInputs(CorrosionSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var list = new List<ModelInput>
        {
            new(WallThickness, "mm", "nominal wall thickness"),
            new(InitiationTime, "years", "time before wall loss starts (e.g. coating life)", 0.0),
        };
        if (settings.GrowthLaw == CorrosionGrowthLaw.Linear)
        {
            list.Add(new(Rate, "mm/year", "wall-loss rate"));
        }
        else
        {
            list.Add(new(PowerCoefficient, "mm/year^n", "power-law coefficient k"));
            list.Add(new(PowerExponent, "-", "power-law exponent n"));
        }

        if (settings.FailureMode != CorrosionFailureMode.Leak)
        {
            list.Add(new(Diameter, "mm", "outside diameter"));
            list.Add(new(DefectLength, "mm", "longitudinal defect length (at initiation when it grows)"));
            if (settings.LengthGrows) list.Add(new(LengthRate, "mm/year", "growth rate of the defect length"));
            list.Add(settings.FailureMode == CorrosionFailureMode.BurstModifiedB31G
                ? new(YieldStrength, "MPa", "specified minimum yield strength (SMYS)")
                : new(TensileStrength, "MPa", "tensile strength (SMTS)"));
            list.Add(new(ModelFactor, "-", "model-uncertainty factor on the capacity", 1.0));
            list.Add(new(Pressure, "MPa", settings.PressureIsAnnualMaximum ? "annual maximum internal pressure" : "operating internal pressure"));
        }

        return list;
    }

    /// <summary>Exposure time τ = max(0, t − T₀) in years.</summary>
    private double Exposure(ReadOnlySpan<double> x, double timeYears) => Math.Max(0, timeYears - _t0.Read(x));

    /// <summary>Wall loss d(x, t) in mm, not capped at the wall.</summary>
    public double DepthMm(ReadOnlySpan<double> x, double timeYears)
    {
        var tau = Exposure(x, timeYears);
        return Settings.GrowthLaw == CorrosionGrowthLaw.Linear
            ? _rate.Read(x) * tau
            : tau > 0 ? _k.Read(x) * Math.Pow(tau, _n.Read(x)) : 0;
    }

    /// <summary>Defect length L(x, t) in mm (burst modes only).</summary>
    public double LengthMm(ReadOnlySpan<double> x, double timeYears)
    {
        var l = _length.Read(x);
        return Settings.LengthGrows ? l + _lengthRate.Read(x) * Exposure(x, timeYears) : l;
    }

    /// <inheritdoc />
    /// <remarks>The wall loss, capped at the wall thickness (a through-wall defect).</remarks>
    public double Size(ReadOnlySpan<double> x, double timeYears) => Math.Min(DepthMm(x, timeYears), _wall.Read(x));

    /// <inheritdoc />
    public double Margin(ReadOnlySpan<double> x, double timeYears)
    {
        var depth = DepthMm(x, timeYears);
        var wall = _wall.Read(x);
        if (Settings.FailureMode == CorrosionFailureMode.Leak) return Settings.LeakFraction * wall - depth;
        var cap = Capacity(x, wall, depth, LengthMm(x, timeYears));
        return _factor.Read(x) * cap.PressureMPa - _pressure.Read(x);
    }

    /// <summary>The burst capacity in MPa at time t (burst modes only; without the model factor).</summary>
    public double BurstCapacityMPa(ReadOnlySpan<double> x, double timeYears)
    {
        if (Settings.FailureMode == CorrosionFailureMode.Leak)
        {
            throw new InvalidOperationException("The leak failure mode has no burst capacity.");
        }

        return Capacity(x, _wall.Read(x), DepthMm(x, timeYears), LengthMm(x, timeYears)).PressureMPa;
    }

    /// <inheritdoc />
    public bool HasMarginGradient => true;

    /// <inheritdoc />
    public double MarginWithGradient(ReadOnlySpan<double> x, double timeYears, Span<double> gradient)
    {
        gradient.Clear();
        var tau = Exposure(x, timeYears);
        var wall = _wall.Read(x);

        // Depth and its derivatives with respect to the growth inputs.
        double depth, dDepthDt0;
        if (Settings.GrowthLaw == CorrosionGrowthLaw.Linear)
        {
            var r = _rate.Read(x);
            depth = r * tau;
            dDepthDt0 = tau > 0 ? -r : 0;
        }
        else
        {
            var k = _k.Read(x);
            var n = _n.Read(x);
            var pow = tau > 0 ? Math.Pow(tau, n) : 0;
            depth = k * pow;
            dDepthDt0 = tau > 0 ? -k * n * pow / tau : 0;
        }

        // Depth sensitivity factor of g, applied to each growth input below.
        double dgdDepth;
        double g;
        if (Settings.FailureMode == CorrosionFailureMode.Leak)
        {
            g = Settings.LeakFraction * wall - depth;
            _wall.Add(gradient, Settings.LeakFraction);
            dgdDepth = -1;
        }
        else
        {
            var length = LengthMm(x, timeYears);
            var cap = Capacity(x, wall, depth, length);
            var factor = _factor.Read(x);
            g = factor * cap.PressureMPa - _pressure.Read(x);
            _factor.Add(gradient, cap.PressureMPa);
            _pressure.Add(gradient, -1);
            _wall.Add(gradient, factor * cap.DWallThickness);
            _diameter.Add(gradient, factor * cap.DDiameter);
            _strength.Add(gradient, factor * cap.DStrength);
            var dgdLength = factor * cap.DLength;
            _length.Add(gradient, dgdLength);
            if (Settings.LengthGrows)
            {
                var rl = _lengthRate.Read(x);
                _lengthRate.Add(gradient, dgdLength * tau);
                if (tau > 0) _t0.Add(gradient, -dgdLength * rl);
            }

            dgdDepth = factor * cap.DDepth;
        }

        _t0.Add(gradient, dgdDepth * dDepthDt0);
        if (Settings.GrowthLaw == CorrosionGrowthLaw.Linear)
        {
            _rate.Add(gradient, dgdDepth * tau);
        }
        else if (tau > 0)
        {
            var pow = Math.Pow(tau, _n.Read(x));
            _k.Add(gradient, dgdDepth * pow);
            _n.Add(gradient, dgdDepth * _k.Read(x) * pow * Math.Log(tau));
        }

        return g;
    }

    /// <inheritdoc />
    /// <remarks>
    /// Leak: g = f·w − d(t) with d(t) = r·max(0, t − T₀) or k·max(0, t − T₀)ⁿ, so T_f = T₀ + f·w/r or
    /// T₀ + (f·w/k)^(1/n) (never when the rate, k or n is ≤ 0; at once when f·w ≤ 0). Burst with a fixed defect length:
    /// the same with the critical depth of the capacity equation; with a growing length a one-dimensional root between
    /// two such closed forms (<see cref="GrowingLengthExposure"/>).
    /// </remarks>
    public double FailureTimeYears(ReadOnlySpan<double> x)
    {
        if (Settings.FailureMode != CorrosionFailureMode.Leak) return BurstFailureTimeYears(x);
        var allowed = Settings.LeakFraction * _wall.Read(x);
        if (!(allowed > 0)) return 0;
        return TimeToDepth(x, allowed);
    }

    /// <summary>
    /// Burst with a defect length that does not grow: the capacity equation solved for the critical depth d* on the
    /// intact-wall branch (<see cref="CorrodedPipeCapacity.DnvRpF101CriticalDepthRatio"/>), then the time the depth
    /// reaches it. NaN (the caller searches for the root of g in t) where the length grows or d* is not on that branch.
    /// </summary>
    private double BurstFailureTimeYears(ReadOnlySpan<double> x)
    {
        var length = Math.Max(_length.Read(x), 0);
        var critical = CriticalDepthMm(x, length);
        if (!(critical > 0)) return double.NaN;
        if (!Settings.LengthGrows) return TimeToDepth(x, critical);
        var exposure = GrowingLengthExposure(x, length, critical);
        return double.IsNaN(exposure) ? double.NaN : Math.Max(0, _t0.Read(x) + exposure);
    }

    /// <summary>The depth at which the capacity of a defect of <paramref name="lengthMm"/> falls to the pressure (intact-wall branch), or NaN.</summary>
    private double CriticalDepthMm(ReadOnlySpan<double> x, double lengthMm)
    {
        var wall = _wall.Read(x);
        var ratio = Settings.FailureMode == CorrosionFailureMode.BurstModifiedB31G
            ? CorrodedPipeCapacity.ModifiedB31GCriticalDepthRatio(_diameter.Read(x), wall, _strength.Read(x), lengthMm, Settings.FlowStressAdderMPa, _factor.Read(x), _pressure.Read(x))
            : CorrodedPipeCapacity.DnvRpF101CriticalDepthRatio(_diameter.Read(x), wall, _strength.Read(x), lengthMm, Settings.CapacityFactor, _factor.Read(x), _pressure.Read(x));
        return ratio * wall;
    }

    /// <summary>
    /// Exposure τ_f at burst when the length grows, L(τ) = L₀ + r_L·τ with r_L ≥ 0: the root of
    /// h(τ) = d(τ) − d*(L(τ)), d* the critical depth of a fixed length. d* falls as L grows (the bulging factor grows),
    /// so τ_f lies between τ_lo = d⁻¹(d*(L(τ_hi))) and τ_hi = d⁻¹(d*(L₀)), both closed forms, and h rises from ≤ 0 to
    /// ≥ 0 across that bracket; Illinois regula falsi on it needs a few critical depths instead of a dozen margins.
    /// NaN (the caller searches on g itself) where r_L &lt; 0, the depth does not grow, or a critical depth leaves the
    /// intact-wall branch.
    /// </summary>
    private double GrowingLengthExposure(ReadOnlySpan<double> x, double length0, double critical0)
    {
        var rateL = _lengthRate.Read(x);
        if (!(rateL >= 0)) return double.NaN;
        double lo, hi;
        hi = ExposureToDepth(x, critical0);
        if (!double.IsFinite(hi)) return double.NaN;
        var criticalHi = CriticalDepthMm(x, length0 + rateL * hi);
        if (!(criticalHi > 0)) return double.NaN;
        lo = ExposureToDepth(x, criticalHi);
        if (!(lo >= 0 && lo <= hi)) return double.NaN;
        // h(τ_hi) = d*(L₀) − d*(L(τ_hi)) and h(τ_lo) = d*(L(τ_hi)) − d*(L(τ_lo)): the depths at the bracket's ends are
        // the critical depths that defined them.
        var criticalLo = CriticalDepthMm(x, length0 + rateL * lo);
        if (!(criticalLo > 0)) return double.NaN;
        double hLo = criticalHi - criticalLo, hHi = critical0 - criticalHi;
        if (hLo == 0) return lo;
        var side = 0;
        for (var it = 0; it < 100 && hi - lo > 1e-9 * Math.Max(1, hi); it++)
        {
            var tau = hHi > hLo ? hi - hHi * (hi - lo) / (hHi - hLo) : 0.5 * (lo + hi);
            if (!(tau > lo && tau < hi)) tau = 0.5 * (lo + hi);
            var c = CriticalDepthMm(x, length0 + rateL * tau);
            if (!(c > 0)) return double.NaN;
            var h = DepthAtExposure(x, tau) - c;
            // Regula falsi closes on the root from one side; stop there once depth and critical depth agree to
            // rounding (1e-12 mm is far below 1e-7 years of growth) instead of waiting for the far end to move.
            if (Math.Abs(h) <= 1e-12 * Math.Max(1, c)) return tau;
            if (h < 0)
            {
                lo = tau;
                hLo = h;
                if (side == -1) hHi *= 0.5;
                side = -1;
            }
            else
            {
                hi = tau;
                hHi = h;
                if (side == 1) hLo *= 0.5;
                side = 1;
            }
        }

        // The upper end: a failed exposure, as the general root search returns.
        return hi;
    }

    private double DepthAtExposure(ReadOnlySpan<double> x, double tau) =>
        Settings.GrowthLaw == CorrosionGrowthLaw.Linear ? _rate.Read(x) * tau : tau > 0 ? _k.Read(x) * Math.Pow(tau, _n.Read(x)) : 0;

    /// <summary>The time the wall loss reaches <paramref name="depthMm"/> (&gt; 0): T₀ + d/r or T₀ + (d/k)^(1/n), at least 0; +∞ when it never does.</summary>
    private double TimeToDepth(ReadOnlySpan<double> x, double depthMm) => Math.Max(0, _t0.Read(x) + ExposureToDepth(x, depthMm));

    /// <summary>The exposure τ at which the wall loss reaches <paramref name="depthMm"/> (&gt; 0): d/r or (d/k)^(1/n); +∞ when it never does.</summary>
    private double ExposureToDepth(ReadOnlySpan<double> x, double depthMm)
    {
        if (Settings.GrowthLaw == CorrosionGrowthLaw.Linear)
        {
            var r = _rate.Read(x);
            return r > 0 ? depthMm / r : double.PositiveInfinity;
        }

        var k = _k.Read(x);
        var n = _n.Read(x);
        return k > 0 && n > 0 ? Math.Pow(depthMm / k, 1 / n) : double.PositiveInfinity;
    }

    /// <inheritdoc />
    /// <remarks>Depth and length never shrink when their rates are ≥ 0, and the capacity falls with both.</remarks>
    public bool MarginNeverIncreases(ReadOnlySpan<double> x)
    {
        var depthGrows = Settings.GrowthLaw == CorrosionGrowthLaw.Linear ? _rate.Read(x) >= 0 : _k.Read(x) >= 0 && _n.Read(x) >= 0;
        return depthGrows && (!Settings.LengthGrows || _lengthRate.Read(x) >= 0);
    }

    private CapacityWithGradient Capacity(ReadOnlySpan<double> x, double wall, double depth, double length) =>
        Settings.FailureMode == CorrosionFailureMode.BurstModifiedB31G
            ? CorrodedPipeCapacity.ModifiedB31GWithGradient(_diameter.Read(x), wall, _strength.Read(x), depth, Math.Max(length, 0), Settings.FlowStressAdderMPa)
            : CorrodedPipeCapacity.DnvRpF101WithGradient(_diameter.Read(x), wall, _strength.Read(x), depth, Math.Max(length, 0), Settings.CapacityFactor);

    private static string DefaultName(CorrosionSettings s)
    {
        var growth = s.GrowthLaw == CorrosionGrowthLaw.Linear ? "linear rate" : "power law";
        var mode = s.FailureMode switch
        {
            CorrosionFailureMode.Leak => FormattableString.Invariant($"leak at {s.LeakFraction:0.##} of the wall"),
            CorrosionFailureMode.BurstDnvRpF101 => "burst (DNV-RP-F101)",
            _ => "burst (modified B31G)",
        };
        return $"Wall-loss corrosion, {growth}, {mode}";
    }
}
