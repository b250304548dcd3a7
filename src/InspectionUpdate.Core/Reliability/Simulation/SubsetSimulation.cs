using System.Globalization;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability.Systems;

namespace InspectionUpdate.Reliability.Simulation;

/// <summary>
/// Subset simulation (Au &amp; Beck 2001, Probabilistic Engineering Mechanics 16:263–277) in standard normal space
/// with the adaptive conditional sampler of Papaioannou, Betz, Zwirglmaier &amp; Straub (2015, PEM 41:89–103).
/// </summary>
/// <remarks>
/// <para>Level 0 draws N independent standard normal samples. Each level sets the threshold bⱼ at the p0-quantile
/// of G; the N·p0 samples below it seed Markov chains of length 1/p0 that stay conditional on G ≤ bⱼ. The chains use
/// conditional sampling: the candidate is v ~ N(ρu, diag(σ²)) with ρᵢ = √(1 − σᵢ²), which leaves the standard normal
/// density invariant in any dimension, accepted when G(v) ≤ bⱼ. The spreads σᵢ = min(1, λσ̂ᵢ) (σ̂ᵢ the sample standard
/// deviation of the seeds) adapt λ after every group of chains: λ ← λ·exp((â − a*)/√k).
/// The run stops at the first level whose threshold would be ≤ 0: Pf = p0^(m) · N_f/N.</para>
/// <para>The CoV estimate is that of Au &amp; Beck (2001): δⱼ² = (1 − Pⱼ)/(N Pⱼ)·(1 + γⱼ) with γⱼ from the
/// autocorrelation of the level indicator along the chains, and δ² ≈ Σδⱼ² (neglecting correlation between levels,
/// so it tends to understate the true CoV somewhat; Au &amp; Beck).</para>
/// <para>Seeded and reproducible: every chain has its own stream derived from (seed, level, chain), so the result does
/// not depend on the thread count. The performance function is called from several threads unless
/// <see cref="SubsetSimulationOptions.MaxDegreeOfParallelism"/> is 1.</para>
/// </remarks>
public static class SubsetSimulation
{
    /// <summary>The name reported in <see cref="SimulationResult.Method"/>.</summary>
    public const string MethodName = "subset simulation (adaptive conditional sampling)";

    /// <summary>Estimates P(G(U) ≤ 0) for U standard normal of the given dimension.</summary>
    /// <param name="performance">G(u): failure when ≤ 0. Must be thread-safe (see remarks). NaN values count as safe and are reported.</param>
    /// <param name="dimension">Length of u (≥ 1).</param>
    /// <param name="options">Settings; null for defaults.</param>
    /// <param name="cancellationToken">Stops the run between chain groups.</param>
    /// <exception cref="ArgumentOutOfRangeException">Dimension below 1 or an option out of range.</exception>
    public static SubsetSimulationResult Run(Func<ReadOnlySpan<double>, double> performance, int dimension, SubsetSimulationOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(performance);
        if (dimension < 1) throw new ArgumentOutOfRangeException(nameof(dimension), dimension, "The dimension of u must be at least 1.");
        options ??= SubsetSimulationOptions.Default;
        options.Validate();
        return new Runner(performance, dimension, options, cancellationToken).Run();
    }

