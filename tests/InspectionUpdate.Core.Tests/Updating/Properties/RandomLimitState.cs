using System.Globalization;
using System.Linq.Expressions;
using System.Reflection;
using System.Text;
using MathNet.Numerics.LinearAlgebra;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>
/// A term of a generated limit state: its expression text and the same formula as a LINQ expression tree over
/// (double[] x, double t), compiled by the test (System.Linq.Expressions), independent of the engine's expression
/// reader.
/// </summary>
internal sealed record Term(string Text, Expression Body)
{
    public static readonly ParameterExpression X = Expression.Parameter(typeof(double[]), "x");
    public static readonly ParameterExpression T = Expression.Parameter(typeof(double), "t");

    private static readonly MethodInfo Sqrt = typeof(Math).GetMethod(nameof(Math.Sqrt), [typeof(double)])!;
    private static readonly MethodInfo Log = typeof(Math).GetMethod(nameof(Math.Log), [typeof(double)])!;
    private static readonly MethodInfo Exp = typeof(Math).GetMethod(nameof(Math.Exp), [typeof(double)])!;
    private static readonly MethodInfo Pow = typeof(Math).GetMethod(nameof(Math.Pow), [typeof(double), typeof(double)])!;
    private static readonly MethodInfo MinMethod = typeof(Math).GetMethod(nameof(Math.Min), [typeof(double), typeof(double)])!;

    public static Term Time { get; } = new("t", T);

    public static Term Constant(double v) => new(Num(v), Expression.Constant(v));

    public static Term Input(int i, string name) => new(name, Expression.ArrayIndex(X, Expression.Constant(i)));

    public static Term operator +(Term a, Term b) => new($"{a.Text} + {b.Text}", Expression.Add(a.Body, b.Body));

    public static Term operator -(Term a, Term b) => new($"{a.Text} - ({b.Text})", Expression.Subtract(a.Body, b.Body));

    public static Term operator *(Term a, Term b) => new($"({a.Text}) * ({b.Text})", Expression.Multiply(a.Body, b.Body));

    public static Term operator /(Term a, Term b) => new($"({a.Text}) / ({b.Text})", Expression.Divide(a.Body, b.Body));

    public static Term Min(Term a, Term b) => new($"min({a.Text}, {b.Text})", Expression.Call(MinMethod, a.Body, b.Body));

    public static Term SqrtOf(Term a) => new($"sqrt({a.Text})", Expression.Call(Sqrt, a.Body));

    public static Term LnOf(Term a) => new($"ln({a.Text})", Expression.Call(Log, a.Body));

    public static Term ExpOf(Term a) => new($"exp({a.Text})", Expression.Call(Exp, a.Body));

    public static Term PowOf(Term a, double p) => new($"pow({a.Text}, {Num(p)})", Expression.Call(Pow, a.Body, Expression.Constant(p)));

    public Func<double[], double, double> Compile() => Expression.Lambda<Func<double[], double, double>>(Body, X, T).Compile();

    /// <summary>A number as the expression language reads it (no exponent; negative in brackets).</summary>
    public static string Num(double v)
    {
        var s = Math.Abs(v).ToString("0.0#################", CultureInfo.InvariantCulture);
        return v < 0 ? $"(-{s})" : s;
    }
}

/// <summary>
/// A seeded random time-variant limit state g(x, t) written as a user expression, with 2–8 inputs of mixed families
/// (normal, lognormal, Gumbel, uniform, Weibull), some correlated, linear or nonlinear, some series systems via min().
/// Every form is g = c + A(x) − B(x)·h(t) (or a min of such), with B ≥ 0 built from positive inputs only and h ≥ 0
/// non-decreasing in t, so g never rises with time: failure by t is exactly g(x, t) ≤ 0, and the first failing year
/// of a sample is found by bisection on the yearly grid. The constant c is set from a pilot sample of the test's own
/// draws so that Pf at the horizon lies roughly between 2e-4 and 0.3 (and down to 1e-5 for the closed-form cases).
/// </summary>
internal sealed class RandomLimitState
{
    private readonly Matrix<double>? _cholesky;
    private readonly int[] _normalIndices;

