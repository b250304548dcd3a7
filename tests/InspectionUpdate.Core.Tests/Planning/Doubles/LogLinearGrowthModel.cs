using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Tests.Planning.Doubles;

/// <summary>
/// Test model: ln a(t) = X₁ + X₂·τ with τ the time since entry into service or the last repair, X₁ ~ N(m₁, s₁)
/// (log initial depth, renewed on repair), X₂ ~ N(m₂, s₂) (log growth rate, shared); failure when a ≥ a_c.
/// Every event is linear in Gaussian variables, so probabilities have closed forms or exact low-dimensional
/// integrals (see <see cref="LogLinearGaussianUpdater"/>).
/// </summary>
internal sealed class LogLinearGrowthModel : IDegradationModel
{
    public LogLinearGrowthModel(double meanLogInitialDepth, double sdLogInitialDepth, double meanRate, double sdRate, double criticalDepthMm)
    {
        MeanLogInitialDepth = meanLogInitialDepth;
        SdLogInitialDepth = sdLogInitialDepth;
        MeanRate = meanRate;
        SdRate = sdRate;
        CriticalDepthMm = criticalDepthMm;
        Inputs = new StochasticModel([
            new NormalVariable("lnInitialDepth", meanLogInitialDepth, sdLogInitialDepth),
            new NormalVariable("lnRate_perYear", meanRate, sdRate),
        ]);
    }

    /// <summary>The worked updating case of docs/references.md: X₁ ~ N(ln 0.5, 0.5), X₂ ~ N(0.10, 0.02), a_c = 20 mm.</summary>
    public static LogLinearGrowthModel WorkedCase() => new(Math.Log(0.5), 0.5, 0.10, 0.02, 20);

    public double MeanLogInitialDepth { get; }

    public double SdLogInitialDepth { get; }

    public double MeanRate { get; }

    public double SdRate { get; }

    public double CriticalDepthMm { get; }

    public string Name => "log-linear crack growth (test double)";

    public StochasticModel Inputs { get; }

    public string SizeQuantity => "depth_mm";

    public IReadOnlyList<string> RenewedOnRepair { get; } = ["lnInitialDepth"];

    public string? AnnualMaximumInput => null;

    public double MaximumSizeMm => double.PositiveInfinity;

    public double Size(ReadOnlySpan<double> x, double timeYears) => Math.Exp(x[0] + x[1] * timeYears);

    public double Margin(ReadOnlySpan<double> x, double timeYears) => CriticalDepthMm - Size(x, timeYears);

    /// <summary>Closed-form prior Pf(τ) = Φ((m₁ + m₂τ − ln a_c)/√(s₁² + s₂²τ²)), τ years since renewal.</summary>
    public double PriorPf(double tauYears) => StandardNormal.Cdf(
        (MeanLogInitialDepth + MeanRate * tauYears - Math.Log(CriticalDepthMm)) /
        Math.Sqrt(SdLogInitialDepth * SdLogInitialDepth + SdRate * SdRate * tauYears * tauYears));
}
