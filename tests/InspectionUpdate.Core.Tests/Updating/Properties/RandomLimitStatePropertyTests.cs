using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>
/// "No converged number may be wrong", prior profiles: seeded random user expressions (see
/// <see cref="RandomLimitState"/>), read from model-file text and run through the automatic route as a component
/// without findings is assessed (the sample-set updater with first order below its resolution and as a cross-check,
/// yearly grid to the service life). Every number it marks converged is compared with a reference computed in the test
/// without the engine's samplers: crude Monte Carlo over the expression written as a C# delegate, or the closed form
/// where g is linear in normals.
/// </summary>
public class RandomLimitStatePropertyTests(ITestOutputHelper output)
{
    private const int Seed = 20261203;
    private const int Cases = 300;

    /// <summary>Sampling settings of the route under test: defaults except a smaller sample cap to keep the run short.</summary>
    internal static SampleSetOptions AutoRoute(int horizonYears, int seed) => SampleSetOptions.Default with
    {
        MaxSamples = 16_000,
        Samples = 8_000,
        Seed = seed,
        FirstOrderBelowResolution = true,
        HorizonYears = horizonYears,
    };

    /// <summary>
    /// Limit states (case numbers) exempted from the comparisons as a known missed failure mode: none. Cases 8, 183 and
    /// 232 (series systems whose members fail late) were wrong and converged until the sample set gave every design
    /// point of a multi-start search a centre; they are checked like the others.
    /// </summary>
    private static readonly HashSet<int> MissedFailureModeCases = [];

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Independent computation in the test: crude Monte Carlo of P(g(X, t) ≤ 0) with the test's own inverse transforms and polar-method normals, standard error √(p(1 − p)/N)")]
    [Reference("Closed form: g = c + Σaᵢxᵢ − k·t over correlated normals, Pf(t) = Φ(−(c + Σaᵢμᵢ − k·t)/√(aᵀΣa))")]
    [Reference("Liu & Der Kiureghian 1986, Probabilistic Engineering Mechanics 1(2): exact Nataf correlations for normal and lognormal pairs (from memory)")]
    public void Every_converged_number_of_a_prior_profile_agrees_with_its_reference() => Run(strict: true);


