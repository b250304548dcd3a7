namespace InspectionUpdate.Reliability.Simulation;

/// <summary>Sums over the samples of one or more blocks.</summary>
/// <param name="Samples">Samples drawn.</param>
/// <param name="Failures">Samples with g ≤ 0.</param>
/// <param name="SumWeight">Σ of the failure indicator times the sample weight (1 for crude Monte Carlo).</param>
/// <param name="SumWeightSquared">Σ of the squared weighted indicator.</param>
/// <param name="NonFinite">Samples where g was NaN or infinite (counted as safe).</param>
internal readonly record struct SampleSums(long Samples, long Failures, double SumWeight, double SumWeightSquared, long NonFinite)
{
    public SampleSums Add(SampleSums o) =>
        new(Samples + o.Samples, Failures + o.Failures, SumWeight + o.SumWeight, SumWeightSquared + o.SumWeightSquared, NonFinite + o.NonFinite);

    /// <summary>Mean of the weighted indicator: the Pf estimate.</summary>
    public double Mean => Samples == 0 ? double.NaN : SumWeight / Samples;

    /// <summary>
    /// Coefficient of variation of the mean from the sample variance of the weighted indicator:
    /// s² = (Σw² − N·p̂²)/(N − 1), CoV = √(s²/N)/p̂; +∞ without failures.
    /// </summary>
    public double CoefficientOfVariation
    {
        get
        {
            if (Failures == 0 || Samples < 2) return double.PositiveInfinity;
            var p = Mean;
            var variance = Math.Max(SumWeightSquared - Samples * p * p, 0.0) / (Samples - 1);
            return Math.Sqrt(variance / Samples) / p;
        }
    }
}

/// <summary>
/// Runs fixed-size sample blocks in parallel, each with its own seeded stream, and applies the stopping rule in
/// block order, so the outcome does not depend on the number of threads.
/// </summary>
internal static class BlockSampler
{
    /// <summary>Draws <paramref name="count"/> samples from <paramref name="stream"/> and returns their sums.</summary>
    public delegate SampleSums Block(SampleStream stream, int count);

    /// <summary>Outcome of a run.</summary>
    /// <param name="Total">Sums over the blocks up to and including the one that met the target (or all).</param>
    /// <param name="Evaluated">Samples actually evaluated, including blocks of the last round past the stopping point.</param>
    /// <param name="TargetMet">True when the target CoV was met.</param>
    public readonly record struct Outcome(SampleSums Total, long Evaluated, bool TargetMet);

    public static Outcome Run(SamplingOptions options, Block block, CancellationToken cancellationToken)
    {
        var blockSize = options.BlockSize;
        var max = options.MaxSamples;
        var blocks = (max + blockSize - 1) / blockSize;
        var threads = options.MaxDegreeOfParallelism ?? Environment.ProcessorCount;
        // The round size only schedules work (results are combined and tested block by block): one block per
        // thread at first, doubling to four per thread, so an early stop wastes little.
        var maxPerRound = threads == 1 ? 1 : 4 * threads;
        var perRound = threads;
        var results = new SampleSums[maxPerRound];
        var parallel = new ParallelOptions { MaxDegreeOfParallelism = threads, CancellationToken = cancellationToken };
        var total = default(SampleSums);
        long evaluated = 0;
        for (long first = 0; first < blocks; first += perRound, perRound = Math.Min(2 * perRound, maxPerRound))
        {
            var count = (int)Math.Min(perRound, blocks - first);
            var start = first;
            if (count == 1)
            {
                cancellationToken.ThrowIfCancellationRequested();
                results[0] = RunBlock(options, block, start, blockSize, max);
            }
            else
            {
                Parallel.For(0, count, parallel, j => results[j] = RunBlock(options, block, start + j, blockSize, max));
            }

            for (var j = 0; j < count; j++) evaluated += results[j].Samples;
            for (var j = 0; j < count; j++)
            {
                total = total.Add(results[j]);
                if (options.TargetCoefficientOfVariation is { } target && total.Failures > 0
                    && total.CoefficientOfVariation <= target)
                {
                    return new Outcome(total, evaluated, true);
                }
            }
        }

        return new Outcome(total, evaluated, false);
    }

    /// <summary>The shared result: estimate, CoV, generalized β, convergence and the reasons it failed.</summary>
    public static SimulationResult ToResult(string method, SamplingOptions options, Outcome outcome, string? note)
    {
        var total = outcome.Total;
        var p = total.Mean;
        var cov = total.CoefficientOfVariation;
        var problems = new List<string>();
        if (total.Failures == 0)
        {
            problems.Add(FormattableString.Invariant(
                $"No failure in {total.Samples} samples: Pf is below about {3.0 / total.Samples:G3} (95 % upper bound, rule of three)."));
        }
        else if (options.TargetCoefficientOfVariation is { } target && !outcome.TargetMet)
        {
            problems.Add(FormattableString.Invariant(
                $"Sample cap {options.MaxSamples} reached with CoV {cov:G3} above the target {target:G3}."));
        }

        if (total.NonFinite > 0)
        {
            problems.Add(FormattableString.Invariant(
                $"{total.NonFinite} samples gave a non-finite limit-state value and were counted as safe; the estimate is biased low."));
        }

        var converged = problems.Count == 0;
        if (note is not null) problems.Add(note);
        return new SimulationResult
        {
            FailureProbability = p,
            CoefficientOfVariation = cov,
            GeneralizedBeta = -Probability.StandardNormal.InverseCdf(Math.Clamp(p, 0.0, 1.0)),
            Samples = total.Samples,
            LimitStateEvaluations = outcome.Evaluated,
            Seed = options.Seed,
            Method = method,
            Converged = converged,
            Diagnostic = problems.Count == 0 ? null : string.Join(" ", problems),
        };
    }

    private static SampleSums RunBlock(SamplingOptions options, Block block, long index, int blockSize, long max)
    {
        var size = (int)Math.Min(blockSize, max - index * blockSize);
        return block(SampleStream.ForBlock(options.Seed, index), size);
    }
}
