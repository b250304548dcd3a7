using InspectionUpdate.Reliability.Simulation;

namespace InspectionUpdate.Tests.Reliability.Simulation;

/// <summary>Statistical assertions for simulated failure probabilities.</summary>
internal static class SimulationAssert
{
    /// <summary>The run converged and its estimate lies within <paramref name="k"/> estimated standard errors of <paramref name="exact"/>.</summary>
    public static void WithinStandardErrors(double exact, SimulationResult result, double k = 3)
    {
        Assert.True(result.Converged, result.Diagnostic);
        Assert.True(Math.Abs(result.FailureProbability - exact) <= k * result.StandardError,
            $"{result.Method}: {result.FailureProbability:R} vs exact {exact:R}, {k} SE = {k * result.StandardError:R}");
    }
}
