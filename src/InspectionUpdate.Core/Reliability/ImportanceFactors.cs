using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability;

/// <summary>Importance factors from a FORM design point.</summary>
internal static class ImportanceFactors
{
    /// <summary>
    /// αᵢ² for independent inputs. For correlated inputs the importance vector γ of Der Kiureghian (2005,
    /// Engineering Design Reliability Handbook, ch. 14): γ ∝ αᵀ J_{u,x} D with D the diagonal of standard deviations
    /// of the equivalent normals [from memory]. Until the correlated case lands it falls back to α².
    /// </summary>
    public static double[] Compute(IProbabilityTransformation transformation, double[] u, double[] alpha)
    {
        var f = new double[alpha.Length];
        for (var i = 0; i < alpha.Length; i++) f[i] = alpha[i] * alpha[i];
        return f;
    }
}
