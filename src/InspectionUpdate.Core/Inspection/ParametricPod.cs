using InspectionUpdate.Probability;

namespace InspectionUpdate.Inspection;

/// <summary>
/// A probability-of-detection curve built from a base curve F(a) (a CDF in the size a, mm), an optional lower detection
/// limit and an optional saturation: PoD(a) = 0 for a &lt; <see cref="LowerLimitMm"/>, else
/// <see cref="MaxPod"/>·F(a).
/// </summary>
/// <remarks>
/// <para>The lower detection limit clips the curve: sizes below it are never detected, and at the limit PoD jumps from
/// 0 to MaxPod·F(limit). The detectable size therefore has an atom of that mass at the limit.</para>
/// <para>Saturation: a fraction 1 − MaxPod of defects is never detected whatever its size (e.g. an access or
/// orientation problem). <see cref="DetectableSize"/> keeps its CDF equal to PoD (it is <em>not</em> renormalized, which
/// would overstate what a no-indication finding tells) and places the never-detected mass as an atom at
/// <see cref="NeverDetectedSizeMm"/>, a size no degradation reaches, so "no indication" (a − A_d ≤ 0) always holds
/// there and the map from standard normal space stays finite and monotone. The renormalized variable
/// (detected-when-detectable) is <see cref="DetectableSizeWhenDetectable"/>, for an updater that splits the event
/// tree into "method works" (probability MaxPod) and "never detects".</para>
/// <para>A probability of false call (an indication where nothing is) is carried for likelihood-based updating through
/// <see cref="IndicationProbability"/>; the detectable-size variable does not include it.</para>
/// </remarks>
public abstract class ParametricPod : ProbabilityOfDetection
{
    /// <summary>Size (mm) at which the never-detected mass of a saturating curve is placed: 1 km, beyond any defect.</summary>
    public const double NeverDetectedSizeMm = 1.0e6;

    /// <summary>Validates and stores the options common to every form.</summary>
    /// <param name="lowerLimitMm">Lower detection limit in mm, ≥ 0 (0: none).</param>
    /// <param name="maxPod">Saturation PoD_max in (0, 1] (1: none).</param>
    /// <param name="falseCallProbability">Probability of an indication where no defect is, in [0, 1).</param>
    /// <exception cref="ArgumentOutOfRangeException">A value is NaN or outside its range.</exception>
    protected ParametricPod(double lowerLimitMm, double maxPod, double falseCallProbability)
    {
        if (!double.IsFinite(lowerLimitMm) || lowerLimitMm < 0 || lowerLimitMm >= NeverDetectedSizeMm)
        {
            throw new ArgumentOutOfRangeException(nameof(lowerLimitMm), lowerLimitMm, "The lower detection limit must be finite, ≥ 0 mm and below 1e6 mm.");
        }

        if (!(maxPod > 0 && maxPod <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(maxPod), maxPod, "The saturation PoD must lie in (0, 1].");
        }

        if (!(falseCallProbability >= 0 && falseCallProbability < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(falseCallProbability), falseCallProbability, "The probability of false call must lie in [0, 1).");
        }

        LowerLimitMm = lowerLimitMm;
        MaxPod = maxPod;
        FalseCallProbability = falseCallProbability;
    }

