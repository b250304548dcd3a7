namespace InspectionUpdate.Inspection;

/// <summary>Exponential-type PoD: F(a) = 1 − exp(−a/λ), λ &gt; 0 in mm (the detectable size is exponential with mean λ).</summary>
public sealed class ExponentialPod : ParametricPod
{
    /// <summary>Creates the curve with the scale λ (mm): PoD(λ) = 1 − e⁻¹ ≈ 0.632 before saturation.</summary>
    /// <exception cref="ArgumentOutOfRangeException">λ not finite and &gt; 0, or a common option out of range.</exception>
    public ExponentialPod(double lambdaMm, double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0)
        : base(lowerLimitMm, maxPod, falseCallProbability)
    {
        if (!double.IsFinite(lambdaMm) || lambdaMm <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(lambdaMm), lambdaMm, "λ (scale of the exponential PoD) must be finite and > 0 mm.");
        }

        LambdaMm = lambdaMm;
    }

    /// <inheritdoc />
    public override string Form => PodForms.Exponential;

    /// <summary>Scale λ in mm.</summary>
    public double LambdaMm { get; }

    /// <inheritdoc />
    protected override double BaseCdf(double sizeMm) => -PodMath.Expm1(-sizeMm / LambdaMm);

    /// <inheritdoc />
    protected override double BaseCcdf(double sizeMm) => Math.Exp(-sizeMm / LambdaMm);

    /// <inheritdoc />
    protected override double BasePdf(double sizeMm) => Math.Exp(-sizeMm / LambdaMm) / LambdaMm;

    /// <inheritdoc />
    protected override double BaseInverseCdf(double p) => -LambdaMm * PodMath.Log1p(-p);

    /// <inheritdoc />
    protected override double BaseInverseCcdf(double q) => -LambdaMm * Math.Log(q);

    /// <inheritdoc />
    protected override double? BaseMean => LambdaMm;

    /// <inheritdoc />
    protected override double? BaseStandardDeviation => LambdaMm;
}
