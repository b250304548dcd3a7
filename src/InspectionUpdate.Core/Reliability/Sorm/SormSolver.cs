using System.Globalization;
using System.Numerics;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Systems;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Reliability.Sorm;

/// <summary>
/// Second-order reliability: principal curvatures at the FORM design point and the asymptotic corrections of
/// Breitung (1984, J. Eng. Mech. 110(3):357–366), Hohenbichler, Gollwitzer, Kruse &amp; Rackwitz (1987, Structural
/// Safety 4:267–284) and Tvedt (1990, J. Eng. Mech. 116(6):1183–1197; the three-term formula as printed in the
/// OpenTURNS theory documentation, "SORM approximation", which writes (1 + βκ) for our (1 − βκ) because its
/// curvatures have the opposite sign; checked against exact paraboloid probabilities and against the Tvedt value printed
/// by OpenTURNS' own SORM test, t_SORM_std, in the tests).
/// </summary>
/// <remarks>
/// The Hessian H of G(u) is taken by central differences at u*, rotated by an orthogonal R whose last row is α
/// (Gram–Schmidt), A = (R H Rᵀ)/‖∇G‖; the curvatures are minus the eigenvalues of its leading (n − 1) × (n − 1)
/// block, so that the surface is locally vₙ = β − ½Σκᵢvᵢ² with failure beyond it. The formulas are asymptotic in β;
/// for β &lt; 0 they are applied to the safe domain (β → −β, κ → −κ) and the complement is returned.
/// </remarks>
public static class SormSolver
{
    /// <summary>Runs FORM and then SORM.</summary>
    public static SormResult Solve(ReliabilityProblem problem, FormOptions? formOptions = null, double finiteDifferenceStep = 1e-3)
    {
        ArgumentNullException.ThrowIfNull(problem);
        return Solve(problem, FormSolver.Solve(problem, formOptions), finiteDifferenceStep);
    }

    /// <summary>SORM around an existing FORM result of the same problem.</summary>
    /// <param name="problem">The problem FORM was run on.</param>
    /// <param name="form">Its FORM result; a non-converged one gives a non-converged SORM result.</param>
    /// <param name="finiteDifferenceStep">Step of the Hessian differences in u (standard deviations), in (1e-6, 0.1].</param>
    /// <exception cref="ArgumentOutOfRangeException">The step is out of range.</exception>
    /// <exception cref="ArgumentException">The design point does not match the problem's dimension.</exception>
    public static SormResult Solve(ReliabilityProblem problem, FormResult form, double finiteDifferenceStep = 1e-3)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(form);
        if (!(finiteDifferenceStep > 1e-6 && finiteDifferenceStep <= 0.1))
        {
            throw new ArgumentOutOfRangeException(nameof(finiteDifferenceStep), finiteDifferenceStep, "The finite-difference step must lie in (1e-6, 0.1].");
        }

        var n = problem.Transformation.StandardDimension;
        if (form.DesignPointU.Count != n)
        {
            throw new ArgumentException($"The FORM design point has {form.DesignPointU.Count} entries; the problem has {n} random variables.", nameof(form));
        }

        var function = new StandardSpaceLimitState(problem.Transformation, problem.LimitState, finiteDifferenceStep / 10);
        var u = form.DesignPointU.ToArray();
        var gradient = new double[n];
        function.ValueAndGradient(u, gradient);
        var gradNorm = Math.Sqrt(gradient.Sum(v => v * v));
        var hessian = function.Hessian(u);
        var notes = new List<string>();
        var converged = form.Converged;
        if (!form.Converged) notes.Add("FORM did not converge: " + form.Diagnostic);

        var finite = double.IsFinite(gradNorm) && gradNorm > 0;
        foreach (var h in hessian) finite &= double.IsFinite(h);
        double[] curvatures;
        if (!finite)
        {
            converged = false;
            notes.Add("The gradient or Hessian at the design point is not finite or vanishes.");
            curvatures = Enumerable.Repeat(double.NaN, Math.Max(n - 1, 0)).ToArray();
        }
        else
        {
            curvatures = Curvatures(hessian, form.Alpha.ToArray(), gradNorm);
        }

