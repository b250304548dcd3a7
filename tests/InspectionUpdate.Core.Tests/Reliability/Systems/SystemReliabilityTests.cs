using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Multinormal;
using InspectionUpdate.Reliability.Systems;

namespace InspectionUpdate.Tests.Reliability.Systems;

public class SystemReliabilityTests
{
    // X1 ~ N(10, 2), X2 ~ N(5, 1), X3 ~ N(0, 3), independent.
    private static readonly double[] Means = [10, 5, 0];
    private static readonly double[] Sds = [2, 1, 3];

    private static StochasticModel Model() =>
        new([new NormalVariable("X1", Means[0], Sds[0]), new NormalVariable("X2", Means[1], Sds[1]), new NormalVariable("X3", Means[2], Sds[2])]);

    private static LimitState Linear(string name, double c, double[] a) =>
        new(name, x =>
        {
            var g = c;
            for (var i = 0; i < a.Length; i++) g += a[i] * x[i];
            return g;
        });

    /// <summary>Closed form: a linear g = c + aᵀX of independent normals is normal with mean c + aᵀμ and variance Σaᵢ²σᵢ².</summary>
    private static (double Mean, double Sd) Moments(double c, double[] a)
    {
        var mean = c;
        var variance = 0.0;
        for (var i = 0; i < a.Length; i++)
        {
            mean += a[i] * Means[i];
            variance += a[i] * a[i] * Sds[i] * Sds[i];
        }

        return (mean, Math.Sqrt(variance));
    }

    private static double Covariance(double[] a, double[] b)
    {
        var s = 0.0;
        for (var i = 0; i < a.Length; i++) s += a[i] * b[i] * Sds[i] * Sds[i];
        return s;
    }

    private static readonly double[] A1 = [1, -1, 0.5];
    private static readonly double[] A2 = [0.5, -2, -0.3];
    private const double C1 = 0.5;
    private const double C2 = 6.0;

    [Theory]
    [InlineData(SystemLinearization.IndividualDesignPoints)]
    [InlineData(SystemLinearization.JointDesignPoint)]
    [Reference("Closed form: two linear limit states of normals are jointly normal, P(g1 ≤ 0, g2 ≤ 0) = Φ₂(−μ1/σ1, −μ2/σ2; ρ12) with ρ12 = cov/(σ1σ2)")]
    public void Parallel_system_of_two_linear_limit_states_equals_the_exact_bivariate_probability(SystemLinearization linearization)
    {
        var (m1, s1) = Moments(C1, A1);
        var (m2, s2) = Moments(C2, A2);
        var rho = Covariance(A1, A2) / (s1 * s2);
        var exact = BivariateNormal.Cdf(-m1 / s1, -m2 / s2, rho);

        var result = SystemReliability.Analyze(new NatafTransformation(Model()), [Linear("g1", C1, A1), Linear("g2", C2, A2)], SystemKind.Parallel,
            new SystemOptions { Linearization = linearization });

        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(linearization, result.Linearization);
        Assert.Equal(exact, result.FailureProbability, 1e-9 * exact);
        Assert.Equal(rho, result.Correlation[0, 1], 1e-7);
        Assert.Equal(2, result.Components.Count);
        Assert.Contains(linearization == SystemLinearization.JointDesignPoint ? "joint design point" : "own design point", result.Method, StringComparison.Ordinal);
        Assert.InRange(exact, 1e-4, 0.05);
    }

    [Fact]
    [Reference("Closed form: P(g1 ≤ 0 ∪ g2 ≤ 0) = 1 − Φ₂(μ1/σ1, μ2/σ2; ρ12) for jointly normal linear margins")]
    public void Series_system_of_two_linear_limit_states_equals_the_exact_union_probability()
    {
        var (m1, s1) = Moments(C1, A1);
        var (m2, s2) = Moments(C2, A2);
        var rho = Covariance(A1, A2) / (s1 * s2);
        var exact = 1 - BivariateNormal.Cdf(m1 / s1, m2 / s2, rho);

        var result = SystemReliability.Analyze(new NatafTransformation(Model()), [Linear("g1", C1, A1), Linear("g2", C2, A2)], SystemKind.Series);

        Assert.True(result.Converged, result.Diagnostic);
        Assert.Equal(exact, result.FailureProbability, 1e-9 * exact);
    }

    [Fact]
    [Reference("Closed form: the joint design point of two active linear constraints aᵢᵀu ≥ βᵢ is u* = Aᵀ(AAᵀ)⁻¹β")]
    public void Joint_design_point_of_two_linear_constraints_is_the_minimum_norm_vertex()
    {
        // In u directly: standard normal inputs, g1 = 3 − u1, g2 = 3 − (0.6 u1 + 0.8 u2). Both constraints are active.
        var model = new StochasticModel([new NormalVariable("U1", 0, 1), new NormalVariable("U2", 0, 1)]);
        var g1 = new LimitState("g1", x => 3 - x[0]);
        var g2 = new LimitState("g2", x => 3 - (0.6 * x[0] + 0.8 * x[1]));
        var result = SystemReliability.Analyze(new NatafTransformation(model), [g1, g2], SystemKind.Parallel,
            new SystemOptions { Linearization = SystemLinearization.JointDesignPoint });
        // AAᵀ = [[1, .6], [.6, 1]], β = (3, 3): λ = (AAᵀ)⁻¹β = (1.875, 1.875); u* = Aᵀλ = (3, 1.5).
        Assert.True(result.Converged, result.Diagnostic);
        Assert.NotNull(result.JointDesignPointU);
        Assert.Equal(3.0, result.JointDesignPointU![0], 1e-6);
        Assert.Equal(1.5, result.JointDesignPointU[1], 1e-6);
        Assert.Equal(BivariateNormal.Cdf(-3, -3, 0.6), result.FailureProbability, 1e-10);
    }

