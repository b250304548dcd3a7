using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Updating.FirstOrder;

/// <summary>
/// The joint design point of an intersection of events in standard normal space: min ½‖u‖² subject to the
/// equalities h_E(u) = 0 and the inequalities h_I(u) ≤ 0, by the multi-constraint HL-RF (Newton projection) step
/// u ← Jᵀ(JJᵀ)⁻¹(Ju − c(u)) on the active constraints, with an active-set loop on the inequalities (an inequality
/// joins when violated, leaves when its Lagrange multiplier has the wrong sign).
/// </summary>
/// <remarks>
/// Interim, local to first-order updating: to be replaced by the Reliability layer's joint design-point search of
/// parallel systems when it lands. Events inactive at the joint point keep their individual linearization.
/// </remarks>
internal static class JointDesignPoint
{
    private const double MaxStep = 2.0;

    public sealed record Result(double[] U, bool Converged, string? Diagnostic, bool[]? Active = null, int Evaluations = 0);

    public static Result Find(IReadOnlyList<EventFunction> functions, IReadOnlyList<bool> initiallyActive, double[] start, int maxIterations = 80)
    {
        var before = functions.Sum(f => f.Evaluations);
        var result = FindCore(functions, initiallyActive, start, maxIterations);
        return result with { Evaluations = functions.Sum(f => f.Evaluations) - before };
    }

    private static Result FindCore(IReadOnlyList<EventFunction> functions, IReadOnlyList<bool> initiallyActive, double[] start, int maxIterations)
    {
        var k = functions.Count;
        var d = start.Length;
        var active = new bool[k];
        var u = (double[])start.Clone();
        for (var i = 0; i < k; i++)
        {
            active[i] = functions[i].IsEquality || initiallyActive[i] || functions[i].ValueAtU(u) > 0;
        }

        var grad = new double[d];
        for (var round = 0; round < 2 * k + 2; round++)
        {
            var idx = Enumerable.Range(0, k).Where(i => active[i]).ToArray();
            if (idx.Length == 0) return new Result(new double[d], true, null, active); // the origin lies in the intersection
            if (idx.Length > d) return new Result(u, false, "More active constraints than random variables at the joint design point.");
            Vector<double>? lambda = null;
            var inner = false;
            for (var it = 0; it < maxIterations; it++)
            {
                var j = Matrix<double>.Build.Dense(idx.Length, d);
                var c = Vector<double>.Build.Dense(idx.Length);
                var worst = 0.0;
                for (var a = 0; a < idx.Length; a++)
                {
                    var h = functions[idx[a]].ValueAndForwardGradientAtU(u, grad);
                    var norm = Math.Sqrt(grad.Sum(g => g * g));
                    if (!(norm > 0) || !double.IsFinite(h)) return new Result(u, false, $"'{functions[idx[a]].Name}' has no usable gradient at the joint design point.");
                    c[a] = h;
                    worst = Math.Max(worst, Math.Abs(h) / norm);
                    for (var b = 0; b < d; b++) j[a, b] = grad[b];
                }

                var uv = Vector<double>.Build.DenseOfArray(u);
                var gram = j * j.Transpose();
                Vector<double> next;
                try
                {
                    lambda = gram.Cholesky().Solve(j * uv - c);
                    next = j.Transpose() * lambda;
                }
                catch (ArgumentException)
                {
                    return new Result(u, false, "The active constraints are linearly dependent at the joint design point.");
                }

                var step = next - uv;
                var len = step.L2Norm();
                if (len > MaxStep) step *= MaxStep / len;
                for (var b = 0; b < d; b++) u[b] += step[b];
                if (len < 1e-7 * Math.Max(1.0, uv.L2Norm()) && worst < 1e-7)
                {
                    inner = true;
                    break;
                }
            }

            if (!inner) return new Result(u, false, "The joint design-point search did not converge.");

            // Multiplier μ = −λ must be ≥ 0 for an active inequality; otherwise it does not bind.
            var dropped = false;
            var worstMultiplier = 1e-10;
            var drop = -1;
            for (var a = 0; a < idx.Length; a++)
            {
                if (functions[idx[a]].IsEquality) continue;
                if (lambda![a] > worstMultiplier)
                {
                    worstMultiplier = lambda[a];
                    drop = idx[a];
                }
            }

            if (drop >= 0)
            {
                active[drop] = false;
                dropped = true;
            }

            var added = false;
            for (var i = 0; i < k; i++)
            {
                if (active[i] || functions[i].IsEquality) continue;
                // A violated inequality joins; the tolerance is on h itself (event functions are O(1) to O(100)).
                if (functions[i].ValueAtU(u) > 1e-9)
                {
                    active[i] = true;
                    added = true;
                }
            }

            if (!dropped && !added) return new Result(u, true, null, active);
        }

        return new Result(u, false, "The active set of the joint design point did not settle.");
    }
}
