using InspectionUpdate.Probability;

namespace InspectionUpdate.Reliability.Verification;

/// <summary>
/// Problems of the public reliability benchmark collections: the reliability problem repository (RP numbers, Rozsás
/// &amp; Slobbe, rprepo.readthedocs.io) whose problems were also used in the black-box reliability challenge 2019, and
/// the four-branch series system of Waarts (2000). Every limit state and input was written here from the published
/// description (the repository's pages and the problem descriptions of OpenTURNS' benchmark package otbenchmark);
/// failure is g ≤ 0. The reference values and their sources are kept, with the values of the other sources, in
/// tests/InspectionUpdate.Core.Tests/data/benchmarks/ (a test checks that these constants match that file).
/// </summary>
public static class BenchmarkProblems
{
    private const string Repo = "reliability problem repository (rprepo.readthedocs.io), as described in otbenchmark";
    private const string Quadrature = "independent quadrature in the tests (this project)";
    private static readonly double Sqrt2 = Math.Sqrt(2);

    /// <summary>All problems, in collection order.</summary>
    public static IReadOnlyList<BenchmarkProblem> All { get; } = Build();

    /// <summary>The problem with the given identifier (case-insensitive), or null.</summary>
    public static BenchmarkProblem? Find(string id) => All.FirstOrDefault(p => string.Equals(p.Id, id, StringComparison.OrdinalIgnoreCase));

    private static NormalVariable N(string name, double mean, double sd) => new(name, mean, sd);

    private static RandomVariable[] StandardNormals(int count, string prefix = "X") =>
        Enumerable.Range(1, count).Select(i => (RandomVariable)N(prefix + i, 0, 1)).ToArray();

    private static ReliabilityProblem Make(string name, IReadOnlyList<RandomVariable> inputs, LimitStateFunction g) =>
        new(new StochasticModel(inputs), new LimitState(name, g));

    private static double Rp22(ReadOnlySpan<double> x) => 2.5 - (x[0] + x[1]) / Sqrt2 + 0.1 * (x[0] - x[1]) * (x[0] - x[1]);

