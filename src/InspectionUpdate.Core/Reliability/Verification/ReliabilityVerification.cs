using System.Globalization;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Reliability.Sorm;

namespace InspectionUpdate.Reliability.Verification;

/// <summary>One method's estimate in a verification table.</summary>
/// <param name="Method">The method, e.g. "FORM (iHL-RF)" or "SORM, Breitung (1984)".</param>
/// <param name="Route">The computation route.</param>
/// <param name="FailureProbability">The estimate; NaN when the method does not apply (see <paramref name="Note"/>).</param>
/// <param name="GeneralizedBeta">−Φ⁻¹(Pf).</param>
/// <param name="CoefficientOfVariation">Estimated CoV for simulation rows; null for approximations.</param>
/// <param name="Lower95">Lower end of an approximate 95 % interval, p̂(1 − 1.96·CoV) clipped at 0; null for approximations.</param>
/// <param name="Upper95">Upper end, p̂(1 + 1.96·CoV); null for approximations.</param>
/// <param name="LimitStateEvaluations">Evaluations this row cost on its own.</param>
/// <param name="Converged">False when the method did not converge or its formula is invalid here.</param>
/// <param name="Note">Diagnostic or note, or null.</param>
public sealed record VerificationRow(
    string Method,
    ComputationRoute Route,
    double FailureProbability,
    double GeneralizedBeta,
    double? CoefficientOfVariation,
    double? Lower95,
    double? Upper95,
    long LimitStateEvaluations,
    bool Converged,
    string? Note);

/// <summary>Settings of a verification run.</summary>
public sealed record VerificationOptions
{
    /// <summary>FORM settings (also the design point for SORM and importance sampling).</summary>
    public FormOptions Form { get; init; } = FormOptions.Default;

    /// <summary>Include importance sampling around the design point. Default true.</summary>
    public bool IncludeImportanceSampling { get; init; } = true;

    /// <summary>Importance-sampling settings.</summary>
    public SamplingOptions ImportanceSampling { get; init; } = new() { TargetCoefficientOfVariation = 0.05, MaxSamples = 200_000 };

    /// <summary>Include subset simulation. Default true.</summary>
    public bool IncludeSubsetSimulation { get; init; } = true;

    /// <summary>Subset-simulation settings.</summary>
    public SubsetSimulationOptions Subset { get; init; } = new() { SamplesPerLevel = 2000 };

    /// <summary>The default settings.</summary>
    public static VerificationOptions Default { get; } = new();
}

/// <summary>A side-by-side comparison of reliability methods on one problem.</summary>
public sealed record VerificationReport
{
    /// <summary>Name of the limit state.</summary>
    public required string LimitStateName { get; init; }

    /// <summary>Rows in the order FORM, SORM (three formulas), importance sampling, subset simulation.</summary>
    public required IReadOnlyList<VerificationRow> Rows { get; init; }

    /// <summary>
    /// The converged simulation row with the smallest CoV (the yardstick the approximations are read against), or
    /// null when no simulation converged.
    /// </summary>
    public VerificationRow? Reference { get; init; }

    /// <summary>Methods whose estimate lies outside the reference's 95 % interval.</summary>
    public required IReadOnlyList<string> OutsideReferenceInterval { get; init; }

    /// <summary>The caution every shown result carries.</summary>
    public string Caution { get; init; } =
        "These results support, never replace, engineering judgement; defer to the applicable codes and licensed practice.";
}

/// <summary>
/// Runs FORM, SORM (Breitung, Hohenbichler–Rackwitz, Tvedt), importance sampling at the design point and subset
/// simulation on one problem and returns their estimates side by side with their uncertainties.
/// </summary>
public static class ReliabilityVerification
{
    private const double Z95 = 1.959963984540054;

    /// <summary>Runs the comparison. Never throws for non-convergence: each row says whether it converged.</summary>
    public static VerificationReport Run(ReliabilityProblem problem, VerificationOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= VerificationOptions.Default;
        var rows = new List<VerificationRow>();

        var form = FormSolver.Solve(problem, options.Form);
        rows.Add(new VerificationRow(form.Method, ComputationRoute.FirstOrder, form.FailureProbability, form.Beta, null, null, null,
            form.LimitStateEvaluations, form.Converged, form.Diagnostic));

        var sorm = SormSolver.Solve(problem, form);
        var first = true;
        foreach (var e in sorm.Estimates)
        {
            // The Hessian's evaluations are charged to the first SORM row; the formulas themselves cost nothing.
            rows.Add(new VerificationRow("SORM, " + e.Method, ComputationRoute.SecondOrder, e.FailureProbability, e.GeneralizedBeta, null, null, null,
                first ? sorm.LimitStateEvaluations : 0, e.Valid && sorm.Converged, e.Note ?? (sorm.Converged ? null : sorm.Diagnostic)));
            first = false;
        }

        if (options.IncludeImportanceSampling)
        {
            cancellationToken.ThrowIfCancellationRequested();
            rows.Add(FromSimulation(ImportanceSampling.Run(problem, form, options.ImportanceSampling, cancellationToken), ComputationRoute.ImportanceSampling));
        }

        if (options.IncludeSubsetSimulation)
        {
            cancellationToken.ThrowIfCancellationRequested();
            rows.Add(FromSimulation(SubsetSimulation.Run(problem, options.Subset, cancellationToken).Simulation, ComputationRoute.SubsetSimulation));
        }

        var reference = rows
            .Where(r => r.CoefficientOfVariation is { } c && double.IsFinite(c) && r.Converged)
            .OrderBy(r => r.CoefficientOfVariation)
            .FirstOrDefault();
        var outside = reference is null
            ? []
            : rows.Where(r => r != reference && double.IsFinite(r.FailureProbability)
                && (r.FailureProbability < reference.Lower95 || r.FailureProbability > reference.Upper95))
                .Select(r => r.Method).ToArray();

        return new VerificationReport
        {
            LimitStateName = problem.LimitState.Name,
            Rows = rows,
            Reference = reference,
            OutsideReferenceInterval = outside,
        };
    }

    private static VerificationRow FromSimulation(SimulationResult s, ComputationRoute route)
    {
        var cov = s.CoefficientOfVariation;
        double? lower = null, upper = null;
        if (double.IsFinite(cov))
        {
            lower = Math.Max(0, s.FailureProbability * (1 - Z95 * cov));
            upper = Math.Min(1, s.FailureProbability * (1 + Z95 * cov));
        }

        var note = s.Diagnostic;
        var seed = string.Create(CultureInfo.InvariantCulture, $"seed {s.Seed}, {s.Samples} samples");
        return new VerificationRow(s.Method, route, s.FailureProbability, s.GeneralizedBeta, cov, lower, upper, s.LimitStateEvaluations,
            s.Converged, note is null ? seed : note + " (" + seed + ")");
    }
}
