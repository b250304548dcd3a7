using InspectionUpdate.Application;

namespace InspectionUpdate.Tests.Application;

public sealed class ShardSpecTests
{
    [Fact]
    [Reference("FNV-1a 64-bit, offset basis 14695981039346656037 and prime 1099511628211 (Fowler, Noll, Vo; IETF draft-eastlake-fnv, from memory): FNV-1a(\"a\") = 0xaf63dc4c8601ec8c")]
    public void The_shard_of_a_code_is_fnv1a_of_its_bytes_modulo_n()
    {
        // 0xaf63dc4c8601ec8c mod 7 computed independently of the code under test.
        Assert.Equal((int)(0xaf63dc4c8601ec8cUL % 7UL), ShardSpec.Of("a", 7));
        Assert.Equal(0, ShardSpec.Of("anything", 1));
    }

    [Fact]
    [Reference("Definition of a partition: every component in exactly one shard")]
    public void Every_code_falls_in_exactly_one_of_n_shards()
    {
        var codes = Enumerable.Range(0, 500).Select(i => "C-" + i.ToString(System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        var shards = Enumerable.Range(0, 4).Select(k => new ShardSpec(k, 4)).ToArray();
        Assert.All(codes, c => Assert.Single(shards, s => s.Contains(c)));
        // A hash that spreads: no shard empty among 500 codes.
        Assert.All(shards, s => Assert.Contains(codes, s.Contains));
    }

    [Theory]
    [InlineData("2/4", null, null, 2, 4)]
    [InlineData("4", "3", null, 3, 4)]
    [InlineData("4", null, "1", 1, 4)]
    [Reference("Slurm sbatch --array sets SLURM_ARRAY_TASK_ID; Kubernetes Indexed Jobs set JOB_COMPLETION_INDEX (documented variables, from memory)")]
    public void Parses_k_of_n_or_takes_k_from_the_scheduler(string text, string? slurm, string? kubernetes, int k, int n)
    {
        var spec = ShardSpec.Parse(text, v => v == "SLURM_ARRAY_TASK_ID" ? slurm : v == "JOB_COMPLETION_INDEX" ? kubernetes : null);
        Assert.Equal(new ShardSpec(k, n), spec);
    }

    [Theory]
    [InlineData("4/4", "--shard '4'")]
    [InlineData("a/4", "--shard 'a'")]
    [InlineData("1/0", "--shard '1/0'")]
    [InlineData("4", "--shard '4'")]
    [Reference("Project rule: bad input names the field and the value")]
    public void Bad_shards_name_the_option_and_the_value(string text, string start)
    {
        var e = Assert.Throws<ApplicationFailureException>(() => ShardSpec.Parse(text, _ => null));
        Assert.Equal(FailureKind.BadInput, e.Kind);
        Assert.StartsWith(start, e.Message, StringComparison.Ordinal);
    }
}
