using System.Globalization;
using System.Text.Json;
using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Degradation.Expressions;
using InspectionUpdate.Degradation.Fatigue;
using InspectionUpdate.Probability;

namespace InspectionUpdate.Degradation.Definition;

/// <summary>The degradation mechanism a definition describes.</summary>
public enum MechanismKind
{
    /// <summary>Wall-loss corrosion (<see cref="CorrosionModel"/>).</summary>
    Corrosion,

    /// <summary>Fatigue crack growth (<see cref="CrackGrowthModel"/>).</summary>
    CrackGrowth,

    /// <summary>S–N fatigue with Miner's rule (<see cref="MinerModel"/>).</summary>
    SnFatigue,

    /// <summary>A user-defined limit state (<see cref="ExpressionModel"/>).</summary>
    Expression,
}

/// <summary>The outcome of parsing a definition: the definition when valid, and every problem found.</summary>
/// <param name="Definition">The definition, or null when any problem was found.</param>
/// <param name="Problems">Every problem, each with its JSON path and value.</param>
public sealed record ComponentModelParseResult(ComponentModelDefinition? Definition, IReadOnlyList<DefinitionProblem> Problems)
{
    /// <summary>True when the definition parsed, validated and builds.</summary>
    public bool IsValid => Definition is not null && Problems.Count == 0;

    /// <summary>All problems, one per line.</summary>
    public string Describe() => string.Join(Environment.NewLine, Problems.Select(p => p.ToString()));
}

/// <summary>
/// A component's degradation model as written in a component-model file (JSON, this project's own format;
/// schema in docs/schema/component-model.schema.json): the mechanism and its settings, the random inputs with
/// their families and parameters, correlations and the service life. Parse from text (the core does no file I/O),
/// then <see cref="Build"/> the model.
/// </summary>
public sealed class ComponentModelDefinition
{
    /// <summary>The format version this code reads.</summary>
    public const int CurrentSchemaVersion = 1;

    private ComponentModelDefinition()
    {
    }

    /// <summary>The JSON text it was parsed from.</summary>
    public string SourceJson { get; private init; } = "";

    /// <summary>Format version (1).</summary>
    public int SchemaVersion { get; private init; }

    /// <summary>Name of the model, shown in results.</summary>
    public string Name { get; private init; } = "";

    /// <summary>Free-text description, or null.</summary>
    public string? Description { get; private init; }

    /// <summary>Service life in years.</summary>
    public double ServiceLifeYears { get; private init; }

    /// <summary>The mechanism.</summary>
    public MechanismKind Mechanism { get; private init; }

    /// <summary>Corrosion settings (when <see cref="Mechanism"/> is Corrosion).</summary>
    public CorrosionSettings? Corrosion { get; private init; }

    /// <summary>Crack-growth settings (when CrackGrowth).</summary>
    public CrackGrowthSettings? CrackGrowth { get; private init; }

    /// <summary>The crack-growth preset key used, or null.</summary>
    public string? CrackGrowthPreset { get; private init; }

    /// <summary>S–N settings (when SnFatigue).</summary>
    public MinerSettings? SnFatigue { get; private init; }

    /// <summary>Limit-state expression (when Expression).</summary>
    public string? LimitStateExpression { get; private init; }

    /// <summary>Size expression (when Expression), or null.</summary>
    public string? SizeExpression { get; private init; }

    /// <summary>Settings of an expression model (when Expression).</summary>
    public ExpressionModelSettings? ExpressionSettings { get; private init; }

    /// <summary>The inputs, presets expanded, in file order (preset inputs last).</summary>
    public IReadOnlyList<InputSpec> Inputs { get; private init; } = [];

    /// <summary>Correlations between inputs.</summary>
    public IReadOnlyList<InputCorrelation> Correlations { get; private init; } = [];

    /// <summary>Parses and validates a definition, reporting every problem with its JSON path.</summary>
    public static ComponentModelParseResult Parse(string json)
    {
        var problems = new List<DefinitionProblem>();
        if (string.IsNullOrWhiteSpace(json))
        {
            problems.Add(new("$", null, "the definition is empty"));
            return new(null, problems);
        }

        JsonDocument doc;
        try
        {
            doc = JsonDocument.Parse(json, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip });
        }
        catch (JsonException e)
        {
            problems.Add(new(e.Path ?? "$", null, $"not valid JSON (line {e.LineNumber + 1}, byte {e.BytePositionInLine + 1}): {e.Message.Split(" Path:")[0]}"));
            return new(null, problems);
        }

