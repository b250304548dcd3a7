using InspectionUpdate.Inspection;
using InspectionUpdate.Planning;
using InspectionUpdate.Probability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;

namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// The sample-set route on a Paris-law-like crack (a model without a closed-form failure time: the generic
/// first-passage search runs) against likelihood-weighted crude Monte Carlo over the prior done in the test:
/// P(F(t) | data) = Σ wᵢ1[g(xᵢ, t) ≤ 0] / Σ wᵢ with wᵢ = Π L_k(xᵢ), and the same for the yearly increment, each with
/// its delta-method standard error. Every converged number must lie within four combined standard errors.
/// </summary>
[Reference("Independent computation in the test: likelihood-weighted crude Monte Carlo over the prior (ratio estimator, delta-method standard error)")]
public class SampleSetCrackTests
{
    private static readonly CumulativeLognormalPod Pod = new(Math.Log(1.5), 0.5);
    private static readonly InspectionMethod Method = TestModels.Method(Pod);
    private static readonly double[] Checked = [8, 12, 16, 20, 25, 30];

    public static TheoryData<string> Cases() => new() { "no indication", "indication then repair" };

    private static IReadOnlyList<InspectionOutcome> Evidence(string name) => name switch
    {
        "no indication" => [new NoIndication(6, "N-6", Method), new NoIndication(12, "N-12", Method)],
        _ => [new IndicationNotSized(10, "I-10", Method), new Repair(10, "R-10", new Dictionary<string, RandomVariable>())],
    };

    [Theory]
    [MemberData(nameof(Cases))]
    [Trait("Category", "Statistical")]
    public void Converged_cumulative_and_yearly_Pf_agree_with_crude_Monte_Carlo(string name)
    {
        var model = TestModels.ParisCrack();
        var evidence = Evidence(name);
        var repairAt = evidence.OfType<Repair>().Select(r => r.TimeYears).DefaultIfEmpty(-1).First();
        var times = Checked.SelectMany(t => new[] { t - 1, t }).Distinct().Order().ToArray();
        var profile = new SampleSetUpdater(SampleSetOptions.Default with { FirstOrderBelowResolution = false, Seed = 5 }).Profile(model, evidence, times, name);
        var reference = CrudeMonteCarlo(model, evidence, times, repairAt, 400_000, 11);
        var failures = new List<string>();
        var compared = 0;
        for (var i = 0; i < times.Length; i++)
        {
            var p = profile.Points[i];
            Assert.InRange(p.CumulativePf, 0, 1);
            if (!p.Converged || p.UpperBound is not null) continue;
            var (refP, refSe) = reference.Cumulative[i];
            var se = (p.CoefficientOfVariation ?? 0) * p.CumulativePf;
            var combined = Math.Sqrt(se * se + refSe * refSe);
            if (refP > 1e-4)
            {
                compared++;
                if (Math.Abs(p.CumulativePf - refP) > 4 * combined) failures.Add($"t = {times[i]}: Pf {p.CumulativePf:E4} ± {se:E2} against {refP:E4} ± {refSe:E2}");
            }

            if (i > 0 && Checked.Contains(times[i]) && p.IntervalCoefficientOfVariation is { } icov && !(repairAt > times[i - 1] && repairAt < times[i]))
            {
                var (refD, refDSe) = reference.Interval[i];
                var dse = icov * p.IntervalPf;
                var dcombined = Math.Sqrt(dse * dse + refDSe * refDSe);
                if (refD > 1e-4 && Math.Abs(p.IntervalPf - refD) > 4 * dcombined) failures.Add($"t = {times[i]}: ΔPf {p.IntervalPf:E4} ± {dse:E2} against {refD:E4} ± {refDSe:E2}");
            }
        }

        Assert.True(compared >= 4, $"only {compared} converged values above 1e-4 to compare");
        Assert.True(failures.Count == 0, string.Join(Environment.NewLine, failures));
    }

