using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Planning.Doubles;

/// <summary>Test PoD: PoD(a) = Φ((ln a − μ)/σ), so the detectable size is lognormal(μ, σ) (MIL-HDBK-1823A probit form).</summary>
internal sealed class ProbitLogPod(double mu, double sigma) : ProbabilityOfDetection
{
    public double Mu { get; } = mu;

    public double Sigma { get; } = sigma;

    public override string Form => "probit in ln a (test double)";

    public override double Evaluate(double sizeMm) => sizeMm <= 0 ? 0 : StandardNormal.Cdf((Math.Log(sizeMm) - Mu) / Sigma);

    public override RandomVariable DetectableSize(string name) => LognormalVariable.FromLogParameters(name, Mu, Sigma);

    public static InspectionMethod Method(string name, double medianDetectableMm, double sigma) =>
        new(name, new ProbitLogPod(Math.Log(medianDetectableMm), sigma), new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.5));
}
