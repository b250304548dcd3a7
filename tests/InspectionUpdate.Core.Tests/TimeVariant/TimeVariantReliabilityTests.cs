using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Simulation;
using InspectionUpdate.Tests.Degradation;
using InspectionUpdate.TimeVariant;
using MathNet.Numerics;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.TimeVariant;

public class TimeVariantReliabilityTests
{
    // Log-linear crack case: with a0, ac, Y, m, h, ν fixed and C, q lognormal, the margin
    // g = ln ψ(a0, ac) − ln C − m ln Y − (m/2) ln π − m ln q − ln Γ(1 + m/h) − ln(ν t) is linear in normals, so
    // β(t) = μ_g(t)/σ_g exactly.
    private const double A0 = 0.5, Ac = 20, Yc = 1.12, Mc = 3, Hc = 0.9, Nu = 5e6;
    private static readonly LognormalVariable CVar = Ln("parisC", 5.21e-13, 0.5);
    private static readonly LognormalVariable QVar = Ln("weibullScale_MPa", 6, 0.2);

    private static CrackGrowthModel LogLinearModel() => new(Model(D("initialDepth_mm", A0), D("criticalDepth_mm", Ac), D("thickness_mm", 25),
        D("geometryFactor", Yc), QVar, D("weibullShape", Hc), D("cyclesPerYear", Nu), CVar, D("parisM", Mc)));

    private static double ExactBeta(double t)
    {
        var psi = (Math.Pow(A0, 1 - Mc / 2) - Math.Pow(Ac, 1 - Mc / 2)) / (Mc / 2 - 1);
        var k = Math.Log(psi) - Mc * Math.Log(Yc) - Mc / 2 * Math.Log(Math.PI) - SpecialFunctions.GammaLn(1 + Mc / Hc) - Math.Log(Nu * t);
        var mu = k - CVar.Lambda - Mc * QVar.Lambda;
        var sigma = Math.Sqrt(CVar.Zeta * CVar.Zeta + Mc * Mc * QVar.Zeta * QVar.Zeta);
        return mu / sigma;
    }

    [Fact]
    [Reference("Exact β(t) = μ_g/σ_g for a margin linear in normal variables (Cornell 1969), written out for the log-cycle crack margin")]
    public void Profile_matches_the_exact_beta_of_the_log_linear_crack_model()
    {
        var result = TimeVariantReliability.Run(LogLinearModel(), TimeGrid.Yearly(50));
        Assert.Equal(50, result.Profile.Points.Count);
        Assert.True(result.Profile.AllConverged);
        foreach (var p in result.Profile.Points)
        {
            Assert.Equal(ExactBeta(p.TimeYears), p.Beta, 1e-6);
            Assert.Equal(ComputationRoute.FirstOrder, p.Route);
            Assert.NotNull(p.Alpha);
        }

        // ΔPf and hazard follow their definitions.
        var pts = result.Profile.Points;
        Assert.Equal(pts[0].CumulativePf, pts[0].IntervalPf, 1e-15);
        for (var i = 1; i < pts.Count; i++)
        {
            Assert.Equal(pts[i].CumulativePf - pts[i - 1].CumulativePf, pts[i].IntervalPf, 1e-15);
            Assert.Equal(pts[i].IntervalPf / (1 - pts[i - 1].CumulativePf), pts[i].Hazard, 1e-15);
        }
    }

