namespace InspectionUpdate.Probability;

/// <summary>
/// Fictive (normal-space) correlations of the Nataf model.
/// </summary>
internal static class FictiveCorrelations
{
    /// <summary>Computes R₀ over the random variables of the model from the physical correlation matrix.</summary>
    public static CorrelationMatrix Compute(StochasticModel model, CorrelationMatrix physical)
    {
        var idx = model.RandomIndices;
        var n = idx.Count;
        var r0 = new double[n, n];
        for (var a = 0; a < n; a++)
        {
            r0[a, a] = 1;
            for (var b = 0; b < a; b++)
            {
                var rho = physical[idx[a], idx[b]];
                var value = rho == 0 ? 0 : Pair(model.Variables[idx[a]], model.Variables[idx[b]], rho);
                r0[a, b] = value;
                r0[b, a] = value;
            }
        }

        return new CorrelationMatrix(r0, "fictive correlation");
    }

    /// <summary>The fictive correlation of one pair. Placeholder until the full Nataf solution lands: normal pairs only.</summary>
    private static double Pair(RandomVariable xi, RandomVariable xj, double rho)
    {
        if (xi is NormalVariable && xj is NormalVariable) return rho;
        throw new NotSupportedException($"Fictive correlation for {xi.Family}–{xj.Family} is not implemented yet.");
    }
}
