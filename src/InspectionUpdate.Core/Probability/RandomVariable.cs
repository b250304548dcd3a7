namespace InspectionUpdate.Probability;

/// <summary>
/// A named scalar random variable: the marginal of one input of a reliability problem.
/// </summary>
/// <remarks>
/// Implementations are immutable and thread-safe. <see cref="Ccdf"/> and <see cref="InverseCcdf"/> exist so the
/// transformation to standard normal space stays accurate in the upper tail, where 1 − F(x) cancels.
/// </remarks>
public abstract class RandomVariable
{
    /// <summary>Creates a variable with a name used in messages, results and reports.</summary>
    protected RandomVariable(string name)
    {
        if (string.IsNullOrWhiteSpace(name))
        {
            throw new ArgumentException("A random variable needs a non-empty name.", nameof(name));
        }

        Name = name;
    }

    /// <summary>Name of the variable, e.g. "corrosionRate_mmPerYear".</summary>
    public string Name { get; }

    /// <summary>Short name of the distribution family, e.g. "Lognormal".</summary>
    public abstract string Family { get; }

    /// <summary>Mean value.</summary>
    public abstract double Mean { get; }

    /// <summary>Standard deviation (0 for a deterministic value).</summary>
    public abstract double StandardDeviation { get; }

    /// <summary>True for a point mass: it has no coordinate in standard normal space.</summary>
    public virtual bool IsDeterministic => false;

    /// <summary>Probability density at x (0 outside the support).</summary>
    public abstract double Pdf(double x);

    /// <summary>F(x) = P(X ≤ x).</summary>
    public abstract double Cdf(double x);

    /// <summary>1 − F(x), accurate where F(x) is close to 1. Override when a direct form exists.</summary>
    public virtual double Ccdf(double x) => 1.0 - Cdf(x);

    /// <summary>F⁻¹(p) for p in (0, 1).</summary>
    public abstract double InverseCdf(double p);

    /// <summary>The x with 1 − F(x) = q, accurate for tiny q. Override when a direct form exists.</summary>
    public virtual double InverseCcdf(double q) => InverseCdf(1.0 - q);

    /// <summary>Maps a standard normal coordinate to this variable: x = F⁻¹(Φ(u)), using the upper tail for u &gt; 0.</summary>
    /// <remarks>Families with a direct map (normal, lognormal) override it: the round trip through Φ and Φ⁻¹ costs most of a sample's time on the sampling route.</remarks>
    public virtual double FromStandardNormal(double u) =>
        u <= 0 ? InverseCdf(StandardNormal.Cdf(u)) : InverseCcdf(StandardNormal.Ccdf(u));

    /// <summary>Maps a value of this variable to standard normal space: u = Φ⁻¹(F(x)), using the upper tail where F &gt; 0.5.</summary>
    public double ToStandardNormal(double x)
    {
        var f = Cdf(x);
        return f <= 0.5 ? StandardNormal.InverseCdf(f) : StandardNormal.InverseCcdf(Ccdf(x));
    }

    /// <summary>Coefficient of variation σ/|μ| (NaN when the mean is 0).</summary>
    public double CoefficientOfVariation => Mean == 0 ? double.NaN : StandardDeviation / Math.Abs(Mean);

    /// <inheritdoc />
    public override string ToString() =>
        FormattableString.Invariant($"{Name} ~ {Family}(mean {Mean:G6}, sd {StandardDeviation:G6})");
}
