using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.TimeVariant;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace InspectionUpdate.Degradation.Fatigue;

/// <summary>One input parameter the calibration may adjust, with its search bounds.</summary>
/// <param name="Input">Input name in the crack-growth definition, e.g. "parisC".</param>
/// <param name="Parameter">Distribution parameter, e.g. "mean" or "cov".</param>
/// <param name="LowerBound">Smallest allowed value (finite).</param>
/// <param name="UpperBound">Largest allowed value (finite, &gt; lower).</param>
public sealed record CalibrationParameter(string Input, string Parameter, double LowerBound, double UpperBound);

/// <summary>Outcome of a calibration: the values found and how well the two Pf(t) curves then agree.</summary>
public sealed record CalibrationResult
{
    /// <summary>The adjusted parameters.</summary>
    public required IReadOnlyList<CalibrationParameter> Parameters { get; init; }

    /// <summary>Calibrated values, one per parameter.</summary>
    public required IReadOnlyList<double> Values { get; init; }

    /// <summary>Times (years) at which the curves were matched.</summary>
    public required IReadOnlyList<double> TimesYears { get; init; }

    /// <summary>β(t) of the reference (e.g. S–N) model.</summary>
    public required IReadOnlyList<double> ReferenceBeta { get; init; }

    /// <summary>β(t) of the calibrated model.</summary>
    public required IReadOnlyList<double> CalibratedBeta { get; init; }

    /// <summary>max over t of |β_calibrated − β_reference|.</summary>
    public required double MaxBetaDifference { get; init; }

    /// <summary>The calibrated definition (the original with the values set).</summary>
    public ComponentModelDefinition? CalibratedDefinition { get; init; }

    /// <summary>True when the optimizer converged, every profile step converged, and the β difference is within the requested tolerance.</summary>
    public required bool Converged { get; init; }

    /// <summary>Objective evaluations (each one a profile of the candidate model).</summary>
    public required int ObjectiveEvaluations { get; init; }

    /// <summary>Why the calibration is not converged, or null.</summary>
    public string? Diagnostic { get; init; }
}

/// <summary>
/// Calibrates a crack-growth model to a reference model, typically the S–N model of the same detail: adjusts the
/// input parameters the user chooses so that β(t) of the two agree over the times given, by minimizing
/// Σₜ(β_cg(t) − β_ref(t))² with the Nelder–Mead simplex (MathNet) in bounded coordinates.
/// </summary>
/// <remarks>
/// Matching the fracture-mechanics model to the S–N model this way is common practice in inspection planning for
/// welded joints (no source): the S–N curve carries the test evidence, the crack-growth model the link to
/// inspection findings.
/// </remarks>
public static class FatigueCalibration
{
    /// <summary>Calibrates parameters of a component-model definition against <paramref name="reference"/>.</summary>
    /// <exception cref="ArgumentException">No parameters, an unknown input, bad bounds, or no times.</exception>
    public static CalibrationResult Calibrate(ComponentModelDefinition definition, IDegradationModel reference,
        IReadOnlyList<CalibrationParameter> parameters, IReadOnlyList<double> timesYears, double betaTolerance = 0.02, int maxIterations = 400)
    {
        ArgumentNullException.ThrowIfNull(definition);
        ArgumentNullException.ThrowIfNull(parameters);
        foreach (var p in parameters)
        {
            if (definition.Inputs.All(i => i.Name != p.Input))
            {
                throw new ArgumentException($"Calibration parameter names input '{p.Input}', which the definition does not have.", nameof(parameters));
            }
        }

        ComponentModelDefinition Variant(IReadOnlyList<double> v)
        {
            var d = definition;
            for (var i = 0; i < parameters.Count; i++) d = d.WithInputParameter(parameters[i].Input, parameters[i].Parameter, v[i]);
            return d;
        }

        var result = Calibrate(v => Variant(v).Build(), reference, parameters, timesYears, betaTolerance, maxIterations);
        return result with { CalibratedDefinition = Variant(result.Values) };
    }

