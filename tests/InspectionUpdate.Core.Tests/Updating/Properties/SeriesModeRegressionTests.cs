using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Tests.Updating.Properties;

/// <summary>
/// Case 232 of the random limit states: a series of three members, one of which (a large margin against a load growing
/// with √t) fails almost only in the last year of the horizon. With a multi-start FORM search of eight starts the sample
/// set found no design point of that member and, on most seeds, reported a converged Pf(20 y) a third too low
/// (about 2.6e-4 against 3.9e-4). The search now starts on every axis of u.
/// </summary>
public class SeriesModeRegressionTests
{
    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Independent computation in the test: crude Monte Carlo of P(g(X, t) ≤ 0) with the test's own inverse transforms, 2,000,000 samples, standard error √(p(1 − p)/N)")]
    public void A_member_failing_only_near_the_horizon_is_not_missed_on_any_of_eight_seeds()
    {
        var ls = RandomLimitState.Create(20261203, 232);
        var model = ComponentModelDefinition.Parse(ls.Json()).Definition!.Build();
        const int N = 2_000_000;
        var draws = new IndependentDraws(987654);
        var x = new double[ls.Inputs.Length];
        var z = new double[ls.Inputs.Length];
        long by19 = 0, by20 = 0;
        for (var s = 0; s < N; s++)
        {
            ls.Draw(draws, x, z);
            if (ls.Eval(x, 19) <= 0) by19++;
            if (ls.Eval(x, 20) <= 0) by20++;
        }

        var p20 = by20 / (double)N;
        var d20 = (by20 - by19) / (double)N;
        var se20 = Math.Sqrt(p20 * (1 - p20) / N);
        var seD = Math.Sqrt(d20 * (1 - d20) / N);
        var years = Enumerable.Range(1, 20).Select(y => (double)y).ToArray();
        for (var seed = 230; seed < 238; seed++)
        {
            var profile = new SampleSetUpdater(RandomLimitStatePropertyTests.AutoRoute(20, seed)).Profile(model, [], years, "prior");
            var last = profile.Points[^1];
            if (!last.Converged) continue;
            var se = last.CumulativePf * (last.CoefficientOfVariation ?? 0);
            Assert.True(Math.Abs(last.CumulativePf - p20) <= 4 * Math.Sqrt(se * se + se20 * se20),
                $"seed {seed}: converged Pf(20 y) {last.CumulativePf:E3} ± {se:E2} against crude {p20:E3} ± {se20:E2}");
            var seI = last.IntervalPf * (last.IntervalCoefficientOfVariation ?? 0);
            Assert.True(Math.Abs(last.IntervalPf - d20) <= 4 * Math.Sqrt(seI * seI + seD * seD),
                $"seed {seed}: converged ΔPf(19→20 y) {last.IntervalPf:E3} ± {seI:E2} against crude {d20:E3} ± {seD:E2}");
        }
    }
}
