namespace InspectionUpdate.TimeVariant;

/// <summary>
/// A stationary Gaussian load process S(t) (a load that varies within a year: pressure surges, wind, waves) with a
/// squared-exponential autocorrelation ρ(τ) = exp(−(τ/ℓ)²), ℓ the correlation length in years.
/// </summary>
/// <remarks>
/// The squared-exponential correlation gives a mean-square differentiable process, so the rate at which it crosses
/// a level is finite (Rice's formula): the cycle rate is ω₀ = √(−ρ″(0)) = √2/ℓ per year. An exponential
/// correlation exp(−|τ|/ℓ) would give an infinite crossing rate and is not offered. Used by
/// <see cref="Phi2Outcrossing"/>.
/// </remarks>
public sealed record GaussianProcessLoad
{
    /// <summary>Creates the load process; throws when a parameter is not finite or not &gt; 0 (the mean may be any finite number).</summary>
    /// <param name="name">Name of the load in the limit state (e.g. "S").</param>
    /// <param name="mean">Mean value μ_S, in the load's unit.</param>
    /// <param name="standardDeviation">Standard deviation σ_S &gt; 0, same unit.</param>
    /// <param name="correlationLengthYears">Correlation length ℓ &gt; 0 in years.</param>
    public GaussianProcessLoad(string name, double mean, double standardDeviation, double correlationLengthYears)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        if (!double.IsFinite(mean)) throw new ArgumentOutOfRangeException(nameof(mean), mean, "The mean of the load process must be finite.");
        if (!(double.IsFinite(standardDeviation) && standardDeviation > 0))
            throw new ArgumentOutOfRangeException(nameof(standardDeviation), standardDeviation, "The standard deviation of the load process must be finite and > 0.");
        if (!(double.IsFinite(correlationLengthYears) && correlationLengthYears > 0))
            throw new ArgumentOutOfRangeException(nameof(correlationLengthYears), correlationLengthYears, "The correlation length must be finite and > 0 years.");
        Name = name;
        Mean = mean;
        StandardDeviation = standardDeviation;
        CorrelationLengthYears = correlationLengthYears;
    }

    /// <summary>Name of the load in the limit state.</summary>
    public string Name { get; }

    /// <summary>Mean value μ_S.</summary>
    public double Mean { get; }

    /// <summary>Standard deviation σ_S.</summary>
    public double StandardDeviation { get; }

    /// <summary>Correlation length ℓ in years.</summary>
    public double CorrelationLengthYears { get; }

    /// <summary>Autocorrelation ρ(τ) = exp(−(τ/ℓ)²) at a lag of <paramref name="lagYears"/>.</summary>
    public double Correlation(double lagYears) => Math.Exp(-(lagYears / CorrelationLengthYears) * (lagYears / CorrelationLengthYears));

    /// <summary>Cycle rate ω₀ = √(−ρ″(0)) = √2/ℓ (per year): the standard deviation of Ṡ is ω₀σ_S.</summary>
    public double CycleRatePerYear => Math.Sqrt(2) / CorrelationLengthYears;
}
