using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Probability;

/// <summary>
/// Fictive (normal-space) correlations ρ₀ of the Nataf model (Liu &amp; Der Kiureghian 1986): the correlation of
/// zᵢ = Φ⁻¹(Fᵢ(xᵢ)) and zⱼ that reproduces the physical correlation ρ of xᵢ and xⱼ,
/// ρ = ∫∫ hᵢ(zᵢ) hⱼ(zⱼ) φ₂(zᵢ, zⱼ; ρ₀) dzᵢ dzⱼ with h(z) = (F⁻¹(Φ(z)) − μ)/σ.
/// </summary>
/// <remarks>
/// <para>Exact forms where they exist: normal–normal ρ₀ = ρ; normal–lognormal ρ₀ = ρV/√ln(1 + V²) = ρV/ζ;
/// lognormal–lognormal ρ₀ = ln(1 + ρVᵢVⱼ)/(ζᵢζⱼ) with ζ² = ln(1 + V²). With one normal marginal and any other,
/// E[Zᵢh(Zⱼ)] = ρ₀E[Zh(Z)], so ρ₀ = ρF with the constant F = σⱼ/E[Z·xⱼ(Z)], a one-dimensional integral
/// (Gauss–Hermite, 128 nodes).</para>
/// <para>Otherwise ρ(ρ₀) is evaluated with the substitution zⱼ = ρ₀zᵢ + √(1 − ρ₀²)v over a 48 × 48 Gauss–Hermite
/// product rule, and ρ(ρ₀) = ρ is solved by Brent's method on [−1, 1]; ρ(ρ₀) increases in ρ₀, so the root is
/// unique, and ρ(−1), ρ(1) are the attainable bounds: a target outside them is rejected. Accuracy against the exact
/// lognormal–lognormal form and against two-dimensional adaptive integration is shown in the tests.</para>
/// <para>Deterministic variables have no z and are skipped. Nothing is cached; all state is local to a call.</para>
/// </remarks>
internal static class FictiveCorrelations
{
    /// <summary>Computes R₀ over the random variables of the model from the physical correlation matrix.</summary>
    /// <exception cref="DistributionParameterException">A correlation is not attainable for its marginals, or R₀ is not positive definite.</exception>
    public static CorrelationMatrix Compute(StochasticModel model, CorrelationMatrix physical)
    {
        var idx = model.RandomIndices;
        var n = idx.Count;
        var r0 = new double[n, n];
        for (var a = 0; a < n; a++)
        {
            r0[a, a] = 1;
            for (var b = 0; b < a; b++)
            {
                var rho = physical[idx[a], idx[b]];
                var value = Pair(model.Variables[idx[a]], model.Variables[idx[b]], rho, $"[{idx[a]},{idx[b]}]");
                r0[a, b] = value;
                r0[b, a] = value;
            }
        }

        return new CorrelationMatrix(r0, "fictive correlation");
    }

    /// <summary>The fictive correlation of one pair for the physical correlation ρ in (−1, 1).</summary>
    /// <param name="xi">First marginal.</param>
    /// <param name="xj">Second marginal.</param>
    /// <param name="rho">Physical (Pearson) correlation.</param>
    /// <param name="entry">Matrix entry named in errors, e.g. "[2,0]".</param>
    /// <exception cref="DistributionParameterException">ρ is not attainable for these marginals.</exception>
    public static double Pair(RandomVariable xi, RandomVariable xj, double rho, string entry = "rho")
    {
        if (rho == 0 || xi.IsDeterministic || xj.IsDeterministic) return 0;

        if (xi is NormalVariable && xj is NormalVariable) return rho;

        if (xi is LognormalVariable li && xj is LognormalVariable lj)
        {
            var vi = li.CoefficientOfVariation;
            var vj = lj.CoefficientOfVariation;
            var arg = 1 + rho * vi * vj;
            var r0 = arg > 0 ? Math.Log(arg) / (li.Zeta * lj.Zeta) : double.NegativeInfinity;
            return Checked(r0, xi, xj, rho, entry, LognormalBounds(li, lj));
        }

        if (xi is NormalVariable || xj is NormalVariable)
        {
            var other = xi is NormalVariable ? xj : xi;
            var factor = other is LognormalVariable l
                ? Math.Sqrt(ElementaryFunctions.Expm1(l.Zeta * l.Zeta)) / l.Zeta
                : NormalFactor(other);
            return Checked(rho * factor, xi, xj, rho, entry, (-1 / factor, 1 / factor));
        }

        return SolveNumerically(xi, xj, rho, entry);
    }

