namespace InspectionUpdate.Updating.Sampling;

/// <summary>
/// The sampling density q(u) of a sample set in the standard normal space of the model inputs: a mixture of the
/// prior N(0, I) (the defensive component, Hesterberg 1995, Technometrics 37(2):185–194, which keeps every weight
/// φ/q ≤ 1/w₀) and Gaussians N(cⱼ, κ²S) sharing the Laplace covariance S of the posterior, inflated by κ.
/// </summary>
internal sealed class SamplingMixture
{
    private const double HalfLog2Pi = 0.91893853320467274178;
    private readonly double[][] _centres;
    private readonly double[] _logWeights;
    private readonly double[] _cumulative;
    private readonly double[,] _lower;
    private readonly double _logNorm;
    private readonly int _d;

    /// <param name="priorWeight">Weight of N(0, I).</param>
    /// <param name="centres">Centres of the other components, with their weights (summing to 1 − priorWeight).</param>
    /// <param name="lower">Lower Cholesky factor of κ²S.</param>
    /// <param name="logDet">ln det(κ²S).</param>
    public SamplingMixture(double priorWeight, IReadOnlyList<(double[] Centre, double Weight)> centres, double[,] lower, double logDet)
    {
        _d = lower.GetLength(0);
        _lower = lower;
        _centres = centres.Select(c => c.Centre).ToArray();
        _logWeights = [Math.Log(priorWeight), .. centres.Select(c => Math.Log(c.Weight))];
        _cumulative = new double[_logWeights.Length];
        var total = 0.0;
        for (var j = 0; j < _logWeights.Length; j++)
        {
            total += Math.Exp(_logWeights[j]);
            _cumulative[j] = total;
        }

        for (var j = 0; j < _cumulative.Length; j++) _cumulative[j] /= total;
        _logNorm = -_d * HalfLog2Pi - 0.5 * logDet;
    }

    /// <summary>Centres of the non-prior components (u-space).</summary>
    public IReadOnlyList<double[]> Centres => _centres;

    /// <summary>Draws u from the mixture.</summary>
    public void Draw(Random rng, Span<double> u)
    {
        var pick = rng.NextDouble();
        var j = 0;
        while (j < _cumulative.Length - 1 && pick >= _cumulative[j]) j++;
        Span<double> z = stackalloc double[_d];
        for (var i = 0; i < _d; i++) z[i] = Gaussian(rng);
        if (j == 0)
        {
            z.CopyTo(u);
            return;
        }

        var c = _centres[j - 1];
        for (var i = 0; i < _d; i++)
        {
            var s = c[i];
            for (var k = 0; k <= i; k++) s += _lower[i, k] * z[k];
            u[i] = s;
        }
    }

    /// <summary>ln q(u).</summary>
    public double LogDensity(ReadOnlySpan<double> u)
    {
        var prior = -_d * HalfLog2Pi;
        for (var i = 0; i < _d; i++) prior -= 0.5 * u[i] * u[i];
        var max = _logWeights[0] + prior;
        Span<double> terms = _centres.Length + 1 <= 64 ? stackalloc double[_centres.Length + 1] : new double[_centres.Length + 1];
        terms[0] = max;
        Span<double> z = stackalloc double[_d];
        for (var j = 0; j < _centres.Length; j++)
        {
            var c = _centres[j];
            var q = 0.0;
            for (var i = 0; i < _d; i++)
            {
                var s = u[i] - c[i];
                for (var k = 0; k < i; k++) s -= _lower[i, k] * z[k];
                z[i] = s / _lower[i, i];
                q += z[i] * z[i];
            }

            terms[j + 1] = _logWeights[j + 1] + _logNorm - 0.5 * q;
            if (terms[j + 1] > max) max = terms[j + 1];
        }

        var sum = 0.0;
        foreach (var t in terms) sum += Math.Exp(t - max);
        return max + Math.Log(sum);
    }

    /// <summary>ln φ(u) of the standard normal prior.</summary>
    public static double LogPrior(ReadOnlySpan<double> u)
    {
        var s = -u.Length * HalfLog2Pi;
        foreach (var v in u) s -= 0.5 * v * v;
        return s;
    }

    private static double Gaussian(Random rng)
    {
        // Box–Muller, one value per call: the stream is simple to reproduce from the seed.
        var u1 = 1.0 - rng.NextDouble();
        var u2 = rng.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}