    /// <summary>
    /// A due date read off the sample set against the crossing of the same crude Monte Carlo curve: the planner's
    /// date must lie within 0.05 years of the time where the reference annual ΔPf reaches the target, or the
    /// reference must not be able to tell them apart (its own curve within two standard errors of the target there).
    /// </summary>
    [Fact]
    [Trait("Category", "Statistical")]
    public void Due_date_matches_the_crossing_of_the_reference_annual_Pf()
    {
        var model = TestModels.ParisCrack();
        IReadOnlyList<InspectionOutcome> evidence = [new NoIndication(6, "N-6", Method)];
        const double target = 1e-3;
        var planner = new InspectionPlanner(new SampleSetUpdater(SampleSetOptions.Default with { FirstOrderBelowResolution = false, Seed = 3 }));
        var next = planner.NextInspection(new PlanningRequest
        {
            Model = model,
            Evidence = evidence,
            InServiceDate = new DateOnly(2000, 1, 1),
            Target = AnnualTarget.FromAnnualPf(target, AnnualMeasure.IntervalPf),
            EndOfServiceYears = 40,
            StartTimeYears = 6,
        });
        Assert.Equal(NextInspectionStatus.Due, next.Status);
        var due = next.TimeYears;
        // The reference annual ΔPf at the due date ± 0.05 y must bracket the target within its noise.
        var (before, beforeSe) = AnnualAt(model, evidence, due - 0.05);
        var (after, afterSe) = AnnualAt(model, evidence, due + 0.05);
        Assert.True(before <= target + 2 * beforeSe, $"reference ΔPf {before:E4} ± {beforeSe:E2} already above the target 0.05 y before the due date {due:F3}");
        Assert.True(after >= target - 2 * afterSe, $"reference ΔPf {after:E4} ± {afterSe:E2} still below the target 0.05 y after the due date {due:F3}");
    }

    private static (double Value, double Se) AnnualAt(TestDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double t)
    {
        var r = CrudeMonteCarlo(model, evidence, [t - 1, t], -1, 400_000, 29);
        return r.Interval[1];
    }

    private sealed record Reference((double P, double Se)[] Cumulative, (double P, double Se)[] Interval);

    /// <summary>
    /// Likelihood-weighted crude Monte Carlo of P(F(t) | data) on the given times; after a repair the renewed initial
    /// depth is drawn afresh and failure counts from the repair (local time t − t_r).
    /// </summary>
    private static Reference CrudeMonteCarlo(TestDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double[] times, double repairAt, int samples, int seed)
    {
        var t = new NatafTransformation(model.Inputs);
        var rng = new Random(seed);
        var u = new double[3];
        var x = new double[3];
        var renewed = new double[3];
        var w = new double[samples];
        var failed = new bool[samples, times.Length];
        for (var s = 0; s < samples; s++)
        {
            for (var k = 0; k < 3; k++) u[k] = StandardNormal.InverseCdf(1 - rng.NextDouble());
            t.ToPhysical(u, x);
            x.CopyTo(renewed, 0);
            renewed[0] = model.Inputs.Variables[0].InverseCdf(1 - rng.NextDouble());
            var weight = 1.0;
            foreach (var e in evidence)
            {
                weight *= e switch
                {
                    NoIndication n => 1 - Pod.Evaluate(model.Size(x, n.TimeYears)),
                    IndicationNotSized d => Pod.Evaluate(model.Size(x, d.TimeYears)),
                    _ => 1,
                };
            }

            w[s] = weight;
            for (var k = 0; k < times.Length; k++)
            {
                var afterRepair = repairAt >= 0 && times[k] > repairAt;
                failed[s, k] = afterRepair ? model.Margin(renewed, times[k] - repairAt) <= 0 : model.Margin(x, times[k]) <= 0;
            }
        }

        var total = w.Sum();
        var cumulative = new (double, double)[times.Length];
        var interval = new (double, double)[times.Length];
        for (var k = 0; k < times.Length; k++)
        {
            cumulative[k] = Ratio(w, total, s => failed[s, k]);
            interval[k] = k == 0 ? cumulative[k] : Ratio(w, total, s => failed[s, k] && !failed[s, k - 1]);
        }

        return new Reference(cumulative, interval);
    }

    private static (double P, double Se) Ratio(double[] w, double total, Func<int, bool> indicator)
    {
        double hit = 0;
        for (var s = 0; s < w.Length; s++)
        {
            if (indicator(s)) hit += w[s];
        }

        var p = hit / total;
        double v = 0;
        for (var s = 0; s < w.Length; s++)
        {
            var r = w[s] * ((indicator(s) ? 1 : 0) - p);
            v += r * r;
        }

        return (p, Math.Sqrt(v) / total);
    }
}
