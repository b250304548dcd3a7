namespace InspectionUpdate.Inspection;

/// <summary>
/// Log-logistic PoD: log-odds linear in ln a, F(a) = 1/(1 + exp(−(ln a − μ)/σ)), i.e. logit F = β₀ + β₁ ln a with
/// β₁ = 1/σ and β₀ = −μ/σ (MIL-HDBK-1823A, hit/miss model with the logit link).
/// </summary>
/// <remarks>
/// Equivalent to the form F(a) = 1 − 1/(1 + (a/a₅₀)^b) with a₅₀ = e^μ and b = 1/σ. The mean of the detectable size
/// exists only for σ &lt; 1 and its variance only for σ &lt; 1/2 (moments of the log-logistic distribution).
/// </remarks>
public sealed class LogLogisticPod : ParametricPod
{
    /// <summary>Creates the curve from the location μ (of ln a, a in mm) and the scale σ &gt; 0 in ln a.</summary>
    /// <exception cref="ArgumentOutOfRangeException">μ not finite, σ not finite and &gt; 0, or a common option out of range.</exception>
    public LogLogisticPod(double muLnMm, double sigmaLn, double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0)
        : base(lowerLimitMm, maxPod, falseCallProbability)
    {
        RequireLogLocationScale(muLnMm, sigmaLn);

        MuLnMm = muLnMm;
        SigmaLn = sigmaLn;
    }

    /// <summary>From log-odds coefficients: logit PoD = β₀ + β₁ ln a (a in mm), β₁ &gt; 0.</summary>
    public static LogLogisticPod FromLogOdds(double beta0, double beta1, double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0)
    {
        if (!double.IsFinite(beta1) || beta1 <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(beta1), beta1, "β₁ (slope of the log-odds in ln a) must be finite and > 0.");
        }

        return new LogLogisticPod(-beta0 / beta1, 1 / beta1, lowerLimitMm, maxPod, falseCallProbability);
    }

    /// <summary>From the form 1 − 1/(1 + (a/a₅₀)^b): the size a₅₀ (mm) with PoD 1/2 and the shape b &gt; 0.</summary>
    public static LogLogisticPod FromMedianAndShape(double medianSizeMm, double shape, double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0)
    {
        if (!double.IsFinite(medianSizeMm) || medianSizeMm <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(medianSizeMm), medianSizeMm, "The median detectable size must be finite and > 0 mm.");
        }

        if (!double.IsFinite(shape) || shape <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(shape), shape, "The shape b must be finite and > 0.");
        }

        return new LogLogisticPod(Math.Log(medianSizeMm), 1 / shape, lowerLimitMm, maxPod, falseCallProbability);
    }

    /// <inheritdoc />
    public override string Form => PodForms.LogLogistic;

    /// <summary>Location μ: ln of the size (mm) where the base curve is 1/2.</summary>
    public double MuLnMm { get; }

    /// <summary>Scale σ in ln a.</summary>
    public double SigmaLn { get; }

    private double Z(double sizeMm) => (Math.Log(sizeMm) - MuLnMm) / SigmaLn;

    // Λ(z) written so that neither tail cancels: e^z/(1 + e^z) for z < 0.
    private static double Logistic(double z) => PodMath.Logistic(z);

    /// <inheritdoc />
    protected override double BaseCdf(double sizeMm) => Logistic(Z(sizeMm));

    /// <inheritdoc />
    protected override double BaseCcdf(double sizeMm) => Logistic(-Z(sizeMm));

    /// <inheritdoc />
    protected override double BasePdf(double sizeMm)
    {
        var z = Z(sizeMm);
        return Logistic(z) * Logistic(-z) / (SigmaLn * sizeMm);
    }

    /// <inheritdoc />
    protected override double BaseInverseCdf(double p) => Math.Exp(MuLnMm + SigmaLn * (Math.Log(p) - PodMath.Log1p(-p)));

    /// <inheritdoc />
    protected override double BaseInverseCcdf(double q) => Math.Exp(MuLnMm + SigmaLn * (PodMath.Log1p(-q) - Math.Log(q)));

    /// <inheritdoc />
    protected override double? BaseMean => SigmaLn < 1
        ? Math.Exp(MuLnMm) * Math.PI * SigmaLn / Math.Sin(Math.PI * SigmaLn)
        : double.PositiveInfinity;

    /// <inheritdoc />
    protected override double? BaseStandardDeviation
    {
        get
        {
            if (SigmaLn >= 0.5)
            {
                return double.PositiveInfinity;
            }

            var m1 = BaseMean!.Value;
            var m2 = Math.Exp(2 * MuLnMm) * 2 * Math.PI * SigmaLn / Math.Sin(2 * Math.PI * SigmaLn);
            return Math.Sqrt(m2 - m1 * m1);
        }
    }
}