    private RandomLimitState(int caseNumber, string kind, Marginal[] inputs, IReadOnlyList<(int I, int J, double Rho)> correlations, Term g, int horizon,
        (double Mean, double Sd, double Slope)? closedForm, Matrix<double>? fictive)
    {
        CaseNumber = caseNumber;
        Kind = kind;
        Inputs = inputs;
        Correlations = correlations;
        G = g;
        Eval = g.Compile();
        HorizonYears = horizon;
        ClosedForm = closedForm;
        _cholesky = fictive?.Cholesky().Factor;
        _normalIndices = Enumerable.Range(0, inputs.Length).Where(i => inputs[i].Family is Family.Normal or Family.Lognormal).ToArray();
    }

    public int CaseNumber { get; }

    /// <summary>"linear in normals (closed form)", "linear", "nonlinear" or "series of k".</summary>
    public string Kind { get; }

    public Marginal[] Inputs { get; }

    /// <summary>Physical correlations between pairs of normal or lognormal inputs.</summary>
    public IReadOnlyList<(int I, int J, double Rho)> Correlations { get; }

    public Term G { get; }

    /// <summary>g(x, t) compiled from <see cref="G"/> by the test.</summary>
    public Func<double[], double, double> Eval { get; }

    public int HorizonYears { get; }

    /// <summary>For g = μ-linear in normals: Pf(t) = Φ(−(Mean − Slope·t)/Sd).</summary>
    public (double Mean, double Sd, double Slope)? ClosedForm { get; }

