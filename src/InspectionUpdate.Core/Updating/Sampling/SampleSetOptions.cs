using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating.Sampling;

/// <summary>Settings of the sample-set route (<see cref="SampleSetUpdater"/>). Immutable; validated by the updater.</summary>
public sealed record SampleSetOptions
{
    /// <summary>Samples of the first draw. Default 8,000.</summary>
    public int Samples { get; init; } = 8_000;

    /// <summary>
    /// Largest number of samples: the set doubles until the cumulative Pf at the end of each renewal period reaches
    /// the target CoV, or this cap. Default 128,000.
    /// </summary>
    public int MaxSamples { get; init; } = 128_000;

    /// <summary>Target coefficient of variation of a cumulative Pf; above it the number is not converged. Default 0.05.</summary>
    public double TargetCoefficientOfVariation { get; init; } = 0.05;

    /// <summary>
    /// Smallest effective number of failure samples, (Σ wᵢ)²/Σ wᵢ² over the samples failed by t, behind a converged
    /// Pf(t): below it the sampled standard error itself is not trustworthy (the density may have missed part of the
    /// failure region). Default 30.
    /// </summary>
    public int MinimumFailureSamples { get; init; } = 30;

    /// <summary>Random-number seed (results are reproducible from it).</summary>
    public int Seed { get; init; } = 1;

    /// <summary>Weight of the prior N(0, I) in the sampling mixture (defensive component, Hesterberg 1995). Default 0.1.</summary>
    public double DefensiveWeight { get; init; } = 0.1;

    /// <summary>
    /// A Pf(t) that the sample set cannot resolve (too few failure samples) is reported from first order, marked
    /// converged, only when first order converged below this level. Default 1e-9: two orders below the smallest
    /// annual target of the JCSS Probabilistic Model Code table (β = 4.7, about 1.3e-6).
    /// </summary>
    public double NegligibleProbability { get; init; } = 1e-9;

    /// <summary>
    /// A sampled Pf(t) whose failure region is covered (at least <see cref="MinimumFailureSamples"/> effective failure
    /// samples) and whose value plus three standard errors lies below this level is converged even above the target
    /// CoV (its CoV is still reported). Pf(t) bounds every annual Pf up to t, so no planning decision against an annual
    /// target of ten times the floor or more depends on more digits there. Default 1e-5, a tenth of the common annual
    /// target 1e-4; plans against a lower target lower it to a tenth of that target (the application layer does so),
    /// down to 1.3e-7 for the smallest annual target of the JCSS Probabilistic Model Code table (β = 4.7).
    /// </summary>
    public double DecisionFloor { get; init; } = 1e-5;

    /// <summary>
    /// Reliability-index levels per renewal period (0, 1, …, then half levels) whose design points become mixture
    /// components. Default 7 (β = 0 to 6).
    /// </summary>
    public int AnchorsPerPeriod { get; init; } = 7;

    /// <summary>
    /// Horizon in years for the failure-time search of models without a closed form (times beyond it are censored:
    /// a sample that has not failed by then counts as surviving). Default 100.
    /// </summary>
    public double HorizonYears { get; init; } = 100;

    /// <summary>Grid steps per year of the first-passage search where g(x, t) may rise and fall in t. Default 4.</summary>
    public int SearchStepsPerYear { get; init; } = 4;

    /// <summary>
    /// Relative margin added to three combined standard errors before a first-order value is said to disagree with
    /// the sampled one. Default 0.1.
    /// </summary>
    public double CrossCheckMargin { get; init; } = 0.1;

    /// <summary>Settings of the FORM searches for the mixture's design points and the first-order cross-check.</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>True to use first order below the sampling resolution and for the cross-check (the automatic route); false for sampling only.</summary>
    public bool FirstOrderBelowResolution { get; init; } = true;

    /// <summary>The defaults.</summary>
    public static SampleSetOptions Default { get; } = new();

    internal void Validate()
    {
        ArgumentNullException.ThrowIfNull(Form, nameof(Form));
        if (Samples < 500) throw new ArgumentOutOfRangeException(nameof(Samples), Samples, "Samples must be ≥ 500.");
        if (MaxSamples < Samples) throw new ArgumentOutOfRangeException(nameof(MaxSamples), MaxSamples, "MaxSamples must be ≥ Samples.");
        if (!(TargetCoefficientOfVariation > 0 && TargetCoefficientOfVariation < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(TargetCoefficientOfVariation), TargetCoefficientOfVariation, "The target CoV must lie in (0, 1).");
        }

        if (MinimumFailureSamples < 1) throw new ArgumentOutOfRangeException(nameof(MinimumFailureSamples), MinimumFailureSamples, "Must be ≥ 1.");
        if (!(DefensiveWeight > 0 && DefensiveWeight < 1)) throw new ArgumentOutOfRangeException(nameof(DefensiveWeight), DefensiveWeight, "Must lie in (0, 1).");
        if (!(NegligibleProbability >= 0 && NegligibleProbability < 1e-3))
        {
            throw new ArgumentOutOfRangeException(nameof(NegligibleProbability), NegligibleProbability, "Must lie in [0, 1e-3).");
        }

        if (!(DecisionFloor >= NegligibleProbability && DecisionFloor < 1e-3))
        {
            throw new ArgumentOutOfRangeException(nameof(DecisionFloor), DecisionFloor, "Must lie in [NegligibleProbability, 1e-3).");
        }

        if (AnchorsPerPeriod < 1 || AnchorsPerPeriod > 13) throw new ArgumentOutOfRangeException(nameof(AnchorsPerPeriod), AnchorsPerPeriod, "Must lie in 1–13.");
        if (!(HorizonYears > 0 && HorizonYears <= 1000)) throw new ArgumentOutOfRangeException(nameof(HorizonYears), HorizonYears, "Must lie in (0, 1000] years.");
        if (SearchStepsPerYear < 1 || SearchStepsPerYear > 100) throw new ArgumentOutOfRangeException(nameof(SearchStepsPerYear), SearchStepsPerYear, "Must lie in 1–100.");
        if (!(CrossCheckMargin >= 0 && double.IsFinite(CrossCheckMargin))) throw new ArgumentOutOfRangeException(nameof(CrossCheckMargin), CrossCheckMargin, "Must be finite and ≥ 0.");
    }
}