    private static List<BenchmarkProblem> Build()
    {
        var list = new List<BenchmarkProblem>
        {
            new()
            {
                Id = "RP8", Source = Repo, Description = "X1 + 2X2 + 2X3 + X4 − 5X5 − 5X6; six lognormals (means 120, 120, 120, 120, 50, 40; CoV 0.1, 0.1, 0.1, 0.1, 0.2, 0.2)",
                Problem = Make("RP8",
                    [LognormalVariable.FromMeanStd("X1", 120, 12), LognormalVariable.FromMeanStd("X2", 120, 12), LognormalVariable.FromMeanStd("X3", 120, 12),
                     LognormalVariable.FromMeanStd("X4", 120, 12), LognormalVariable.FromMeanStd("X5", 50, 10), LognormalVariable.FromMeanStd("X6", 40, 8)],
                    x => x[0] + 2 * x[1] + 2 * x[2] + x[3] - 5 * x[4] - 5 * x[5]),
                ReferencePf = 7.84e-4, ReferenceRelativeUncertainty = 0.01, ReferenceSource = "rprepo RP8 page (7.84e-4)",
                Features = BenchmarkFeature.NonNormalInputs,
            },
            new()
            {
                Id = "RP14", Source = Repo, Description = "X1 − 32/(πX2³)·√(X3²X4²/16 + X5²); X1 U(70, 80), X2 N(39, 0.1), X3 Gumbel(mean 1500, sd 350), X4 N(400, 0.1), X5 N(250000, 35000)",
                Problem = Make("RP14",
                    [UniformVariable.FromBounds("X1", 70, 80), N("X2", 39, 0.1), GumbelVariable.FromMeanStd("X3", 1500, 350), N("X4", 400, 0.1), N("X5", 250000, 35000)],
                    x => x[0] - 32 / (Math.PI * x[1] * x[1] * x[1]) * Math.Sqrt(x[2] * x[2] * x[3] * x[3] / 16 + x[4] * x[4])),
                ReferencePf = 7.7285e-4, ReferenceRelativeUncertainty = 0.01, ReferenceSource = "otbenchmark benchmark table, 'Exact' column (7.7285e-4); see the data README",
                Features = BenchmarkFeature.NonNormalInputs | BenchmarkFeature.UnusedInputs,
            },
            new()
            {
                Id = "RP22", Source = Repo, Description = "2.5 − (X1 + X2)/√2 + 0.1(X1 − X2)²; X1, X2 standard normal",
                Problem = Make("RP22", StandardNormals(2), Rp22),
                ReferencePf = Refs.Rp22, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
            },
            new()
            {
                Id = "RP24", Source = Repo, Description = "2.5 − 0.2357(X1 − X2) + 0.00463(X1 + X2 − 20)⁴; X1, X2 N(10, 3)",
                Problem = Make("RP24", [N("X1", 10, 3), N("X2", 10, 3)], x => 2.5 - 0.2357 * (x[0] - x[1]) + 0.00463 * Math.Pow(x[0] + x[1] - 20, 4)),
                ReferencePf = Refs.Rp24, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP25", Source = Repo, Description = "max(X1² − 8X2 + 16, −16X1 + X2 + 32) (parallel system); X1, X2 standard normal",
                Problem = Make("RP25", StandardNormals(2), x => Math.Max(x[0] * x[0] - 8 * x[1] + 16, -16 * x[0] + x[1] + 32)),
                ReferencePf = Refs.Rp25, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.FormKnownToFail | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP28", Source = Repo, Description = "X1·X2 − 146.14; X1 N(78064, 11710), X2 N(0.0104, 0.00156)",
                Problem = Make("RP28", [N("X1", 78064, 11710), N("X2", 0.0104, 0.00156)], x => x[0] * x[1] - 146.14),
                ReferencePf = Refs.Rp28, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.MultipleDesignPoints,
            },
            new()
            {
                Id = "RP31", Source = Repo, Description = "2 − X2 + 256X1⁴; X1, X2 standard normal",
                Problem = Make("RP31", StandardNormals(2), x => 2 - x[1] + 256 * Math.Pow(x[0], 4)),
                ReferencePf = Refs.Rp31, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP33", Source = Repo, Description = "min(−X1 − X2 − X3 + 3√3, −X3 + 3) (series system); X1..X3 standard normal",
                Problem = Make("RP33", StandardNormals(3), x => Math.Min(-x[0] - x[1] - x[2] + 3 * Math.Sqrt(3), 3 - x[2])),
                ReferencePf = Refs.Rp33, ReferenceRelativeUncertainty = 0, ReferenceSource = "closed form 2Φ(−3) − Φ₂(−3, −3; 1/√3)",
                Features = BenchmarkFeature.System | BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP35", Source = Repo, Description = "min(2 − X2 + exp(−0.1X1²) + (0.2X1)⁴, 4.5 − X1X2) (series system); X1, X2 standard normal",
                Problem = Make("RP35", StandardNormals(2), x => Math.Min(2 - x[1] + Math.Exp(-0.1 * x[0] * x[0]) + Math.Pow(0.2 * x[0], 4), 4.5 - x[0] * x[1])),
                ReferencePf = Refs.Rp35, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP38", Source = Repo, Description = "15.59e4 − X1X2³/(2X3³)·(X4² − 4X5X6X7² + X4(X6 + 4X5 + 2X6X7))/(X4X5(X4 + X6 + 2X6X7)); seven normals, CoV 0.1",
                Problem = Make("RP38",
                    [N("X1", 350, 35), N("X2", 50.8, 5.08), N("X3", 3.81, 0.381), N("X4", 173, 17.3), N("X5", 9.38, 0.938), N("X6", 33.1, 3.31), N("X7", 0.036, 0.0036)],
                    x => 15.59e4 - x[0] * x[1] * x[1] * x[1] / (2 * x[2] * x[2] * x[2])
                        * ((x[3] * x[3] - 4 * x[4] * x[5] * x[6] * x[6] + x[3] * (x[5] + 4 * x[4] + 2 * x[5] * x[6])) / (x[3] * x[4] * (x[3] + x[5] + 2 * x[5] * x[6])))),
                ReferencePf = 8.1e-3, ReferenceRelativeUncertainty = 0.01, ReferenceSource = "rprepo RP38 as quoted in otbenchmark (8.1e-3, two digits)",
            },
            new()
            {
                Id = "RP53", Source = Repo, Description = "sin(5X1/2) + 2 − (X1² + 4)(X2 − 1)/20; X1 N(1.5, 1), X2 N(2.5, 1)",
                Problem = Make("RP53", [N("X1", 1.5, 1), N("X2", 2.5, 1)], x => Math.Sin(2.5 * x[0]) + 2 - (x[0] * x[0] + 4) * (x[1] - 1) / 20),
                ReferencePf = Refs.Rp53, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP54", Source = Repo, Description = "X1 + … + X20 − 8.951; twenty exponentials with rate 1",
                Problem = Make("RP54", Enumerable.Range(1, 20).Select(i => (RandomVariable)ExponentialVariable.FromParameters("X" + i, 1)).ToArray(), x =>
                {
                    var s = 0.0;
                    foreach (var v in x) s += v;
                    return s - 8.951;
                }),
                ReferencePf = Refs.Rp54, ReferenceRelativeUncertainty = 0, ReferenceSource = "closed form: Gamma(20, 1) CDF at 8.951",
                Features = BenchmarkFeature.ManyInputs | BenchmarkFeature.NonNormalInputs | BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP55", Source = Repo, Description = "min of 0.2 + 0.6(X1 − X2)⁴ ∓ (X1 − X2)/√2 and ±(X1 − X2) + 5/√2 − 2.2 (series system); X1, X2 U(−1, 1)",
                Problem = Make("RP55", [UniformVariable.FromBounds("X1", -1, 1), UniformVariable.FromBounds("X2", -1, 1)], x =>
                {
                    var d = x[0] - x[1];
                    var q = 0.2 + 0.6 * d * d * d * d;
                    return Math.Min(Math.Min(q - d / Sqrt2, q + d / Sqrt2), Math.Min(d + 5 / Sqrt2 - 2.2, -d + 5 / Sqrt2 - 2.2));
                }),
                ReferencePf = Refs.Rp55, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.NonNormalInputs | BenchmarkFeature.FormKnownToFail | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP57", Source = Repo, Description = "min(max(−X1² + X2³ + 3, 2 − X1 − 8X2), (X1 + 3)² + (X2 + 3)² − 4); X1, X2 standard normal",
                Problem = Make("RP57", StandardNormals(2), x => Math.Min(Math.Max(-x[0] * x[0] + x[1] * x[1] * x[1] + 3, 2 - x[0] - 8 * x[1]),
                    (x[0] + 3) * (x[0] + 3) + (x[1] + 3) * (x[1] + 3) - 4)),
                ReferencePf = Refs.Rp57, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.FormKnownToFail | BenchmarkFeature.NonSmooth | BenchmarkFeature.MultipleDesignPoints,
            },
            new()
            {
                Id = "RP60", Source = Repo, Description = "min(X1 − X5, max(min(X2, X3, X4) − X5/2, max(X4, min(X2, X3)) − X5)); five lognormals (means 2200, 2100, 2300, 2000, 1200; CoV 0.1, X5 0.4)",
                Problem = Make("RP60",
                    [LognormalVariable.FromMeanStd("X1", 2200, 220), LognormalVariable.FromMeanStd("X2", 2100, 210), LognormalVariable.FromMeanStd("X3", 2300, 230),
                     LognormalVariable.FromMeanStd("X4", 2000, 200), LognormalVariable.FromMeanStd("X5", 1200, 480)],
                    x =>
                    {
                        var g9 = Math.Max(x[3] - x[4], Math.Min(x[1] - x[4], x[2] - x[4]));
                        var g10 = Math.Min(Math.Min(x[1], x[2]), x[3]) - x[4] / 2;
                        return Math.Min(x[0] - x[4], Math.Max(g10, g9));
                    }),
                ReferencePf = 4.56e-2, ReferenceRelativeUncertainty = 0.01, ReferenceSource = "rprepo RP60 as quoted in otbenchmark (4.56e-2)",
                Features = BenchmarkFeature.System | BenchmarkFeature.NonNormalInputs | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP63", Source = Repo, Description = "0.1·(X2² + … + X100²) − X1 − 4.5; one hundred standard normals",
                Problem = Make("RP63", StandardNormals(100), x =>
                {
                    var s = 0.0;
                    for (var i = 1; i < x.Length; i++) s += x[i] * x[i];
                    return 0.1 * s - x[0] - 4.5;
                }),
                ReferencePf = Refs.Rp63, ReferenceRelativeUncertainty = 0, ReferenceSource = "exact: E[Φ(4.5 − 0.1·χ²₉₉)] by quadrature in the tests",
                Features = BenchmarkFeature.ManyInputs | BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP75", Source = Repo, Description = "3 − X1X2; X1, X2 standard normal",
                Problem = Make("RP75", StandardNormals(2), x => 3 - x[0] * x[1]),
                ReferencePf = Refs.Rp75, ReferenceRelativeUncertainty = 0, ReferenceSource = "exact: 2∫φ(x)Φ(−3/x)dx over x > 0 by quadrature in the tests",
                Features = BenchmarkFeature.MultipleDesignPoints,
            },
            new()
            {
                Id = "RP77", Source = Repo, Description = "X1 − X2 − X3 if X3 ≤ 5, else X3 − X2; X1 N(10, 0.5), X2 N(0, 1), X3 N(4, 1)",
                Problem = Make("RP77", [N("X1", 10, 0.5), N("X2", 0, 1), N("X3", 4, 1)], x => x[2] <= 5 ? x[0] - x[1] - x[2] : x[2] - x[1]),
                ReferencePf = Refs.Rp77, ReferenceRelativeUncertainty = 0, ReferenceSource = "exact: one-dimensional integral over X3 in the tests",
                Features = BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP89", Source = Repo, Description = "min(−X1² − X2 + 8, −X1/5 − X2 + 6) (series system); X1, X2 standard normal",
                Problem = Make("RP89", StandardNormals(2), x => Math.Min(-x[0] * x[0] - x[1] + 8, -x[0] / 5 - x[1] + 6)),
                ReferencePf = Refs.Rp89, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.FormKnownToFail,
            },
            new()
            {
                Id = "RP91", Source = Repo, Description = "min of a quadratic in X2..X4 and two stress ratios 84000X1/… − 1 (series system); five normals",
                Problem = Make("RP91", [N("X1", 0.07433, 0.005), N("X2", 0.1, 0.01), N("X3", 13, 60), N("X4", 4751, 48), N("X5", -684, 11)], x =>
                {
                    var g1 = 0.847 + 0.96 * x[1] + 0.986 * x[2] - 0.216 * x[3] + 0.077 * x[1] * x[1] + 0.11 * x[2] * x[2] + 7.0 / 378 * x[3] * x[3]
                        - x[2] * x[1] - 0.106 * x[1] * x[3] - 0.11 * x[2] * x[3];
                    var g2 = 84000 * x[0] / Math.Sqrt(x[2] * x[2] + x[3] * x[3] - x[2] * x[3] + 3 * x[4] * x[4]) - 1;
                    var g3 = 84000 * x[0] / Math.Abs(x[3]) - 1;
                    return Math.Min(g1, Math.Min(g2, g3));
                }),
                ReferencePf = 6.97e-4, ReferenceRelativeUncertainty = 0.01, ReferenceSource = "rprepo RP91 as quoted in otbenchmark (6.97e-4)",
                Features = BenchmarkFeature.System | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP107", Source = Repo, Description = "5√10 − (X1 + … + X10); ten standard normals",
                Problem = Make("RP107", StandardNormals(10), x =>
                {
                    var s = 0.0;
                    foreach (var v in x) s += v;
                    return 5 * Math.Sqrt(10) - s;
                }),
                ReferencePf = Refs.Rp107, ReferenceRelativeUncertainty = 0, ReferenceSource = "closed form Φ(−5)",
            },
            new()
            {
                Id = "RP110", Source = Repo, Description = "min(X1 ≤ 3.5 ? 0.85 − 0.1X1 : 4 − X1, X2 ≤ 2 ? 2.3 − X2 : 0.5 − 0.1X2); X1, X2 standard normal",
                Problem = Make("RP110", StandardNormals(2), x => Math.Min(x[0] <= 3.5 ? 0.85 - 0.1 * x[0] : 4 - x[0], x[1] <= 2 ? 2.3 - x[1] : 0.5 - 0.1 * x[1])),
                ReferencePf = Refs.Rp110, ReferenceRelativeUncertainty = 0, ReferenceSource = "closed form Φ(−4) + Φ(−5) − Φ(−4)Φ(−5)",
                Features = BenchmarkFeature.System | BenchmarkFeature.NonSmooth | BenchmarkFeature.MultipleDesignPoints,
            },
            new()
            {
                Id = "RP111", Source = Repo, Description = "12.5 − |X1X2|; X1, X2 standard normal",
                Problem = Make("RP111", StandardNormals(2), x => 12.5 - Math.Abs(x[0] * x[1])),
                ReferencePf = Refs.Rp111, ReferenceRelativeUncertainty = 0, ReferenceSource = "exact: 4∫φ(x)Φ(−12.5/x)dx over x > 0 by quadrature in the tests",
                Features = BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "4-branch", Source = "four-branch series system, Waarts (2000) PhD thesis TU Delft (k = 7), as described in otbenchmark",
                Description = "min(3 + 0.1(X1 − X2)² ∓ (X1 + X2)/√2, ±(X1 − X2) + 7/√2); X1, X2 standard normal",
                Problem = Make("four-branch", StandardNormals(2), x =>
                {
                    var d = x[0] - x[1];
                    var s = (x[0] + x[1]) / Sqrt2;
                    var q = 3 + 0.1 * d * d;
                    return Math.Min(Math.Min(q - s, q + s), Math.Min(d + 7 / Sqrt2, -d + 7 / Sqrt2));
                }),
                ReferencePf = Refs.FourBranch, ReferenceRelativeUncertainty = 0, ReferenceSource = Quadrature,
                Features = BenchmarkFeature.System | BenchmarkFeature.MultipleDesignPoints | BenchmarkFeature.NonSmooth,
            },
            new()
            {
                Id = "RP22+8", Source = "RP22 of the reliability problem repository with eight inputs appended that g does not use (this project)",
                Description = "RP22's g of X1, X2; X3..X10 (normal, lognormal, Gumbel, uniform, exponential, Weibull) unused",
                Problem = Make("RP22 with unused inputs",
                    [.. StandardNormals(2), N("X3", 5, 2), LognormalVariable.FromMeanStd("X4", 10, 3), GumbelVariable.FromMeanStd("X5", 100, 30),
                     UniformVariable.FromBounds("X6", -1, 4), ExponentialVariable.FromParameters("X7", 0.5), WeibullVariable.FromParameters("X8", 2, 3),
                     N("X9", -50, 1), LognormalVariable.FromMeanStd("X10", 1, 0.5)],
                    Rp22),
                ReferencePf = Refs.Rp22, ReferenceRelativeUncertainty = 0, ReferenceSource = "equal to RP22's (the added inputs do not enter g)",
                Features = BenchmarkFeature.UnusedInputs | BenchmarkFeature.NonNormalInputs,
            },
        };
        return list;
    }

    /// <summary>Reference values computed by the tests' quadrature or closed forms (rounded to 6 significant digits; the quadrature grids agree to about 1e-4 relative).</summary>
    internal static class Refs
    {
        public const double Rp22 = 4.20731e-3;
        public const double Rp24 = 2.86044e-3;
        public const double Rp25 = 4.14980e-5;
        public const double Rp28 = 1.45330e-7;
        public const double Rp31 = 3.22668e-3;
        public const double Rp33 = 2.57560e-3;
        public const double Rp35 = 3.47895e-3;
        public const double Rp53 = 3.13205e-2;
        public const double Rp54 = 9.90603e-4;
        public const double Rp55 = 0.560014;
        public const double Rp57 = 2.82405e-2;
        public const double Rp63 = 3.76944e-4;
        public const double Rp75 = 9.81930e-3;
        public const double Rp77 = 2.69084e-7;
        public const double Rp89 = 5.47128e-3;
        public const double Rp107 = 2.86652e-7;
        public const double Rp110 = 3.19579e-5;
        public const double Rp111 = 8.03509e-7;
        public const double FourBranch = 2.22280e-3;
    }
}
