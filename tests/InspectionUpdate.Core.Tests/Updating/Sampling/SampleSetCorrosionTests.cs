using InspectionUpdate.Inspection;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// The sample-set route on linear corrosion with a leak limit state, prior and updated, against the two-dimensional
/// quadrature of <see cref="CorrosionLeakQuadrature"/>: every cumulative Pf and every annual ΔPf above 1e-8 within
/// 2 % or three of its own standard errors (the accuracy target of the engine issue, judged as a family by
/// <see cref="ProfileAgreement"/>), every one converged.
/// </summary>
[Reference("Independent computation in the test: nested adaptive Gauss–Kronrod quadrature (MathNet) of the closed-form failure region r ≥ f·w/(t − T₀)")]
public class SampleSetCorrosionTests(ITestOutputHelper output)
{
    private static readonly CumulativeLognormalPod Pod = new(Math.Log(1.0), 0.6);
    private static readonly InspectionMethod Method = new("test UT", Pod, new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
    private static readonly double[] Years = Enumerable.Range(1, 50).Select(i => (double)i).ToArray();

    public static TheoryData<string> Cases() => new() { "prior", "no indication", "sized", "no indication then sized", "in service" };

    private static (IReadOnlyList<InspectionOutcome> Evidence, CorrosionLeakQuadrature Reference) Case(string name) => name switch
    {
        "prior" => ([], new CorrosionLeakQuadrature([])),
        "no indication" => ([new NoIndication(12, "N-12", Method)], new CorrosionLeakQuadrature([(12, CorrosionLeakQuadrature.NoIndication(Pod))])),
        "sized" => ([new SizedIndication(15, "S-15", Method, 2.0)], new CorrosionLeakQuadrature([(15, CorrosionLeakQuadrature.Sized(2.0, 0.3))])),
        "no indication then sized" => ([new NoIndication(8, "N-8", Method), new SizedIndication(18, "S-18", Method, 3.0)],
            new CorrosionLeakQuadrature([(8, CorrosionLeakQuadrature.NoIndication(Pod)), (18, CorrosionLeakQuadrature.Sized(3.0, 0.3))])),
        // Survival to 20 years: the leak limit state itself, g > 0 at 20 y, i.e. likelihood 1[depth(20) < f·w].
        _ => ([new SurvivedInService(20, "S-20")], new CorrosionLeakQuadrature([(20, a => a < CorrosionLeakQuadrature.LeakFraction * CorrosionLeakQuadrature.Wall ? 1 : 0)])),
    };

    [Theory]
    [MemberData(nameof(Cases))]
    [Trait("Category", "Statistical")]
    public void Every_cumulative_and_annual_Pf_agrees_with_quadrature(string name)
    {
        var (evidence, reference) = Case(name);
        var model = CorrosionLeakQuadrature.Model();
        var profile = new SampleSetUpdater().Profile(model, evidence, Years, name);
        var prev = 0.0;
        var agreement = new ProfileAgreement();
        for (var i = 0; i < Years.Length; i++)
        {
            var p = profile.Points[i];
            var exact = reference.Conditional(Years[i]);
            var exactInterval = exact - prev;
            prev = exact;
            output.WriteLine($"{Years[i],3} Pf {p.CumulativePf:E4} exact {exact:E4} cov {p.CoefficientOfVariation:F4} ΔPf {p.IntervalPf:E4} exact {exactInterval:E4} cov {p.IntervalCoefficientOfVariation:F4} {p.Route} {p.Converged} {p.Note}");
            if (p.UpperBound is { } bound)
            {
                // A bounded value claims only Pf ≤ bound.
                if (exact > bound) agreement.Fail($"t = {Years[i]}: bound {bound:E3} below the exact {exact:E4}");
            }
            else if (exact > 1e-8)
            {
                if (!p.Converged) agreement.Fail($"t = {Years[i]}: not converged ({p.Note})");
                agreement.Compare($"t = {Years[i]}: Pf", p.CumulativePf, exact, (p.CoefficientOfVariation ?? 0) * p.CumulativePf);
            }
            else if (p.Converged && p.Route == ComputationRoute.ImportanceSampling && p.CumulativePf > 0)
            {
                // Below the accuracy floor a converged sampled value must still be consistent with the exact one.
                var se = (p.CoefficientOfVariation ?? 0) * p.CumulativePf;
                if (Math.Abs(p.CumulativePf - exact) > 4.5 * se + 1e-8) agreement.Fail($"t = {Years[i]}: Pf {p.CumulativePf:E4} against {exact:E4} (se {se:E2})");
            }

            if (p.UpperBound is null && exactInterval > 1e-8)
            {
                agreement.Compare($"t = {Years[i]}: ΔPf", p.IntervalPf, exactInterval, (p.IntervalCoefficientOfVariation ?? 0) * p.IntervalPf);
            }

            Assert.InRange(p.CumulativePf, 0, 1);
            Assert.InRange(p.IntervalPf, 0, 1);
        }

        agreement.AssertAgrees();
    }
}
