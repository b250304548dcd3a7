namespace InspectionUpdate.Reliability;

/// <summary>How FORM obtains ∂g/∂x.</summary>
public enum GradientMethod
{
    /// <summary>Analytic when the limit state supplies one, else forward differences.</summary>
    Automatic,

    /// <summary>Forward finite differences with relative steps (n extra evaluations).</summary>
    ForwardDifference,

    /// <summary>Central finite differences with relative steps (2n extra evaluations, more accurate).</summary>
    CentralDifference,
}
