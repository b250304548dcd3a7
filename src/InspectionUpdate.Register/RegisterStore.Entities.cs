using System.Data.Common;
using System.Globalization;
using InspectionUpdate.Inspection;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    private const string ComponentColumns =
        "c.component_id, c.site_id, c.code, c.description, c.install_date, c.wall_thickness_mm, c.parameter_group, c.recorded_utc, c.recorded_by";

    private const string MethodColumns =
        "method_id, name, description, pod_form, pod_mu_ln_mm, pod_sigma_ln, pod_lambda_mm, pod_lower_limit_mm, pod_max, " +
        "false_call_probability, sizing_kind, sizing_bias_mm, sizing_sd_mm, sizing_ln_bias, sizing_ln_sd, recorded_utc, recorded_by";

    /// <summary>Adds a site. Refused (nothing written) when the code is blank or taken, or the name or actor is blank.</summary>
    public WriteResult<Site> AddSite(NewSite site, string actor)
    {
        ArgumentNullException.ThrowIfNull(site);
        return Write((c, t) =>
        {
            var problems = new List<ValidationProblem>();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "code", site.Code);
            RequireText(problems, "name", site.Name);
            if (!string.IsNullOrWhiteSpace(site.Code) && Sql.Scalar(c, t, "SELECT 1 FROM site WHERE code = $code", ("$code", site.Code)) is not null)
            {
                problems.Add(new("code", site.Code, "a site with this code already exists"));
            }

            if (problems.Count > 0)
            {
                return (WriteResult<Site>.Refused(problems), false);
            }

            var now = NowText();
            var id = Sql.Insert(c, t, "INSERT INTO site (code, name, recorded_utc, recorded_by) VALUES ($code, $name, $at, $by)",
                ("$code", site.Code), ("$name", site.Name), ("$at", now), ("$by", actor));
            return (WriteResult<Site>.Ok(new Site(id, site.Code, site.Name, new Provenance(Sql.ParseUtc(now), Who(actor), ""))), true);
        });
    }

    /// <summary>Sites recorded on or before <paramref name="asOf"/> (all when null), by code, each with its name as corrected by then.</summary>
    public IReadOnlyList<Site> Sites(DateTimeOffset? asOf = null) => Read((c, t) => Sql.Query(c, t,
        "SELECT site_id, code, name, recorded_utc, recorded_by FROM site WHERE recorded_utc <= $asOf ORDER BY code",
        r => new Site(r.Long("site_id"), r.Text("code"), r.Text("name"), r.Provenance(false)),
        ("$asOf", AsOfText(asOf))).Select(site => WithSiteCorrection(c, t, site, AsOfText(asOf))).ToList());

    /// <summary>
    /// Adds a component with revision 1 of its model definition. Refused, listing every problem, when the site is
    /// unknown, the code taken, the install date in the future, the wall thickness not &gt; 0, the model definition not
    /// valid JSON or its version blank.
    /// </summary>
    public WriteResult<Component> AddComponent(NewComponent component, string actor)
    {
        ArgumentNullException.ThrowIfNull(component);
        return Write((c, t) =>
        {
            var problems = new List<ValidationProblem>();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "code", component.Code);
            var siteId = Sql.Scalar(c, t, "SELECT site_id FROM site WHERE code = $code", ("$code", component.SiteCode ?? ""));
            if (siteId is null)
            {
                problems.Add(new("site_code", component.SiteCode, "no site with this code"));
            }

            if (!string.IsNullOrWhiteSpace(component.Code) && Sql.Scalar(c, t, "SELECT code FROM component WHERE lower(code) = lower($code)", ("$code", component.Code)) is string taken)
            {
                problems.Add(new("code", component.Code, taken == component.Code
                    ? "a component with this code already exists"
                    : $"component '{taken}' differs only in upper and lower case: their report files would collide"));
            }

            if (!string.IsNullOrWhiteSpace(component.Code) && CodeProblem(component.Code) is { } codeProblem)
            {
                problems.Add(new("code", component.Code.Length > 80 ? component.Code[..77] + "..." : component.Code, codeProblem));
            }

            if (component.InstallDate > Today())
            {
                problems.Add(new("install_date", Sql.Date(component.InstallDate), "the install date lies in the future"));
            }

            if (component.WallThicknessMm is { } wall && !(double.IsFinite(wall) && wall > 0))
            {
                problems.Add(new("wall_thickness_mm", Sql.Invariant(wall), "the wall thickness must be finite and > 0 mm"));
            }

            if (component.ParameterGroup is { } group && string.IsNullOrWhiteSpace(group))
            {
                problems.Add(new("parameter_group", group, "a parameter group name must not be blank (use null for none)"));
            }

            ValidateModel(problems, component.ModelDefinitionJson, component.ModelVersion);
            if (problems.Count > 0)
            {
                return (WriteResult<Component>.Refused(problems), false);
            }

            var now = NowText();
            var id = Sql.Insert(c, t,
                "INSERT INTO component (site_id, code, description, install_date, wall_thickness_mm, parameter_group, recorded_utc, recorded_by) " +
                "VALUES ($site, $code, $description, $install, $wall, $group, $at, $by)",
                ("$site", siteId), ("$code", component.Code), ("$description", component.Description ?? ""),
                ("$install", Sql.Date(component.InstallDate)), ("$wall", component.WallThicknessMm), ("$group", component.ParameterGroup),
                ("$at", now), ("$by", actor));
            Sql.Insert(c, t,
                "INSERT INTO component_model_revision (component_id, revision, definition_json, model_version, recorded_utc, recorded_by, reason) " +
                "VALUES ($component, 1, $json, $version, $at, $by, 'initial model definition')",
                ("$component", id), ("$json", component.ModelDefinitionJson), ("$version", component.ModelVersion), ("$at", now), ("$by", actor));
            return (WriteResult<Component>.Ok(ReadComponent(c, t, id, DateTimeOffset.MaxValue)!), true);
        });
    }

    /// <summary>The longest component code accepted (it names the component's report files).</summary>
    public const int MaximumCodeLength = 64;

    private static readonly HashSet<string> ReservedCodes = new(StringComparer.OrdinalIgnoreCase)
    {
        // The register report's own files, and names some file systems reserve.
        "index", "register", "con", "prn", "aux", "nul",
        "com1", "com2", "com3", "com4", "com5", "com6", "com7", "com8", "com9",
        "lpt1", "lpt2", "lpt3", "lpt4", "lpt5", "lpt6", "lpt7", "lpt8", "lpt9",
    };

    /// <summary>
    /// Why a component code cannot be used, or null: at most <see cref="MaximumCodeLength"/> ASCII letters, digits,
    /// '-', '_' and '.', starting with a letter or digit and not ending with '.', and not a reserved name; so that
    /// the code is its report's file name on every file system and distinct codes give distinct files.
    /// </summary>
    public static string? CodeProblem(string code)
    {
        ArgumentNullException.ThrowIfNull(code);
        if (code.Length > MaximumCodeLength) return FormattableString.Invariant($"a component code has at most {MaximumCodeLength} characters (this one has {code.Length})");
        if (!char.IsAsciiLetterOrDigit(code[0]) || code[^1] == '.' || !code.All(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '_' or '.'))
            return "a component code uses only ASCII letters, digits, '-', '_' and '.', starts with a letter or digit and does not end with '.'";
        return ReservedCodes.Contains(code.Split('.')[0]) ? "is a reserved name (the register report's files or a device name)" : null;
    }

    /// <summary>
    /// Records a new revision of a component's model definition (the old one stays readable for as-of reads).
    /// Refused when the component is unknown, the JSON invalid, the version, actor or reason blank.
    /// </summary>
    public WriteResult<ComponentModelRevision> ReviseModel(string componentCode, string definitionJson, string modelVersion, string actor, string reason) =>
        Write((c, t) =>
        {
            var problems = new List<ValidationProblem>();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "reason", reason);
            var id = Sql.Scalar(c, t, "SELECT component_id FROM component WHERE code = $code", ("$code", componentCode ?? "")) as long?;
            if (id is null)
            {
                problems.Add(new("component_code", componentCode, "no component with this code"));
            }

            ValidateModel(problems, definitionJson, modelVersion);
            if (problems.Count > 0)
            {
                return (WriteResult<ComponentModelRevision>.Refused(problems), false);
            }

            var latest = LatestModel(c, t, id!.Value, DateTimeOffset.MaxValue)!;
            var now = Monotone(latest.Recorded.RecordedUtc);
            var revisionId = Sql.Insert(c, t,
                "INSERT INTO component_model_revision (component_id, revision, supersedes_revision_id, definition_json, model_version, recorded_utc, recorded_by, reason) " +
                "VALUES ($component, $revision, $supersedes, $json, $version, $at, $by, $reason)",
                ("$component", id), ("$revision", latest.Revision + 1), ("$supersedes", latest.RevisionId), ("$json", definitionJson),
                ("$version", modelVersion), ("$at", now), ("$by", actor), ("$reason", reason));
            return (WriteResult<ComponentModelRevision>.Ok(new ComponentModelRevision(revisionId, id.Value, latest.Revision + 1, definitionJson, modelVersion,
                new Provenance(Sql.ParseUtc(now), Who(actor), reason))), true);
        });

    /// <summary>
    /// Retires a component (it leaves reports and runs from now on, and stays readable as of earlier dates) or
    /// reinstates it; the change is recorded with who, when and why, never deleted. Refused when the component is
    /// unknown, already in that state, or the actor or reason is blank.
    /// </summary>
    public WriteResult<ComponentStatusChange> SetRetired(string componentCode, bool retired, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        var id = Sql.Scalar(c, t, "SELECT component_id FROM component WHERE code = $code", ("$code", componentCode ?? "")) as long?;
        if (id is null) problems.Add(new("component_code", componentCode, "no component with this code"));
        else if (RetiredAsOf(c, t, id.Value, DateTimeOffset.MaxValue) == retired)
            problems.Add(new("component_code", componentCode, retired ? "the component is already retired" : "the component is in service (not retired)"));
        if (problems.Count > 0) return (WriteResult<ComponentStatusChange>.Refused(problems), false);

        var previous = Sql.Scalar(c, t, "SELECT MAX(recorded_utc) FROM component_status WHERE component_id = $id", ("$id", id)) as string;
        var now = previous is null ? NowText() : Monotone(Sql.ParseUtc(previous));
        var status = retired ? "retired" : "in-service";
        var statusId = Sql.Insert(c, t, "INSERT INTO component_status (component_id, status, recorded_utc, recorded_by, reason) VALUES ($id, $status, $at, $by, $reason)",
            ("$id", id), ("$status", status), ("$at", now), ("$by", actor), ("$reason", reason));
        return (WriteResult<ComponentStatusChange>.Ok(new ComponentStatusChange(statusId, id!.Value, componentCode!, status, new Provenance(Sql.ParseUtc(now), Who(actor), reason))), true);
    });

    /// <summary>Whether the component was retired as known on <paramref name="asOf"/> (now when null).</summary>
    public bool IsRetired(long componentId, DateTimeOffset? asOf = null) => Read((c, t) => RetiredAsOf(c, t, componentId, asOf ?? DateTimeOffset.MaxValue));

    /// <summary>Every retire and reinstate of a component, oldest first.</summary>
    public IReadOnlyList<ComponentStatusChange> StatusHistory(long componentId) => Read((c, t) => Sql.Query(c, t,
        "SELECT s.status_id, s.component_id, c.code, s.status, s.recorded_utc, s.recorded_by, s.reason FROM component_status s JOIN component c USING (component_id) WHERE s.component_id = $id ORDER BY s.status_id",
        r => new ComponentStatusChange(r.Long("status_id"), r.Long("component_id"), r.Text("code"), r.Text("status"), r.Provenance(true)), ("$id", componentId)));

    /// <summary>Components in service (not retired) as known on <paramref name="asOf"/>: the ones reports and runs cover.</summary>
    public IReadOnlyList<Component> ComponentsInService(DateTimeOffset? asOf = null) => Components(asOf).Where(x => !IsRetired(x.Id, asOf)).ToList();

    private static bool RetiredAsOf(DbConnection c, DbTransaction t, long componentId, DateTimeOffset asOf) =>
        Sql.Scalar(c, t, "SELECT status FROM component_status WHERE component_id = $id AND recorded_utc <= $asOf ORDER BY recorded_utc DESC, status_id DESC LIMIT 1",
            ("$id", componentId), ("$asOf", Sql.Utc(asOf))) as string == "retired";

    /// <summary>Every revision of a component's model definition, oldest first.</summary>
    public IReadOnlyList<ComponentModelRevision> ModelHistory(long componentId) => Read((c, t) => Sql.Query(c, t,
        "SELECT * FROM component_model_revision WHERE component_id = $id ORDER BY revision", ReadModel, ("$id", componentId)));

    /// <summary>Components recorded on or before <paramref name="asOf"/> (all when null), each with its model as known then, by code.</summary>
    public IReadOnlyList<Component> Components(DateTimeOffset? asOf = null) => Read((c, t) =>
    {
        var ids = Sql.Query(c, t, "SELECT component_id FROM component WHERE recorded_utc <= $asOf ORDER BY code", r => r.GetInt64(0), ("$asOf", AsOfText(asOf)));
        return ids.Select(id => ReadComponent(c, t, id, asOf ?? DateTimeOffset.MaxValue)!).ToList();
    });

    /// <summary>The component with this id as known on <paramref name="asOf"/>, or null if it did not exist then.</summary>
    public Component? GetComponent(long componentId, DateTimeOffset? asOf = null) =>
        Read((c, t) => ReadComponent(c, t, componentId, asOf ?? DateTimeOffset.MaxValue));

    /// <summary>The component with this code as known on <paramref name="asOf"/>, or null.</summary>
    public Component? FindComponent(string code, DateTimeOffset? asOf = null) => Read((c, t) =>
    {
        var id = Sql.Scalar(c, t, "SELECT component_id FROM component WHERE code = $code", ("$code", code ?? "")) as long?;
        return id is null ? null : ReadComponent(c, t, id.Value, asOf ?? DateTimeOffset.MaxValue);
    });

    /// <summary>Components of a shared-parameter group as known on <paramref name="asOf"/>, by code.</summary>
    public IReadOnlyList<Component> ComponentsInGroup(string parameterGroup, DateTimeOffset? asOf = null) =>
        Components(asOf).Where(x => x.ParameterGroup == parameterGroup).ToList();

    /// <summary>
    /// Adds an inspection method. Refused, listing every problem, when the name is blank or taken or a PoD or sizing
    /// parameter is missing or out of range (the curve and the sizing error are built to check them).
    /// </summary>
    public WriteResult<StoredMethod> AddMethod(NewMethod method, string actor)
    {
        ArgumentNullException.ThrowIfNull(method);
        ArgumentNullException.ThrowIfNull(method.Pod);
        ArgumentNullException.ThrowIfNull(method.Sizing);
        return Write((c, t) =>
        {
            var problems = new List<ValidationProblem>();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "name", method.Name);
            if (!string.IsNullOrWhiteSpace(method.Name) && Sql.Scalar(c, t, "SELECT 1 FROM inspection_method WHERE name = $name", ("$name", method.Name)) is not null)
            {
                problems.Add(new("name", method.Name, "a method with this name already exists"));
            }

            ValidatePod(problems, method.Pod);
            ValidateSizing(problems, method.Sizing);
            if (problems.Count > 0)
            {
                return (WriteResult<StoredMethod>.Refused(problems), false);
            }

            var additive = method.Sizing.Kind == SizingErrorKind.AdditiveNormal;
            var now = NowText();
            var id = Sql.Insert(c, t,
                "INSERT INTO inspection_method (name, description, pod_form, pod_mu_ln_mm, pod_sigma_ln, pod_lambda_mm, pod_lower_limit_mm, pod_max, " +
                "false_call_probability, sizing_kind, sizing_bias_mm, sizing_sd_mm, sizing_ln_bias, sizing_ln_sd, recorded_utc, recorded_by) " +
                "VALUES ($name, $description, $form, $mu, $sigma, $lambda, $lower, $max, $pfc, $kind, $bias, $sd, $lnbias, $lnsd, $at, $by)",
                ("$name", method.Name), ("$description", method.Description ?? ""), ("$form", method.Pod.Form),
                ("$mu", method.Pod.MuLnMm), ("$sigma", method.Pod.SigmaLn), ("$lambda", method.Pod.LambdaMm),
                ("$lower", method.Pod.LowerLimitMm), ("$max", method.Pod.MaxPod), ("$pfc", method.Pod.FalseCallProbability),
                ("$kind", SizingKindText(method.Sizing.Kind)),
                ("$bias", additive ? method.Sizing.Bias : null), ("$sd", additive ? method.Sizing.StandardDeviation : null),
                ("$lnbias", additive ? null : method.Sizing.Bias), ("$lnsd", additive ? null : method.Sizing.StandardDeviation),
                ("$at", now), ("$by", actor));
            return (WriteResult<StoredMethod>.Ok(ReadMethods(c, t, AsOfText(null), "method_id = $id", ("$id", id)).Single()), true);
        });
    }

    /// <summary>Methods recorded on or before <paramref name="asOf"/> (all when null), by name, each with its parameters as corrected by then.</summary>
    public IReadOnlyList<StoredMethod> Methods(DateTimeOffset? asOf = null) =>
        Read((c, t) => ReadMethods(c, t, AsOfText(asOf), "recorded_utc <= $asOf", ("$asOf", AsOfText(asOf))));

    /// <summary>The method with this name (its latest correction), or null.</summary>
    public StoredMethod? FindMethod(string name) =>
        Read((c, t) => ReadMethods(c, t, AsOfText(null), "name = $name", ("$name", name ?? "")).SingleOrDefault());

    /// <summary>Methods selected by <paramref name="where"/>, each with its latest correction recorded on or before <paramref name="asOfText"/>.</summary>
    private static List<StoredMethod> ReadMethods(DbConnection c, DbTransaction t, string asOfText, string where, params (string, object?)[] parameters) =>
        Sql.Query(c, t, $"SELECT {MethodColumns} FROM inspection_method WHERE {where} ORDER BY name", MethodFromRow, parameters)
            .Select(m => WithMethodCorrection(c, t, m, asOfText)).ToList();

    // Reads the method columns shared by inspection_method and inspection_method_revision (name, id and provenance from the caller's columns).
    private static StoredMethod MethodFromRow(DbDataReader r) => MethodParameters(r, r.Long("method_id"), r.Text("name"), r.Provenance(false));

    private static StoredMethod MethodParameters(DbDataReader r, long id, string name, Provenance recorded)
    {
        var additive = r.Text("sizing_kind") == "additive-normal";
        var sizing = additive
            ? new SizingError(SizingErrorKind.AdditiveNormal, r.Real("sizing_bias_mm"), r.Real("sizing_sd_mm"))
            : new SizingError(SizingErrorKind.MultiplicativeLognormal, r.Real("sizing_ln_bias"), r.Real("sizing_ln_sd"));
        var pod = new PodSpec(r.Text("pod_form"), r.NullableDouble("pod_mu_ln_mm"), r.NullableDouble("pod_sigma_ln"), r.NullableDouble("pod_lambda_mm"),
            r.Real("pod_lower_limit_mm"), r.Real("pod_max"), r.Real("false_call_probability"));
        return new StoredMethod(id, name, r.Text("description"), pod, sizing, recorded);
    }

    private static Component? ReadComponent(DbConnection c, DbTransaction t, long id, DateTimeOffset asOf)
    {
        var model = LatestModel(c, t, id, asOf);
        if (model is null)
        {
            return null;
        }

        return Sql.Query(c, t, $"SELECT {ComponentColumns} FROM component c WHERE c.component_id = $id AND c.recorded_utc <= $asOf", r => new Component(
            r.Long("component_id"), r.Long("site_id"), r.Text("code"), r.Text("description"), Sql.ParseDate(r.Text("install_date")),
            r.NullableDouble("wall_thickness_mm"), r.NullableString("parameter_group"), model, r.Provenance(false)),
            ("$id", id), ("$asOf", Sql.Utc(asOf))).SingleOrDefault();
    }

    private static ComponentModelRevision? LatestModel(DbConnection c, DbTransaction t, long componentId, DateTimeOffset asOf) =>
        Sql.Query(c, t,
            "SELECT * FROM component_model_revision WHERE component_id = $id AND recorded_utc <= $asOf ORDER BY revision DESC LIMIT 1",
            ReadModel, ("$id", componentId), ("$asOf", Sql.Utc(asOf))).SingleOrDefault();

    private static ComponentModelRevision ReadModel(DbDataReader r) =>
        new(r.Long("model_revision_id"), r.Long("component_id"), (int)r.Long("revision"), r.Text("definition_json"), r.Text("model_version"), r.Provenance(true));

    private static void ValidateModel(List<ValidationProblem> problems, string? json, string? version)
    {
        RequireText(problems, "model_version", version);
        if (string.IsNullOrWhiteSpace(json))
        {
            problems.Add(new("model_definition_json", json, "the model definition is required"));
            return;
        }

        // The same parse and build as an assessment (ComponentModelDefinition.Parse builds the model and its
        // transformation): everything the register accepts, an assessment accepts.
        problems.AddRange(ModelProblems(json));
    }

    /// <summary>
    /// Every problem of a model definition as assess would find it (parse, validation, model and transformation
    /// build), each naming the JSON path ("model $.inputs.rate_mmPerYear.cov") and the value; empty when valid.
    /// </summary>
    public static IReadOnlyList<ValidationProblem> ModelProblems(string json)
    {
        var parsed = Degradation.Definition.ComponentModelDefinition.Parse(json);
        return parsed.IsValid ? [] : parsed.Problems.Select(p => new ValidationProblem("model " + p.Path, p.Value, p.Message)).ToList();
    }

    private static void ValidatePod(List<ValidationProblem> problems, PodSpec pod)
    {
        try
        {
            _ = pod.ToCurve();
        }
        catch (ArgumentException e)
        {
            var field = e.ParamName switch
            {
                "muLnMm" => "pod_mu_ln_mm",
                "sigmaLn" => "pod_sigma_ln",
                "lambdaMm" => "pod_lambda_mm",
                "lowerLimitMm" => "pod_lower_limit_mm",
                "maxPod" => "pod_max",
                "falseCallProbability" => "false_call_probability",
                { } other => other,
                null => "pod_form",
            };
            var value = e is ArgumentOutOfRangeException { ActualValue: { } v } ? Convert.ToString(v, CultureInfo.InvariantCulture) : null;
            problems.Add(new(field, value ?? pod.Form, FirstSentence(e.Message)));
        }

        // Parameters of the other forms must be absent, so a stored row rebuilds exactly this curve.
        if (pod.Form == PodForms.Exponential && (pod.MuLnMm is not null || pod.SigmaLn is not null))
        {
            problems.Add(new("pod_mu_ln_mm", pod.Form, "the exponential form takes only pod_lambda_mm"));
        }

        if (pod.Form != PodForms.Exponential && pod.LambdaMm is not null)
        {
            problems.Add(new("pod_lambda_mm", Sql.Invariant(pod.LambdaMm.Value), $"the {pod.Form} form takes pod_mu_ln_mm and pod_sigma_ln, not pod_lambda_mm"));
        }
    }

    private static void ValidateSizing(List<ValidationProblem> problems, SizingError sizing)
    {
        var additive = sizing.Kind == SizingErrorKind.AdditiveNormal;
        if (!Enum.IsDefined(sizing.Kind))
        {
            problems.Add(new("sizing_kind", sizing.Kind.ToString(), "unknown sizing-error kind"));
            return;
        }

        if (!double.IsFinite(sizing.Bias))
        {
            problems.Add(new(additive ? "sizing_bias_mm" : "sizing_ln_bias", Sql.Invariant(sizing.Bias), "the sizing bias must be finite"));
        }

        if (!(double.IsFinite(sizing.StandardDeviation) && sizing.StandardDeviation > 0))
        {
            problems.Add(new(additive ? "sizing_sd_mm" : "sizing_ln_sd", Sql.Invariant(sizing.StandardDeviation), "the sizing standard deviation must be finite and > 0"));
        }
    }

    internal static string SizingKindText(SizingErrorKind kind) =>
        kind == SizingErrorKind.AdditiveNormal ? "additive-normal" : "multiplicative-lognormal";

    private static void RequireText(List<ValidationProblem> problems, string field, string? value)
    {
        if (string.IsNullOrWhiteSpace(value))
        {
            problems.Add(new(field, value, "must not be empty"));
        }
    }

    private static string FirstSentence(string message)
    {
        var cut = message.IndexOf(" (Parameter", StringComparison.Ordinal);
        return (cut > 0 ? message[..cut] : message).Split('\n')[0].Trim();
    }

    private static string Abbreviate(string text) => text.Length <= 60 ? text : text[..57] + "...";

    private DateOnly Today() => DateOnly.FromDateTime(Now().UtcDateTime);

    private static string AsOfText(DateTimeOffset? asOf) => Sql.Utc(asOf ?? DateTimeOffset.MaxValue);

    // A revision is recorded no earlier than the one it supersedes, even if this machine's clock is behind.
    private string Monotone(DateTimeOffset previous)
    {
        var now = Now();
        return Sql.Utc(now > previous ? now : previous);
    }
}
