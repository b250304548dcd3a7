using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Inspection;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;
using InspectionUpdate.Updating.Sampling;
using MathNet.Numerics.Integration;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// The sample-set route with an annual-maximum pressure (engine issue: "updating with annual-maximum loads works through
/// the sampled yearly maxima"): linear wall loss of a pipe with the DNV-RP-F101 burst capacity, only the corrosion rate
/// r and the yearly maxima Pⱼ random. Given r, the failures of the years are independent, so
/// P(no failure in years 1…n | r) = Πⱼ F_P(cap(r·(j − T₀))), and every Pf(t | data) is a one-dimensional integral over r,
/// computed here by MathNet's Gauss–Legendre rule in the standard normal variable of r (not the production code).
/// </summary>
[Reference("Independent computation in the test: 1-D Gauss–Legendre quadrature (MathNet, 512 points on u ∈ [−9, 9]) of the product over years of the Gumbel distribution function of the DNV-RP-F101 capacity (capacity written out in the test from the published equation)")]
public class SampleSetAnnualMaximumTests(ITestOutputHelper output)
{
    private const double Wall = 12.7, Diameter = 508, Tensile = 455, Length = 200, Initiation = 3;
    private static readonly LognormalVariable Rate = LognormalVariable.FromMeanCov(CorrosionModel.Rate, 0.15, 0.4);
    private static readonly GumbelVariable Pressure = GumbelVariable.FromMeanStd(CorrosionModel.Pressure, 10, 0.6);
    private static readonly CumulativeLognormalPod Pod = new(Math.Log(1.5), 0.5);
    private static readonly InspectionMethod Method = new("test UT", Pod, new SizingError(SizingErrorKind.AdditiveNormal, 0, 0.3));
    private static readonly double[] Years = Enumerable.Range(1, 40).Select(i => (double)i).ToArray();

    public static TheoryData<string> Cases() => new() { "prior", "no indication", "sized, then in service" };

    [Theory]
    [MemberData(nameof(Cases))]
    [Trait("Category", "Statistical")]
    public void Every_cumulative_and_annual_Pf_agrees_with_quadrature(string name)
    {
        var model = Model();
        AssertCapacityMatchesTheModel(model);
        IReadOnlyList<InspectionOutcome> evidence = name switch
        {
            "prior" => [],
            "no indication" => [new NoIndication(12, "N-12", Method)],
            _ => [new SizedIndication(15, "S-15", Method, 2.5), new SurvivedInService(22, "R-22")],
        };
        Func<double, double> likelihood = name switch
        {
            "prior" => _ => 1,
            "no indication" => r => 1 - Pod.Evaluate(Depth(r, 12)),
            _ => r => Math.Exp(-0.5 * Math.Pow((2.5 - Depth(r, 15)) / 0.3, 2)),
        };
        var survivedTo = name.Contains("in service", StringComparison.Ordinal) ? 22 : 0;

        var profile = new SampleSetUpdater().Profile(model, evidence, Years, name);
        var evidenceProbability = Integrate(r => likelihood(r) * Survival(r, survivedTo));
        var agreement = new ProfileAgreement();
        var prev = 0.0;
        for (var i = 0; i < Years.Length; i++)
        {
            var t = Years[i];
            var p = profile.Points[i];
            var exact = t <= survivedTo ? 0 : Integrate(r => likelihood(r) * (Survival(r, survivedTo) - Survival(r, (int)t))) / evidenceProbability;
            var exactInterval = exact - prev;
            prev = exact;
            output.WriteLine($"{t,3} Pf {p.CumulativePf:E4} exact {exact:E4} cov {p.CoefficientOfVariation:F4} ΔPf {p.IntervalPf:E4} exact {exactInterval:E4} {p.Route} {p.Converged} {p.Note}");
            Assert.InRange(p.CumulativePf, 0, 1);
            Assert.InRange(p.IntervalPf, 0, 1);
            if (p.UpperBound is { } bound)
            {
                if (exact > bound) agreement.Fail($"t = {t}: bound {bound:E3} below the exact {exact:E4}");
                continue;
            }

            if (exact > 1e-8)
            {
                if (!p.Converged) agreement.Fail($"t = {t}: not converged ({p.Note})");
                agreement.Compare($"t = {t}: Pf", p.CumulativePf, exact, (p.CoefficientOfVariation ?? 0) * p.CumulativePf);
            }
            else if (exact == 0 && p.CumulativePf != 0)
            {
                agreement.Fail($"t = {t}: Pf {p.CumulativePf:E4} before the in-service record, where it is exactly 0");
            }

            if (exactInterval > 1e-8)
            {
                agreement.Compare($"t = {t}: ΔPf", p.IntervalPf, exactInterval, (p.IntervalCoefficientOfVariation ?? 0) * p.IntervalPf);
            }
        }

        agreement.AssertAgrees();
        // The profile reaches the planning range: the check above is not about zeros only.
        Assert.True(profile.Points[^1].CumulativePf > 1e-3, $"Pf(40 y) = {profile.Points[^1].CumulativePf:E3}");
    }