    private void Run(bool strict)
    {
        var clock = Stopwatch.StartNew();
        var failures = new List<string>();
        var notes = new List<string>();
        var known = new List<string>();
        int sampled = 0, firstOrderKept = 0, bounds = 0, converged = 0, points = 0;
        var firstOrder = new ReliabilityUpdater(UpdatingOptions.Default with { Route = UpdatingRoute.FirstOrder });
        var foStats = new FirstOrderStats();
        for (var c = 0; c < Cases; c++)
        {
            var ls = RandomLimitState.Create(Seed, c);
            var parsed = ComponentModelDefinition.Parse(ls.Json());
            Assert.True(parsed.Definition is not null && parsed.Problems.Count == 0, $"{ls}: {string.Join("; ", parsed.Problems)}");
            var model = parsed.Definition.Build();

            // The expression reader and the test's compiled tree must agree (same formula, two implementations).
            var probe = new double[ls.Inputs.Length];
            ls.Draw(new IndependentDraws(c), probe, new double[ls.Inputs.Length]);
            Assert.Equal(ls.Eval(probe, 0.5 * ls.HorizonYears), model.Margin(probe, 0.5 * ls.HorizonYears), 9);

            var years = Enumerable.Range(1, ls.HorizonYears).Select(y => (double)y).ToArray();
            ReliabilityProfile profile;
            try
            {
                profile = new SampleSetUpdater(AutoRoute(ls.HorizonYears, c + 1)).Profile(model, [], years, "prior");
            }
            catch (Exception e) when (e is ArgumentException or InvalidOperationException or ArithmeticException)
            {
                failures.Add($"{ls}: the route threw {e.GetType().Name}: {e.Message}");
                continue;
            }

            var reference = Reference(ls, profile);
            var checks = new ConvergedNumberChecks($"case {c}");
            checks.Check(profile, reference.Cumulative, reference.Interval);
            var problems = checks.General.ToList();
            var comparisons = checks.Keyed.Select(k => k.Text).ToList();
            if (!strict)
            {
                // A comparison that the same number conditioned on an intact start passes is known defect (1).
                var intact = new ConvergedNumberChecks($"case {c} (intact at entry)");
                intact.Check(profile, reference.CumulativeIntact, reference.IntervalIntact);
                var intactKeys = intact.FailedKeys;
                var explained = checks.Keyed.Count(k => !intactKeys.Contains(k.Key));
                if (explained > 0)
                {
                    known.Add(string.Create(CultureInfo.InvariantCulture, $"case {c}: {explained} number(s) off by about P(g(x, 0) ≤ 0) = {reference.FailedAtEntry:E2} (defect 1)"));
                }

                comparisons = checks.Keyed.Where(k => intactKeys.Contains(k.Key)).Select(k => k.Text).ToList();
                if (MissedFailureModeCases.Contains(c))
                {
                    known.AddRange(comparisons.Select(k => k + " (defect 3)"));
                    comparisons.Clear();
                }

                known.AddRange(checks.Known.Select(k => k + " (defect 2)"));
            }
            else
            {
                problems.AddRange(checks.Known);
            }

            problems.AddRange(comparisons);
            if (problems.Count > 0) failures.Add($"{ls}{Environment.NewLine}  " + string.Join(Environment.NewLine + "  ", problems));
            sampled += checks.ComparedSampled;
            firstOrderKept += checks.ComparedFirstOrder;
            bounds += checks.ComparedBounds;
            converged += profile.Points.Count(p => p.Converged);
            points += profile.Points.Count;

            // First order alone, for comparison only (the automatic route does not keep these): how often is a
            // converged first-order Pf at the horizon more than 10 % or 50 % off a resolved reference?
            try
            {
                var fo = firstOrder.Estimate(model, [], ls.HorizonYears);
                var r = reference.Cumulative[^1];
                if (fo.Converged && r.RelativeError < 0.05) foStats.Add(c, fo.CumulativePf, r.Value);
            }
            catch (Exception e) when (e is ArgumentException or InvalidOperationException or ArithmeticException)
            {
                notes.Add($"case {c}: first order threw {e.GetType().Name}");
            }
        }

        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"{Cases} limit states, {points} points, {converged} converged; compared {sampled} sampled numbers, {firstOrderKept} first-order numbers, {bounds} upper bounds; {clock.Elapsed.TotalSeconds:F0} s"));
        output.WriteLine(foStats.ToString());
        foreach (var n in notes) output.WriteLine(n);
        output.WriteLine($"{known.Count} problem(s) of known defects:");
        foreach (var n in known) output.WriteLine("  " + n);
        Assert.True(sampled >= 3 * Cases, $"only {sampled} converged sampled numbers compared");
        Assert.True(failures.Count == 0, $"{failures.Count} limit states with a wrong converged number:{Environment.NewLine}{string.Join(Environment.NewLine, failures)}");
    }

    /// <summary>
    /// The reference profile: closed form where there is one; otherwise crude Monte Carlo sized so that the relative
    /// standard error of Pf at the horizon is about 4 % (30,000 to 200,000 samples), the first failing year of each
    /// sample found by bisection (g never rises with t). Also returned: the same numbers conditioned on an intact
    /// component at entry into service, P(0 &lt; T_f ≤ t)/P(T_f &gt; 0), which is what the sample set computes while the
    /// known defect that drops samples failed at t = 0 stands (the skipped strict test below).
    /// </summary>
    internal static ProfileReference Reference(RandomLimitState ls, ReliabilityProfile profile)
    {
        var years = ls.HorizonYears;
        if (ls.ClosedForm is { } cf)
        {
            var cum = new Estimate[years];
            var inc = new Estimate[years];
            var cumIntact = new Estimate[years];
            var incIntact = new Estimate[years];
            var p0 = IndependentDraws.Phi(-cf.Mean / cf.Sd);
            var prev = 0.0;
            for (var k = 0; k < years; k++)
            {
                var t = k + 1.0;
                var pf = IndependentDraws.Phi(-(cf.Mean - cf.Slope * t) / cf.Sd);
                cum[k] = Estimate.Exact(pf);
                // ΔPf over (t − 1, t]; the first step runs from Pf(0) = 0 (nothing has happened before entry into service).
                inc[k] = Estimate.Exact(k == 0 ? pf : pf - prev);
                cumIntact[k] = Estimate.Exact((pf - p0) / (1 - p0));
                incIntact[k] = Estimate.Exact((k == 0 ? pf - p0 : pf - prev) / (1 - p0));
                prev = pf;
            }

            return new ProfileReference(cum, inc, cumIntact, incIntact, p0);
        }

        // Size the crude sample from the route's own Pf at the horizon only as a guide (the reference value is its own).
        var guide = Math.Max(profile.Points[^1].CumulativePf, 1e-4);
        var samples = (int)Math.Clamp(600 / guide, 30_000, 200_000);
        var all = new FailureHistogram(years);
        var intact = new FailureHistogram(years);
        var draws = new IndependentDraws(unchecked(ls.CaseNumber * 7 + 1));
        var x = new double[ls.Inputs.Length];
        var z = new double[ls.Inputs.Length];
        var g = ls.Eval;
        var atEntry = 0;
        for (var s = 0; s < samples; s++)
        {
            ls.Draw(draws, x, z);
            all.AddSample(1);
            if (g(x, years) > 0)
            {
                intact.AddSample(1);
                continue;
            }

            if (!(g(x, 0) > 0))
            {
                atEntry++;
                all.AddFailure(0, 1);
                continue;
            }

            intact.AddSample(1);
            int lo = 0, hi = years - 1; // failed by year hi + 1; find the first failing year
            while (lo < hi)
            {
                var mid = (lo + hi) / 2;
                if (g(x, mid + 1) <= 0) hi = mid;
                else lo = mid + 1;
            }

            all.AddFailure(lo, 1);
            intact.AddFailure(lo, 1);
        }

        var (c1, i1) = all.Estimates();
        var (c2, i2) = intact.Estimates();
        return new ProfileReference(c1, i1, c2, i2, (double)atEntry / samples);
    }

    internal sealed record ProfileReference(Estimate[] Cumulative, Estimate[] Interval, Estimate[] CumulativeIntact, Estimate[] IntervalIntact, double FailedAtEntry);

    private sealed class FirstOrderStats
    {
        private readonly List<(int Case, double Fo, double Reference)> _rows = [];

        public void Add(int c, double fo, double reference) => _rows.Add((c, fo, reference));

        public override string ToString()
        {
            var off10 = _rows.Where(r => Math.Abs(r.Fo - r.Reference) > 0.1 * r.Reference).ToList();
            var off50 = _rows.Where(r => Math.Abs(r.Fo - r.Reference) > 0.5 * r.Reference).ToList();
            var worst = _rows.OrderByDescending(r => Math.Abs(Math.Log(Math.Max(r.Fo, 1e-300) / r.Reference))).Take(5);
            return string.Create(CultureInfo.InvariantCulture,
                $"first order alone at the horizon (converged, reference CoV < 5 %): {_rows.Count} compared, {off10.Count} more than 10 % off, {off50.Count} more than 50 % off; worst: {string.Join(", ", worst.Select(w => $"case {w.Case} {w.Fo:E2} vs {w.Reference:E2}"))}");
        }
    }
}