        var estimates = Estimates(form.Beta, curvatures);
        foreach (var e in estimates.Where(e => !e.Valid)) notes.Add(e.Method + ": " + e.Note);
        return new SormResult
        {
            Form = form,
            Curvatures = curvatures,
            GradientNorm = gradNorm,
            Breitung = estimates[0],
            HohenbichlerRackwitz = estimates[1],
            Tvedt = estimates[2],
            Converged = converged,
            Diagnostic = notes.Count == 0 ? null : string.Join(" ", notes),
            LimitStateEvaluations = function.Evaluations,
        };
    }

    /// <summary>Relative change of a SORM factor (1 − βκ) above which two curvature estimates are said to disagree.</summary>
    public const double CurvatureAgreementTolerance = 0.05;

    /// <summary>
    /// SORM around an existing FORM result with a check of the curvatures: the Hessian is taken with the given step and
    /// with <paramref name="checkFactor"/> times it, and the result carries a <see cref="SormResult.CurvatureWarning"/>
    /// when max |β|·|κᵢ(h) − κᵢ(kh)| exceeds <see cref="CurvatureAgreementTolerance"/> (so a factor 1 − βκᵢ moves by
    /// more than 5 %). A smooth surface gives curvatures that agree to O(h²); a kink or a branch switch within a step
    /// of the design point gives second differences that scale as 1/h and disagree.
    /// </summary>
    /// <param name="problem">The problem FORM was run on.</param>
    /// <param name="form">Its FORM result.</param>
    /// <param name="finiteDifferenceStep">Step of the Hessian differences in u, in (1e-6, 0.1]; the estimates use this one.</param>
    /// <param name="checkFactor">Ratio of the check step to the step, in [2, 20]; the check step is capped at 0.1.</param>
    /// <exception cref="ArgumentOutOfRangeException">The step or the factor is out of range.</exception>
    public static SormResult SolveWithCurvatureCheck(ReliabilityProblem problem, FormResult form, double finiteDifferenceStep = 1e-3, double checkFactor = 4)
    {
        if (!(checkFactor >= 2 && checkFactor <= 20))
        {
            throw new ArgumentOutOfRangeException(nameof(checkFactor), checkFactor, "The check factor must lie in [2, 20].");
        }

        var primary = Solve(problem, form, finiteDifferenceStep);
        var checkStep = Math.Min(0.1, finiteDifferenceStep * checkFactor);
        var check = Solve(problem, form, checkStep);
        var evaluations = primary.LimitStateEvaluations + check.LimitStateEvaluations;
        var scale = Math.Max(1, double.IsFinite(form.Beta) ? Math.Abs(form.Beta) : 1);
        var worst = 0.0;
        for (var i = 0; i < primary.Curvatures.Count; i++)
        {
            var d = Math.Abs(primary.Curvatures[i] - check.Curvatures[i]);
            worst = double.IsNaN(d) ? double.PositiveInfinity : Math.Max(worst, d);
        }

        string? warning = null;
        if (scale * worst > CurvatureAgreementTolerance)
        {
            warning = string.Create(CultureInfo.InvariantCulture,
                $"Curvatures unstable: with steps {finiteDifferenceStep:G2} and {checkStep:G2} they differ by up to {worst:G3} (|β|·Δκ = {scale * worst:G3} > {CurvatureAgreementTolerance:G2}); the surface has a kink, a branch switch or noise near the design point, and the SORM estimates are not reliable.");
        }
        else if (primary.Converged && problem.Transformation.StandardDimension > 1)
        {
            var (offset, probes) = SecondOrderModelOffset(problem, form, finiteDifferenceStep);
            evaluations += probes;
            if (offset > SecondOrderModelTolerance)
            {
                warning = string.Create(CultureInfo.InvariantCulture,
                    $"The second-order model does not hold one standard deviation from the design point along the surface: the surface there lies {offset:G3} standard deviations from the quadratic fit (> {SecondOrderModelTolerance:G2}); higher-order terms dominate and FORM and SORM may be far off.");
            }
        }

        return primary with { CurvatureWarning = warning, LimitStateEvaluations = evaluations };
    }

    /// <summary>Largest distance (standard deviations) between the surface and its quadratic fit at the probes, beyond which SORM is flagged.</summary>
    public const double SecondOrderModelTolerance = 0.25;

    /// <summary>
    /// Probes G at u* ± δt for the n − 1 tangent directions t of the rotation (δ = 1 standard deviation, where the
    /// probability mass near the design point lies) and returns max |G − (∇G·δt + ½δ²tᵀHt)| / ‖∇G‖: how far the
    /// surface lies from its second-order model there, in standard deviations. Directions beyond 50 are not probed.
    /// </summary>
    private static (double Offset, long Evaluations) SecondOrderModelOffset(ReliabilityProblem problem, FormResult form, double step)
    {
        const double delta = 1.0;
        var n = problem.Transformation.StandardDimension;
        var function = new StandardSpaceLimitState(problem.Transformation, problem.LimitState, step / 10);
        var u = form.DesignPointU.ToArray();
        var gradient = new double[n];
        var g0 = function.ValueAndGradient(u, gradient);
        var gradNorm = Math.Sqrt(gradient.Sum(v => v * v));
        var hessian = function.Hessian(u);
        var r = Rotation(form.Alpha.ToArray());
        var worst = 0.0;
        var p = new double[n];
        for (var k = 0; k < Math.Min(n - 1, 50); k++)
        {
            var quad = 0.0;
            var slope = 0.0;
            for (var i = 0; i < n; i++)
            {
                slope += gradient[i] * r[k, i];
                for (var j = 0; j < n; j++) quad += r[k, i] * hessian[i, j] * r[k, j];
            }

            foreach (var sign in new[] { -1.0, 1.0 })
            {
                for (var i = 0; i < n; i++) p[i] = u[i] + sign * delta * r[k, i];
                var g = function.Value(p);
                var model = g0 + sign * delta * slope + 0.5 * delta * delta * quad;
                var offset = Math.Abs(g - model) / gradNorm;
                worst = double.IsFinite(offset) ? Math.Max(worst, offset) : double.PositiveInfinity;
            }
        }

        return (worst, function.Evaluations);
    }

    /// <summary>
    /// The three estimates for a given β and principal curvatures (Breitung's sign convention: κ &gt; 0 curves towards
    /// the origin). Public so the curvatures of any surface can be corrected, e.g. in tests and the updating layer.
    /// </summary>
    public static SormEstimate[] Estimates(double beta, IReadOnlyList<double> curvatures)
    {
        ArgumentNullException.ThrowIfNull(curvatures);
        if (!double.IsFinite(beta) || curvatures.Any(k => !double.IsFinite(k)))
        {
            const string note = "β or a curvature is not finite.";
            return [Invalid("Breitung (1984)", note), Invalid("Hohenbichler–Rackwitz (1987)", note), Invalid("Tvedt (1990)", note)];
        }

        if (beta >= 0)
        {
            return [Breitung(beta, curvatures), HohenbichlerRackwitz(beta, curvatures), Tvedt(beta, curvatures)];
        }

        // Median point fails: approximate the (smaller) safe probability and take the complement.
        var mirrored = curvatures.Select(k => -k).ToArray();
        return [Complement(Breitung(-beta, mirrored)), Complement(HohenbichlerRackwitz(-beta, mirrored)), Complement(Tvedt(-beta, mirrored))];
    }

    private static SormEstimate Complement(SormEstimate e)
    {
        if (!e.Valid) return e;
        if (!(e.FailureProbability <= 1))
        {
            // Strong curvature of the safe domain (e.g. many dimensions): the asymptotic formula exceeds 1 there.
            return Invalid(e.Method, string.Create(CultureInfo.InvariantCulture,
                $"β < 0: the formula applied to the safe domain gives {e.FailureProbability:G3}, not a probability."));
        }

        var p = 1 - e.FailureProbability;
        return e with { FailureProbability = p, GeneralizedBeta = -StandardNormal.InverseCdf(p), Note = "β < 0: applied to the safe domain and complemented." };
    }

    private static SormEstimate Breitung(double beta, IReadOnlyList<double> kappa)
    {
        const string name = "Breitung (1984)";
        var factor = 1.0;
        foreach (var k in kappa)
        {
            var t = 1 - beta * k;
            if (!(t > 0)) return Invalid(name, string.Create(CultureInfo.InvariantCulture, $"βκ = {beta * k:G4} ≥ 1 for a principal curvature κ = {k:G4}."));
            factor /= Math.Sqrt(t);
        }

        return Valid(name, StandardNormal.Cdf(-beta) * factor);
    }

    private static SormEstimate HohenbichlerRackwitz(double beta, IReadOnlyList<double> kappa)
    {
        const string name = "Hohenbichler–Rackwitz (1987)";
        var q = StandardNormal.Cdf(-beta);
        var psi = StandardNormal.Pdf(beta) / q;
        var factor = 1.0;
        foreach (var k in kappa)
        {
            var t = 1 - psi * k;
            if (!(t > 0)) return Invalid(name, string.Create(CultureInfo.InvariantCulture, $"κφ(β)/Φ(−β) = {psi * k:G4} ≥ 1 for κ = {k:G4}."));
            factor /= Math.Sqrt(t);
        }

        return Valid(name, q * factor);
    }

    /// <summary>
    /// Tvedt (1990): A₁ + A₂ + A₃ with A₁ = Φ(−β)∏(1 − βκ)^(−½),
    /// A₂ = [βΦ(−β) − φ(β)]{∏(1 − βκ)^(−½) − ∏(1 − (β+1)κ)^(−½)},
    /// A₃ = (β+1)[βΦ(−β) − φ(β)]{∏(1 − βκ)^(−½) − Re ∏(1 − (β+i)κ)^(−½)}.
    /// </summary>
    private static SormEstimate Tvedt(double beta, IReadOnlyList<double> kappa)
    {
        const string name = "Tvedt (1990)";
        double p1 = 1, p2 = 1;
        var p3 = Complex.One;
        foreach (var k in kappa)
        {
            var t1 = 1 - beta * k;
            var t2 = 1 - (beta + 1) * k;
            if (!(t1 > 0) || !(t2 > 0))
            {
                return Invalid(name, string.Create(CultureInfo.InvariantCulture, $"(β + 1)κ = {(beta + 1) * k:G4} ≥ 1 for κ = {k:G4}."));
            }

            p1 /= Math.Sqrt(t1);
            p2 /= Math.Sqrt(t2);
            p3 /= Complex.Sqrt(1 - new Complex(beta, 1) * k);
        }

        var q = StandardNormal.Cdf(-beta);
        var c = beta * q - StandardNormal.Pdf(beta);
        var a1 = q * p1;
        var a2 = c * (p1 - p2);
        var a3 = (beta + 1) * c * (p1 - p3.Real);
        var p = a1 + a2 + a3;
        return p is > 0 and < 1 ? Valid(name, p) : Invalid(name, string.Create(CultureInfo.InvariantCulture, $"The three-term sum {p:G4} is not a probability."));
    }

    private static SormEstimate Valid(string name, double p) => p is >= 0 and <= 1
        ? new(name, p, -StandardNormal.InverseCdf(p), true, null)
        : Invalid(name, string.Create(CultureInfo.InvariantCulture, $"The formula gives {p:G3}, not a probability."));

    private static SormEstimate Invalid(string name, string note) => new(name, double.NaN, double.NaN, false, note);

    /// <summary>κ = −eig((R H Rᵀ)₁₁)/‖∇G‖ with R orthogonal, last row α.</summary>
    internal static double[] Curvatures(double[,] hessian, double[] alpha, double gradNorm)
    {
        var n = alpha.Length;
        if (n == 1) return [];
        var r = Rotation(alpha);
        var h = Matrix<double>.Build.DenseOfArray(hessian);
        var rm = Matrix<double>.Build.DenseOfArray(r);
        var a = rm * h * rm.Transpose() / gradNorm;
        var block = a.SubMatrix(0, n - 1, 0, n - 1);
        block = (block + block.Transpose()) / 2;
        var evd = block.Evd(Symmetricity.Symmetric);
        return evd.EigenValues.Select(c => -c.Real).OrderBy(v => v).ToArray();
    }

    /// <summary>Orthogonal matrix whose last row is α, by Gram–Schmidt on α and the unit vectors (the one closest to α left out).</summary>
    internal static double[,] Rotation(double[] alpha)
    {
        var n = alpha.Length;
        var skip = 0;
        for (var i = 1; i < n; i++)
        {
            if (Math.Abs(alpha[i]) > Math.Abs(alpha[skip])) skip = i;
        }

        var basis = new List<double[]> { (double[])alpha.Clone() };
        for (var i = 0; i < n; i++)
        {
            if (i == skip) continue;
            var e = new double[n];
            e[i] = 1;
            basis.Add(e);
        }

        var ortho = new List<double[]>();
        foreach (var v in basis)
        {
            var w = (double[])v.Clone();
            // Modified Gram–Schmidt, twice for numerical orthogonality.
            for (var pass = 0; pass < 2; pass++)
            {
                foreach (var q in ortho)
                {
                    var d = 0.0;
                    for (var k = 0; k < n; k++) d += w[k] * q[k];
                    for (var k = 0; k < n; k++) w[k] -= d * q[k];
                }
            }

            var norm = Math.Sqrt(w.Sum(x => x * x));
            for (var k = 0; k < n; k++) w[k] /= norm;
            ortho.Add(w);
        }

        var r = new double[n, n];
        for (var row = 0; row < n - 1; row++)
            for (var k = 0; k < n; k++) r[row, k] = ortho[row + 1][k];
        for (var k = 0; k < n; k++) r[n - 1, k] = ortho[0][k];
        return r;
    }
}