    /// <summary>Estimates the failure probability of a reliability problem (G(u) = g(T⁻¹(u))).</summary>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static SubsetSimulationResult Run(ReliabilityProblem problem, SubsetSimulationOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(problem);
        return RunSystem(problem.Transformation, [problem.LimitState], SystemKind.Series, options, cancellationToken);
    }

    /// <summary>
    /// Estimates the failure probability of a system over one transformation: a series system fails when
    /// min gᵢ ≤ 0, a parallel system when max gᵢ ≤ 0.
    /// </summary>
    /// <remarks>Components should be scaled comparably: the intermediate thresholds act on min or max of the raw values.</remarks>
    /// <exception cref="ArgumentException">No limit states.</exception>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static SubsetSimulationResult RunSystem(IProbabilityTransformation transformation, IReadOnlyList<ILimitState> limitStates, SystemKind kind,
        SubsetSimulationOptions? options = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(transformation);
        ArgumentNullException.ThrowIfNull(limitStates);
        if (limitStates.Count == 0) throw new ArgumentException("A system needs at least one limit state.", nameof(limitStates));
        var m = transformation.PhysicalDimension;
        var components = limitStates.ToArray();
        double G(ReadOnlySpan<double> u)
        {
            Span<double> x = m <= 128 ? stackalloc double[m] : new double[m];
            transformation.ToPhysical(u, x);
            var value = components[0].Evaluate(x);
            for (var i = 1; i < components.Length; i++)
            {
                var gi = components[i].Evaluate(x);
                value = kind == SystemKind.Series ? Math.Min(value, gi) : Math.Max(value, gi);
            }

            return value;
        }

        var result = Run(G, transformation.StandardDimension, options, cancellationToken);
        // Each G call evaluates every component.
        var sim = result.Simulation with { LimitStateEvaluations = result.Simulation.LimitStateEvaluations * components.Length };
        return result with { Simulation = sim };
    }

    private sealed class Runner
    {
        private readonly Func<ReadOnlySpan<double>, double> _g;
        private readonly int _n;
        private readonly SubsetSimulationOptions _o;
        private readonly CancellationToken _cancel;
        private readonly ParallelOptions _parallel;
        private long _evaluations;
        private long _nonFinite;

        public Runner(Func<ReadOnlySpan<double>, double> g, int n, SubsetSimulationOptions o, CancellationToken cancel)
        {
            _g = g;
            _n = n;
            _o = o;
            _cancel = cancel;
            _parallel = new ParallelOptions { MaxDegreeOfParallelism = o.MaxDegreeOfParallelism ?? -1, CancellationToken = cancel };
        }

        private double Evaluate(ReadOnlySpan<double> u)
        {
            var v = _g(u);
            Interlocked.Increment(ref _evaluations);
            if (double.IsNaN(v))
            {
                Interlocked.Increment(ref _nonFinite);
                return double.PositiveInfinity;
            }

            return v;
        }

        public SubsetSimulationResult Run()
        {
            var nSamples = _o.SamplesPerLevel;
            var p0 = _o.LevelProbability;
            var nc = (int)Math.Round(nSamples * p0);
            var ns = (int)Math.Round(1 / p0);
            var u = new double[nSamples][];
            var g = new double[nSamples];

            // Level 0: direct Monte Carlo, one stream per block of 64 samples.
            const int block = 64;
            var blocks = (nSamples + block - 1) / block;
            Parallel.For(0, blocks, _parallel, b =>
            {
                var stream = SampleStream.ForBlock(_o.Seed, b);
                for (var k = b * block; k < Math.Min(nSamples, (b + 1) * block); k++)
                {
                    u[k] = new double[_n];
                    stream.NextStandardNormal(u[k]);
                    g[k] = Evaluate(u[k]);
                }
            });

            var levels = new List<SubsetLevel>();
            var chainIndicators = (int[][]?)null;
            var lastAcceptance = double.NaN;
            var lastScaling = double.NaN;
            var logPf = 0.0;
            var cov2 = 0.0;
            var converged = false;
            string? diagnostic = null;
            var totalSamples = (long)nSamples;

            for (var level = 0; ; level++)
            {
                var order = Enumerable.Range(0, nSamples).OrderBy(i => g[i]).ThenBy(i => i).ToArray();
                var threshold = 0.5 * (g[order[nc - 1]] + g[order[nc]]);
                var failures = g.Count(v => v <= 0);
                var last = threshold <= 0 || failures >= nc;
                double pj;
                double b;
                if (last)
                {
                    b = 0;
                    pj = (double)failures / nSamples;
                }
                else
                {
                    b = threshold;
                    pj = p0;
                }

                var gamma = chainIndicators is null ? 0 : Gamma(chainIndicators, g, b, nc, ns, pj);
                var deltaJ2 = pj > 0 ? (1 - pj) / (nSamples * pj) * (1 + gamma) : double.PositiveInfinity;
                levels.Add(new SubsetLevel(b, pj, Math.Sqrt(deltaJ2), gamma, lastAcceptance, lastScaling));
                logPf += Math.Log(pj);
                cov2 += deltaJ2;

                if (last)
                {
                    converged = failures > 0;
                    if (!converged) diagnostic = "No sample reached the failure domain at the last level.";
                    break;
                }

                if (!double.IsFinite(threshold) || level + 1 >= _o.MaxLevels)
                {
                    diagnostic = !double.IsFinite(threshold)
                        ? "The intermediate threshold is not finite (too many non-finite performance values)."
                        : string.Create(CultureInfo.InvariantCulture, $"The failure domain was not reached within {_o.MaxLevels} levels (last threshold {threshold:G4}); the estimate is an upper bound of sorts.");
                    logPf += Math.Log((double)failures / nSamples);
                    break;
                }

                if (levels.Count >= 2 && !(threshold < levels[^2].Threshold))
                {
                    diagnostic = string.Create(CultureInfo.InvariantCulture, $"The threshold stopped decreasing at level {level} (b = {threshold:G4}): G has a plateau.");
                    logPf += Math.Log(Math.Max(failures, 0) / (double)nSamples);
                    break;
                }

                _cancel.ThrowIfCancellationRequested();
                var seeds = order.Take(nc).ToArray();
                (chainIndicators, lastAcceptance, lastScaling) = Chains(level + 1, seeds, u, g, threshold, ns);
                totalSamples += nSamples - nc;
            }

            var pf = Math.Exp(logPf);
            var cov = pf > 0 ? Math.Sqrt(cov2) : double.PositiveInfinity;
            if (_nonFinite > 0)
            {
                diagnostic = (diagnostic is null ? "" : diagnostic + " ") +
                    string.Create(CultureInfo.InvariantCulture, $"{_nonFinite} performance values were NaN and counted as safe.");
            }

            var keep = _o.KeepFailureSamples && converged
                ? Enumerable.Range(0, nSamples).Where(i => g[i] <= 0).Select(i => (double[])u[i].Clone()).ToArray()
                : [];
            return new SubsetSimulationResult
            {
                Simulation = new SimulationResult
                {
                    FailureProbability = pf,
                    CoefficientOfVariation = cov,
                    GeneralizedBeta = pf > 0 ? -StandardNormal.InverseCdf(Math.Min(pf, 1)) : double.PositiveInfinity,
                    Samples = totalSamples,
                    LimitStateEvaluations = _evaluations,
                    Seed = _o.Seed,
                    Method = MethodName,
                    Converged = converged,
                    Diagnostic = diagnostic,
                },
                Levels = levels,
                FailureSamplesU = keep,
            };
        }

        /// <summary>
        /// Grows a chain of length <paramref name="ns"/> from each seed, conditional on G ≤ b; replaces u and g by the
        /// new level's samples (chain k occupies entries k·ns … k·ns + ns − 1) and returns the chain layout.
        /// </summary>
        private (int[][] Chains, double Acceptance, double Scaling) Chains(int level, int[] seeds, double[][] u, double[] g, double b, int ns)
        {
            var nc = seeds.Length;
            var seedU = seeds.Select(i => (double[])u[i].Clone()).ToArray();
            var seedG = seeds.Select(i => g[i]).ToArray();

            // Random order of the seeds so the adaptation sees a mixed sample (stream fixed by seed and level).
            var shuffle = SampleStream.ForBlock(_o.Seed, -level);
            var perm = Enumerable.Range(0, nc).ToArray();
            for (var i = nc - 1; i > 0; i--)
            {
                var j = (int)(shuffle.NextUniform() * (i + 1));
                (perm[i], perm[j]) = (perm[j], perm[i]);
            }

            // σ̂ᵢ: sample standard deviation of the seeds per coordinate.
            var sigmaHat = new double[_n];
            for (var d = 0; d < _n; d++)
            {
                var mean = 0.0;
                for (var k = 0; k < nc; k++) mean += seedU[k][d];
                mean /= nc;
                var ss = 0.0;
                for (var k = 0; k < nc; k++) ss += (seedU[k][d] - mean) * (seedU[k][d] - mean);
                sigmaHat[d] = nc > 1 ? Math.Sqrt(ss / (nc - 1)) : 1;
            }

            var groupSize = Math.Max(1, (int)Math.Round(_o.AdaptationFraction * nc));
            var lambda = _o.InitialScaling;
            var chains = new int[nc][];
            long accepted = 0, proposed = 0;
            var group = 0;
            for (var start = 0; start < nc; start += groupSize, group++)
            {
                _cancel.ThrowIfCancellationRequested();
                var end = Math.Min(nc, start + groupSize);
                var sigma = new double[_n];
                var rho = new double[_n];
                for (var d = 0; d < _n; d++)
                {
                    sigma[d] = Math.Min(1, lambda * sigmaHat[d]);
                    rho[d] = Math.Sqrt(1 - sigma[d] * sigma[d]);
                }

                var acceptedInGroup = new long[end - start];
                Parallel.For(start, end, _parallel, c =>
                {
                    var chain = perm[c];
                    var stream = SampleStream.ForBlock(_o.Seed, ((long)level << 32) + chain + 1);
                    var current = (double[])seedU[chain].Clone();
                    var gCurrent = seedG[chain];
                    var candidate = new double[_n];
                    var baseIndex = chain * ns;
                    u[baseIndex] = (double[])current.Clone();
                    g[baseIndex] = gCurrent;
                    long acc = 0;
                    for (var s = 1; s < ns; s++)
                    {
                        for (var d = 0; d < _n; d++) candidate[d] = rho[d] * current[d] + sigma[d] * stream.NextStandardNormal();
                        var gc = Evaluate(candidate);
                        if (gc <= b)
                        {
                            Array.Copy(candidate, current, _n);
                            gCurrent = gc;
                            acc++;
                        }

                        u[baseIndex + s] = (double[])current.Clone();
                        g[baseIndex + s] = gCurrent;
                    }

                    acceptedInGroup[c - start] = acc;
                    chains[chain] = Enumerable.Range(baseIndex, ns).ToArray();
                });

                var acceptedGroup = acceptedInGroup.Sum();
                var proposedGroup = (long)(end - start) * (ns - 1);
                accepted += acceptedGroup;
                proposed += proposedGroup;
                var rate = proposedGroup > 0 ? (double)acceptedGroup / proposedGroup : _o.TargetAcceptance;
                lambda *= Math.Exp((rate - _o.TargetAcceptance) / Math.Sqrt(group + 1));
            }

            return (chains, proposed > 0 ? (double)accepted / proposed : double.NaN, lambda);
        }

        /// <summary>
        /// γⱼ = 2 Σₖ₌₁^{Ns−1} (1 − k/Ns) ρⱼ(k) from the indicator I(G ≤ b) along the chains (Au &amp; Beck 2001, eq. 29
        /// and following).
        /// </summary>
        private static double Gamma(int[][] chains, double[] g, double b, int nc, int ns, double pj)
        {
            var n = nc * ns;
            var r0 = 0.0;
            foreach (var chain in chains)
            {
                foreach (var i in chain) r0 += g[i] <= b ? 1 : 0;
            }

            r0 = r0 / n - pj * pj;
            if (!(r0 > 0)) return 0;
            var gamma = 0.0;
            for (var k = 1; k < ns; k++)
            {
                var sum = 0.0;
                foreach (var chain in chains)
                {
                    for (var l = 0; l + k < ns; l++)
                    {
                        if (g[chain[l]] <= b && g[chain[l + k]] <= b) sum += 1;
                    }
                }

                var rk = sum / (n - k * nc) - pj * pj;
                gamma += 2 * (1 - (double)k / ns) * rk / r0;
            }

            return Math.Max(gamma, 0);
        }
    }
}
