using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating.Sampling;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>
/// "No converged number may be wrong", updated profiles: seeded random crack-growth and corrosion components with
/// 0–5 findings (see <see cref="RandomComponent"/>) through the automatic route as <c>assess</c> runs it (the
/// sample-set updater, first order below its resolution and as a cross-check), every converged cumulative Pf and
/// annual ΔPf on the yearly grid against likelihood-weighted crude Monte Carlo over the prior written in the test.
/// </summary>
public class FindingSetPropertyTests(ITestOutputHelper output)
{
    private const int Seed = 20261204;
    private const int Cases = 200;
    private const int ReferenceSamples = 40_000;

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Independent computation in the test: likelihood-weighted crude Monte Carlo over the prior, P(F(t) | data) = Σwᵢ1[T_f,ᵢ ≤ t]/Σwᵢ, wᵢ = Π L_k(xᵢ), ratio estimator with delta-method standard error")]
    [Reference("JCSS Probabilistic Model Code Part 1, Annex B: closed form of Paris' law with constant Y (from memory)")]
    public void Every_converged_number_of_an_updated_profile_agrees_with_weighted_crude_Monte_Carlo() => Run(strict: true);


    private void Run(bool strict)
    {
        var known = new List<string>();
        var clock = Stopwatch.StartNew();
        var failures = new List<string>();
        int sampled = 0, firstOrderKept = 0, bounds = 0, converged = 0, points = 0, notConverged = 0;
        for (var c = 0; c < Cases; c++)
        {
            var component = RandomComponent.Create(Seed, c);
            var years = Enumerable.Range(1, component.HorizonYears).Select(y => (double)y).ToArray();
            ReliabilityProfile profile;
            try
            {
                profile = new SampleSetUpdater(RandomLimitStatePropertyTests.AutoRoute(component.HorizonYears, c + 1))
                    .Profile(component.Model, component.Evidence, years, "updated");
            }
            catch (Exception e) when (e is ArgumentException or InvalidOperationException or ArithmeticException)
            {
                failures.Add($"{component}: the route threw {e.GetType().Name}: {e.Message}");
                continue;
            }
            var (cumulative, interval) = component.Reference(ReferenceSamples);
            var checks = new ConvergedNumberChecks($"case {c}");
            checks.Check(profile, cumulative, interval, component.PeriodStarts);
            var problems = checks.General.Concat(checks.Keyed.Select(k => k.Text)).ToList();
            if (strict) problems.AddRange(checks.Known);
            else known.AddRange(checks.Known.Select(k => k + " (defect 2)"));
            if (problems.Count > 0)
            {
                failures.Add($"{component}{Environment.NewLine}  " + string.Join(Environment.NewLine + "  ", problems));
                output.WriteLine(component.ToString());
                for (var i = 0; i < profile.Points.Count; i++)
                {
                    var p = profile.Points[i];
                    output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"  {p.TimeYears,3} Pf {p.CumulativePf:E4} cov {p.CoefficientOfVariation:F3} ΔPf {p.IntervalPf:E4} icov {p.IntervalCoefficientOfVariation:F3} {p.Route} {p.Converged} bound {p.UpperBound:E2} | ref {cumulative[i].Value:E4} ± {cumulative[i].StandardError:E2} Δ {interval[i].Value:E4} ± {interval[i].StandardError:E2} | {p.Note}"));
                }
            }
            sampled += checks.ComparedSampled;
            firstOrderKept += checks.ComparedFirstOrder;
            bounds += checks.ComparedBounds;
            converged += profile.Points.Count(p => p.Converged);
            notConverged += profile.Points.Count(p => !p.Converged);
            points += profile.Points.Count;
        }

        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"{Cases} components, {points} points, {converged} converged, {notConverged} not; compared {sampled} sampled numbers, {firstOrderKept} first-order numbers, {bounds} upper bounds; {clock.Elapsed.TotalSeconds:F0} s"));
        output.WriteLine($"{known.Count} problem(s) of known defects:");
        foreach (var n in known) output.WriteLine("  " + n);
        Assert.True(sampled >= 3 * Cases, $"only {sampled} converged sampled numbers compared");
        Assert.True(failures.Count == 0, $"{failures.Count} components with a wrong converged number:{Environment.NewLine}{string.Join(Environment.NewLine, failures)}");
    }
}