    /// <summary>Calibrates a model family θ → model against <paramref name="reference"/>.</summary>
    /// <param name="family">Builds the candidate model for parameter values θ (one per entry of <paramref name="parameters"/>).</param>
    /// <param name="reference">The model whose β(t) is to be reproduced.</param>
    /// <param name="parameters">Parameters and their bounds; the search starts at the middle of the bounds (geometric middle for positive bounds).</param>
    /// <param name="timesYears">Times at which the curves are matched.</param>
    /// <param name="betaTolerance">Largest acceptable |Δβ| for a converged result.</param>
    /// <param name="maxIterations">Iteration cap of the simplex.</param>
    public static CalibrationResult Calibrate(Func<IReadOnlyList<double>, IDegradationModel> family, IDegradationModel reference,
        IReadOnlyList<CalibrationParameter> parameters, IReadOnlyList<double> timesYears, double betaTolerance = 0.02, int maxIterations = 400)
    {
        ArgumentNullException.ThrowIfNull(family);
        ArgumentNullException.ThrowIfNull(reference);
        ArgumentNullException.ThrowIfNull(parameters);
        if (parameters.Count == 0) throw new ArgumentException("At least one parameter must be free.", nameof(parameters));
        foreach (var p in parameters)
        {
            if (!(double.IsFinite(p.LowerBound) && double.IsFinite(p.UpperBound) && p.UpperBound > p.LowerBound))
            {
                throw new ArgumentException(FormattableString.Invariant($"Parameter {p.Input}.{p.Parameter}: bounds [{p.LowerBound}, {p.UpperBound}] must be finite and increasing."), nameof(parameters));
            }
        }

        if (!(betaTolerance > 0)) throw new ArgumentOutOfRangeException(nameof(betaTolerance), betaTolerance, "Must be > 0.");
        var grid = TimeGrid.FromTimes(timesYears);
        var options = new ProfileOptions { Fallback = null, Label = "calibration" };
        var referenceProfile = TimeVariantReliability.Profile(reference, grid, options);
        var referenceBeta = referenceProfile.Points.Select(p => p.Beta).ToArray();
        if (!referenceProfile.AllConverged)
        {
            throw new ArgumentException("The reference model's FORM profile did not converge at every time; choose other times.", nameof(reference));
        }

        // Bounded coordinates: θ = lo + (hi − lo)·s(z), s the logistic function; for positive bounds in log space.
        double[] ToValues(Vector<double> z) => parameters.Select((p, i) =>
        {
            var s = 1 / (1 + Math.Exp(-z[i]));
            return p.LowerBound > 0
                ? Math.Exp(Math.Log(p.LowerBound) + s * (Math.Log(p.UpperBound) - Math.Log(p.LowerBound)))
                : p.LowerBound + s * (p.UpperBound - p.LowerBound);
        }).ToArray();

        var evaluations = 0;
        var allConverged = true;
        double Objective(Vector<double> z)
        {
            evaluations++;
            IDegradationModel model;
            try
            {
                model = family(ToValues(z));
            }
            catch (ArgumentException)
            {
                return 1e6; // an invalid candidate (e.g. parameters out of a distribution's range)
            }

            var profile = TimeVariantReliability.Profile(model, grid, options);
            var sum = 0.0;
            for (var i = 0; i < referenceBeta.Length; i++)
            {
                var d = profile.Points[i].Beta - referenceBeta[i];
                sum += double.IsFinite(d) ? d * d : 1e6;
            }

            return sum;
        }

        var start = Vector<double>.Build.Dense(parameters.Count, 0.0);
        var step = Vector<double>.Build.Dense(parameters.Count, 1.0);
        MinimizationResult minimum;
        string? diagnostic = null;
        var optimizerConverged = true;
        try
        {
            minimum = NelderMeadSimplex.Minimum(ObjectiveFunction.Value(Objective), start, step, 1e-10, maxIterations);
        }
        catch (MaximumIterationsException e)
        {
            optimizerConverged = false;
            diagnostic = e.Message;
            minimum = null!;
        }

        var values = minimum is null ? ToValues(start) : ToValues(minimum.MinimizingPoint);
        var final = TimeVariantReliability.Profile(family(values), grid, options);
        allConverged &= final.AllConverged;
        var calibratedBeta = final.Points.Select(p => p.Beta).ToArray();
        var maxDiff = calibratedBeta.Zip(referenceBeta, (a, b) => Math.Abs(a - b)).Max();
        var atBound = parameters.Select((p, i) => Math.Abs(values[i] - p.LowerBound) < 1e-6 * (p.UpperBound - p.LowerBound) || Math.Abs(values[i] - p.UpperBound) < 1e-6 * (p.UpperBound - p.LowerBound)).ToArray();
        if (atBound.Any(b => b)) diagnostic = Join(diagnostic, "a parameter ended at its bound: widen the bounds or free another parameter");
        if (maxDiff > betaTolerance) diagnostic = Join(diagnostic, FormattableString.Invariant($"max |Δβ| = {maxDiff:G3} exceeds the tolerance {betaTolerance:G3}"));
        if (!allConverged) diagnostic = Join(diagnostic, "some FORM steps of the calibrated profile did not converge");
        return new CalibrationResult
        {
            Parameters = parameters,
            Values = values,
            TimesYears = grid.TimesYears,
            ReferenceBeta = referenceBeta,
            CalibratedBeta = calibratedBeta,
            MaxBetaDifference = maxDiff,
            Converged = optimizerConverged && allConverged && maxDiff <= betaTolerance,
            ObjectiveEvaluations = evaluations,
            Diagnostic = diagnostic,
        };
    }

    private static string Join(string? a, string b) => a is null ? b : $"{a}; {b}";
}
