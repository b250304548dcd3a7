using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using InspectionUpdate.Degradation;
using InspectionUpdate.Degradation.Definition;
using InspectionUpdate.Register;
using InspectionUpdate.Reporting;
using InspectionUpdate.Time;

namespace InspectionUpdate.Application;

/// <summary>Builds <see cref="ComponentContext"/>s from the register or from files.</summary>
public static class ComponentContexts
{
    /// <summary>Parses and builds a component model definition; every problem becomes a line of one bad-input error.</summary>
    public static (IDegradationModel Model, ComponentModelDefinition Definition) BuildModel(string json, string source)
    {
        var parsed = ComponentModelDefinition.Parse(json);
        if (!parsed.IsValid)
        {
            var lines = parsed.Problems.Select(p => p.Value is null ? $"{p.Path}: {p.Message.TrimEnd('.')}." : $"{p.Path} '{p.Value}': {p.Message.TrimEnd('.')}.").ToArray();
            throw lines.Length == 1
                ? new ApplicationFailureException(FailureKind.BadInput, $"The model of {source} is not valid: {lines[0]}")
                : new ApplicationFailureException(FailureKind.BadInput, $"The model of {source} has {lines.Length.ToString(CultureInfo.InvariantCulture)} problems.", lines);
        }

        return (parsed.Definition!.Build(), parsed.Definition!);
    }

    /// <summary>
    /// One component of the register as recorded on <paramref name="knownOn"/> (default: <paramref name="asOf"/>),
    /// with evidence up to <paramref name="asOf"/> (the evidence cut is made by the request).
    /// </summary>
    /// <remarks>Hashes the whole register for the report's fingerprint: for many components use the overload that takes a <see cref="RegisterSnapshot"/>.</remarks>
    public static ComponentContext FromRegister(IRegister store, InspectionUpdate.Register.Component component, DateOnly asOf, DateOnly? knownOn = null) =>
        FromRegister(new RegisterSnapshot(store, asOf, knownOn), component);

    /// <summary>
    /// One component of the register as recorded on the snapshot's known-on date. The register fingerprint, the sites and the
    /// methods are read once per snapshot; this reads only the component's own rows, so it costs the same whatever the
    /// register size.
    /// </summary>
    /// <param name="snapshot">The register as known on the evidence date.</param>
    /// <param name="component">The component, as known then.</param>
    /// <param name="componentFingerprint">Its fingerprint when the caller has it already; computed when null.</param>
    public static ComponentContext FromRegister(RegisterSnapshot snapshot, InspectionUpdate.Register.Component component, string? componentFingerprint = null) =>
        FromRegister(snapshot, component, componentFingerprint, registerFingerprint: true);

    /// <summary>As the public overload; without <paramref name="registerFingerprint"/> the context's register fingerprint is left empty (the whole register is not hashed).</summary>
    internal static ComponentContext FromRegister(RegisterSnapshot snapshot, InspectionUpdate.Register.Component component, string? componentFingerprint, bool registerFingerprint)
    {
        ArgumentNullException.ThrowIfNull(snapshot);
        ArgumentNullException.ThrowIfNull(component);
        var store = snapshot.Store;
        var known = snapshot.Known;
        var (model, definition) = BuildModel(component.Model.DefinitionJson, "component " + component.Code);
        var site = snapshot.Sites.FirstOrDefault(s => s.Id == component.SiteId);
        // Each finding's revisions recorded by then, in one read (not one read per finding).
        var findings = store.FindingRevisions(component.Id, known).ToList();
        var latest = findings.GroupBy(f => f.FindingId).ToDictionary(g => g.Key, g => g.Max(r => r.Revision));
        var methods = snapshot.Methods;
        var used = findings.Select(f => f.MethodName).Where(n => n is not null).Distinct().ToHashSet();
        return new ComponentContext
        {
            Id = component.Code,
            Name = component.Description,
            Site = site is null ? "?" : $"{site.Code} ({site.Name})",
            SiteCode = site?.Code ?? "?",
            InServiceDate = component.InstallDate,
            Model = model,
            // The component's own words, never the model file's title: sister components share one definition.
            ModelDescription = $"{MechanismWords(definition.Mechanism)} model of {component.Code}, version {component.Model.ModelVersion} (revision {component.Model.Revision.ToString(CultureInfo.InvariantCulture)})",
            ModelRevision = component.Model.Revision,
            InputSource = $"model version {component.Model.ModelVersion} in the register",
            ServiceLifeYears = definition.ServiceLifeYears > 0 ? definition.ServiceLifeYears : null,
            Evidence = store.EvidenceFor(component.Id, known),
            Findings = findings.OrderBy(f => f.InspectionDate).ThenBy(f => f.FindingId).ThenBy(f => f.Revision)
                .Select(f => Finding(f, component.InstallDate, f.Revision < latest[f.FindingId] || f.Withdrawn)).ToArray(),
            Repairs = store.Repairs(component.Id, known).Select(r => new ReportRepair(r.RepairDate, ServiceTime.YearsSince(component.InstallDate, r.RepairDate), r.Description)).ToArray(),
            Methods = methods.OrderBy(m => used.Contains(m.Name) ? 0 : 1).Select(m => m.ToInspectionMethod()).ToArray(),
            Fingerprint = registerFingerprint ? snapshot.Fingerprint : string.Empty,
            ComponentFingerprint = componentFingerprint ?? store.ComponentFingerprint(component.Id, known),
            Source = store.Path,
            KnownOn = snapshot.KnownOn,
        };
    }