    /// <summary>Checks the location μ (ln mm) and scale σ (ln a) of the log-linear forms.</summary>
    /// <exception cref="ArgumentOutOfRangeException">μ not finite ("muLnMm") or σ not finite and &gt; 0 ("sigmaLn").</exception>
    protected static void RequireLogLocationScale(double muLnMm, double sigmaLn)
    {
        if (!double.IsFinite(muLnMm))
        {
            throw new ArgumentOutOfRangeException(nameof(muLnMm), muLnMm, "μ (location in ln a, a in mm) must be finite.");
        }

        if (!double.IsFinite(sigmaLn) || sigmaLn <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(sigmaLn), sigmaLn, "σ (scale in ln a) must be finite and > 0.");
        }
    }

    /// <summary>Lower detection limit in mm (0 when there is none): PoD = 0 below it.</summary>
    public double LowerLimitMm { get; }

    /// <summary>Saturation PoD_max in (0, 1]: the PoD of very large defects.</summary>
    public double MaxPod { get; }

    /// <summary>Probability of false call: an indication reported where no defect is, in [0, 1).</summary>
    public double FalseCallProbability { get; }

    /// <summary>Base CDF F(a) for a &gt; 0, accurate where it is small.</summary>
    protected abstract double BaseCdf(double sizeMm);

    /// <summary>1 − F(a) for a &gt; 0, accurate where it is small.</summary>
    protected abstract double BaseCcdf(double sizeMm);

    /// <summary>Base density f(a) for a &gt; 0.</summary>
    protected abstract double BasePdf(double sizeMm);

    /// <summary>F⁻¹(p), p in (0, 1).</summary>
    protected abstract double BaseInverseCdf(double p);

    /// <summary>The a with 1 − F(a) = q, q in (0, 1), accurate for tiny q.</summary>
    protected abstract double BaseInverseCcdf(double q);

    /// <inheritdoc />
    public sealed override double Evaluate(double sizeMm)
    {
        if (double.IsNaN(sizeMm))
        {
            return double.NaN;
        }

        return sizeMm <= 0 || sizeMm < LowerLimitMm ? 0 : MaxPod * BaseCdf(sizeMm);
    }

    /// <summary>1 − PoD(a), the probability of missing a defect of size a (mm), accurate where PoD is close to 1.</summary>
    public double MissProbability(double sizeMm)
    {
        if (double.IsNaN(sizeMm))
        {
            return double.NaN;
        }

        if (sizeMm <= 0 || sizeMm < LowerLimitMm)
        {
            return 1;
        }

        return MaxPod == 1 ? BaseCcdf(sizeMm) : (1 - MaxPod) + MaxPod * BaseCcdf(sizeMm);
    }

    /// <summary>
    /// Probability of an indication at a location with a defect of size a (mm, 0 for none): the defect is detected, or
    /// it is missed and a false call is made: PoD(a) + (1 − PoD(a))·P_fc.
    /// </summary>
    public double IndicationProbability(double sizeMm) =>
        Evaluate(sizeMm) + MissProbability(sizeMm) * FalseCallProbability;

    /// <summary>The size a_p (mm) with PoD(a_p) = p, e.g. a₉₀ for p = 0.9.</summary>
    /// <exception cref="ArgumentOutOfRangeException">p is not in (0, MaxPod).</exception>
    public double SizeAtPod(double p)
    {
        if (!(p > 0 && p < MaxPod))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, FormattableString.Invariant($"The PoD level must lie in (0, {MaxPod:R}) (the saturation)."));
        }

        var s = p / MaxPod;
        var a = s > 0.5 ? BaseInverseCcdf(1 - s) : BaseInverseCdf(s);
        return Math.Max(a, LowerLimitMm);
    }

    /// <summary>The detectable size A_d with CDF equal to PoD; see the remarks of <see cref="ParametricPod"/> for the atoms.</summary>
    public sealed override RandomVariable DetectableSize(string name) => new DetectableSizeVariable(name, this, MaxPod);

    /// <summary>The detectable size given the method can detect the defect at all: CDF PoD(a)/MaxPod (no atom at infinity).</summary>
    public RandomVariable DetectableSizeWhenDetectable(string name) => new DetectableSizeVariable(name, this, 1.0);

    /// <summary>Mean of the base curve F, or +∞ when it does not exist; null when no closed form is coded.</summary>
    protected virtual double? BaseMean => null;

    /// <summary>Standard deviation of the base curve F, or +∞; null when no closed form is coded.</summary>
    protected virtual double? BaseStandardDeviation => null;

    private sealed class DetectableSizeVariable : RandomVariable
    {
        private readonly ParametricPod _pod;
        private readonly double _scale;
        private readonly double _lowerAtom;
        private readonly Lazy<(double Mean, double Sd)> _moments;

        public DetectableSizeVariable(string name, ParametricPod pod, double scale) : base(name)
        {
            _pod = pod;
            _scale = scale;
            _lowerAtom = pod.LowerLimitMm > 0 ? scale * pod.BaseCdf(pod.LowerLimitMm) : 0;
            _moments = new Lazy<(double, double)>(ComputeMoments);
        }

        public override string Family => "DetectableSize(" + _pod.Form + ")";

        public override double Mean => _moments.Value.Mean;

        public override double StandardDeviation => _moments.Value.Sd;

        private bool Saturates => _scale < 1;

        public override double Pdf(double x) =>
            x > _pod.LowerLimitMm && x > 0 && (!Saturates || x < NeverDetectedSizeMm) ? _scale * _pod.BasePdf(x) : 0;

        public override double Cdf(double x)
        {
            if (double.IsNaN(x)) return double.NaN;
            if (x <= 0 || x < _pod.LowerLimitMm) return 0;
            if (Saturates && x >= NeverDetectedSizeMm) return 1;
            return _scale * _pod.BaseCdf(x);
        }

        public override double Ccdf(double x)
        {
            if (double.IsNaN(x)) return double.NaN;
            if (x <= 0 || x < _pod.LowerLimitMm) return 1;
            if (Saturates && x >= NeverDetectedSizeMm) return 0;
            return _scale == 1 ? _pod.BaseCcdf(x) : (1 - _scale) + _scale * _pod.BaseCcdf(x);
        }

        public override double InverseCdf(double p)
        {
            if (!(p >= 0 && p <= 1))
            {
                throw new ArgumentOutOfRangeException(nameof(p), p, "Probability must lie in [0, 1].");
            }

            if (p <= _lowerAtom) return _pod.LowerLimitMm;
            if (Saturates)
            {
                return p >= _scale ? NeverDetectedSizeMm : Math.Min(NeverDetectedSizeMm, Base(p / _scale));
            }

            return p == 1 ? double.PositiveInfinity : Base(p);
        }

        public override double InverseCcdf(double q)
        {
            if (!(q >= 0 && q <= 1))
            {
                throw new ArgumentOutOfRangeException(nameof(q), q, "Probability must lie in [0, 1].");
            }

            if (q >= 1 - _lowerAtom) return _pod.LowerLimitMm;
            if (Saturates)
            {
                var rest = q - (1 - _scale);
                return rest <= 0 ? NeverDetectedSizeMm : Math.Min(NeverDetectedSizeMm, BaseUpper(rest / _scale));
            }

            return q == 0 ? double.PositiveInfinity : BaseUpper(q);
        }

        // Base inverse choosing the accurate tail; s is a base-curve probability.
        private double Base(double s) => s > 0.5 ? _pod.BaseInverseCcdf(1 - s) : _pod.BaseInverseCdf(s);

        private double BaseUpper(double q) => q < 0.5 ? _pod.BaseInverseCcdf(q) : _pod.BaseInverseCdf(1 - q);

        private (double, double) ComputeMoments()
        {
            if (!Saturates)
            {
                if (_pod.BaseMean is double.PositiveInfinity)
                {
                    return (double.PositiveInfinity, double.PositiveInfinity);
                }

                if (_pod.LowerLimitMm == 0 && _pod.BaseMean is { } m && _pod.BaseStandardDeviation is { } sd)
                {
                    return (m, sd);
                }
            }

            // E[g(X)] = atom terms + scale·∫ g(F⁻¹(s)) ds over the continuous part; double-exponential quadrature copes
            // with the integrable end-point singularities of the quantile function.
            var s0 = _pod.LowerLimitMm > 0 ? _pod.BaseCdf(_pod.LowerLimitMm) : 0;
            var s1 = Saturates ? _pod.BaseCdf(NeverDetectedSizeMm) : 1;
            var atomHigh = Saturates ? 1 - _scale * s1 : 0;

            double Integral(Func<double, double> g) =>
                s1 > s0 ? MathNet.Numerics.Integrate.DoubleExponential(s => g(Base(Math.Clamp(s, s0, s1))), s0, s1, 1e-10) : 0;

            var m1 = _lowerAtom * _pod.LowerLimitMm + _scale * Integral(x => x) + atomHigh * NeverDetectedSizeMm;
            if (!Saturates && _pod.BaseStandardDeviation is double.PositiveInfinity)
            {
                return (m1, double.PositiveInfinity);
            }

            var m2 = _lowerAtom * _pod.LowerLimitMm * _pod.LowerLimitMm + _scale * Integral(x => x * x)
                + atomHigh * NeverDetectedSizeMm * NeverDetectedSizeMm;
            return (m1, Math.Sqrt(Math.Max(0, m2 - m1 * m1)));
        }
    }
}
