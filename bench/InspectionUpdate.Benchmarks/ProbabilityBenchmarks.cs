using BenchmarkDotNet.Attributes;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Benchmarks;

/// <summary>
/// Cost of the probability layer inside FORM: one u → x mapping per family (in the body and in the far tails), the
/// Nataf u → x map and Jacobian of six correlated non-normal inputs, and building that transformation (fictive
/// correlations by quadrature).
/// Run: dotnet run -c Release --project bench/InspectionUpdate.Benchmarks -- --filter '*Probability*' --job short
/// </summary>
[MemoryDiagnoser]
[MedianColumn]
public class ProbabilityBenchmarks
{
    // Standard normal points spread over the body and both tails (|u| up to 8, i.e. probabilities near 1e-15).
    private static readonly double[] Points = Enumerable.Range(0, 64).Select(i => -8 + 16.0 * i / 63).ToArray();

    private RandomVariable _variable = null!;

    /// <summary>Distribution family mapped by <see cref="FromStandardNormal"/>.</summary>
    [Params("normal", "lognormal", "gumbel", "weibull", "gamma", "beta", "truncated-normal")]
    public string Family { get; set; } = "normal";

    [GlobalSetup]
    public void Setup()
    {
        _variable = Family switch
        {
            "normal" => new NormalVariable("X", 10, 2),
            "lognormal" => LognormalVariable.FromMeanCov("X", 10, 0.3),
            "gumbel" => GumbelVariable.FromMeanCov("X", 10, 0.3),
            "weibull" => WeibullVariable.FromMeanCov("X", 10, 0.3),
            "gamma" => GammaVariable.FromMeanCov("X", 10, 0.3),
            "beta" => BetaVariable.FromParameters("X", 2, 3, 5, 20),
            _ => TruncatedNormalVariable.FromParameters("X", 10, 4, 5, double.PositiveInfinity),
        };
    }

    /// <summary>x = F⁻¹(Φ(u)) at 64 points over u ∈ [−8, 8]; divide by 64 for one mapping.</summary>
    [Benchmark]
    public double FromStandardNormal()
    {
        var s = 0.0;
        foreach (var u in Points) s += _variable.FromStandardNormal(u);
        return s;
    }

}

/// <summary>The Nataf transformation of six correlated non-normal inputs (see <see cref="ProbabilityBenchmarks"/>).</summary>
[MemoryDiagnoser]
[MedianColumn]
public class ProbabilityNatafBenchmarks
{
    private readonly double[] _u = [0.3, -1.2, 2.5, -0.7, 1.1, -2.9];
    private readonly double[] _x = new double[6];
    private readonly double[] _jacobian = new double[36];
    private NatafTransformation _nataf = null!;
    private StochasticModel _model = null!;

    [GlobalSetup]
    public void Setup()
    {
        _model = SixCorrelated();
        _nataf = new NatafTransformation(_model);
    }

    /// <summary>Nataf u → x for six correlated inputs (lognormal, Gumbel, Weibull, gamma, beta, truncated normal).</summary>
    [Benchmark]
    public double NatafToPhysical()
    {
        _nataf.ToPhysical(_u, _x);
        return _x[0];
    }

    /// <summary>Nataf Jacobian ∂x/∂u for the same six inputs.</summary>
    [Benchmark]
    public double NatafJacobian()
    {
        _nataf.JacobianPhysicalByStandard(_u, _jacobian);
        return _jacobian[0];
    }

    /// <summary>Building the transformation: 15 fictive correlations (closed forms and 48×48 Gauss–Hermite solutions).</summary>
    [Benchmark]
    public NatafTransformation NatafConstruction() => new(_model);

    private static StochasticModel SixCorrelated()
    {
        var vars = new RandomVariable[]
        {
            LognormalVariable.FromMeanCov("R", 300, 0.1),
            GumbelVariable.FromMeanCov("S", 150, 0.3),
            WeibullVariable.FromMeanCov("W", 5, 0.25),
            GammaVariable.FromMeanCov("G", 2, 0.4),
            BetaVariable.FromParameters("B", 2, 3, 0, 1),
            TruncatedNormalVariable.FromParameters("T", 1, 0.5, 0, double.PositiveInfinity),
        };
        var r = new double[6, 6];
        for (var i = 0; i < 6; i++)
        {
            r[i, i] = 1;
            for (var j = 0; j < i; j++) r[i, j] = r[j, i] = 0.2;
        }

        return new StochasticModel(vars, new CorrelationMatrix(r));
    }
}
