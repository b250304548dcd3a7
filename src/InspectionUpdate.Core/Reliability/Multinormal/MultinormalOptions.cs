namespace InspectionUpdate.Reliability.Multinormal;

/// <summary>Settings of the multivariate normal integration (quasi-Monte Carlo part; closed forms ignore them).</summary>
public sealed record MultinormalOptions
{
    /// <summary>
    /// Absolute error target: the integration stops when the error estimate (three standard errors over the random
    /// shifts) is at most max(<see cref="AbsoluteTolerance"/>, <see cref="RelativeTolerance"/> × value). Default 1e-8.
    /// </summary>
    public double AbsoluteTolerance { get; init; } = 1e-8;

    /// <summary>Relative error target (see <see cref="AbsoluteTolerance"/>). Default 1e-3.</summary>
    public double RelativeTolerance { get; init; } = 1e-3;

    /// <summary>Cap on integrand evaluations; reaching it without meeting the tolerances gives a non-converged result. Default 4,000,000.</summary>
    public long MaxEvaluations { get; init; } = 4_000_000;

    /// <summary>Number of independent random shifts of the lattice (at least 4); the error estimate comes from their spread. Default 10.</summary>
    public int RandomShifts { get; init; } = 10;

    /// <summary>Seed of the random shifts, so results are reproducible.</summary>
    public int Seed { get; init; } = 1_234_567;

    /// <summary>
    /// Conditional variance below which a variable counts as a linear combination of the ones before it (rank-revealing
    /// Cholesky). Default 1e-12, i.e. conditional standard deviation 1e-6.
    /// </summary>
    public double SingularityTolerance { get; init; } = 1e-12;

    /// <summary>The default settings.</summary>
    public static MultinormalOptions Default { get; } = new();

    internal void Validate()
    {
        if (!(AbsoluteTolerance >= 0) || !double.IsFinite(AbsoluteTolerance))
            throw new ArgumentOutOfRangeException(nameof(AbsoluteTolerance), AbsoluteTolerance, "Must be finite and ≥ 0.");
        if (!(RelativeTolerance >= 0) || !double.IsFinite(RelativeTolerance))
            throw new ArgumentOutOfRangeException(nameof(RelativeTolerance), RelativeTolerance, "Must be finite and ≥ 0.");
        if (AbsoluteTolerance == 0 && RelativeTolerance == 0)
            throw new ArgumentOutOfRangeException(nameof(AbsoluteTolerance), AbsoluteTolerance, "At least one of the absolute and relative tolerances must be positive.");
        if (MaxEvaluations < 1000)
            throw new ArgumentOutOfRangeException(nameof(MaxEvaluations), MaxEvaluations, "Must be at least 1000.");
        if (RandomShifts < 4)
            throw new ArgumentOutOfRangeException(nameof(RandomShifts), RandomShifts, "Must be at least 4.");
        if (!(SingularityTolerance > 0 && SingularityTolerance < 1e-4))
            throw new ArgumentOutOfRangeException(nameof(SingularityTolerance), SingularityTolerance, "Must lie in (0, 1e-4).");
    }
}

/// <summary>A multivariate normal probability with its error estimate and how it was obtained.</summary>
/// <param name="Value">The probability, in [0, 1].</param>
/// <param name="ErrorEstimate">
/// Estimated absolute error: three standard errors over the random shifts for quasi-Monte Carlo (about 99.7 %
/// confidence, as Genz reports it), the quadrature error for the trivariate integral, the documented accuracy for closed
/// forms. Use <see cref="StandardError"/> for statistics.
/// </param>
/// <param name="Method">The algorithm used, e.g. "bivariate (Genz 2004)".</param>
/// <param name="Evaluations">Integrand evaluations (0 for closed forms).</param>
public sealed record MultinormalResult(double Value, double ErrorEstimate, string Method, long Evaluations)
{
    /// <summary>False when the tolerances were not met within the evaluation cap; <see cref="Value"/> is then a best estimate.</summary>
    public bool Converged { get; init; } = true;

    /// <summary>Why the result did not converge, or a note (e.g. a rank deficiency found), or null.</summary>
    public string? Diagnostic { get; init; }

    /// <summary>Rank of the correlation matrix of the constrained variables as found by the pivoted Cholesky factorization.</summary>
    public int Rank { get; init; }

    /// <summary>One standard error: <see cref="ErrorEstimate"/> / 3 for quasi-Monte Carlo, <see cref="ErrorEstimate"/> otherwise.</summary>
    public double StandardError { get; init; }
}