    private static CorrosionModel Model() => new(
        new StochasticModel(
        [
            new DeterministicVariable(CorrosionModel.WallThickness, Wall),
            new DeterministicVariable(CorrosionModel.InitiationTime, Initiation),
            new DeterministicVariable(CorrosionModel.Diameter, Diameter),
            new DeterministicVariable(CorrosionModel.DefectLength, Length),
            new DeterministicVariable(CorrosionModel.TensileStrength, Tensile),
            new DeterministicVariable(CorrosionModel.ModelFactor, 1.0),
            Pressure,
            Rate,
        ]),
        new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101, GrowthLaw = CorrosionGrowthLaw.Linear, PressureIsAnnualMaximum = true });

    private static double Depth(double rate, double t) => rate * Math.Max(0, t - Initiation);

    /// <summary>DNV-RP-F101 single defect, written out: p = 2·t·f_u/(D − t) · (1 − d/t)/(1 − d/(t·Q)), Q = √(1 + 0.31·L²/(D·t)).</summary>
    private static double Capacity(double depth)
    {
        var q = Math.Sqrt(1 + 0.31 * Length * Length / (Diameter * Wall));
        return 2 * Wall * Tensile / (Diameter - Wall) * (1 - depth / Wall) / (1 - depth / (Wall * q));
    }

    /// <summary>P(no failure in years 1…n | r) = Πⱼ F_P(cap(d(r, j))).</summary>
    private static double Survival(double rate, int years)
    {
        var s = 1.0;
        for (var j = 1; j <= years; j++) s *= GumbelCdf(Capacity(Depth(rate, j)));
        return s;
    }

    /// <summary>Gumbel (maxima) distribution function with mean 10 and standard deviation 0.6: β = 0.6·√6/π, μ = 10 − γβ.</summary>
    private static double GumbelCdf(double p)
    {
        var scale = 0.6 * Math.Sqrt(6) / Math.PI;
        var location = 10 - 0.5772156649015329 * scale;
        return Math.Exp(-Math.Exp(-(p - location) / scale));
    }

    /// <summary>E_prior[f(r)] by Gauss–Legendre in the standard normal variable u of r = exp(λ + ζu), ζ² = ln(1 + 0.4²), λ = ln 0.15 − ζ²/2.</summary>
    private static double Integrate(Func<double, double> f)
    {
        var zeta = Math.Sqrt(Math.Log(1 + 0.4 * 0.4));
        var lambda = Math.Log(0.15) - 0.5 * zeta * zeta;
        return GaussLegendreRule.Integrate(u => Math.Exp(-0.5 * u * u) / Math.Sqrt(2 * Math.PI) * f(Math.Exp(lambda + zeta * u)), -9, 9, 512);
    }

    private static void AssertCapacityMatchesTheModel(CorrosionModel model)
    {
        // The test's own capacity and the model's agree at one state, so the reference describes the same component.
        var x = model.Inputs.Variables.Select(v => v.Mean).ToArray();
        var depth = Depth(x[model.Inputs.IndexOf(CorrosionModel.Rate)], 20);
        Assert.Equal(Capacity(depth), model.BurstCapacityMPa(x, 20), 1e-9);
    }
}
