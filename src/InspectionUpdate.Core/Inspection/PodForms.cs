namespace InspectionUpdate.Inspection;

/// <summary>Names of the probability-of-detection curve forms, as stored in the register and shown in reports.</summary>
public static class PodForms
{
    /// <summary>Log-logistic: log-odds linear in ln a (<see cref="LogLogisticPod"/>).</summary>
    public const string LogLogistic = "log-logistic";

    /// <summary>Cumulative lognormal: probit linear in ln a (<see cref="CumulativeLognormalPod"/>).</summary>
    public const string CumulativeLognormal = "cumulative-lognormal";

    /// <summary>Exponential type 1 − exp(−a/λ) (<see cref="ExponentialPod"/>).</summary>
    public const string Exponential = "exponential";
}
