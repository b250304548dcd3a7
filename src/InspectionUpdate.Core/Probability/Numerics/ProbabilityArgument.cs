namespace InspectionUpdate.Probability.Numerics;

/// <summary>Checks of probability arguments passed to inverse distribution functions.</summary>
internal static class ProbabilityArgument
{
    /// <summary>Throws unless p is in [0, 1] (NaN rejected).</summary>
    public static void Check(double p, string parameterName)
    {
        if (!(p >= 0 && p <= 1))
        {
            throw new ArgumentOutOfRangeException(parameterName, p, "Probability must lie in [0, 1].");
        }
    }
}