    /// <summary>A method file's method name: its file name in capitals (<c>ut-grid.method.json</c> → <c>UT-GRID</c>).</summary>
    private static string MethodName(string file) => Path.GetFileName(file)[..^".method.json".Length].ToUpperInvariant();

    /// <summary>
    /// A component from a model file, with an optional findings CSV and the method files (*.method.json) of the
    /// model's folder. The findings go through a temporary register so that they are validated and mapped exactly as
    /// the register does; nothing is kept.
    /// </summary>
    public static ComponentContext FromFiles(string modelPath, string? findingsPath, DateOnly inService, DateOnly asOf)
    {
        var json = ModelFiles.Read(modelPath);
        var (model, definition) = BuildModel(json, Path.GetFileName(modelPath));
        var folder = Path.GetDirectoryName(modelPath)!;
        var methodFiles = Directory.GetFiles(folder, "*.method.json").Order(StringComparer.Ordinal).ToArray();
        var hash = new StringBuilder(json);
        var temp = Path.Combine(Path.GetTempPath(), "iu-whatif-" + Guid.NewGuid().ToString("N")[..12] + ".register");
        try
        {
            // The what-if register records at the evidence date, so that reads "as known on" that date see everything.
            using var store = Registers.Open(temp, RegisterOpenMode.CreateNew, new FixedClock(asOf));
            const string actor = "what-if";
            Registers.Require(store.AddSite(new NewSite("FILE", "model file"), actor), "what-if site");
            var code = Path.GetFileNameWithoutExtension(modelPath).Replace(".model", string.Empty, StringComparison.Ordinal);
            Registers.Require(store.AddComponent(new NewComponent("FILE", code, definition.Name, inService, model.MaximumSizeMm is { } w && double.IsFinite(w) ? w : null, json, "file"), actor), "what-if component");
            foreach (var file in methodFiles)
            {
                Registers.Require(store.AddMethod(MethodFile.Read(file, MethodName(file)), actor), "method file " + Path.GetFileName(file));
                hash.Append(File.ReadAllText(file));
            }

            if (findingsPath is not null)
            {
                var csv = File.ReadAllText(findingsPath);
                hash.Append(csv);
                // The file names the component by the model file's name; rewrite nothing: rows must use that code.
                var result = store.ImportFindingsCsv(new StringReader(csv), Path.GetFileName(findingsPath), actor, "what-if");
                if (!result.Succeeded)
                {
                    // Say where a what-if run takes the component code and the methods from: the rows name them.
                    var refused = Registers.Problems("findings file " + Path.GetFileName(findingsPath), result.Problems);
                    var names = methodFiles.Length == 0 ? "none" : string.Join(", ", methodFiles.Select(MethodName));
                    var hint = $"Without a register the component code is '{code}' (the model file's name) and the methods are the *.method.json files beside the model file (here: {names}).";
                    throw new ApplicationFailureException(FailureKind.BadInput, refused.Message, [.. refused.Problems, hint]);
                }
            }

            var component = store.FindComponent(code)!;
            var context = FromRegister(store, component, asOf);
            return context with
            {
                Site = "-",
                ModelDescription = definition.Name + " (model file)",
                InputSource = "model file " + Path.GetFileName(modelPath),
                Fingerprint = "sha256:" + Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(hash.ToString()))),
                ComponentFingerprint = Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(hash.ToString()))),
                Source = modelPath + (findingsPath is null ? string.Empty : " + " + findingsPath),
            };
        }
        finally
        {
            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
            foreach (var f in new[] { temp, temp + "-wal", temp + "-shm" })
            {
                if (File.Exists(f)) File.Delete(f);
            }
        }
    }

    /// <summary>The mechanism of a model definition in words.</summary>
    public static string MechanismWords(MechanismKind kind) => kind switch
    {
        MechanismKind.Corrosion => "wall-loss corrosion",
        MechanismKind.CrackGrowth => "fatigue crack growth",
        MechanismKind.SnFatigue => "S–N fatigue (Miner's rule)",
        MechanismKind.Expression => "user-defined limit state",
        _ => kind.ToString(),
    };

    private static ReportFinding Finding(FindingRevision f, DateOnly inService, bool superseded) => new(
        $"F-{f.FindingId.ToString(CultureInfo.InvariantCulture)} r{f.Revision.ToString(CultureInfo.InvariantCulture)}", f.InspectionDate,
        ServiceTime.YearsSince(inService, f.InspectionDate), FindingWords.Of(f.Kind) + (f.Withdrawn ? " (withdrawn)" : string.Empty), f.MethodName ?? "-",
        f.MeasuredSizeMm ?? f.RemainingWallMm, f.Revision, f.Recorded.RecordedBy, f.Revision > 1 || f.Withdrawn ? f.Recorded.Reason : null, superseded);
}
