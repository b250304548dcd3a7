using System.Data.Common;
using System.Globalization;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    private const string RepairSelect =
        "SELECT rr.*, r.component_id, c.code AS component_code FROM repair_revision rr JOIN repair r ON r.repair_id = rr.repair_id " +
        "JOIN component c ON c.component_id = r.component_id ";

    private const string RepairLatestAsOf =
        "rr.recorded_utc <= $asOf AND rr.revision = (SELECT MAX(x.revision) FROM repair_revision x WHERE x.repair_id = rr.repair_id AND x.recorded_utc <= $asOf)";

    /// <summary>
    /// Records a repair with its post-repair prior (revision 1). Refused, listing every problem, when the component
    /// is unknown, the date before install or in the future, or the prior does not parse.
    /// </summary>
    public WriteResult<RepairRevision> AddRepair(NewRepair repair, string actor, string reason)
    {
        ArgumentNullException.ThrowIfNull(repair);
        return Write((c, t) =>
        {
            var problems = ValidateRepair(c, t, repair, actor, reason, out var componentId);
            if (problems.Count > 0)
            {
                return (WriteResult<RepairRevision>.Refused(problems), false);
            }

            var now = NowText();
            var id = Sql.Insert(c, t, "INSERT INTO repair (component_id, recorded_utc, recorded_by) VALUES ($component, $at, $by)",
                ("$component", componentId), ("$at", now), ("$by", actor));
            InsertRepairRevision(c, t, id, 1, null, repair, false, actor, reason, now);
            return (WriteResult<RepairRevision>.Ok(ReadRepairs(c, t, "rr.repair_id = $id", ("$id", id)).Single()), true);
        });
    }

    /// <summary>Records a corrected repair as a new revision (same component); the old revision stays readable.</summary>
    public WriteResult<RepairRevision> ReviseRepair(long repairId, NewRepair corrected, string actor, string reason)
    {
        ArgumentNullException.ThrowIfNull(corrected);
        return Write((c, t) =>
        {
            var latest = ReadRepairs(c, t, "rr.repair_id = $id ORDER BY rr.revision DESC LIMIT 1", ("$id", repairId)).SingleOrDefault();
            var problems = ValidateRepair(c, t, corrected, actor, reason, out _, latest?.PostRepairPriorJson);
            if (latest is null)
            {
                problems.Add(new("repair_id", repairId.ToString(CultureInfo.InvariantCulture), "no repair with this id"));
            }
            else if (latest.ComponentCode != corrected.ComponentCode)
            {
                problems.Add(new("component_code", corrected.ComponentCode, $"a revision cannot move repair {repairId} from component '{latest.ComponentCode}'"));
            }

            if (problems.Count > 0)
            {
                return (WriteResult<RepairRevision>.Refused(problems), false);
            }

            InsertRepairRevision(c, t, repairId, latest!.Revision + 1, latest.RevisionId, corrected, false, actor, reason, Monotone(latest.Recorded.RecordedUtc));
            return (WriteResult<RepairRevision>.Ok(ReadRepairs(c, t, "rr.repair_id = $id ORDER BY rr.revision DESC LIMIT 1", ("$id", repairId)).Single()), true);
        });
    }

    /// <summary>Withdraws a repair recorded in error (a new revision marked withdrawn).</summary>
    public WriteResult<RepairRevision> WithdrawRepair(long repairId, string actor, string reason) => Write((c, t) =>
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        var latest = ReadRepairs(c, t, "rr.repair_id = $id ORDER BY rr.revision DESC LIMIT 1", ("$id", repairId)).SingleOrDefault();
        if (latest is null || latest.Withdrawn)
        {
            problems.Add(new("repair_id", repairId.ToString(CultureInfo.InvariantCulture), latest is null ? "no repair with this id" : "the repair is already withdrawn"));
        }

        if (problems.Count > 0)
        {
            return (WriteResult<RepairRevision>.Refused(problems), false);
        }

        var content = new NewRepair(latest!.ComponentCode, latest.RepairDate, latest.Description, latest.PostRepairPriorJson);
        InsertRepairRevision(c, t, repairId, latest.Revision + 1, latest.RevisionId, content, true, actor, reason, Monotone(latest.Recorded.RecordedUtc));
        return (WriteResult<RepairRevision>.Ok(ReadRepairs(c, t, "rr.repair_id = $id ORDER BY rr.revision DESC LIMIT 1", ("$id", repairId)).Single()), true);
    });

    /// <summary>Repairs of a component as known on <paramref name="asOf"/> (latest revisions; withdrawn left out unless asked), by date.</summary>
    public IReadOnlyList<RepairRevision> Repairs(long componentId, DateTimeOffset? asOf = null, bool includeWithdrawn = false) =>
        Read((c, t) => ReadRepairs(c, t,
            $"r.component_id = $component AND {RepairLatestAsOf}{(includeWithdrawn ? "" : " AND rr.withdrawn = 0")} ORDER BY rr.repair_date, rr.repair_id",
            ("$component", componentId), ("$asOf", AsOfText(asOf))));

    /// <summary>Every revision of a repair, oldest first.</summary>
    public IReadOnlyList<RepairRevision> RepairHistory(long repairId) =>
        Read((c, t) => ReadRepairs(c, t, "rr.repair_id = $id ORDER BY rr.revision", ("$id", repairId)));

    private List<ValidationProblem> ValidateRepair(DbConnection c, DbTransaction t, NewRepair repair, string actor, string reason, out long componentId,
        string? storedPriorJson = null)
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        componentId = 0;
        var component = Sql.Query(c, t, "SELECT component_id, install_date FROM component WHERE code = $code",
            r => (Id: r.Long("component_id"), Install: Sql.ParseDate(r.Text("install_date"))), ("$code", repair.ComponentCode ?? "")).SingleOrDefault();
        if (component == default)
        {
            problems.Add(new("component_code", repair.ComponentCode, "no component with this code"));
        }
        else
        {
            componentId = component.Id;
            if (repair.RepairDate < component.Install)
            {
                problems.Add(new("repair_date", Sql.Date(repair.RepairDate), $"the repair date lies before the component's install date {Sql.Date(component.Install)}"));
            }
        }

        if (repair.RepairDate > Today())
        {
            problems.Add(new("repair_date", Sql.Date(repair.RepairDate), "the repair date lies in the future"));
        }

        // A prior carried forward unchanged from the stored revision may still use the old key "distribution".
        if (storedPriorJson is not null && repair.PostRepairPriorJson == storedPriorJson) PostRepairPrior.ParseCarriedForward(repair.PostRepairPriorJson, problems);
        else PostRepairPrior.Parse(repair.PostRepairPriorJson, problems);
        return problems;
    }

    private static void InsertRepairRevision(DbConnection c, DbTransaction t, long repairId, int revision, long? supersedes, NewRepair r,
        bool withdrawn, string actor, string reason, string now) =>
        Sql.Insert(c, t,
            "INSERT INTO repair_revision (repair_id, revision, supersedes_revision_id, repair_date, description, post_repair_prior_json, withdrawn, " +
            "recorded_utc, recorded_by, reason) VALUES ($repair, $revision, $supersedes, $date, $description, $prior, $withdrawn, $at, $by, $reason)",
            ("$repair", repairId), ("$revision", revision), ("$supersedes", supersedes), ("$date", Sql.Date(r.RepairDate)),
            ("$description", r.Description ?? ""), ("$prior", r.PostRepairPriorJson), ("$withdrawn", withdrawn ? 1 : 0),
            ("$at", now), ("$by", actor), ("$reason", reason));

    private static List<RepairRevision> ReadRepairs(DbConnection c, DbTransaction t, string where, params (string, object?)[] parameters) =>
        Sql.Query(c, t, RepairSelect + "WHERE " + where, r => new RepairRevision(
            r.Long("repair_id"), (int)r.Long("revision"), r.Long("repair_revision_id"), r.Long("component_id"), r.Text("component_code"),
            Sql.ParseDate(r.Text("repair_date")), r.Text("description"), r.Text("post_repair_prior_json"), r.Long("withdrawn") == 1, r.Provenance(true)),
            parameters);
}