    /// <summary>F = ρ₀/ρ for a normal marginal paired with <paramref name="other"/>: σ/E[Z·x(Z)].</summary>
    internal static double NormalFactor(RandomVariable other)
    {
        var rule = GaussHermiteRule.Nodes128;
        var s = 0.0;
        for (var a = 0; a < rule.Count; a++) s += rule.Weights[a] * rule.Nodes[a] * other.FromStandardNormal(rule.Nodes[a]);
        return other.StandardDeviation / s;
    }

    /// <summary>ρ(ρ₀): the physical correlation that a fictive correlation produces, by the 48 × 48 Gauss–Hermite rule.</summary>
    internal static double PhysicalFromFictive(RandomVariable xi, RandomVariable xj, double rho0) =>
        new PairIntegral(xi, xj, 0).Evaluate(rho0);

    /// <summary>ρ₀ by quadrature and root finding, whatever the families (the closed forms bypass this).</summary>
    internal static double SolveNumerically(RandomVariable xi, RandomVariable xj, double rho, string entry = "rho")
    {
        var f = new PairIntegral(xi, xj, rho);
        // f(±1) = ρ(±1) − ρ: the target must lie strictly between the attainable bounds.
        var lo = f.Evaluate(-1);
        var hi = f.Evaluate(1);
        if (!(lo < 0 && hi > 0)) return Checked(double.NaN, xi, xj, rho, entry, (lo + rho, hi + rho));

        var r0 = RootFinder.Brent(ref f, -1, 1, lo, hi, 1e-13);
        return Checked(r0, xi, xj, rho, entry, (lo + rho, hi + rho));
    }

    private static (double Min, double Max) LognormalBounds(LognormalVariable li, LognormalVariable lj)
    {
        // ρ(ρ₀) = (exp(ρ₀ζᵢζⱼ) − 1)/(VᵢVⱼ) at ρ₀ = ±1.
        var vv = li.CoefficientOfVariation * lj.CoefficientOfVariation;
        var zz = li.Zeta * lj.Zeta;
        return (ElementaryFunctions.Expm1(-zz) / vv, ElementaryFunctions.Expm1(zz) / vv);
    }

    private static double Checked(double r0, RandomVariable xi, RandomVariable xj, double rho, string entry, (double Min, double Max) bounds)
    {
        if (double.IsFinite(r0) && Math.Abs(r0) < 1) return r0;
        throw new DistributionParameterException("correlation", entry, rho, FormattableString.Invariant(
            $"is not attainable between '{xi.Name}' ({xi.Family}) and '{xj.Name}' ({xj.Family}): these marginals admit correlations only in ({bounds.Min:G5}, {bounds.Max:G5})"));
    }

    /// <summary>ρ(ρ₀) − target over the product Gauss–Hermite rule, with hᵢ at the nodes computed once.</summary>
    private readonly struct PairIntegral : IScalarFunction
    {
        // Node pairs whose product weight is below this contribute less than rounding for these integrands.
        private const double NegligibleWeight = 1e-24;
        private readonly double[] _hi;
        private readonly RandomVariable _xj;
        private readonly double _target;

        public PairIntegral(RandomVariable xi, RandomVariable xj, double target)
        {
            var rule = GaussHermiteRule.Nodes48;
            _hi = new double[rule.Count];
            for (var a = 0; a < rule.Count; a++) _hi[a] = (xi.FromStandardNormal(rule.Nodes[a]) - xi.Mean) / xi.StandardDeviation;
            _xj = xj;
            _target = target;
        }

        public double Evaluate(double rho0)
        {
            var rule = GaussHermiteRule.Nodes48;
            var z = rule.Nodes;
            var w = rule.Weights;
            var s = Math.Sqrt(Math.Max(0, 1 - rho0 * rho0));
            var mean = _xj.Mean;
            var sd = _xj.StandardDeviation;
            var total = 0.0;
            for (var a = 0; a < z.Length; a++)
            {
                var inner = 0.0;
                for (var b = 0; b < z.Length; b++)
                {
                    if (w[a] * w[b] < NegligibleWeight) continue;
                    inner += w[b] * (_xj.FromStandardNormal(rho0 * z[a] + s * z[b]) - mean);
                }

                total += w[a] * _hi[a] * inner;
            }

            return total / sd - _target;
        }
    }
}