        using (doc)
        {
            // Text the reader could not take (a lone surrogate, a duplicate key, a number beyond double range) and
            // sizes beyond the bounds are refused before reading, each with its path.
            JsonInputBounds.Check(doc.RootElement, "$", problems);
            if (problems.Count > 0) return new(null, problems);
            var reader = new Reader(problems);
            var definition = reader.Read(doc.RootElement, json);
            if (problems.Count > 0 || definition is null) return new(null, problems);
            try
            {
                var model = definition.Build();
                // The transformation is where fictive correlations are computed: build it once to surface its errors here.
                _ = new NatafTransformation(model.Inputs);
                ProbeTails(model.Inputs, definition.Inputs, problems);
            }
            catch (ExpressionParseException e)
            {
                problems.Add(new($"$.mechanism.{e.ParamName}", e.Expression, e.Message));
            }
            catch (Exception e) when (e is ArgumentException or NotSupportedException or InvalidOperationException)
            {
                problems.Add(new(e is DistributionParameterException { VariableName: "correlation" or "fictive correlation" } ? "$.correlations" : "$", null, WithoutParameterSuffix(e.Message)));
            }

            return problems.Count > 0 ? new(null, problems) : new(definition, problems);
        }
    }

    /// <summary>
    /// Evaluates every random input's quantiles as far into the tails as the solvers go (probabilities 1e-12 and
    /// 1 − 1e-12): parameters a family accepts but cannot evaluate (e.g. a gamma shape of 1e-320) are refused here,
    /// naming the input, instead of failing in the middle of an assessment.
    /// </summary>
    private static void ProbeTails(Probability.StochasticModel inputs, IReadOnlyList<InputSpec> specs, List<DefinitionProblem> problems)
    {
        foreach (var v in inputs.Variables.Where(v => !v.IsDeterministic))
        {
            var spec = specs.FirstOrDefault(s => s.Name == v.Name);
            var given = spec is null ? v.Family
                : $"{spec.Family} with " + string.Join(", ", spec.Parameters.Select(p => $"{p.Key} = {p.Value.ToString("R", CultureInfo.InvariantCulture).ToLowerInvariant()}"));
            try
            {
                var values = new[] { v.InverseCdf(1e-12), v.InverseCdf(0.5), v.InverseCcdf(1e-12), v.Mean, v.StandardDeviation };
                if (values.All(double.IsFinite) && v.StandardDeviation > 0) continue;
                problems.Add(new($"$.inputs.{v.Name}", given, "the distribution's parameters give no finite quantiles, mean or spread (parameters at the edge of the family's range)"));
            }
            catch (Exception e) when (e is ArgumentException or InvalidOperationException or ArithmeticException or AggregateException)
            {
                var message = e is AggregateException a ? a.InnerExceptions[0].Message : e.Message;
                problems.Add(new($"$.inputs.{v.Name}", given, "the distribution cannot be evaluated with these parameters: " + WithoutParameterSuffix(message)));
            }
        }
    }

    private static string WithoutParameterSuffix(string m)
    {
        var i = m.LastIndexOf(" (Parameter '", StringComparison.Ordinal);
        return (i > 0 ? m[..i] : m).ReplaceLineEndings(" ");
    }

    /// <summary>Builds the degradation model.</summary>
    /// <exception cref="ArgumentException">The inputs do not fit the mechanism (cannot happen for a definition that parsed as valid).</exception>
    public IDegradationModel Build()
    {
        var variables = Inputs.Select(i => RandomVariableFactory.Create(i.Name, i.Family, i.Parameters)).ToArray();
        CorrelationMatrix? correlation = null;
        if (Correlations.Count > 0)
        {
            var r = new double[variables.Length, variables.Length];
            for (var i = 0; i < variables.Length; i++) r[i, i] = 1;
            foreach (var c in Correlations)
            {
                var a = IndexOf(c.First);
                var b = IndexOf(c.Second);
                r[a, b] = c.Rho;
                r[b, a] = c.Rho;
            }

            correlation = new CorrelationMatrix(r);
        }

        var inputs = new StochasticModel(variables, correlation);
        return Mechanism switch
        {
            MechanismKind.Corrosion => new CorrosionModel(inputs, Corrosion, Name),
            MechanismKind.CrackGrowth => new CrackGrowthModel(inputs, CrackGrowth, Name),
            MechanismKind.SnFatigue => new MinerModel(inputs, SnFatigue, Name),
            _ => new ExpressionModel(inputs, LimitStateExpression!, SizeExpression, ExpressionSettings! with { Name = Name }),
        };
    }

    /// <summary>A copy with one parameter of one input changed (e.g. for calibration); validated when built.</summary>
    /// <exception cref="ArgumentException">No input of that name.</exception>
    public ComponentModelDefinition WithInputParameter(string input, string parameter, double value)
    {
        var i = IndexOf(input);
        var inputs = Inputs.ToArray();
        inputs[i] = inputs[i].WithParameter(parameter, value);
        return Copy(inputs);
    }

    /// <summary>A copy with one input replaced or added.</summary>
    public ComponentModelDefinition WithInput(InputSpec input)
    {
        ArgumentNullException.ThrowIfNull(input);
        var list = Inputs.ToList();
        var i = list.FindIndex(s => s.Name == input.Name);
        if (i >= 0) list[i] = input;
        else list.Add(input);
        return Copy(list);
    }

    private ComponentModelDefinition Copy(IReadOnlyList<InputSpec> inputs) => new()
    {
        SourceJson = SourceJson,
        SchemaVersion = SchemaVersion,
        Name = Name,
        Description = Description,
        ServiceLifeYears = ServiceLifeYears,
        Mechanism = Mechanism,
        Corrosion = Corrosion,
        CrackGrowth = CrackGrowth,
        CrackGrowthPreset = CrackGrowthPreset,
        SnFatigue = SnFatigue,
        LimitStateExpression = LimitStateExpression,
        SizeExpression = SizeExpression,
        ExpressionSettings = ExpressionSettings,
        Inputs = inputs,
        Correlations = Correlations,
    };

    private int IndexOf(string name)
    {
        for (var i = 0; i < Inputs.Count; i++)
        {
            if (Inputs[i].Name == name) return i;
        }

        throw new ArgumentException($"The definition has no input '{name}' (inputs: {string.Join(", ", Inputs.Select(s => s.Name))}).", nameof(name));
    }

    /// <summary>Walks the JSON, collecting every problem instead of stopping at the first.</summary>
    private sealed class Reader(List<DefinitionProblem> problems)
    {
        // Every input name written in the file, valid or not, so one bad input is not also reported as missing.
        private readonly HashSet<string> _declared = new(StringComparer.Ordinal);

        private static readonly string[] TopKeys = ["schemaVersion", "name", "description", "serviceLife_years", "mechanism", "inputs", "correlations"];

        public ComponentModelDefinition? Read(JsonElement root, string json)
        {
            if (root.ValueKind != JsonValueKind.Object)
            {
                Add("$", root, "the definition must be a JSON object");
                return null;
            }

            Keys(root, "$", TopKeys);
            var version = Number(root, "schemaVersion", "$", true);
            if (version is { } v && v != CurrentSchemaVersion)
            {
                Add("$.schemaVersion", root.GetProperty("schemaVersion"), $"unsupported version; this program reads version {CurrentSchemaVersion}");
            }

            var name = String(root, "name", "$", true);
            if (name is { Length: 0 } || name is not null && string.IsNullOrWhiteSpace(name)) Add("$.name", root.GetProperty("name"), "must not be empty");
            var description = String(root, "description", "$", false);
            var life = Number(root, "serviceLife_years", "$", true);
            if (life is { } l && !(l >= 1 && l <= 500)) Add("$.serviceLife_years", root.GetProperty("serviceLife_years"), "must lie in [1, 500] years (profiles step at most monthly over the life)");

            var mech = Object(root, "mechanism", "$", true);
            MechanismKind? kind = null;
            CorrosionSettings? corrosion = null;
            CrackGrowthSettings? crack = null;
            MinerSettings? sn = null;
            string? preset = null, limitState = null, size = null;
            ExpressionModelSettings? exprSettings = null;
            if (mech is { } m)
            {
                var type = Enum(m, "type", "$.mechanism", true, ["corrosion", "crackGrowth", "snFatigue", "expression"]);
                switch (type)
                {
                    case "corrosion":
                        kind = MechanismKind.Corrosion;
                        corrosion = ReadCorrosion(m);
                        break;
                    case "crackGrowth":
                        kind = MechanismKind.CrackGrowth;
                        (crack, preset) = ReadCrack(m);
                        break;
                    case "snFatigue":
                        kind = MechanismKind.SnFatigue;
                        sn = ReadSn(m);
                        break;
                    case "expression":
                        kind = MechanismKind.Expression;
                        (limitState, size, exprSettings) = ReadExpression(m);
                        break;
                }
            }

            var inputs = ReadInputs(root, preset);
            if (inputs is { Count: > 0 } && inputs.All(i => i.Family == "Deterministic"))
            {
                Add("$.inputs", null, "every input is a fixed value: at least one must be random (a family with its parameters) for a probability of failure");
            }

            var correlations = ReadCorrelations(root, inputs);
            if (kind is { } k && inputs is not null) CheckInputsFitMechanism(k, inputs, corrosion, crack, sn, exprSettings);
            if (kind == MechanismKind.Expression && limitState is not null && inputs is not null)
            {
                // An input no expression names is most often a misspelling of one that is named.
                var used = ExpressionCompiler.InputsUsed(limitState + " " + size, inputs.Select(i => i.Name).ToArray()).ToHashSet(StringComparer.Ordinal);
                foreach (var unused in inputs.Where(i => !used.Contains(i.Name)))
                {
                    Add($"$.inputs.{unused.Name}", null, "the limit state and size expressions never use this input; remove it or use it");
                }
            }

            if (problems.Count > 0 || kind is null || inputs is null) return null;

            return new ComponentModelDefinition
            {
                SourceJson = json,
                SchemaVersion = (int)version!.Value,
                Name = name!,
                Description = description,
                ServiceLifeYears = life!.Value,
                Mechanism = kind.Value,
                Corrosion = corrosion,
                CrackGrowth = crack,
                CrackGrowthPreset = preset,
                SnFatigue = sn,
                LimitStateExpression = limitState,
                SizeExpression = size,
                ExpressionSettings = exprSettings,
                Inputs = inputs,
                Correlations = correlations,
            };
        }

        private CorrosionSettings ReadCorrosion(JsonElement m)
        {
            const string p = "$.mechanism";
            Keys(m, p, ["type", "growthLaw", "failureMode", "leakFraction", "lengthGrows", "pressureIsAnnualMaximum", "capacityFactor", "flowStressAdder_MPa"]);
            var s = new CorrosionSettings
            {
                GrowthLaw = Enum(m, "growthLaw", p, false, ["linear", "powerLaw"]) == "powerLaw" ? CorrosionGrowthLaw.PowerLaw : CorrosionGrowthLaw.Linear,
                FailureMode = Enum(m, "failureMode", p, true, ["leak", "burstDnvRpF101", "burstModifiedB31G"]) switch
                {
                    "burstDnvRpF101" => CorrosionFailureMode.BurstDnvRpF101,
                    "burstModifiedB31G" => CorrosionFailureMode.BurstModifiedB31G,
                    _ => CorrosionFailureMode.Leak,
                },
                LengthGrows = Bool(m, "lengthGrows", p) ?? false,
                PressureIsAnnualMaximum = Bool(m, "pressureIsAnnualMaximum", p) ?? false,
            };
            if (Number(m, "leakFraction", p, false) is { } f)
            {
                if (!(f > 0 && f <= 1)) Add($"{p}.leakFraction", m.GetProperty("leakFraction"), "must lie in (0, 1]");
                else s = s with { LeakFraction = f };
            }

            if (Number(m, "capacityFactor", p, false) is { } c)
            {
                if (!(c > 0)) Add($"{p}.capacityFactor", m.GetProperty("capacityFactor"), "must be > 0 (1.0, or 1.05 as some editions print)");
                else s = s with { CapacityFactor = c };
            }

            if (Number(m, "flowStressAdder_MPa", p, false) is { } fa)
            {
                if (!(fa >= 0)) Add($"{p}.flowStressAdder_MPa", m.GetProperty("flowStressAdder_MPa"), "must be ≥ 0");
                else s = s with { FlowStressAdderMPa = fa };
            }

            if (s.PressureIsAnnualMaximum && s.FailureMode == CorrosionFailureMode.Leak)
            {
                Add($"{p}.pressureIsAnnualMaximum", m.GetProperty("pressureIsAnnualMaximum"), "an annual maximum pressure needs a burst failure mode");
            }

            return s;
        }

        private (CrackGrowthSettings, string?) ReadCrack(JsonElement m)
        {
            const string p = "$.mechanism";
            Keys(m, p, ["type", "law", "stressRanges", "geometry", "threshold", "preset"]);
            var preset = String(m, "preset", p, false);
            CrackGrowthPreset? pr = null;
            if (preset is not null && !CrackGrowthPresets.All.TryGetValue(preset, out pr))
            {
                Add($"{p}.preset", m.GetProperty("preset"), $"unknown preset (known: {string.Join(", ", CrackGrowthPresets.All.Keys)})");
            }

            var law = Enum(m, "law", p, pr is null, ["oneStage", "twoStage"]) ?? pr?.Law ?? "oneStage";
            if (pr is not null && law != pr.Law) Add($"{p}.law", m.GetProperty("law"), $"preset '{pr.Key}' is a {pr.Law} law");
            var s = new CrackGrowthSettings
            {
                Law = law == "twoStage" ? CrackGrowthLaw.TwoStage : CrackGrowthLaw.OneStage,
                StressRanges = Enum(m, "stressRanges", p, true, ["constantAmplitude", "weibull"]) == "constantAmplitude" ? StressRangeModel.ConstantAmplitude : StressRangeModel.Weibull,
                UseThreshold = Bool(m, "threshold", p) ?? false,
            };
            if (m.TryGetProperty("geometry", out var g))
            {
                var gp = $"{p}.geometry";
                if (g.ValueKind == JsonValueKind.String && g.GetString() == "constant")
                {
                    // Y is the input geometryFactor.
                }
                else if (g.ValueKind == JsonValueKind.Object)
                {
                    Keys(g, gp, ["depthRatios", "values"]);
                    var r = Numbers(g, "depthRatios", gp);
                    var y = Numbers(g, "values", gp);
                    if (r is not null && y is not null)
                    {
                        try
                        {
                            s = s with { Geometry = GeometryFunction.Tabulated(r, y) };
                        }
                        catch (ArgumentException e)
                        {
                            Add(gp, g, e.Message);
                        }
                    }
                }
                else
                {
                    Add(gp, g, "must be \"constant\" or an object {\"depthRatios\": [...], \"values\": [...]}");
                }
            }

            return (s, pr?.Key);
        }

        private MinerSettings ReadSn(JsonElement m)
        {
            const string p = "$.mechanism";
            Keys(m, p, ["type", "curve", "stressRanges"]);
            var s = new MinerSettings
            {
                StressRanges = Enum(m, "stressRanges", p, true, ["constantAmplitude", "weibull"]) == "constantAmplitude" ? StressRangeModel.ConstantAmplitude : StressRangeModel.Weibull,
            };
            if (!m.TryGetProperty("curve", out var c))
            {
                Add($"{p}.curve", null, $"required: a preset name ({string.Join(", ", SnCurve.Presets.Keys)}) or a curve object");
                return s;
            }

            var cp = $"{p}.curve";
            if (c.ValueKind == JsonValueKind.String)
            {
                if (SnCurve.Presets.TryGetValue(c.GetString()!, out var curve)) return s with { Curve = curve };
                Add(cp, c, $"unknown S–N curve (known: {string.Join(", ", SnCurve.Presets.Keys)})");
                return s;
            }

            if (c.ValueKind != JsonValueKind.Object)
            {
                Add(cp, c, "must be a preset name or a curve object");
                return s;
            }

            Keys(c, cp, ["name", "m1", "log10A1", "m2", "log10A2", "transitionCycles", "thicknessExponent", "referenceThickness_mm"]);
            var custom = new SnCurve(String(c, "name", cp, false) ?? "user S–N curve",
                Number(c, "m1", cp, true) ?? double.NaN, Number(c, "log10A1", cp, true) ?? double.NaN,
                Number(c, "m2", cp, true) ?? double.NaN, Number(c, "log10A2", cp, true) ?? double.NaN,
                Number(c, "transitionCycles", cp, false) ?? 1e7, Number(c, "thicknessExponent", cp, false) ?? 0,
                Number(c, "referenceThickness_mm", cp, false) ?? 25, "user-defined curve");
            foreach (var problem in custom.Problems()) Add(cp, c, problem);
            return s with { Curve = custom };
        }

        private (string?, string?, ExpressionModelSettings) ReadExpression(JsonElement m)
        {
            const string p = "$.mechanism";
            Keys(m, p, ["type", "limitState", "size", "sizeQuantity", "renewedOnRepair", "annualMaximumInput", "maximumSize_mm"]);
            var limit = String(m, "limitState", p, true);
            var size = String(m, "size", p, false);
            var settings = new ExpressionModelSettings
            {
                SizeQuantity = String(m, "sizeQuantity", p, false) ?? "size_mm",
                AnnualMaximumInput = String(m, "annualMaximumInput", p, false),
                MaximumSizeMm = Number(m, "maximumSize_mm", p, false) ?? double.PositiveInfinity,
                RenewedOnRepair = Strings(m, "renewedOnRepair", p) ?? [],
            };
            if (!(settings.MaximumSizeMm > 0)) Add($"{p}.maximumSize_mm", m.GetProperty("maximumSize_mm"), "must be > 0");
            return (limit, size, settings);
        }

        private List<InputSpec>? ReadInputs(JsonElement root, string? preset)
        {
            var o = Object(root, "inputs", "$", true);
            if (o is null) return null;
            var list = new List<InputSpec>();
            foreach (var prop in o.Value.EnumerateObject())
            {
                var path = $"$.inputs.{prop.Name}";
                _declared.Add(prop.Name);
                var spec = ReadInput(prop.Name, prop.Value, path);
                if (spec is null) continue;
                try
                {
                    RandomVariableFactory.Create(spec.Name, spec.Family, spec.Parameters);
                    list.Add(spec);
                }
                catch (ArgumentException e)
                {
                    var param = e.ParamName;
                    // The variable constructors name the standard deviation in full; the file calls it "sd".
                    var wanted = param == "standardDeviation" ? "sd" : param;
                    var key = wanted is null ? null : spec.Parameters.Keys.FirstOrDefault(k => string.Equals(k, wanted, StringComparison.OrdinalIgnoreCase));
                    var at = key is not null ? $"{path}.{key}" : param == "family" ? $"{path}.family" : path;
                    var value = key is not null ? spec.Parameters[key].ToString("R", CultureInfo.InvariantCulture) : param == "family" ? spec.Family : null;
                    Add(at, value, WithoutParameterSuffix(e));
                }
            }

            if (preset is not null)
            {
                foreach (var s in CrackGrowthPresets.All[preset].Inputs)
                {
                    if (_declared.Add(s.Name)) list.Add(s);
                }
            }

            return list;
        }

        private InputSpec? ReadInput(string name, JsonElement e, string path)
        {
            if (e.ValueKind == JsonValueKind.Number)
            {
                // A bare number is a deterministic input.
                return new InputSpec(name, "Deterministic", new Dictionary<string, double> { ["value"] = e.GetDouble() });
            }

            if (e.ValueKind != JsonValueKind.Object)
            {
                Add(path, e, "must be a number (a fixed value) or an object {\"family\": ..., parameters}");
                return null;
            }

            if (e.TryGetProperty("distribution", out var misspelt) && !e.TryGetProperty("family", out _))
            {
                // One spelling across our files (model files and post-repair priors): name the expected key.
                Add($"{path}.distribution", misspelt, "the key is \"family\", not \"distribution\": write {\"family\": ..., parameters}");
                return null;
            }

            var family = String(e, "family", path, true);
            var parameters = new Dictionary<string, double>(StringComparer.Ordinal);
            foreach (var p in e.EnumerateObject())
            {
                if (p.Name == "family") continue;
                if (p.Name == "note") continue; // free text: where the numbers come from
                if (p.Value.ValueKind != JsonValueKind.Number)
                {
                    Add($"{path}.{p.Name}", p.Value, "a distribution parameter must be a number");
                    continue;
                }

                parameters[p.Name] = p.Value.GetDouble();
            }

            return family is null ? null : new InputSpec(name, family, parameters);
        }

        private List<InputCorrelation> ReadCorrelations(JsonElement root, List<InputSpec>? inputs)
        {
            var list = new List<InputCorrelation>();
            if (!root.TryGetProperty("correlations", out var arr)) return list;
            if (arr.ValueKind != JsonValueKind.Array)
            {
                Add("$.correlations", arr, "must be an array of {\"between\": [a, b], \"rho\": r}");
                return list;
            }

            var i = 0;
            var seen = new HashSet<(string, string)>();
            foreach (var c in arr.EnumerateArray())
            {
                var path = $"$.correlations[{i++}]";
                if (c.ValueKind != JsonValueKind.Object)
                {
                    Add(path, c, "must be an object {\"between\": [a, b], \"rho\": r}");
                    continue;
                }

                Keys(c, path, ["between", "rho"]);
                var between = Strings(c, "between", path);
                var rho = Number(c, "rho", path, true);
                if (between is null)
                {
                    if (!c.TryGetProperty("between", out _)) Add($"{path}.between", null, "required: the two input names");
                    continue;
                }

                if (between.Count != 2 || between[0] == between[1])
                {
                    Add($"{path}.between", c.GetProperty("between"), "must name two different inputs");
                    continue;
                }

                foreach (var n in between)
                {
                    if (inputs is not null && !_declared.Contains(n)) Add($"{path}.between", n, "is not one of the inputs");
                }

                var key = string.CompareOrdinal(between[0], between[1]) < 0 ? (between[0], between[1]) : (between[1], between[0]);
                if (!seen.Add(key)) Add($"{path}.between", c.GetProperty("between"), "this pair is already correlated above");
                if (rho is { } r)
                {
                    if (!(r > -1 && r < 1)) Add($"{path}.rho", c.GetProperty("rho"), "must lie strictly between -1 and 1");
                    else list.Add(new InputCorrelation(between[0], between[1], r));
                }
            }

            // A correlation of a deterministic input has no meaning.
            foreach (var c in list)
            {
                foreach (var n in new[] { c.First, c.Second })
                {
                    if (inputs?.FirstOrDefault(s => s.Name == n) is { } spec && string.Equals(spec.Family, "Deterministic", StringComparison.OrdinalIgnoreCase)) Add("$.correlations", n, "a deterministic input cannot be correlated");
                }
            }

            if (problems.Count == 0 && inputs is not null && list.Count > 0)
            {
                var r = new double[inputs.Count, inputs.Count];
                for (var k = 0; k < inputs.Count; k++) r[k, k] = 1;
                foreach (var c in list)
                {
                    var a = inputs.FindIndex(s => s.Name == c.First);
                    var b = inputs.FindIndex(s => s.Name == c.Second);
                    r[a, b] = r[b, a] = c.Rho;
                }

                try
                {
                    _ = new CorrelationMatrix(r);
                }
                catch (ArgumentException e)
                {
                    Add("$.correlations", null, $"the correlation matrix is not valid: {e.Message}");
                }
            }

            return list;
        }

        private void CheckInputsFitMechanism(MechanismKind kind, List<InputSpec> inputs, CorrosionSettings? corrosion, CrackGrowthSettings? crack,
            MinerSettings? sn, ExpressionModelSettings? expr)
        {
            IReadOnlyList<ModelInput>? expected = kind switch
            {
                MechanismKind.Corrosion when corrosion is not null => CorrosionModel.ExpectedInputs(corrosion),
                MechanismKind.CrackGrowth when crack is not null => CrackGrowthModel.ExpectedInputs(crack),
                MechanismKind.SnFatigue when sn is not null => MinerModel.ExpectedInputs(sn),
                _ => null,
            };
            if (corrosion is { PressureIsAnnualMaximum: true } && inputs.Any(i => i.Name == "pressure_MPa" && i.Family == "Deterministic"))
            {
                Add("$.mechanism.pressureIsAnnualMaximum", "true", "the pressure input pressure_MPa is a fixed value: an annual maximum must be a random input");
            }

            if (expected is not null)
            {
                foreach (var e in expected.Where(e => e.Required && !_declared.Contains(e.Name)))
                {
                    Add("$.inputs", null, $"required input '{e.Name}' ({e.Meaning}, {e.Unit}) is missing");
                }

                foreach (var name in _declared.Where(n => expected.All(e => e.Name != n)))
                {
                    Add($"$.inputs.{name}", null, $"this mechanism does not use '{name}' (it reads: {string.Join(", ", expected.Select(e => e.Name))})");
                }

                return;
            }

            if (kind == MechanismKind.Expression && expr is not null)
            {
                if (_declared.Count == 0) Add("$.inputs", null, "an expression model needs at least one input");
                foreach (var r in expr.RenewedOnRepair.Where(r => !_declared.Contains(r))) Add("$.mechanism.renewedOnRepair", r, "is not one of the inputs");
                if (expr.AnnualMaximumInput is { } am && !_declared.Contains(am)) Add("$.mechanism.annualMaximumInput", am, "is not one of the inputs");
                else if (expr.AnnualMaximumInput is { } fixedAm && inputs.Any(i => i.Name == fixedAm && i.Family == "Deterministic"))
                {
                    Add("$.mechanism.annualMaximumInput", fixedAm, "is a fixed value: the annual maximum must be a random input (a family with its parameters)");
                }

            }
        }

        private void Keys(JsonElement o, string path, string[] allowed)
        {
            foreach (var p in o.EnumerateObject())
            {
                if (!allowed.Contains(p.Name)) Add($"{path}.{p.Name}", p.Value, $"unknown field (allowed here: {string.Join(", ", allowed)})");
            }
        }

        private JsonElement? Object(JsonElement o, string key, string path, bool required)
        {
            if (!o.TryGetProperty(key, out var v))
            {
                if (required) Add($"{path}.{key}", null, "required object is missing");
                return null;
            }

            if (v.ValueKind != JsonValueKind.Object)
            {
                Add($"{path}.{key}", v, "must be an object");
                return null;
            }

            return v;
        }

        private string? String(JsonElement o, string key, string path, bool required)
        {
            if (!o.TryGetProperty(key, out var v) || v.ValueKind == JsonValueKind.Null)
            {
                if (required) Add($"{path}.{key}", null, "required text is missing");
                return null;
            }

            if (v.ValueKind != JsonValueKind.String)
            {
                Add($"{path}.{key}", v, "must be text");
                return null;
            }

            return v.GetString();
        }

        private string? Enum(JsonElement o, string key, string path, bool required, string[] allowed)
        {
            if (o.TryGetProperty(key, out var given) && given.ValueKind == JsonValueKind.Null)
            {
                Add($"{path}.{key}", "null", $"null is not a value here; give one of: {string.Join(", ", allowed)}");
                return null;
            }

            var s = String(o, key, path, false);
            if (s is null)
            {
                if (required && !o.TryGetProperty(key, out _)) Add($"{path}.{key}", null, $"required; one of: {string.Join(", ", allowed)}");
                return null;
            }

            if (!allowed.Contains(s))
            {
                Add($"{path}.{key}", o.GetProperty(key), $"must be one of: {string.Join(", ", allowed)}");
                return null;
            }

            return s;
        }

        private double? Number(JsonElement o, string key, string path, bool required)
        {
            if (!o.TryGetProperty(key, out var v))
            {
                if (required) Add($"{path}.{key}", null, "required number is missing");
                return null;
            }

            if (v.ValueKind != JsonValueKind.Number)
            {
                Add($"{path}.{key}", v, "must be a number");
                return null;
            }

            var d = v.GetDouble();
            if (!double.IsFinite(d))
            {
                Add($"{path}.{key}", v, "must be finite");
                return null;
            }

            return d;
        }

        private bool? Bool(JsonElement o, string key, string path)
        {
            if (!o.TryGetProperty(key, out var v)) return null;
            if (v.ValueKind is JsonValueKind.True or JsonValueKind.False) return v.GetBoolean();
            Add($"{path}.{key}", v, "must be true or false");
            return null;
        }

        private double[]? Numbers(JsonElement o, string key, string path)
        {
            if (!o.TryGetProperty(key, out var v))
            {
                Add($"{path}.{key}", null, "required array of numbers is missing");
                return null;
            }

            if (v.ValueKind != JsonValueKind.Array || v.EnumerateArray().Any(x => x.ValueKind != JsonValueKind.Number))
            {
                Add($"{path}.{key}", v, "must be an array of numbers");
                return null;
            }

            return v.EnumerateArray().Select(x => x.GetDouble()).ToArray();
        }

        private List<string>? Strings(JsonElement o, string key, string path)
        {
            if (!o.TryGetProperty(key, out var v)) return null;
            if (v.ValueKind != JsonValueKind.Array || v.EnumerateArray().Any(x => x.ValueKind != JsonValueKind.String))
            {
                Add($"{path}.{key}", v, "must be an array of texts");
                return null;
            }

            return v.EnumerateArray().Select(x => x.GetString()!).ToList();
        }

        private void Add(string path, JsonElement value, string message) =>
            problems.Add(new DefinitionProblem(path, Render(value), ComponentModelDefinition.WithoutParameterSuffix(message)));

        private void Add(string path, string? value, string message) =>
            problems.Add(new DefinitionProblem(path, value, ComponentModelDefinition.WithoutParameterSuffix(message)));

        private static string WithoutParameterSuffix(ArgumentException e)
        {
            var m = e.Message;
            var i = m.LastIndexOf(" (Parameter '", StringComparison.Ordinal);
            return i > 0 ? m[..i] : m;
        }

        private static string Render(JsonElement v)
        {
            var text = v.ValueKind == JsonValueKind.String ? $"\"{v.GetString()}\"" : v.GetRawText();
            return text.Length > 80 ? text[..77] + "..." : text;
        }
    }
}
