using InspectionUpdate.Probability;
using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>
/// Φ₃(h; R) by Plackett's (1954) reduction, the route of Genz (2004, Statistics and Computing 14): keep the pair with
/// the largest |ρ| and move the other two correlations along t·ρ, t ∈ [0, 1]:
/// Φ₃ = Φ₂(h₁, h₂; ρ₁₂)Φ(h₃) + ∫₀¹ [ρ₁₃ φ₂(h₁, h₃; tρ₁₃) Φ(z₂(t)) + ρ₂₃ φ₂(h₂, h₃; tρ₂₃) Φ(z₁(t))] dt,
/// with z the standardized conditional bound of the third variable (∂Φₙ/∂ρᵢⱼ = ∂²Φₙ/∂hᵢ∂hⱼ). R(t) is a convex
/// combination of two positive definite matrices, so the path never leaves the valid set.
/// </summary>
internal static class TrivariateNormal
{
    /// <summary>Largest number of subintervals of the adaptive quadrature (at most 15·399 integrand evaluations).</summary>
    private const int MaxIntervals = 200;

    /// <summary>
    /// Φ₃ for finite bounds and a positive definite matrix (caller checks); error is the quadrature estimate and
    /// <c>Converged</c> false when the interval budget ran out first (the caller then uses another method).
    /// </summary>
    public static (double Value, double Error, bool Converged) Cdf(double[] h, double[,] r)
    {
        // Put the largest |ρ| on the pair (0, 1).
        int[] order;
        double a12 = Math.Abs(r[0, 1]), a13 = Math.Abs(r[0, 2]), a23 = Math.Abs(r[1, 2]);
        if (a12 >= a13 && a12 >= a23) order = [0, 1, 2];
        else if (a13 >= a23) order = [0, 2, 1];
        else order = [1, 2, 0];

        var h1 = h[order[0]];
        var h2 = h[order[1]];
        var h3 = h[order[2]];
        var r12 = r[order[0], order[1]];
        var r13 = r[order[0], order[2]];
        var r23 = r[order[1], order[2]];

        var start = BivariateNormal.Cdf(h1, h2, r12) * StandardNormal.Cdf(h3);
        if (r13 == 0 && r23 == 0) return (start, 1e-15, true);

        double Derivative(double t)
        {
            var a = r12;
            var b = t * r23;
            var c = t * r13;
            var value = 0.0;
            if (r13 != 0)
            {
                // X2 given X1 = h1, X3 = h3.
                var den = 1 - c * c;
                var mu = ((a - b * c) * h1 + (b - a * c) * h3) / den;
                var v = 1 - (a * a + b * b - 2 * a * b * c) / den;
                value += r13 * BivariateNormal.Pdf(h1, h3, c) * ConditionalCdf(h2 - mu, v);
            }

            if (r23 != 0)
            {
                // X1 given X2 = h2, X3 = h3.
                var den = 1 - b * b;
                var mu = ((a - c * b) * h2 + (c - a * b) * h3) / den;
                var v = 1 - (a * a + c * c - 2 * a * b * c) / den;
                value += r23 * BivariateNormal.Pdf(h2, h3, b) * ConditionalCdf(h1 - mu, v);
            }

            return value;
        }

        // 1e-15 absolute keeps probabilities down to 1e-9 accurate to about 1e-6 relative; the bounded interval
        // budget keeps a nearly singular matrix from costing minutes (see AdaptiveGaussKronrod).
        var (integral, error, converged) = AdaptiveGaussKronrod.Integrate(Derivative, 0, 1, 1e-15, 1e-12, MaxIntervals);
        return (Math.Clamp(start + integral, 0, 1), Math.Max(error, 1e-15), converged);
    }

    private static double ConditionalCdf(double diff, double variance) =>
        variance > 0 ? StandardNormal.Cdf(diff / Math.Sqrt(variance)) : diff >= 0 ? 1 : 0;
}
