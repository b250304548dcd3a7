using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;
using InspectionUpdate.Cli.Infrastructure;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// Property: every model that <c>component add</c> accepts is one that <c>assess</c> accepts. Seeded mild mutations of
/// the sample model files (numbers scaled, negated, zeroed or pushed to extremes, families swapped among the known
/// ones, keys removed), so that many pass the door; each accepted one is assessed (first order, a short horizon) and
/// must end in exit 0 or 3, never 2 (refused) or 1 (internal error), with every probability it reports finite and
/// within [0, 1]. Counts are written in docs/register.md.
/// </summary>
public sealed class AcceptedModelPropertyTests(ITestOutputHelper output)
{
    private const int RandomStream = 20261204;
    private const int Cases = 30;
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");
    private static readonly string[] KnownFamilies = ["Normal", "Lognormal", "Gamma", "Weibull", "Gumbel", "Uniform"];

    [Fact]
    [Trait("Category", "Statistical")]
    [Reference("Issue 14, validation at the door: everything the register accepts, assess accepts (property over seeded mutations of sample-data/models)")]
    public void Every_model_component_add_accepts_is_one_assess_accepts()
    {
        var random = new Random(RandomStream);
        using var cli = new CliRunner();
        var register = cli.PathOf("property.register");
        Assert.Equal(ExitCodes.Ok, cli.Run("register", "create", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "S", "--name", "property site", "-r", register).ExitCode);
        var models = Directory.GetFiles(Path.Combine(SampleData, "models"), "*.json").Order(StringComparer.Ordinal).ToArray();
        var file = cli.PathOf("case.model.json");
        int accepted = 0, refused = 0, notConverged = 0;
        var watch = Stopwatch.StartNew();
        for (var i = 0; i < Cases; i++)
        {
            var root = JsonNode.Parse(File.ReadAllText(models[i % models.Length]))!;
            var mutations = 1 + random.Next(2);
            for (var m = 0; m < mutations; m++) Mutate(root, random);
            File.WriteAllText(file, root.ToJsonString());
            var code = "P-" + i.ToString(CultureInfo.InvariantCulture);
            var add = cli.Run("component", "add", code, "--site", "S", "--model", file, "--in-service", "2010-01-01", "--wall-mm", "12.7", "-r", register);
            if (add.ExitCode != ExitCodes.Ok)
            {
                Assert.True(add.ExitCode == ExitCodes.BadInput, $"case {i}: component add exit {add.ExitCode}\n{add.Error}");
                refused++;
                continue;
            }

            accepted++;
            var assess = cli.Run("assess", code, "--route", "first-order", "--horizon-years", "2", "--steps-per-year", "1", "-r", register, "--json");
            Assert.True(assess.ExitCode is ExitCodes.Ok or ExitCodes.NotConverged,
                $"case {i}: accepted by component add, but assess exit {assess.ExitCode}\n{assess.Error}\n{root.ToJsonString()[..Math.Min(600, root.ToJsonString().Length)]}");
            if (assess.ExitCode == ExitCodes.NotConverged) notConverged++;
            foreach (var point in assess.Json().GetProperty("prior").GetProperty("points").EnumerateArray())
            {
                foreach (var name in new[] { "cumulative_pf", "annual_pf" })
                {
                    var p = point.GetProperty(name);
                    Assert.True(p.ValueKind == JsonValueKind.Number && p.GetDouble() is >= 0 and <= 1, $"case {i}: {name} {p} outside [0, 1]");
                }
            }
        }

        output.WriteLine($"{Cases} mutated models: {accepted} accepted by component add and all assessed ({notConverged} with steps flagged not converged), {refused} refused; {watch.Elapsed.TotalSeconds:0.0} s");
        // The mutations must let enough models through the door for the property to mean something.
        Assert.True(accepted >= Cases / 4, $"only {accepted} of {Cases} accepted");
        Assert.True(refused > 0);
    }

    private static void Mutate(JsonNode root, Random random)
    {
        var inputs = root["inputs"] as JsonObject;
        var leaves = Walk(root).Where(n => n is JsonValue v && v.TryGetValue<double>(out _) && n.Parent is JsonObject).ToList();
        switch (random.Next(5))
        {
            case 0 or 1 when leaves.Count > 0:
                {
                    var leaf = leaves[random.Next(leaves.Count)];
                    var value = leaf.GetValue<double>();
                    var changed = random.Next(6) switch
                    {
                        0 => -value,
                        1 => 0,
                        2 => value * 1e6,
                        3 => value * 1e-6,
                        _ => value * (0.5 + 1.5 * random.NextDouble()),
                    };
                    ((JsonObject)leaf.Parent!)[leaf.GetPropertyName()] = changed;
                    break;
                }

            case 2 when inputs is not null:
                {
                    var withFamily = inputs.Where(p => p.Value is JsonObject o && o.ContainsKey("family")).Select(p => (JsonObject)p.Value!).ToList();
                    if (withFamily.Count > 0) withFamily[random.Next(withFamily.Count)]["family"] = KnownFamilies[random.Next(KnownFamilies.Length)];
                    break;
                }

            case 3 when inputs is not null && inputs.Count > 0:
                inputs.Remove(inputs.ElementAt(random.Next(inputs.Count)).Key);
                break;
            default:
                if (leaves.Count > 0)
                {
                    var leaf = leaves[random.Next(leaves.Count)];
                    ((JsonObject)leaf.Parent!)[leaf.GetPropertyName()] = leaf.GetValue<double>() * (0.8 + 0.4 * random.NextDouble());
                }

                break;
        }
    }

    private static IEnumerable<JsonNode> Walk(JsonNode node)
    {
        yield return node;
        var children = node switch
        {
            JsonObject o => o.Select(p => p.Value),
            JsonArray a => a,
            _ => [],
        };
        foreach (var c in children.Where(c => c is not null)) foreach (var d in Walk(c!)) yield return d;
    }
}
