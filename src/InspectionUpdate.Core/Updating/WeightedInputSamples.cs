using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>
/// Posterior summaries and histogram draws from weighted samples of the model inputs, shared by the per-time simulation
/// route (<see cref="UpdatingSession"/>) and the sample-set route: weighted mean, standard deviation and 5/50/95 %
/// quantiles; prior draws by the transformation of independent standard normals, posterior draws by systematic
/// resampling of the weights.
/// </summary>
internal static class WeightedInputSamples
{
    /// <summary>The summary of every random input; <paramref name="value"/>(k, i) is input i of sample k.</summary>
    public static IReadOnlyList<InputPosterior> Summaries(StochasticModel model, int count, Func<int, int, double> value, double[] w)
    {
        var total = w.Sum();
        // Samples of zero weight (contradicting a finding) change no moment or quantile: only the others are sorted.
        var kept = new List<int>(count);
        for (var k = 0; k < count; k++)
        {
            if (w[k] > 0) kept.Add(k);
        }

        var n = kept.Count;
        var weights = new double[n];
        for (var j = 0; j < n; j++) weights[j] = w[kept[j]];
        var inputs = new List<InputPosterior>();
        var values = new double[n];
        var sortedWeights = new double[n];
        foreach (var i in model.RandomIndices)
        {
            var v = model.Variables[i];
            for (var j = 0; j < n; j++) values[j] = value(kept[j], i);
            double mean = 0, second = 0;
            for (var j = 0; j < n; j++) mean += weights[j] * values[j];
            mean /= total;
            for (var j = 0; j < n; j++) second += weights[j] * (values[j] - mean) * (values[j] - mean);
            weights.CopyTo(sortedWeights, 0);
            Array.Sort(values, sortedWeights);
            inputs.Add(new InputPosterior(v.Name, v.Mean, v.StandardDeviation, mean, Math.Sqrt(second / total),
                Quantile(values, sortedWeights, total, 0.05), Quantile(values, sortedWeights, total, 0.50), Quantile(values, sortedWeights, total, 0.95)));
        }

        return inputs;
    }

    /// <summary>Prior and posterior draws of every random input (reproducible from the seed).</summary>
    public static IReadOnlyList<InputSamples> Draws(StochasticModel model, Func<int, int, double> value, double[] w, int draws, int seed)
    {
        var transformation = new NatafTransformation(model);
        var rng = new Random(unchecked(seed * 31 + 7));
        var u = new double[transformation.StandardDimension];
        var x = new double[transformation.PhysicalDimension];
        var prior = new double[draws][];
        for (var k = 0; k < draws; k++)
        {
            for (var i = 0; i < u.Length; i++) u[i] = StandardNormal.InverseCdf(1 - rng.NextDouble());
            transformation.ToPhysical(u, x);
            prior[k] = (double[])x.Clone();
        }

        var total = w.Sum();
        var picks = new int[draws];
        var step = total / draws;
        var next = rng.NextDouble() * step;
        var cumulative = 0.0;
        var j = 0;
        for (var k = 0; k < draws; k++)
        {
            while (j < w.Length - 1 && cumulative + w[j] < next)
            {
                cumulative += w[j];
                j++;
            }

            picks[k] = j;
            next += step;
        }

        return model.RandomIndices
            .Select(i => new InputSamples(model.Variables[i].Name, prior.Select(p => p[i]).ToArray(), picks.Select(k => value(k, i)).ToArray()))
            .ToArray();
    }

    /// <summary>The weighted p-quantile of values sorted in increasing order with their weights.</summary>
    private static double Quantile(double[] sortedValues, double[] sortedWeights, double total, double p)
    {
        var target = p * total;
        var cum = 0.0;
        for (var k = 0; k < sortedValues.Length; k++)
        {
            cum += sortedWeights[k];
            if (cum >= target) return sortedValues[k];
        }

        return sortedValues.Length == 0 ? double.NaN : sortedValues[^1];
    }
}
