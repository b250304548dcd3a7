using InspectionUpdate.Probability;

namespace InspectionUpdate.Inspection;

/// <summary>
/// A probability-of-detection curve PoD(a), a non-decreasing function of the defect size a in mm with values in [0, 1].
/// </summary>
/// <remarks>
/// The detectable size A_d of a method is the random variable whose CDF is PoD (JCSS Probabilistic Model Code,
/// Part 1, Annex B): "no indication" is the event a(X, t) − A_d ≤ 0.
/// </remarks>
public abstract class ProbabilityOfDetection
{
    /// <summary>Name of the curve form, e.g. "log-logistic".</summary>
    public abstract string Form { get; }

    /// <summary>PoD(a) for a size in mm; 0 for a ≤ 0.</summary>
    public abstract double Evaluate(double sizeMm);

    /// <summary>The detectable size A_d as a random variable with CDF PoD (normalized if the curve saturates below 1).</summary>
    public abstract RandomVariable DetectableSize(string name);
}
