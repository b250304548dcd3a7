using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>Whether an inspection event is an inequality h ≤ 0 or an equality h = 0.</summary>
public enum EvidenceEventKind
{
    /// <summary>h(x) ≤ 0: no indication, indication not sized, survival.</summary>
    Inequality,

    /// <summary>h(x) = 0: a sized indication.</summary>
    Equality,
}

/// <summary>
/// One finding turned into an event function over the augmented inputs (DESIGN §3): the model inputs of every
/// component and renewal, plus the finding's own detectable size or sizing error.
/// </summary>
public sealed class EvidenceEvent
{
    internal EvidenceEvent(string name, InspectionOutcome outcome, string componentId, int epoch, EvidenceEventKind kind,
        LimitStateFunction function, LimitStateFunction logLikelihood, RandomVariable? auxiliary)
    {
        Name = name;
        Outcome = outcome;
        ComponentId = componentId;
        Epoch = epoch;
        Kind = kind;
        Function = function;
        LogLikelihood = logLikelihood;
        AuxiliaryVariable = auxiliary;
    }

    /// <summary>Name shown in results, e.g. "no indication at 10 y (F-12 rev 1)".</summary>
    public string Name { get; }

    /// <summary>The finding this event comes from.</summary>
    public InspectionOutcome Outcome { get; }

    /// <summary>Component the finding belongs to.</summary>
    public string ComponentId { get; }

    /// <summary>Renewal period of the component the finding informs: 0 before the first repair, k after the k-th.</summary>
    public int Epoch { get; }

    /// <summary>Inequality or equality.</summary>
    public EvidenceEventKind Kind { get; }

    /// <summary>
    /// h(x) over the augmented physical vector (<see cref="EvidenceModel.Model"/>): a(X, t) − A_d for no indication,
    /// A_d − a(X, t) for an indication not sized, a + ε − a_m (additive error) or ln(a·ε) − ln a_m (multiplicative)
    /// for a sized indication, −g(X, t) for survival.
    /// </summary>
    public LimitStateFunction Function { get; }

    /// <summary>
    /// The log-likelihood of the finding given the model inputs only (the auxiliary variable integrated out):
    /// ln(1 − F_Ad(a)), ln F_Ad(a), the log density of the measured size, or 0 / −∞ for survival. It reads the input
    /// part of the augmented vector (<see cref="EvidenceModel.InputModel"/>); up to a constant for equalities.
    /// </summary>
    public LimitStateFunction LogLikelihood { get; }

    /// <summary>The detectable size A_d or sizing error ε of this finding, or null for survival.</summary>
    public RandomVariable? AuxiliaryVariable { get; }

    /// <inheritdoc />
    public override string ToString() => Name;
}
