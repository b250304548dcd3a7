using InspectionUpdate.Register;
using InspectionUpdate.Updating;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

public class PostRepairPriorTests
{
    private const string OldSpelling = """{"inputs":{"d0_mm":{"distribution":"lognormal","mean":0.2,"sd":0.1}}}""";

    [Fact]
    [Reference("Issue 14, one spelling per concept: model files say \"family\", so the post-repair prior does too")]
    public void A_new_prior_spelt_distribution_is_refused_naming_the_key_family()
    {
        using var r = new TestRegister();
        var refused = r.Store.AddRepair(new NewRepair(TestRegister.Component, new DateOnly(2021, 1, 1), "sleeve", OldSpelling), "A", "wo 9");

        var problem = Assert.Single(refused.Problems);
        Assert.Equal("post_repair_prior_json.inputs.d0_mm.distribution", problem.Field);
        Assert.Contains("\"family\"", problem.Message, StringComparison.Ordinal);
        Assert.Equal(0, r.Count("repair"));

        var accepted = r.Store.AddRepair(new NewRepair(TestRegister.Component, new DateOnly(2021, 1, 1), "sleeve",
            """{"inputs":{"d0_mm":{"family":"lognormal","mean":0.2,"sd":0.1,"note":"sleeve supplier's data"}}}"""), "A", "wo 9");
        Assert.True(accepted.Succeeded, string.Join("; ", accepted.Problems));
    }

    [Fact]
    [Reference("Design rule (DESIGN.md §5): rows written by earlier versions stay readable; a correction keeps history")]
    public void A_stored_prior_with_the_old_spelling_is_still_read_and_can_be_carried_through_a_correction()
    {
        using var r = new TestRegister();
        // A repair as a register written before the spelling was unified holds it.
        using (var connection = new SqliteConnection($"Data Source={r.Path};Pooling=False;Foreign Keys=True"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = """
                INSERT INTO repair (component_id, recorded_utc, recorded_by) VALUES ($c, '2024-01-02T00:00:00.0000000Z', 'old');
                INSERT INTO repair_revision (repair_id, revision, repair_date, description, post_repair_prior_json, recorded_utc, recorded_by, reason)
                VALUES (last_insert_rowid(), 1, '2023-06-01', 'overlay', $prior, '2024-01-02T00:00:00.0000000Z', 'old', 'WO-1');
                """;
            command.Parameters.AddWithValue("$c", r.ComponentId);
            command.Parameters.AddWithValue("$prior", OldSpelling);
            command.ExecuteNonQuery();
        }

        var repair = Assert.IsType<Repair>(Assert.Single(r.Store.EvidenceFor(r.ComponentId, r.Clock.UtcNow)));
        // Lognormal with mean 0.2 and sd 0.1: the read variable keeps its mean (closed form of the parameters given).
        Assert.Equal(0.2, repair.PostRepairInputs["d0_mm"].Mean, 12);

        var stored = Assert.Single(r.Store.Repairs(r.ComponentId));
        var corrected = r.Store.ReviseRepair(stored.RepairId, new NewRepair(TestRegister.Component, stored.RepairDate, "weld overlay", stored.PostRepairPriorJson), "B", "description typo");
        Assert.True(corrected.Succeeded, string.Join("; ", corrected.Problems));
        Assert.Equal(2, r.Store.RepairHistory(stored.RepairId).Count);
    }
}
