using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using InspectionUpdate.Planning;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Application;

/// <summary>
/// The keys stored results are filed under. A result is valid while its key matches the key computed now from the
/// register: the component's model revision, its fingerprint (own findings, repairs, model, methods used), the
/// evidence date, the options that change numbers, and the tool's version and build.
/// </summary>
public static class ResultKeys
{
    /// <summary>Canonical text of the options that change a component's numbers (part of the key and of the row's identity).</summary>
    public static string Options(UpdatingRoute route, AnnualTarget target, double? horizonYears, SamplingSettings? sampling = null, AfterDetection afterDetection = AfterDetection.Monitor)
    {
        ArgumentNullException.ThrowIfNull(target);
        var routeText = route switch
        {
            UpdatingRoute.FirstOrder => "first-order",
            UpdatingRoute.Simulation => "simulation",
            _ => "auto",
        };
        return string.Create(CultureInfo.InvariantCulture,
            $"route={routeText};target={AnnualTarget.MeasureName(target.Measure)}:{target.AnnualPf:R};horizon={(horizonYears is { } h ? h.ToString("R", CultureInfo.InvariantCulture) : "model")};steps-per-year=1;schedule=none;after-detection={DetectionBranch.Key(afterDetection)}")
            + (route == UpdatingRoute.FirstOrder ? "" : ";sampling=" + (sampling ?? SamplingSettings.Default));
    }

    /// <summary>SHA-256 (hex) of the key fields, one per line.</summary>
    public static string Compute(int modelRevision, string componentFingerprint, DateOnly asOf, string optionsKey, string toolVersion)
    {
        var text = string.Create(CultureInfo.InvariantCulture,
            $"inspection-update/result-key/1\nmodel-revision={modelRevision}\ncomponent={componentFingerprint}\nas-of={asOf:yyyy-MM-dd}\noptions={optionsKey}\ntool={toolVersion}\n");
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
    }
}

/// <summary>A deterministic split of a register's components into N shards by a stable hash of the component code.</summary>
/// <param name="Index">Shard index K, 0 ≤ K &lt; N.</param>
/// <param name="Count">Number of shards N ≥ 1.</param>
public readonly record struct ShardSpec(int Index, int Count)
{
    /// <summary>Environment variables read for K when only N is given, in this order (Slurm job arrays, Kubernetes Indexed Jobs).</summary>
    public static IReadOnlyList<string> IndexVariables { get; } = ["SLURM_ARRAY_TASK_ID", "JOB_COMPLETION_INDEX"];

    /// <summary>True when the component belongs to this shard.</summary>
    public bool Contains(string componentCode) => Of(componentCode, Count) == Index;

    /// <summary>The shard of a component code: FNV-1a (64-bit) of its UTF-8 bytes, modulo N. Stable across processes, machines and .NET versions.</summary>
    public static int Of(string componentCode, int count)
    {
        ArgumentNullException.ThrowIfNull(componentCode);
        const ulong offset = 14695981039346656037UL;
        const ulong prime = 1099511628211UL;
        var hash = offset;
        foreach (var b in Encoding.UTF8.GetBytes(componentCode))
        {
            hash ^= b;
            hash *= prime;
        }

        return (int)(hash % (ulong)count);
    }

    /// <summary>
    /// Parses "K/N" or "N" (K then from <see cref="IndexVariables"/>). Bad input names the option and the value.
    /// </summary>
    public static ShardSpec Parse(string text, Func<string, string?> environment)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(environment);
        var parts = text.Split('/');
        string? kText;
        string nText;
        string kSource = "--shard";
        if (parts.Length == 2)
        {
            (kText, nText) = (parts[0], parts[1]);
        }
        else if (parts.Length == 1)
        {
            nText = parts[0];
            var found = IndexVariables.Select(v => (Name: v, Value: environment(v))).FirstOrDefault(v => !string.IsNullOrWhiteSpace(v.Value));
            if (found.Value is null)
            {
                throw ApplicationFailureException.BadInput("--shard", text, $"gives no shard index: give K/N, or set {string.Join(" or ", IndexVariables)} (as Slurm job arrays and Kubernetes Indexed Jobs do).");
            }

            (kText, kSource) = (found.Value, found.Name);
        }
        else
        {
            throw ApplicationFailureException.BadInput("--shard", text, "is not K/N (e.g. 0/4: shard 0 of 4, K from 0 to N − 1).");
        }

        if (!int.TryParse(nText, NumberStyles.None, CultureInfo.InvariantCulture, out var n) || n < 1)
        {
            throw ApplicationFailureException.BadInput("--shard", text, "must have a whole number of shards N ≥ 1 after the '/'.");
        }

        if (!int.TryParse(kText, NumberStyles.None, CultureInfo.InvariantCulture, out var k) || k >= n)
        {
            throw ApplicationFailureException.BadInput(kSource, kText, string.Create(CultureInfo.InvariantCulture, $"must be a shard index from 0 to {n - 1} (shards are numbered from 0)."));
        }

        return new ShardSpec(k, n);
    }

    /// <inheritdoc />
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Index}/{Count}");
}
