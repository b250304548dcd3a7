using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Verification;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Updating.Verification;

/// <summary>
/// The sample-set route (the automatic route's numbers, <see cref="SampleSetUpdater"/>) on a time-invariant benchmark
/// problem: the problem's limit state becomes the margin of a degradation model that does not change with time and has
/// no findings, and the route's cumulative Pf at one year is compared with the reference like the other sampling routes.
/// </summary>
/// <remarks>
/// What is tested is the route's weighted sample set and its convergence rule (covered failure region, at least
/// <see cref="SampleSetOptions.MinimumFailureSamples"/> effective failure samples); its design for time-variant
/// profiles (failure times searched on a grid, anchors per period) is idle here. Its first-order fallback below the
/// sampling resolution is switched off, so a number it cannot resolve is reported not converged, not replaced.
/// </remarks>
public sealed class SampleSetBenchmarkRoute(SampleSetOptions? options = null) : IBenchmarkRoute
{
    private readonly SampleSetOptions _options = (options ?? SampleSetOptions.Default) with { FirstOrderBelowResolution = false, HorizonYears = 1 };

    /// <inheritdoc />
    public string Name => "sample set (automatic route)";

    /// <inheritdoc />
    public bool IsSimulation => true;

    /// <summary>The most inputs a problem may have for this route to run on it (component models have a handful).</summary>
    public const int MaximumInputs = 20;

    /// <inheritdoc />
    /// <remarks>
    /// Not run (null) on problems with more than <see cref="MaximumInputs"/> random inputs: the route is built for
    /// component models with a few inputs, and on the 100-input problem RP63 it spent minutes to end not converged
    /// (2 effective failure samples of 128,000; measured 2026-12-03).
    /// </remarks>
    public BenchmarkRouteResult? Run(BenchmarkContext context, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(context);
        cancellationToken.ThrowIfCancellationRequested();
        if (context.Problem.Dimension > MaximumInputs) return null;
        var model = new TimeInvariantModel(context.Problem.Id, context.Problem.Problem);
        var estimate = new SampleSetUpdater(_options).Estimate(model, [], 1.0);
        var cov = estimate.CoefficientOfVariation is { } c && double.IsFinite(c) ? c : (double?)null;
        return new BenchmarkRouteResult
        {
            Route = Name,
            IsSimulation = true,
            FailureProbability = estimate.CumulativePf,
            CoefficientOfVariation = cov,
            LimitStateEvaluations = model.Evaluations,
            Converged = estimate.Converged && cov is not null,
            Note = estimate.Note,
        };
    }

    // g(x) as the margin of a degradation model that does not depend on time; every call is counted.
    private sealed class TimeInvariantModel(string name, ReliabilityProblem problem) : IDegradationModel
    {
        private long _evaluations;

        public long Evaluations => Interlocked.Read(ref _evaluations);

        public string Name { get; } = name;

        public StochasticModel Inputs => problem.Model;

        public string SizeQuantity => "none";

        public double Size(ReadOnlySpan<double> x, double timeYears) => 0;

        public double Margin(ReadOnlySpan<double> x, double timeYears)
        {
            Interlocked.Increment(ref _evaluations);
            return problem.LimitState.Evaluate(x);
        }

        public IReadOnlyList<string> RenewedOnRepair => [];

        public string? AnnualMaximumInput => null;

        public double MaximumSizeMm => double.PositiveInfinity;
    }
}
