using System.Data.Common;
using InspectionUpdate.Inspection;

namespace InspectionUpdate.Register;

// Corrections of sites and methods: revision 1 is the row in site / inspection_method, never changed; each correction
// is a new row in site_revision / inspection_method_revision (revision 2, 3, ...) with who, when and why.
public sealed partial class RegisterStore
{
    private const string MethodParameterColumns =
        "description, pod_form, pod_mu_ln_mm, pod_sigma_ln, pod_lambda_mm, pod_lower_limit_mm, pod_max, " +
        "false_call_probability, sizing_kind, sizing_bias_mm, sizing_sd_mm, sizing_ln_bias, sizing_ln_sd";

    /// <summary>
    /// Corrects a site's name (a new revision; the earlier name stays readable as known on earlier dates). The code is
    /// the site's identity and is not corrected. Refused, listing every problem, when the site is unknown, the name
    /// blank or unchanged, or the actor or reason blank.
    /// </summary>
    /// <param name="siteCode">Code of an existing site.</param>
    /// <param name="name">The corrected name.</param>
    /// <param name="actor">Who corrects it.</param>
    /// <param name="reason">Why.</param>
    public WriteResult<Site> CorrectSite(string siteCode, string name, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        RequireText(problems, "name", name);
        var current = Sql.Query(c, t, "SELECT site_id, code, name, recorded_utc, recorded_by FROM site WHERE code = $code",
            r => new Site(r.Long("site_id"), r.Text("code"), r.Text("name"), r.Provenance(false)), ("$code", siteCode ?? "")).SingleOrDefault();
        if (current is null) problems.Add(new("site_code", siteCode, "no site with this code"));
        else
        {
            current = WithSiteCorrection(c, t, current, AsOfText(null));
            if (current.Name == name) problems.Add(new("name", name, "is the site's name already: nothing to correct"));
        }

        if (problems.Count > 0) return (WriteResult<Site>.Refused(problems), false);

        var previous = LatestSiteRevision(c, t, current!.Id, AsOfText(null));
        var now = Monotone(previous?.Recorded ?? current.Recorded.RecordedUtc);
        Sql.Insert(c, t,
            "INSERT INTO site_revision (site_id, revision, supersedes_revision_id, name, recorded_utc, recorded_by, reason) VALUES ($site, $revision, $supersedes, $name, $at, $by, $reason)",
            ("$site", current.Id), ("$revision", current.Revision + 1), ("$supersedes", previous?.RevisionId), ("$name", name), ("$at", now), ("$by", actor), ("$reason", reason));
        return (WriteResult<Site>.Ok(WithSiteCorrection(c, t, current, AsOfText(null))), true);
    });

    /// <summary>Every revision of a site, oldest first: the row as first recorded, then each correction with its own who, when and why.</summary>
    public IReadOnlyList<Site> SiteHistory(string siteCode) => Read((c, t) =>
    {
        var site = Sql.Query(c, t, "SELECT site_id, code, name, recorded_utc, recorded_by FROM site WHERE code = $code",
            r => new Site(r.Long("site_id"), r.Text("code"), r.Text("name"), r.Provenance(false)), ("$code", siteCode ?? "")).SingleOrDefault();
        if (site is null) return [];
        var corrections = Sql.Query(c, t, "SELECT revision, name, recorded_utc, recorded_by, reason FROM site_revision WHERE site_id = $id ORDER BY revision",
            r => site with { Name = r.Text("name"), Revision = (int)r.Long("revision"), Recorded = r.Provenance(true) }, ("$id", site.Id));
        return (IReadOnlyList<Site>)[site, .. corrections];
    });

    /// <summary>
    /// Corrects a method's description, PoD curve or sizing error (a new revision; findings keep naming the method and
    /// are read with the parameters known on the date asked for, so earlier results are reproduced with --known-on).
    /// The name is the method's identity and is not corrected. Refused, listing every problem, when the method is
    /// unknown, a parameter is missing or out of range (checked as <see cref="AddMethod"/> checks it), nothing
    /// changes, or the actor or reason is blank.
    /// </summary>
    /// <param name="corrected">The whole corrected method; its name names the method to correct.</param>
    /// <param name="actor">Who corrects it.</param>
    /// <param name="reason">Why.</param>
    public WriteResult<StoredMethod> CorrectMethod(NewMethod corrected, string actor, string reason)
    {
        ArgumentNullException.ThrowIfNull(corrected);
        ArgumentNullException.ThrowIfNull(corrected.Pod);
        ArgumentNullException.ThrowIfNull(corrected.Sizing);
        return Write((c, t) =>
        {
            var problems = new List<ValidationProblem>();
            RequireText(problems, "recorded_by", actor);
            RequireText(problems, "reason", reason);
            var current = ReadMethods(c, t, AsOfText(null), "name = $name", ("$name", corrected.Name ?? "")).SingleOrDefault();
            if (current is null) problems.Add(new("name", corrected.Name, "no method with this name"));
            ValidatePod(problems, corrected.Pod);
            ValidateSizing(problems, corrected.Sizing);
            if (current is not null && problems.Count == 0 && current.Description == (corrected.Description ?? "") && current.Pod == corrected.Pod && current.Sizing == corrected.Sizing)
                problems.Add(new("name", corrected.Name, "the corrected method equals the current one: nothing to correct"));
            if (problems.Count > 0) return (WriteResult<StoredMethod>.Refused(problems), false);

            var previous = Sql.Query(c, t, "SELECT method_revision_id, recorded_utc FROM inspection_method_revision WHERE method_id = $id ORDER BY revision DESC LIMIT 1",
                r => (Id: r.Long("method_revision_id"), At: Sql.ParseUtc(r.Text("recorded_utc"))), ("$id", current!.Id)).SingleOrDefault();
            var now = Monotone(previous == default ? current.Recorded.RecordedUtc : previous.At);
            var additive = corrected.Sizing.Kind == SizingErrorKind.AdditiveNormal;
            Sql.Insert(c, t,
                $"INSERT INTO inspection_method_revision (method_id, revision, supersedes_revision_id, {MethodParameterColumns}, recorded_utc, recorded_by, reason) " +
                "VALUES ($method, $revision, $supersedes, $description, $form, $mu, $sigma, $lambda, $lower, $max, $pfc, $kind, $bias, $sd, $lnbias, $lnsd, $at, $by, $reason)",
                ("$method", current.Id), ("$revision", current.Revision + 1), ("$supersedes", previous == default ? null : previous.Id),
                ("$description", corrected.Description ?? ""), ("$form", corrected.Pod.Form),
                ("$mu", corrected.Pod.MuLnMm), ("$sigma", corrected.Pod.SigmaLn), ("$lambda", corrected.Pod.LambdaMm),
                ("$lower", corrected.Pod.LowerLimitMm), ("$max", corrected.Pod.MaxPod), ("$pfc", corrected.Pod.FalseCallProbability),
                ("$kind", SizingKindText(corrected.Sizing.Kind)),
                ("$bias", additive ? corrected.Sizing.Bias : null), ("$sd", additive ? corrected.Sizing.StandardDeviation : null),
                ("$lnbias", additive ? null : corrected.Sizing.Bias), ("$lnsd", additive ? null : corrected.Sizing.StandardDeviation),
                ("$at", now), ("$by", actor), ("$reason", reason));
            return (WriteResult<StoredMethod>.Ok(ReadMethods(c, t, AsOfText(null), "method_id = $id", ("$id", current.Id)).Single()), true);
        });
    }

    /// <summary>Every revision of a method, oldest first: the row as first recorded, then each correction with its own who, when and why.</summary>
    public IReadOnlyList<StoredMethod> MethodHistory(string methodName) => Read((c, t) =>
    {
        var method = Sql.Query(c, t, $"SELECT {MethodColumns} FROM inspection_method WHERE name = $name", MethodFromRow, ("$name", methodName ?? "")).SingleOrDefault();
        if (method is null) return [];
        var corrections = Sql.Query(c, t,
            $"SELECT revision, {MethodParameterColumns}, recorded_utc, recorded_by, reason FROM inspection_method_revision WHERE method_id = $id ORDER BY revision",
            r => MethodParameters(r, method.Id, method.Name, r.Provenance(true)) with { Revision = (int)r.Long("revision") }, ("$id", method.Id));
        return (IReadOnlyList<StoredMethod>)[method, .. corrections];
    });

    private static Site WithSiteCorrection(DbConnection c, DbTransaction t, Site site, string asOfText) =>
        LatestSiteRevision(c, t, site.Id, asOfText) is { } latest ? site with { Name = latest.Name, Revision = latest.Revision } : site;

    // A PostgreSQL register is migrated to the current version when opened; a SQLite file may be older in migration tests.
    private static bool HoldsCorrections(DbConnection c, DbTransaction t) =>
        c is not Microsoft.Data.Sqlite.SqliteConnection sqlite
        || Schema.Migrations.ReadVersion(sqlite, (Microsoft.Data.Sqlite.SqliteTransaction)t) >= Schema.Migrations.CorrectionsVersion;

    private static (long RevisionId, int Revision, string Name, DateTimeOffset Recorded)? LatestSiteRevision(DbConnection c, DbTransaction t, long siteId, string asOfText) =>
        !HoldsCorrections(c, t) ? null : Sql.Query(c, t, "SELECT site_revision_id, revision, name, recorded_utc FROM site_revision WHERE site_id = $id AND recorded_utc <= $asOf ORDER BY revision DESC LIMIT 1",
            r => ((long RevisionId, int Revision, string Name, DateTimeOffset Recorded)?)(r.Long("site_revision_id"), (int)r.Long("revision"), r.Text("name"), Sql.ParseUtc(r.Text("recorded_utc"))),
            ("$id", siteId), ("$asOf", asOfText)).SingleOrDefault();

    // The base row's id, name and first-recorded provenance, with the parameters of the latest correction recorded by then.
    private static StoredMethod WithMethodCorrection(DbConnection c, DbTransaction t, StoredMethod method, string asOfText) =>
        !HoldsCorrections(c, t) ? method : Sql.Query(c, t,
            $"SELECT revision, {MethodParameterColumns} FROM inspection_method_revision WHERE method_id = $id AND recorded_utc <= $asOf ORDER BY revision DESC LIMIT 1",
            r => MethodParameters(r, method.Id, method.Name, method.Recorded) with { Revision = (int)r.Long("revision") },
            ("$id", method.Id), ("$asOf", asOfText)).SingleOrDefault() ?? method;
}