    public override string ToString() => $"case {CaseNumber} ({Kind}, {HorizonYears} y): g = {G.Text}; inputs {string.Join("; ", Inputs.Select(i => i.ToString()))}"
        + (Correlations.Count > 0 ? "; ρ " + string.Join(", ", Correlations.Select(c => $"{Inputs[c.I].Name}–{Inputs[c.J].Name} {c.Rho.ToString("0.###", CultureInfo.InvariantCulture)}")) : "");

    /// <summary>The component-model file of the case.</summary>
    public string Json()
    {
        var sb = new StringBuilder();
        sb.Append(CultureInfo.InvariantCulture, $"{{ \"schemaVersion\": 1, \"name\": \"random limit state {CaseNumber}\", \"serviceLife_years\": {HorizonYears},");
        sb.Append(CultureInfo.InvariantCulture, $" \"mechanism\": {{ \"type\": \"expression\", \"limitState\": \"{G.Text}\" }}, \"inputs\": {{ ");
        sb.Append(string.Join(", ", Inputs.Select(i => $"\"{i.Name}\": {i.Json()}")));
        sb.Append(" }");
        if (Correlations.Count > 0)
        {
            sb.Append(", \"correlations\": [ ");
            sb.Append(string.Join(", ", Correlations.Select(c => string.Create(CultureInfo.InvariantCulture,
                $"{{ \"between\": [\"{Inputs[c.I].Name}\", \"{Inputs[c.J].Name}\"], \"rho\": {c.Rho:R} }}"))));
            sb.Append(" ]");
        }

        sb.Append(" }");
        return sb.ToString();
    }

    /// <summary>One draw of the inputs into <paramref name="x"/> (z is scratch of the same length).</summary>
    public void Draw(IndependentDraws draws, double[] x, double[] z)
    {
        for (var i = 0; i < Inputs.Length; i++)
        {
            if (Inputs[i].Family is Family.Normal or Family.Lognormal) z[i] = draws.Normal();
            else x[i] = Inputs[i].FromProbability(draws.Uniform());
        }

        if (_cholesky is { } l)
        {
            // Correlated normals: z ← L·z over the normal and lognormal inputs (L lower triangular, in their order).
            for (var a = _normalIndices.Length - 1; a >= 0; a--)
            {
                var s = 0.0;
                for (var b = 0; b <= a; b++) s += l[a, b] * z[_normalIndices[b]];
                z[_normalIndices[a]] = s;
            }
        }

        foreach (var i in _normalIndices) x[i] = Inputs[i].FromNormal(z[i]);
    }

    public static RandomLimitState Create(int seed, int caseNumber)
    {
        var rng = new Random(unchecked(seed * 1_000_003 + caseNumber * 7919));
        var horizon = rng.Next(8, 21);
        var n = rng.Next(2, 9);
        var roll = rng.Next(10);
        return roll < 2 ? ClosedFormCase(rng, caseNumber, n, horizon) : GeneralCase(rng, caseNumber, n, horizon, roll);
    }

    /// <summary>g = c + Σ aᵢxᵢ − k·t over correlated normals: Pf(t) = Φ(−(c + Σ aᵢμᵢ − k·t)/√(aᵀΣa)).</summary>
    private static RandomLimitState ClosedFormCase(Random rng, int caseNumber, int n, int horizon)
    {
        var inputs = new Marginal[n];
        var a = new double[n];
        for (var i = 0; i < n; i++)
        {
            var mean = 5 + 15 * rng.NextDouble();
            inputs[i] = new Marginal($"x{i + 1}", Family.Normal, mean, mean * (0.05 + 0.25 * rng.NextDouble()));
            a[i] = (0.5 + 1.5 * rng.NextDouble()) * (rng.NextDouble() < 0.7 ? 1 : -1);
        }

        var r = Matrix<double>.Build.DenseIdentity(n);
        var correlations = new List<(int, int, double)>();
        if (rng.NextDouble() < 0.6)
        {
            // R = D^(−1/2)(B·Bᵀ + I)D^(−1/2) with a small random B: positive definite, moderate correlations.
            var b = Matrix<double>.Build.Dense(n, 2, (_, _) => rng.NextDouble() * 1.4 - 0.7);
            var c = b * b.Transpose() + Matrix<double>.Build.DenseIdentity(n);
            for (var i = 0; i < n; i++)
            {
                for (var j = i + 1; j < n; j++)
                {
                    var rho = Math.Round(c[i, j] / Math.Sqrt(c[i, i] * c[j, j]), 3);
                    r[i, j] = r[j, i] = rho;
                    if (rho != 0) correlations.Add((i, j, rho));
                }
            }
        }

        var variance = 0.0;
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++) variance += a[i] * a[j] * r[i, j] * inputs[i].B * inputs[j].B;
        var sd = Math.Sqrt(variance);
        var betaAtHorizon = 1.0 + 3.3 * rng.NextDouble();
        var slope = sd * (0.3 + 2.7 * rng.NextDouble()) / horizon;
        var linear = Enumerable.Range(0, n).Sum(i => a[i] * inputs[i].A);
        var constant = Math.Round(betaAtHorizon * sd + slope * horizon - linear, 6);
        var g = Term.Constant(constant);
        for (var i = 0; i < n; i++) g += Term.Constant(a[i]) * Term.Input(i, inputs[i].Name);
        g -= Term.Constant(slope) * Term.Time;
        var mean0 = constant + linear;
        return new RandomLimitState(caseNumber, "linear in normals (closed form)", inputs, correlations, g, horizon, (mean0, sd, slope), correlations.Count > 0 ? r : null);
    }

    private static RandomLimitState GeneralCase(Random rng, int caseNumber, int n, int horizon, int roll)
    {
        var inputs = new Marginal[n];
        for (var i = 0; i < n; i++) inputs[i] = RandomMarginal(rng, $"x{i + 1}");

        // Correlations between at most two disjoint pairs of normal or lognormal inputs, so the Nataf (fictive)
        // correlation has a closed form (Liu & Der Kiureghian 1986, exact cases): N–N ρ; N–LN ρ·V/ζ; LN–LN ln(1 + ρV₁V₂)/(ζ₁ζ₂).
        var candidates = Enumerable.Range(0, n).Where(i => inputs[i].Family is Family.Normal or Family.Lognormal).OrderBy(_ => rng.Next()).ToList();
        var correlations = new List<(int, int, double)>();
        Matrix<double>? fictive = null;
        if (candidates.Count >= 2 && rng.NextDouble() < 0.5)
        {
            var normals = Enumerable.Range(0, n).Where(i => inputs[i].Family is Family.Normal or Family.Lognormal).ToArray();
            fictive = Matrix<double>.Build.DenseIdentity(normals.Length);
            var pairs = candidates.Count >= 4 && rng.NextDouble() < 0.4 ? 2 : 1;
            for (var k = 0; k < pairs; k++)
            {
                var (i, j) = (candidates[2 * k], candidates[2 * k + 1]);
                var rho = Math.Round(-0.5 + 1.2 * rng.NextDouble(), 3);
                correlations.Add((i, j, rho));
                var f = FictiveRho(inputs[i], inputs[j], rho);
                var (ai, aj) = (Array.IndexOf(normals, i), Array.IndexOf(normals, j));
                fictive[ai, aj] = fictive[aj, ai] = f;
            }
        }

        var h = horizon;
        Term G(IReadOnlyList<int> subset, bool nonlinear)
        {
            var capacity = subset.Where(i => !inputs[i].Positive || rng.NextDouble() < 0.45).ToList();
            var load = subset.Except(capacity).ToList();
            var a = Term.Constant(0);
            foreach (var i in capacity)
            {
                var x = Term.Input(i, inputs[i].Name);
                var scale = 1 / Math.Abs(Typical(inputs[i]));
                var coefficient = Term.Constant(Math.Round((0.5 + rng.NextDouble()) * scale * (rng.NextDouble() < 0.85 ? 1 : -1), 4));
                a += !nonlinear || !inputs[i].Positive
                    ? coefficient * x
                    : rng.Next(4) switch
                    {
                        0 => coefficient * Term.SqrtOf(x),
                        1 => coefficient * Term.LnOf(x),
                        2 => coefficient * Term.PowOf(x, 2),
                        _ => coefficient * x,
                    };
            }

            if (nonlinear && capacity.Count >= 2 && rng.NextDouble() < 0.5)
            {
                // A product of two capacity inputs (e.g. a strength times a section), scaled to order one.
                var (i, j) = (capacity[0], capacity[1]);
                a += Term.Constant(Math.Round(0.5 / Math.Abs(Typical(inputs[i]) * Typical(inputs[j])), 6)) * (Term.Input(i, inputs[i].Name) * Term.Input(j, inputs[j].Name));
            }

            Term b;
            if (load.Count == 0)
            {
                b = Term.Constant(Math.Round(0.5 + rng.NextDouble(), 3));
            }
            else
            {
                b = Term.Constant(Math.Round(0.5 + rng.NextDouble(), 3));
                foreach (var j in load)
                {
                    var x = Term.Input(j, inputs[j].Name);
                    var scale = 1 / Typical(inputs[j]);
                    if (nonlinear)
                    {
                        var power = Math.Round(0.5 + 1.5 * rng.NextDouble(), 2);
                        b *= Term.Constant(Math.Round(Math.Pow(scale, power), 6)) * Term.PowOf(x, power);
                    }
                    else
                    {
                        b += Term.Constant(Math.Round((0.5 + rng.NextDouble()) * scale, 4)) * x;
                    }
                }
            }

            var rate = Math.Round(0.02 + 0.1 * rng.NextDouble(), 3);
            var p = Math.Round(0.5 + 1.5 * rng.NextDouble(), 2);
            Term time = rng.Next(5) switch
            {
                0 => Term.Time / Term.Constant(h),
                1 => Term.Constant(1) + Term.Constant(rate) * Term.Time,
                2 => Term.SqrtOf(Term.Time),
                3 => Term.PowOf(Term.Time / Term.Constant(h), p),
                _ => Term.ExpOf(Term.Constant(rate) * Term.Time),
            };
            return a - b * time;
        }

        var order = Enumerable.Range(0, n).OrderBy(_ => rng.Next()).ToArray();
        List<int[]> subsets;
        string kind;
        var nonlinear = roll >= 5;
        if (roll >= 8 && n >= 2)
        {
            var k = n >= 3 && rng.NextDouble() < 0.5 ? 3 : 2;
            subsets = Enumerable.Range(0, k).Select(s => order.Where((_, idx) => idx % k == s).ToArray()).ToList();
            // Series members may share an input (a common load, say).
            if (rng.NextDouble() < 0.5) subsets[1] = [.. subsets[1], subsets[0][0]];
            kind = $"series of {k}";
            nonlinear = rng.NextDouble() < 0.5;
        }
        else
        {
            subsets = [order];
            kind = nonlinear ? "nonlinear" : "linear";
        }

        var members = subsets.Select(s => G(s, nonlinear)).ToList();
        var pilot = new RandomLimitState(caseNumber, kind, inputs, correlations, members[0], horizon, null, fictive);
        var compiled = members.Select(m => m.Compile()).ToArray();
        var draws = new IndependentDraws(unchecked(caseNumber * 31 + 17));
        const int pilotSize = 20_000;
        var values = new double[members.Count][];
        for (var m = 0; m < members.Count; m++) values[m] = new double[pilotSize];
        var x = new double[n];
        var z = new double[n];
        for (var s = 0; s < pilotSize; s++)
        {
            pilot.Draw(draws, x, z);
            for (var m = 0; m < members.Count; m++) values[m][s] = compiled[m](x, horizon);
        }

        // Target Pf at the horizon, log-uniform; each series member gets an even share of it.
        var target = Math.Exp(Math.Log(2e-4) + (Math.Log(0.3) - Math.Log(2e-4)) * rng.NextDouble()) / members.Count;
        Term? g = null;
        for (var m = 0; m < members.Count; m++)
        {
            Array.Sort(values[m]);
            var quantile = values[m][Math.Clamp((int)(target * pilotSize), 0, pilotSize - 1)];
            var member = Term.Constant(Math.Round(-quantile, 6)) + members[m];
            g = g is null ? member : Term.Min(g, member);
        }

        return new RandomLimitState(caseNumber, kind, inputs, correlations, g!, horizon, null, fictive);
    }

    private static Marginal RandomMarginal(Random rng, string name)
    {
        switch (rng.Next(5))
        {
            case 0:
                {
                    var mean = Math.Round(5 + 15 * rng.NextDouble(), 3);
                    return new Marginal(name, Family.Normal, mean, Math.Round(mean * (0.05 + 0.25 * rng.NextDouble()), 4));
                }

            case 1:
                return new Marginal(name, Family.Lognormal, Math.Round(1 + 9 * rng.NextDouble(), 3), Math.Round(0.1 + 0.4 * rng.NextDouble(), 3));
            case 2:
                {
                    // Scale at most 0.25 × location: P(x ≤ 0) = exp(−e⁴) ≈ 2e-24.
                    var location = Math.Round(1 + 4 * rng.NextDouble(), 3);
                    return new Marginal(name, Family.Gumbel, location, Math.Round(location * (0.05 + 0.2 * rng.NextDouble()), 4));
                }

            case 3:
                {
                    var lower = Math.Round(0.5 + 1.5 * rng.NextDouble(), 3);
                    return new Marginal(name, Family.Uniform, lower, Math.Round(lower * (1.2 + 1.8 * rng.NextDouble()), 3));
                }

            default:
                return new Marginal(name, Family.Weibull, Math.Round(1.5 + 4.5 * rng.NextDouble(), 3), Math.Round(1 + 4 * rng.NextDouble(), 3));
        }
    }

    /// <summary>A typical value of the input (its mean or a central value), to keep terms of order one.</summary>
    private static double Typical(Marginal m) => m.Family switch
    {
        Family.Uniform => 0.5 * (m.A + m.B),
        Family.Weibull => m.B,
        _ => m.A,
    };

    private static double FictiveRho(Marginal a, Marginal b, double rho) => (a.Family, b.Family) switch
    {
        (Family.Normal, Family.Normal) => rho,
        (Family.Normal, Family.Lognormal) => rho * b.B / b.Zeta,
        (Family.Lognormal, Family.Normal) => rho * a.B / a.Zeta,
        _ => Math.Log(1 + rho * a.B * b.B) / (a.Zeta * b.Zeta),
    };
}
