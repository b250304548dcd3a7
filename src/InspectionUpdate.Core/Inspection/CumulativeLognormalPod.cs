using InspectionUpdate.Probability;

namespace InspectionUpdate.Inspection;

/// <summary>
/// Cumulative lognormal PoD: probit linear in ln a, F(a) = Φ((ln a − μ)/σ) (MIL-HDBK-1823A, hit/miss model with the
/// probit link, and the PoD implied by an â-versus-a regression).
/// </summary>
public sealed class CumulativeLognormalPod : ParametricPod
{
    /// <summary>Creates the curve from μ (mean of ln a, a in mm) and σ &gt; 0 (standard deviation of ln a).</summary>
    /// <exception cref="ArgumentOutOfRangeException">μ not finite, σ not finite and &gt; 0, or a common option out of range.</exception>
    public CumulativeLognormalPod(double muLnMm, double sigmaLn, double lowerLimitMm = 0, double maxPod = 1, double falseCallProbability = 0)
        : base(lowerLimitMm, maxPod, falseCallProbability)
    {
        RequireLogLocationScale(muLnMm, sigmaLn);

        MuLnMm = muLnMm;
        SigmaLn = sigmaLn;
    }

    /// <inheritdoc />
    public override string Form => PodForms.CumulativeLognormal;

    /// <summary>μ: mean of ln A_d (A_d in mm); e^μ is the size with base PoD 1/2.</summary>
    public double MuLnMm { get; }

    /// <summary>σ: standard deviation of ln A_d.</summary>
    public double SigmaLn { get; }

    private double Z(double sizeMm) => (Math.Log(sizeMm) - MuLnMm) / SigmaLn;

    /// <inheritdoc />
    protected override double BaseCdf(double sizeMm) => StandardNormal.Cdf(Z(sizeMm));

    /// <inheritdoc />
    protected override double BaseCcdf(double sizeMm) => StandardNormal.Ccdf(Z(sizeMm));

    /// <inheritdoc />
    protected override double BasePdf(double sizeMm) => StandardNormal.Pdf(Z(sizeMm)) / (SigmaLn * sizeMm);

    /// <inheritdoc />
    protected override double BaseInverseCdf(double p) => Math.Exp(MuLnMm + SigmaLn * StandardNormal.InverseCdf(p));

    /// <inheritdoc />
    protected override double BaseInverseCcdf(double q) => Math.Exp(MuLnMm + SigmaLn * StandardNormal.InverseCcdf(q));

    /// <inheritdoc />
    protected override double? BaseMean => Math.Exp(MuLnMm + 0.5 * SigmaLn * SigmaLn);

    /// <inheritdoc />
    protected override double? BaseStandardDeviation =>
        BaseMean!.Value * Math.Sqrt(PodMath.Expm1(SigmaLn * SigmaLn));
}
