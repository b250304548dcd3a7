using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>A stored result whose key no longer matches the register, and why.</summary>
/// <param name="Source">The register or the shard results file it was read from.</param>
/// <param name="ComponentId">Component code.</param>
/// <param name="AsOf">Evidence date of the result.</param>
/// <param name="OptionsKey">Its options.</param>
/// <param name="Reason">What changed.</param>
public sealed record StaleResult(string Source, string ComponentId, DateOnly AsOf, string OptionsKey, string Reason);

/// <summary>What a merge did.</summary>
/// <param name="Files">Shard results files read.</param>
/// <param name="Accepted">Results written into the register.</param>
/// <param name="Refused">Results refused because their keys no longer match the register.</param>
public sealed record MergeSummary(IReadOnlyList<string> Files, int Accepted, IReadOnlyList<StaleResult> Refused);

/// <summary>What <c>register check</c> found among the stored results.</summary>
/// <param name="Stored">Stored results.</param>
/// <param name="Stale">Those whose key no longer matches the register (recomputed by the next run).</param>
public sealed record StoredResultsCheck(int Stored, IReadOnlyList<StaleResult> Stale);

/// <summary>Checks stored results against their keys, and folds shard results files into the register.</summary>
public static class StoredResults
{
    /// <summary>Why <paramref name="row"/> no longer holds for the register (null when its key matches the key computed now).</summary>
    public static string? WhyStale(IRegister store, StoredResult row)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(row);
        var known = Registers.AsKnownOn(row.AsOf);
        var component = store.FindComponent(row.ComponentCode, known);
        return WhyStale(row, component is null ? null : (component.Id, component.Model.Revision), id => store.ComponentFingerprint(id, known));
    }

    /// <summary>
    /// Why each of <paramref name="rows"/> no longer holds (null where its key matches), in their order: the answers of
    /// <see cref="WhyStale(IRegister, StoredResult)"/> from one bulk read of the component index and the fingerprints
    /// per evidence date instead of two reads per row (a register report checks every stored result).
    /// </summary>
    public static string?[] WhyStale(IRegister store, IReadOnlyList<StoredResult> rows)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(rows);
        var reasons = new string?[rows.Count];
        foreach (var date in Enumerable.Range(0, rows.Count).GroupBy(i => rows[i].AsOf))
        {
            var known = Registers.AsKnownOn(date.Key);
            var ids = store.ComponentIndex(known).ToDictionary(c => c.Code, c => c.Id, StringComparer.Ordinal);
            var stamps = store.ComponentFingerprints(known);
            foreach (var i in date)
            {
                (long, int?)? component = ids.TryGetValue(rows[i].ComponentCode, out var id) ? (id, stamps.TryGetValue(id, out var s) ? s.ModelRevision : null) : null;
                reasons[i] = WhyStale(rows[i], component, id => stamps.TryGetValue(id, out var stamp) ? stamp.Fingerprint : null);
            }
        }

        return reasons;
    }

    /// <summary>The rule: the row's own key, then the component (id, model revision as known then), the build, the fingerprint.</summary>
    private static string? WhyStale(StoredResult row, (long Id, int? ModelRevision)? component, Func<long, string?> fingerprint)
    {
        if (row.ResultKey != ResultKeys.Compute(row.ModelRevision, row.ComponentFingerprint, row.AsOf, row.OptionsKey, row.ToolVersion))
        {
            return "its key does not match its own fields (the row was altered)";
        }

        if (component is not { } c) return $"component {row.ComponentCode} is not in the register as known on {row.AsOf:yyyy-MM-dd}";
        if (c.Id != row.ComponentId) return $"component {row.ComponentCode} has id {c.Id} in the register, not {row.ComponentId}";
        if (row.ToolVersion != ToolInfo.ResultVersion) return $"computed by {row.ToolVersion}, not by this build ({ToolInfo.ResultVersion})";
        if (c.ModelRevision != row.ModelRevision) return $"model revision {row.ModelRevision} was superseded by revision {c.ModelRevision}";
        return fingerprint(c.Id) == row.ComponentFingerprint ? null : "the component's findings, repairs, model or methods changed since it was computed";
    }

    /// <summary>Checks every stored result of the register against its key.</summary>
    public static StoredResultsCheck Check(IRegister store)
    {
        ArgumentNullException.ThrowIfNull(store);
        var rows = store.Results();
        var reasons = WhyStale(store, rows);
        var stale = rows.Select((r, i) => (Row: r, Why: reasons[i])).Where(x => x.Why is not null)
            .Select(x => new StaleResult(store.Path, x.Row.ComponentCode, x.Row.AsOf, x.Row.OptionsKey, x.Why!)).ToArray();
        return new StoredResultsCheck(rows.Count, stale);
    }

    /// <summary>
    /// Folds shard results files into the register: each result whose key still matches the register is written
    /// (replacing the stored one of the same component, date and options); the others are refused and listed.
    /// Writing is in batches, each one transaction; findings are never touched.
    /// </summary>
    /// <exception cref="ApplicationFailureException">A file is missing or not a shard results file (nothing of it is written).</exception>
    public static MergeSummary Merge(IRegister store, IReadOnlyList<string> files)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(files);
        var accepted = 0;
        var refused = new List<StaleResult>();
        var opened = new List<ShardResultsFile>();
        try
        {
            // Open every file first: a bad one refuses the whole merge before anything is written.
            foreach (var file in files)
            {
                try
                {
                    opened.Add(ShardResultsFile.OpenRead(file));
                }
                catch (RegisterFileException e)
                {
                    throw ApplicationFailureException.BadInput("results file", file, "cannot be merged: " + e.Message);
                }
            }

            foreach (var file in opened)
            {
                var batch = new List<StoredResult>();
                foreach (var row in file.Results())
                {
                    var why = WhyStale(store, row);
                    if (why is not null)
                    {
                        refused.Add(new StaleResult(file.Path, row.ComponentCode, row.AsOf, row.OptionsKey, why));
                        continue;
                    }

                    batch.Add(row);
                    if (batch.Count >= 256)
                    {
                        store.Save(batch);
                        accepted += batch.Count;
                        batch.Clear();
                    }
                }

                store.Save(batch);
                accepted += batch.Count;
            }
        }
        finally
        {
            foreach (var f in opened) f.Dispose();
        }

        return new MergeSummary(opened.Select(f => f.Path).ToArray(), accepted, refused);
    }
}