    [Fact]
    public void Cumulative_pf_is_monotone_non_decreasing_for_crack_growth_and_corrosion()
    {
        var crack = TimeVariantReliability.Profile(new CrackGrowthModel(CrackGrowthModelTests.SixInputWeibull()), TimeGrid.Yearly(50));
        var corrosion = TimeVariantReliability.Profile(new CorrosionModel(Model(N("wallThickness_mm", 12.7, 0.3), Ln("initiationTime_years", 5, 0.4),
            Ln("rate_mmPerYear", 0.15, 0.5), D("diameter_mm", 508), Ln("defectLength_mm", 150, 0.3), Ln("tensileStrength_MPa", 530, 0.05),
            Ln("modelFactor", 1.0, 0.1), N("pressure_MPa", 10, 0.3)), new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101 }),
            TimeGrid.Yearly(40, stepsPerYear: 2));
        foreach (var profile in new[] { crack, corrosion })
        {
            Assert.True(profile.AllConverged);
            for (var i = 1; i < profile.Points.Count; i++)
            {
                // Non-decreasing Pf ⇔ non-increasing β, up to FORM's convergence tolerance (|Δβ| ≤ 1e-5 here).
                Assert.True(profile.Points[i].Beta <= profile.Points[i - 1].Beta + 1e-5,
                    FormattableString.Invariant($"β rose at t = {profile.Points[i].TimeYears}: {profile.Points[i - 1].Beta} → {profile.Points[i].Beta}"));
            }
        }
    }

    [Fact]
    public void Warm_starts_spend_fewer_evaluations_than_cold_starts()
    {
        var model = new CrackGrowthModel(CrackGrowthModelTests.SixInputWeibull());
        var warm = TimeVariantReliability.Run(model, TimeGrid.Yearly(50));
        var cold = TimeVariantReliability.Run(model, TimeGrid.Yearly(50), new ProfileOptions { WarmStart = false });
        Assert.True(warm.TotalEvaluations < cold.TotalEvaluations, $"warm {warm.TotalEvaluations}, cold {cold.TotalEvaluations}");
        for (var i = 0; i < 50; i++) Assert.Equal(cold.Profile.Points[i].Beta, warm.Profile.Points[i].Beta, 1e-5);
    }

    [Theory]
    [Trait("Category", "Statistical")]
    [InlineData(10.0)]
    [InlineData(25.0)]
    [InlineData(50.0)]
    [Reference("Project importance sampling at the design point (seeded); FORM error on this mildly nonlinear margin stated as |Δβ| ≤ 0.05")]
    public void Form_pf_agrees_with_importance_sampling_within_the_stated_tolerance(double t)
    {
        var model = new CrackGrowthModel(CrackGrowthModelTests.SixInputWeibull());
        var point = TimeVariantReliability.CumulativeAt(model, t);
        var problem = new ReliabilityProblem(model.Inputs, new InspectionUpdate.Degradation.DegradationLimitState(model, t));
        var form = FormSolver.Solve(problem);
        var sim = ImportanceSampling.Run(problem, form, new SamplingOptions { Seed = 11, TargetCoefficientOfVariation = 0.02, MaxSamples = 200_000 });
        Assert.True(sim.Converged, sim.Diagnostic);
        // Tolerance on β: 0.05 of FORM approximation plus three standard errors of the simulated β.
        var betaSim = -StandardNormal.InverseCdf(sim.FailureProbability);
        var seBeta = sim.StandardError / StandardNormal.Pdf(betaSim);
        Assert.True(Math.Abs(point.Beta - betaSim) <= 0.05 + 3 * seBeta, $"FORM β {point.Beta}, IS β {betaSim} ± {seBeta}");
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Exact β of the log-linear crack model; importance sampling within 3 standard errors")]
    public void Non_converged_steps_are_recomputed_by_simulation_and_say_so()
    {
        var options = new ProfileOptions
        {
            // Tolerances no run can meet: FORM stops at its iteration cap near the design point.
            Form = FormOptions.Default with { MaxIterations = 5, LimitStateTolerance = 1e-300, AlignmentTolerance = 1e-300 },
            Fallback = new ImportanceSamplingFallback(new SamplingOptions { Seed = 3, TargetCoefficientOfVariation = 0.03, MaxSamples = 200_000 }),
        };
        var p = TimeVariantReliability.Run(LogLinearModel(), TimeGrid.FromTimes([20.0]), options).Profile.Points[0];
        Assert.Equal(ComputationRoute.ImportanceSampling, p.Route);
        Assert.True(p.Converged);
        Assert.NotNull(p.CoefficientOfVariation);
        Assert.Contains("FORM did not converge", p.Note);
        var exact = StandardNormal.Cdf(-ExactBeta(20));
        Assert.True(Math.Abs(p.CumulativePf - exact) <= 3 * p.CoefficientOfVariation!.Value * p.CumulativePf, $"{p.CumulativePf} vs {exact}");
    }

    [Fact]
    public void Non_converged_steps_without_a_fallback_are_flagged()
    {
        var options = new ProfileOptions { Form = FormOptions.Default with { MaxIterations = 0 }, Fallback = null };
        var profile = TimeVariantReliability.Profile(LogLinearModel(), TimeGrid.FromTimes([20.0]), options);
        Assert.False(profile.AllConverged);
        Assert.Contains("no simulation fallback", profile.Points[0].Note);
    }

    [Fact]
    [Reference("Exact β(t) of the log-linear model; crossing found by bisection on the exact ΔPf(t) in the test")]
    public void Annual_pf_crossing_matches_the_exact_crossing_time()
    {
        const double target = 1e-4;
        double Annual(double t) => StandardNormal.Cdf(-ExactBeta(t)) - StandardNormal.Cdf(-ExactBeta(t - 1));
        double lo = 1, hi = 60;
        Assert.True(Annual(lo) < target && Annual(hi) > target);
        for (var i = 0; i < 60; i++)
        {
            var mid = 0.5 * (lo + hi);
            if (Annual(mid) >= target) hi = mid;
            else lo = mid;
        }

        var crossing = TimeVariantReliability.FindAnnualPfCrossing(LogLinearModel(), target, 1, 60);
        Assert.True(crossing.Found);
        Assert.True(crossing.Converged);
        Assert.Equal(hi, crossing.TimeYears, 2e-3);
        var betaCrossing = TimeVariantReliability.FindBetaCrossing(LogLinearModel(), 3.0, 0.5, 60);
        Assert.Equal(3.0, ExactBeta(betaCrossing.TimeYears), 1e-3);
    }

    private static CorrosionModel BurstWithPressure(RandomVariable pressure) => new(Model(D("wallThickness_mm", 12.7), Ln("initiationTime_years", 5, 0.4),
        Ln("rate_mmPerYear", 0.2, 0.4), D("diameter_mm", 508), Ln("defectLength_mm", 150, 0.3), Ln("tensileStrength_MPa", 530, 0.05),
        Ln("modelFactor", 1.0, 0.1), pressure), new CorrosionSettings { FailureMode = CorrosionFailureMode.BurstDnvRpF101, PressureIsAnnualMaximum = true });

    [Fact]
    public void Deterministic_annual_maximum_gives_nested_yearly_events()
    {
        var annual = BurstWithPressure(D("pressure_MPa", 12));
        var grid = TimeGrid.Yearly(20);
        var profile = TimeVariantReliability.Profile(annual, grid);
        Assert.True(profile.AllConverged);
        // The same model read as time-invariant: Pf(t) = P(g(X, t) ≤ 0).
        var invariant = new CorrosionModel(annual.Inputs, annual.Settings with { PressureIsAnnualMaximum = false });
        var reference = TimeVariantReliability.Profile(invariant, grid);
        for (var i = 0; i < 20; i++) Assert.Equal(reference.Points[i].CumulativePf, profile.Points[i].CumulativePf, 1e-12);
    }

    // Linear yearly events in normals: g_j = R − D·j − P_j with R, D shared and P_j iid annual maxima. Every
    // yearly event is exactly linear, so the first-order series system is exact up to the integration error.
    private static InspectionUpdate.Degradation.Expressions.ExpressionModel LinearAnnualModel() => new(
        Model(N("R", 20, 1.5), N("D", 0.15, 0.05), N("P", 12, 1.2)), "R - D*t - P",
        settings: new InspectionUpdate.Degradation.Expressions.ExpressionModelSettings { AnnualMaximumInput = "P" });

    [Fact]
    [Reference("Two yearly events: P(E1 ∪ E2) = Φ(−β1) + Φ(−β2) − Φ2(−β1, −β2; ρ) with ρ over the shared inputs, written out with the bivariate normal CDF")]
    public void Two_year_union_of_annual_maxima_matches_the_bivariate_formula()
    {
        var result = TimeVariantReliability.Run(LinearAnnualModel(), TimeGrid.Yearly(2));
        Assert.True(result.Profile.AllConverged);
        // Exact β_j and shared correlation for the linear margins: μ = 20 − 0.15j − 12, σ² = 1.5² + (0.05j)² + 1.2².
        double Beta(int j) => (8 - 0.15 * j) / Math.Sqrt(2.25 + 0.0025 * j * j + 1.44);
        var rho = (2.25 + 0.0025 * 2) / Math.Sqrt((2.25 + 0.0025 + 1.44) * (2.25 + 0.01 + 1.44));
        var p1 = StandardNormal.Cdf(-Beta(1));
        var p2 = StandardNormal.Cdf(-Beta(2));
        var union = p1 + p2 - InspectionUpdate.Reliability.Multinormal.BivariateNormal.Cdf(-Beta(1), -Beta(2), rho);
        Assert.Equal(p1, result.Profile.Points[0].CumulativePf, 1e-9 * p1);
        Assert.Equal(union, result.Profile.Points[1].CumulativePf, 2e-3 * union);
    }

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Seeded Monte Carlo of the yearly process in the test (R, D shared, P_j drawn each year), within 3 standard errors plus the integration error")]
    public void Ten_year_union_of_annual_maxima_matches_a_simulation_of_the_yearly_process()
    {
        var profile = TimeVariantReliability.Profile(LinearAnnualModel(), TimeGrid.Yearly(10));
        Assert.True(profile.AllConverged);
        var rng = new Random(2024);
        double Gauss() => Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
        const int n = 400_000;
        var failures = 0;
        for (var s = 0; s < n; s++)
        {
            var r = 20 + 1.5 * Gauss();
            var d = 0.15 + 0.05 * Gauss();
            for (var j = 1; j <= 10; j++)
            {
                if (r - d * j - (12 + 1.2 * Gauss()) <= 0)
                {
                    failures++;
                    break;
                }
            }
        }

        var pf = (double)failures / n;
        var se = Math.Sqrt(pf * (1 - pf) / n);
        Assert.True(Math.Abs(profile.Points[^1].CumulativePf - pf) <= 3 * se + 2e-3 * pf, $"series {profile.Points[^1].CumulativePf}, simulated {pf} ± {se}");
        // A union exceeds its largest event and stays below the sum (Boole).
        var last = profile.Points[^1].CumulativePf;
        Assert.True(last > StandardNormal.Cdf(-(8 - 1.5) / Math.Sqrt(2.25 + 0.25 + 1.44)));
    }

    [Fact]
    public void Annual_maximum_needs_a_grid_in_whole_years_and_bounds_engine_reports_its_bounds()
    {
        var model = LinearAnnualModel();
        Assert.Throws<ArgumentException>(() => TimeVariantReliability.Run(model, TimeGrid.Yearly(10, stepsPerYear: 2)));
        var bounded = TimeVariantReliability.Run(model, TimeGrid.Yearly(5), new ProfileOptions { SeriesEngine = UnionBoundsEngine.Instance });
        Assert.False(bounded.Profile.Points[^1].Converged);
        Assert.Contains("union bounds", bounded.Profile.Points[^1].Note);
        Assert.Equal(bounded.FormResults.Sum(f => f.FailureProbability), bounded.Profile.Points[^1].CumulativePf, 1e-12);
    }

    [Fact]
    public void Time_grids_validate_their_times()
    {
        Assert.Equal([0.5, 1.0, 1.5, 2.0], TimeGrid.Yearly(2, 2).TimesYears);
        Assert.Contains("Time 1", Assert.Throws<ArgumentException>(() => TimeGrid.FromTimes([1.0, 1.0])).Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => TimeGrid.Yearly(0));
        Assert.True(TimeGrid.Yearly(5).IsWholeYears);
        Assert.False(TimeGrid.Yearly(5, 4).IsWholeYears);
    }

    [Fact]
    [Reference("Exact Pf(t) = E[Φ((r·max(0, t − T₀)/0.8 − μ_w)/σ_w)] over lognormal T₀ and r, by Gauss–Legendre on a window around its peak in the test; IS within 4 standard errors")]
    public void A_step_before_initiation_where_FORM_runs_off_is_simulated_around_the_point_on_the_limit_state()
    {
        // Linear corrosion after an initiation time: g = 0.8·t_w − r·max(0, t − T₀). At 1 year the median point lies
        // in the flat region (T₀ > t), where FORM from the origin runs off along t_w (‖u‖ ≈ 38, far from G = 0) and
        // from the next year's design point oscillates near the true one (β ≈ 11) without meeting its tolerance.
        // The simulation fallback must sample around the latter: around the former every sample fails with a
        // weight of about e^−740, which underflowed to a "converged" 5e-324 with CoV 0 before.
        const string json = """
            {
              "schemaVersion": 1,
              "name": "initiation then linear wall loss",
              "serviceLife_years": 35,
              "mechanism": { "type": "corrosion", "growthLaw": "linear", "failureMode": "leak", "leakFraction": 0.8 },
              "inputs": {
                "wallThickness_mm": { "family": "Normal", "mean": 9.5, "sd": 0.2 },
                "initiationTime_years": { "family": "Lognormal", "mean": 5, "cov": 0.4 },
                "rate_mmPerYear": { "family": "Lognormal", "mean": 0.2, "cov": 0.5 }
              }
            }
            """;
        var parsed = InspectionUpdate.Degradation.Definition.ComponentModelDefinition.Parse(json);
        Assert.True(parsed.IsValid, parsed.Describe());
        var model = parsed.Definition!.Build();
        var result = TimeVariantReliability.Run(model, TimeGrid.Yearly(4));
        var first = result.Profile.Points[0];
        Assert.True(first.Converged, first.Note);

        static (double Mu, double Sigma) LogParameters(double mean, double cov)
        {
            var s2 = Math.Log(1 + cov * cov);
            return (Math.Log(mean) - s2 / 2, Math.Sqrt(s2));
        }

        var (muT, sT) = LogParameters(5, 0.4);
        var (muR, sR) = LogParameters(0.2, 0.5);
        const double t = 1;
        var exact = Integrate.OnRectangle(
            (a, b) =>
            {
                var t0 = Math.Exp(muT + sT * a);
                var r = Math.Exp(muR + sR * b);
                return StandardNormal.Pdf(a) * StandardNormal.Pdf(b) * StandardNormal.Cdf((r * Math.Max(0, t - t0) / 0.8 - 9.5) / 0.2);
            },
            -12, -2, 4, 16, 128);
        Assert.InRange(exact, 1e-30, 1e-25);
        var se = first.CoefficientOfVariation!.Value * first.CumulativePf;
        Assert.InRange(first.CumulativePf, exact - 4 * se, exact + 4 * se);
    }
}
