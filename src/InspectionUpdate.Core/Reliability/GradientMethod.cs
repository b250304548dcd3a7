namespace InspectionUpdate.Reliability;

/// <summary>How FORM obtains ∂g/∂x.</summary>
public enum GradientMethod
{
    /// <summary>Analytic when the limit state supplies one, else forward differences.</summary>
    Automatic,

    /// <summary>Forward finite differences with relative steps (n extra evaluations per gradient).</summary>
    ForwardDifference,

    /// <summary>Central finite differences with relative steps (2n extra evaluations per gradient, more accurate).</summary>
    CentralDifference,

    /// <summary>The limit state's analytic gradient; a solve throws if the limit state has none.</summary>
    Analytic,
}
