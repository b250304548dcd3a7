using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Tests.Planning.Doubles;
using InspectionUpdate.Updating;
using static InspectionUpdate.Tests.Planning.Doubles.PlanningCases;

namespace InspectionUpdate.Tests.Planning;

/// <summary>Properties over seeded random cases of the exact log-linear model.</summary>
public class PlanningPropertyTests
{
    private const int Cases = 10;

    private sealed record Case(LogLinearGrowthModel Model, double TargetPf, InspectionMethod Good, InspectionMethod Poor, double EndYears, double PriorRootYears);

    // Draws cases whose prior reaches the target between 2 and 25 years (checked on the closed form).
    private static IEnumerable<Case> Draw(int seed)
    {
        var rng = new Random(seed);
        double U(double a, double b) => a + (b - a) * rng.NextDouble();
        var made = 0;
        while (made < Cases)
        {
            var model = new LogLinearGrowthModel(Math.Log(U(0.3, 1.0)), U(0.3, 0.6), U(0.06, 0.14), U(0.01, 0.03), U(10, 30));
            var target = Math.Pow(10, U(-5, -3));
            var root = Enumerable.Range(4, 200).Select(i => i * 0.125).FirstOrDefault(t => model.PriorPf(t) - model.PriorPf(t - 1) >= target);
            if (root is < 2 or > 25) continue;
            var poorMedian = U(1.5, 4);
            var sigma = U(0.3, 0.7);
            // Same σ, smaller median: PoD_good(a) ≥ PoD_poor(a) for every a, with a monotone likelihood ratio.
            var good = ProbitLogPod.Method("good", poorMedian * U(0.3, 0.8), sigma);
            var poor = ProbitLogPod.Method("poor", poorMedian, sigma);
            made++;
            yield return new Case(model, target, good, poor, Math.Min(40, root + U(12, 20)), root);
        }
    }

    [Fact]
    [Reference("Independent check in the test: ΔPf(t) recomputed by the exact double at seeded random times between planned inspections, with the evidence in force at each time")]
    public void A_schedule_keeps_the_annual_pf_under_the_target_between_inspections()
    {
        var rng = new Random(7);
        var checkedTimes = 0;
        foreach (var c in Draw(20261202))
        {
            var schedule = new InspectionPlanner(new LogLinearGaussianUpdater()).Schedule(Request(c.Model, c.TargetPf, c.EndYears), c.Good);
            var times = schedule.Inspections.Select(i => i.TimeYears).ToList();
            var bounds = new List<double> { 0 };
            bounds.AddRange(times);
            if (schedule.Status == ScheduleStatus.Complete) bounds.Add(c.EndYears);
            var exact = new LogLinearGaussianUpdater();
            for (var k = 0; k + 1 < bounds.Count; k++)
            {
                IReadOnlyList<InspectionOutcome> evidence = times.Take(k).Select(t => (InspectionOutcome)new NoIndication(t, "check", c.Good)).ToArray();
                for (var j = 0; j < 4; j++)
                {
                    var t = bounds[k] + (bounds[k + 1] - bounds[k]) * rng.NextDouble();
                    var dPf = exact.Estimate(c.Model, evidence, t).CumulativePf - exact.Estimate(c.Model, evidence, Math.Max(0, t - 1)).CumulativePf;
                    Assert.True(dPf <= c.TargetPf, $"ΔPf({t:F4}) = {dPf:E4} > target {c.TargetPf:E4} after {k} planned inspection(s)");
                    checkedTimes++;
                }
            }

            Assert.True(schedule.Verification.WithinTarget);
        }

        Assert.True(checkedTimes >= Cases * 8);
    }

    [Fact]
    [Reference("Common practice, no source: a method whose PoD dominates another's (same σ, smaller median in the probit form, hence a monotone likelihood ratio) never needs more inspections")]
    public void A_dominating_method_never_needs_more_inspections()
    {
        var compared = 0;
        foreach (var c in Draw(4242))
        {
            var planner = new InspectionPlanner(new LogLinearGaussianUpdater());
            var comparison = planner.CompareMethods(Request(c.Model, c.TargetPf, c.EndYears), [c.Good, c.Poor]);
            var (good, poor) = (comparison.Rows[0], comparison.Rows[1]);
            Assert.Equal(good.FirstTimesYears[0], poor.FirstTimesYears[0], 1e-12);
            if (good.Status != ScheduleStatus.Complete || poor.Status != ScheduleStatus.Complete) continue;
            Assert.True(good.InspectionCount <= poor.InspectionCount,
                $"good {good.InspectionCount} > poor {poor.InspectionCount} inspections for target {c.TargetPf:E3}");
            compared++;
        }

        Assert.True(compared >= Cases / 2, $"only {compared} cases had two complete schedules");
    }

    [Fact]
    [Reference("Monotonicity of the first crossing: f(t) ≥ T₂ > T₁ implies f(t) ≥ T₁, so the first time at T₁ is no later (closed-form argument)")]
    public void A_lower_target_never_gives_a_later_first_date()
    {
        var rng = new Random(99);
        foreach (var c in Draw(777))
        {
            IReadOnlyList<InspectionOutcome> evidence = rng.NextDouble() < 0.5 ? [] : [new NoIndication(Math.Min(1.5, c.PriorRootYears / 2), "earlier", c.Poor)];
            var planner = new InspectionPlanner(new LogLinearGaussianUpdater());
            var higher = planner.NextInspection(Request(c.Model, c.TargetPf, c.EndYears, evidence));
            var lower = planner.NextInspection(Request(c.Model, c.TargetPf * (0.05 + 0.85 * rng.NextDouble()), c.EndYears, evidence));
            Assert.True(lower.TimeYears <= higher.TimeYears, $"lower target due {lower.TimeYears:F4} after higher target {higher.TimeYears:F4}");
            Assert.True(lower.Date <= higher.Date);
        }
    }
}