    [Fact]
    [Reference("Independent computation in the test: P(u1 ≥ 3, u2 ≥ 3 + 0.3·u1²) = ∫₃^∞ φ(u1) Q(3 + 0.3·u1²) du1 by MathNet double-exponential quadrature")]
    public void Joint_linearization_fixes_a_parallel_system_whose_individual_design_points_mislead()
    {
        var model = new StochasticModel([new NormalVariable("U1", 0, 1), new NormalVariable("U2", 0, 1)]);
        var g1 = new LimitState("g1", x => 3 - x[0]);
        var g2 = new LimitState("g2", x => 3 - x[1] + 0.3 * x[0] * x[0]);
        var exact = MathNet.Numerics.Integrate.DoubleExponential(a => StandardNormal.Pdf(a) * StandardNormal.Ccdf(3 + 0.3 * a * a), 3, 40, 1e-25);
        var t = new NatafTransformation(model);

        var individual = SystemReliability.Analyze(t, [g1, g2], SystemKind.Parallel);
        var joint = SystemReliability.Analyze(t, [g1, g2], SystemKind.Parallel, new SystemOptions { Linearization = SystemLinearization.JointDesignPoint });

        Assert.True(joint.Converged, joint.Diagnostic);
        // The joint point is (3, 3 + 0.3·9) = (3, 5.7): both constraints active.
        Assert.Equal(3.0, joint.JointDesignPointU![0], 1e-5);
        Assert.Equal(5.7, joint.JointDesignPointU[1], 1e-5);
        var jointError = Math.Abs(joint.FailureProbability - exact) / exact;
        var individualError = Math.Abs(individual.FailureProbability - exact) / exact;
        Assert.True(jointError < 0.5, $"joint {joint.FailureProbability:G4} vs exact {exact:G4}");
        Assert.True(individualError > 100, $"individual {individual.FailureProbability:G4} vs exact {exact:G4}");
    }

    [Fact]
    public void Series_system_asked_for_the_joint_point_says_it_used_the_individual_points()
    {
        var result = SystemReliability.Analyze(new NatafTransformation(Model()), [Linear("g1", C1, A1), Linear("g2", C2, A2)], SystemKind.Series,
            new SystemOptions { Linearization = SystemLinearization.JointDesignPoint });
        Assert.Equal(SystemLinearization.IndividualDesignPoints, result.Linearization);
        Assert.NotNull(result.Diagnostic);
    }

    [Fact]
    public void Rejects_an_empty_list_of_limit_states()
    {
        var e = Assert.Throws<ArgumentException>(() => SystemReliability.Analyze(new NatafTransformation(Model()), [], SystemKind.Series));
        Assert.Equal("limitStates", e.ParamName);
    }
}

public class FirstOrderSystemTests
{
    [Fact]
    [Reference("Closed form: independent events, P(F1 ∪ F2) = 2Φ(−β) − Φ(−β)², relative accuracy at β = 5")]
    public void Small_union_probabilities_keep_relative_accuracy()
    {
        var p = StandardNormal.Cdf(-5);
        var events = new[] { new LinearizedEvent(5, [1.0, 0.0]), new LinearizedEvent(5, [0.0, 1.0]) };
        var result = FirstOrderSystem.Union(events);
        Assert.Equal(2 * p - p * p, result.Value, 1e-12 * p);
    }

    [Fact]
    [Reference("Closed form: identical events, P(F ∩ F) = P(F ∪ F) = Φ(−β)")]
    public void Identical_events_give_the_single_event_probability()
    {
        var alpha = new[] { 0.6, 0.8, 0.0, 0.0 };
        var events = new[] { new LinearizedEvent(3.5, alpha), new LinearizedEvent(3.5, alpha), new LinearizedEvent(4.0, [0.0, 0.0, 1.0, 0.0]), new LinearizedEvent(3.2, [0.0, 0.0, 0.0, 1.0]) };
        var p = StandardNormal.Cdf(-3.5) * StandardNormal.Cdf(-4.0) * StandardNormal.Cdf(-3.2);
        var intersection = FirstOrderSystem.Intersection(events, new MultinormalOptions { RelativeTolerance = 1e-4, AbsoluteTolerance = 1e-30 });
        Assert.Equal(p, intersection.Value, 4 * intersection.StandardError + 1e-12 * p);
        Assert.Equal(3, intersection.Rank);
    }

    [Fact]
    [Reference("Trivariate orthant closed form 1/8 + Σ asin ρij/(4π) with ρij = αiᵀαj")]
    public void Intersection_of_three_events_through_the_origin_matches_the_orthant_formula()
    {
        double[][] alphas = [[1, 0, 0], [0.6, 0.8, 0], [0, 0.6, 0.8]];
        var events = alphas.Select(a => new LinearizedEvent(0, a)).ToArray();
        var r = FirstOrderSystem.Correlation(events);
        var expected = 0.125 + (Math.Asin(r[0, 1]) + Math.Asin(r[0, 2]) + Math.Asin(r[1, 2])) / (4 * Math.PI);
        Assert.Equal(expected, FirstOrderSystem.Intersection(events).Value, 1e-13);
    }

    [Fact]
    public void Rejects_an_alpha_that_is_not_a_unit_vector()
    {
        var e = Assert.Throws<ArgumentException>(() => FirstOrderSystem.Intersection([new LinearizedEvent(3, [1.0, 1.0])]));
        Assert.Equal("events", e.ParamName);
    }
}
