using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Columns;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Reports;
using BenchmarkDotNet.Running;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// FORM on a closed-form nonlinear limit state with 6 and 10 non-normal inputs, independent and correlated,
/// forward differences (the default route). Target: median ≤ 50 µs for 6 independent inputs.
/// Run: dotnet run -c Release --project bench/InspectionUpdate.Benchmarks -- --filter '*FormBenchmarks*' --job short
/// </summary>
[MemoryDiagnoser]
[MedianColumn]
[Config(typeof(Config))]
public class FormBenchmarks
{
    private ReliabilityProblem _problem = null!;
    private ReliabilityProblem _analytic = null!;

    /// <summary>Number of random inputs (all non-normal).</summary>
    [Params(6, 10)]
    public int Inputs { get; set; }

    /// <summary>Whether the inputs are correlated (Nataf with fictive correlations).</summary>
    [Params(false, true)]
    public bool Correlated { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _problem = Problem(Inputs, Correlated, analytic: false);
        _analytic = Problem(Inputs, Correlated, analytic: true);
    }

    /// <summary>FORM with forward differences (the default when the limit state has no gradient).</summary>
    [Benchmark(Baseline = true)]
    public FormResult Forward_differences() => FormSolver.Solve(_problem);

    /// <summary>FORM with the analytic gradient.</summary>
    [Benchmark]
    public FormResult Analytic_gradient() => FormSolver.Solve(_analytic);

    /// <summary>
    /// An invented member check: resistance R = f_y·Z·m·exp(−0.05·c) (yield stress, section modulus and model factor
    /// lognormal, corrosion allowance Weibull) against the load effect 2.5·(Σ Lᵢ + 0.01·L₄L₅ [+ 0.01·L₆L₇]) with
    /// Gumbel, Weibull and lognormal loads; 6 or 10 inputs, all non-normal.
    /// </summary>
    internal static ReliabilityProblem Problem(int n, bool correlated, bool analytic)
    {
        var vars = new List<RandomVariable>
        {
            LognormalVariable.FromMeanCov("fy", 355, 0.07),
            LognormalVariable.FromMeanCov("Z", 1.0, 0.05),
            LognormalVariable.FromMeanCov("m", 1.0, 0.1),
            WeibullVariable.FromMeanCov("c", 2.0, 0.5),
        };
        // Loads: Gumbel, Gumbel, Weibull, Gumbel, lognormal, Weibull, in that order.
        for (var i = vars.Count; i < n; i++)
        {
            var mean = 60.0 / (n - 4);
            var cov = 0.2 + 0.02 * i;
            vars.Add((i - 4) switch
            {
                0 or 1 or 3 => GumbelVariable.FromMeanCov($"L{i}", mean, cov),
                4 => LognormalVariable.FromMeanCov($"L{i}", mean, cov),
                _ => WeibullVariable.FromMeanCov($"L{i}", mean, cov),
            });
        }

        CorrelationMatrix? corr = null;
        if (correlated)
        {
            var r = new double[n, n];
            for (var i = 0; i < n; i++) r[i, i] = 1;
            // Resistance terms mildly correlated, loads pairwise correlated.
            Set(r, 0, 1, 0.3);
            Set(r, 0, 2, 0.2);
            for (var i = 4; i < n; i++)
                for (var j = 4; j < i; j++) Set(r, i, j, 0.4);
            corr = new CorrelationMatrix(r);
        }

        var model = new StochasticModel(vars, corr);
        var limitState = analytic
            ? new LimitState("member", G, (x, grad) =>
            {
                var e = Math.Exp(-0.05 * x[3]);
                var rr = x[0] * x[1] * x[2] * e;
                grad[0] = rr / x[0];
                grad[1] = rr / x[1];
                grad[2] = rr / x[2];
                grad[3] = -0.05 * rr;
                // Load effect 2.5·(Σ Lᵢ + 0.01·L₄·L₅ (+ 0.01·L₆·L₇ with 10 inputs)).
                for (var i = 4; i < x.Length; i++) grad[i] = -2.5;
                grad[4] -= 2.5 * 0.01 * x[5];
                grad[5] -= 2.5 * 0.01 * x[4];
                if (x.Length >= 8)
                {
                    grad[6] -= 2.5 * 0.01 * x[7];
                    grad[7] -= 2.5 * 0.01 * x[6];
                }

                return G(x);
            })
            : new LimitState("member", G);
        return new ReliabilityProblem(model, limitState);
    }

    private static double G(ReadOnlySpan<double> x)
    {
        var resistance = x[0] * x[1] * x[2] * Math.Exp(-0.05 * x[3]);
        var load = 0.01 * x[4] * x[5];
        if (x.Length >= 8) load += 0.01 * x[6] * x[7];
        for (var i = 4; i < x.Length; i++) load += x[i];
        return resistance - 2.5 * load;
    }

    private static void Set(double[,] r, int i, int j, double v)
    {
        r[i, j] = v;
        r[j, i] = v;
    }

    private sealed class Config : ManualConfig
    {
        public Config() => AddColumn(new EvaluationsColumn());
    }

    /// <summary>Limit-state evaluations and iterations of one FORM run (deterministic, computed once per case).</summary>
    private sealed class EvaluationsColumn : IColumn
    {
        public string Id => nameof(EvaluationsColumn);

        public string ColumnName => "Evaluations (iterations)";

        public bool AlwaysShow => true;

        public ColumnCategory Category => ColumnCategory.Custom;

        public int PriorityInCategory => 0;

        public bool IsNumeric => false;

        public UnitType UnitType => UnitType.Dimensionless;

        public string Legend => "Limit-state evaluations per FORM run (iHL-RF iterations in brackets)";

        public string GetValue(Summary summary, BenchmarkCase benchmarkCase)
        {
            var bench = new FormBenchmarks
            {
                Inputs = (int)benchmarkCase.Parameters[nameof(Inputs)],
                Correlated = (bool)benchmarkCase.Parameters[nameof(Correlated)],
            };
            FormResult result;
            try
            {
                bench.Setup();
                result = (FormResult)benchmarkCase.Descriptor.WorkloadMethod.Invoke(bench, null)!;
            }
            catch (Exception ex) when (ex is NotSupportedException or ArgumentException or System.Reflection.TargetInvocationException)
            {
                return "n/a: " + (ex.InnerException ?? ex).Message;
            }

            var flag = result.Converged ? "" : " not converged";
            return FormattableString.Invariant($"{result.LimitStateEvaluations} ({result.Iterations}){flag}");
        }

        public string GetValue(Summary summary, BenchmarkCase benchmarkCase, SummaryStyle style) => GetValue(summary, benchmarkCase);

        public bool IsDefault(Summary summary, BenchmarkCase benchmarkCase) => false;

        public bool IsAvailable(Summary summary) => true;
    }
}
