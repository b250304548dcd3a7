using System.Diagnostics;
using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;
using Xunit.Abstractions;

namespace InspectionUpdate.Tests.Cli;

/// <summary>
/// Seeded fuzzing of what the register accepts at its door: mutated sample model files ('component add'), method
/// files ('method add') and finding CSVs ('finding import'), run in process. Every case ends in success or exit 2
/// with a sentence that names a field or line and quotes a value (never an internal error or .NET wording), within
/// a per-case bound that only a hang would exceed, and a refused write leaves the register's fingerprint unchanged.
/// Counts are written in docs/register.md.
/// </summary>
public sealed class FuzzTests(ITestOutputHelper output)
{
    private const int Seed = 20261203;
    private const int ModelCases = 1400;
    private const int MethodCases = 300;
    private const int CsvCases = 300;

    // Generous: a case takes milliseconds; only a hang (minutes, as before the bounds) reaches this.
    private static readonly TimeSpan HangBound = TimeSpan.FromSeconds(30);

    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");

    private static readonly string[] Families = ["Normal", "Lognormal", "Gamma", "Weibull", "Gumbel", "Beta", "Uniform", "LogNormale", "normal", "", "Deterministic", "TruncatedNormal"];

    private static readonly string[] Oddities =
    [
        "NaN", "Infinity", "-Infinity", "1e999", "-1e999", "1e300", "-1e300", "1e-320", "5e-324", "0", "-0", "-1", "-1e-9", "1e15", "3.5",
        "\"text\"", "\"\"", "null", "true", "[]", "{}", "[1,2]", "{\"family\":null}", "\"LONE-HIGH\"", "\"LONE-LOW x\"", "\"\\u0000\"", "\"😀 ünïcode\"",
        "\"pow(10, 400) * exp(1e6)\"", "\"1/0\"", "\"((((((((((((((((((((((((((((((((((1))))))))))))))))))))))))))))))))))\"", "\"- - - - 1\"", "\"t t\"", "\"sqrt(-1)\"",
        "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[1]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]", // nested beyond the reader's 64 levels once placed in the document
    ];

    [Fact]
    [Trait("Category", "Statistical")]
    public async Task Mutated_models_methods_and_finding_csvs_end_in_success_or_a_named_refusal()
    {
        var random = new Random(Seed);
        using var cli = new CliRunner();
        var register = cli.PathOf("fuzz.register");
        Assert.Equal(ExitCodes.Ok, cli.Run("register", "create", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "SF-IL3", "--name", "fuzz site", "-r", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("site", "add", "HR-1", "--name", "fuzz site 2", "-r", register).ExitCode);
        var methods = Directory.GetFiles(Path.Combine(SampleData, "methods"), "*.method.json").Order(StringComparer.Ordinal).ToArray();
        foreach (var m in methods)
        {
            var id = Path.GetFileName(m).Split('.')[0].ToUpperInvariant();
            Assert.Equal(ExitCodes.Ok, cli.Run("method", "add", id, "--file", m, "-r", register).ExitCode);
        }

        var models = Directory.GetFiles(Path.Combine(SampleData, "models"), "*.json").Order(StringComparer.Ordinal).ToArray();
        foreach (var (code, model) in new[] { ("IL3-KP42", 3), ("IL3-KP38", 3), ("HR1-J112", 0), ("HR1-J118", 0) })
        {
            Assert.Equal(ExitCodes.Ok, cli.Run("component", "add", code, "--site", code.StartsWith("IL3", StringComparison.Ordinal) ? "SF-IL3" : "HR-1",
                "--model", models[model], "--in-service", "2001-09-01", "--wall-mm", "20", "-r", register).ExitCode);
        }

        var csv = File.ReadAllText(Path.Combine(SampleData, "findings.csv"));
        var counts = new Dictionary<string, (int Ok, int Refused)>(StringComparer.Ordinal);
        var file = cli.PathOf("case");
        var fingerprint = Fingerprint(register);
        var watch = Stopwatch.StartNew();
        var slowest = 0.0;
        for (var i = 0; i < ModelCases + MethodCases + CsvCases; i++)
        {
            string family;
            string[] args;
            if (i < ModelCases)
            {
                family = "model";
                File.WriteAllBytes(file, Encoding.UTF8.GetBytes(MutateJson(File.ReadAllText(models[random.Next(models.Length)]), random)));
                args = ["component", "add", "F-" + i.ToString(CultureInfo.InvariantCulture), "--site", "SF-IL3", "--model", file, "--in-service", "2005-01-01", "--wall-mm", "12.7", "-r", register];
            }
            else if (i < ModelCases + MethodCases)
            {
                family = "method";
                File.WriteAllBytes(file, Encoding.UTF8.GetBytes(MutateJson(File.ReadAllText(methods[random.Next(methods.Length)]), random)));
                args = ["method", "add", "M-" + i.ToString(CultureInfo.InvariantCulture), "--file", file, "-r", register];
            }
            else
            {
                family = "csv";
                File.WriteAllBytes(file, MutateCsv(csv, random));
                args = ["finding", "import", file, "-r", register];
            }

            var caseWatch = Stopwatch.StartNew();
            var task = Task.Run(() => cli.Run(args));
            if (await Task.WhenAny(task, Task.Delay(HangBound)) != task)
            {
                var stuck = Encoding.UTF8.GetString(File.ReadAllBytes(file));
                Assert.Fail($"case {i} ({family}) did not finish within {HangBound.TotalSeconds} s: {stuck[..Math.Min(300, stuck.Length)]}");
            }

            var run = await task;
            slowest = Math.Max(slowest, caseWatch.Elapsed.TotalSeconds);
            var (ok, refused) = counts.GetValueOrDefault(family);
            if (run.ExitCode == ExitCodes.Ok)
            {
                counts[family] = (ok + 1, refused);
                fingerprint = Fingerprint(register);
                continue;
            }

            var text = Encoding.UTF8.GetString(File.ReadAllBytes(file));
            Assert.True(run.ExitCode == ExitCodes.BadInput, $"case {i} ({family}): exit {run.ExitCode}\n{run.Error}\n{text[..Math.Min(400, text.Length)]}");
            Assert.DoesNotContain("Internal error", run.Error, StringComparison.Ordinal);
            Assert.DoesNotContain("(Parameter '", run.Error, StringComparison.Ordinal);
            Assert.DoesNotContain("System.", run.Error, StringComparison.Ordinal);
            // A field (JSON path, option, column or line) and a quoted value or a path are named.
            Assert.True(run.Error.Contains('\'', StringComparison.Ordinal) || run.Error.Contains("$.", StringComparison.Ordinal),
                $"case {i} ({family}) names no field or value: {run.Error}");
            Assert.Equal(fingerprint, Fingerprint(register));
            counts[family] = (ok, refused + 1);
        }

        foreach (var (family, (ok, refused)) in counts) output.WriteLine($"{family}: {ok} accepted, {refused} refused");
        output.WriteLine($"{ModelCases + MethodCases + CsvCases} cases in {watch.Elapsed.TotalSeconds:0.0} s, slowest case {slowest:0.00} s (seed {Seed})");
        // The mutations must exercise both outcomes of every family, or the test proves little.
        Assert.All(counts.Values, c => Assert.True(c.Ok > 0 && c.Refused > 0));
    }

    private static string Fingerprint(string register)
    {
        using var store = RegisterStore.Open(register, RegisterOpenMode.OpenExistingToRead);
        var value = store.Fingerprint(DateTimeOffset.MaxValue);
        SqliteConnection.ClearAllPools();
        return value;
    }

    /// <summary>One to three mutations of a JSON document: structural (remove, rename, retype, oddity) or textual (truncate, duplicate, nest).</summary>
    private static string MutateJson(string json, Random random)
    {
        var kind = random.Next(10);
        if (kind == 0) return json[..random.Next(json.Length)]; // truncated
        if (kind == 1)
        {
            // A duplicate of the first key at its own level.
            var at = json.IndexOf('"', StringComparison.Ordinal);
            var end = json.IndexOf(',', at);
            return end < 0 ? json : json[..end] + ", " + json[at..end] + json[end..];
        }

        var root = JsonNode.Parse(json)!;
        var mutations = 1 + random.Next(3);
        for (var m = 0; m < mutations; m++)
        {
            var nodes = Walk(root).Where(n => n.Parent is not null).ToList();
            var node = nodes[random.Next(nodes.Count)];
            var parent = node.Parent!;
            var oddity = JsonNode.Parse(Oddities[random.Next(Oddities.Length)].Replace("NaN", "\"NaN\"", StringComparison.Ordinal).Replace("Infinity", "1e999", StringComparison.Ordinal)
                .Replace("-1e999", "-1e999", StringComparison.Ordinal));
            switch (random.Next(6))
            {
                case 0 when parent is JsonObject o:
                    o.Remove(node.GetPropertyName());
                    break;
                case 1 when parent is JsonObject o:
                    {
                        var name = node.GetPropertyName();
                        o.Remove(name);
                        o[name.Length > 2 ? name.Remove(random.Next(name.Length), 1) : name + "x"] = node;
                        break;
                    }

                case 2 when parent is JsonObject o && node.GetPropertyName() == "family":
                    o["family"] = Families[random.Next(Families.Length)];
                    break;
                case 3 when parent is JsonObject o && node is JsonValue v && v.TryGetValue<double>(out var d):
                    {
                        var changed = random.Next(4) switch { 0 => -d, 1 => 0, 2 => d * 1e300, _ => d * (1 + random.NextDouble()) };
                        o[node.GetPropertyName()] = double.IsFinite(changed) ? changed : JsonNode.Parse("1e999");
                        break;
                    }

                case 4 when parent is JsonObject o:
                    o[node.GetPropertyName()] = new string('x', 20_000);
                    break;
                default:
                    if (parent is JsonObject po) po[node.GetPropertyName()] = oddity;
                    else if (parent is JsonArray pa) pa[pa.IndexOf(node)] = oddity;
                    break;
            }
        }

        // JsonNode cannot hold a lone surrogate: it goes into the text after writing.
        var text = root.ToJsonString().Replace("LONE-HIGH", "\\ud800", StringComparison.Ordinal).Replace("LONE-LOW", "\\udc00", StringComparison.Ordinal);
        // JsonNode escapes non-ASCII and cannot hold NaN; put the literal forms back for the parser to meet.
        return random.Next(8) == 0 ? text.Replace("\"NaN\"", "NaN", StringComparison.Ordinal) : text;
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

    /// <summary>A finding CSV with a few rows kept and one to three of them mutated (cells, columns, encoding).</summary>
    private static byte[] MutateCsv(string csv, Random random)
    {
        var lines = csv.Split('\n', StringSplitOptions.RemoveEmptyEntries).ToList();
        var header = lines[0];
        // One to three rows on new dates, so that unmutated rows are not duplicates of earlier imports.
        var rows = Enumerable.Range(0, 1 + random.Next(3)).Select(_ =>
        {
            var cells = lines[1 + random.Next(lines.Count - 1)].Split(',');
            cells[1] = new DateOnly(2002, 1, 1).AddDays(random.Next(8000)).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
            return cells;
        }).ToList();
        foreach (var cells in rows.Where(_ => random.Next(3) > 0))
        {
            var c = random.Next(cells.Length);
            cells[c] = random.Next(12) switch
            {
                0 => "",
                1 => "-1",
                2 => "NaN",
                3 => "1e999",
                4 => "2031-02-30",
                5 => "sized-indication",
                6 => "NO-SUCH",
                7 => new string('z', 5000),
                8 => "\"unclosed",
                9 => "😀",
                10 => "0",
                _ => "1e-320",
            };
        }

        if (random.Next(10) == 0) header = header.Replace("kind", "knd", StringComparison.Ordinal);
        if (random.Next(10) == 0) header += ",extra";
        var text = header + "\n" + string.Join("\n", rows.Select(r => string.Join(',', r))) + "\n";
        return random.Next(12) switch
        {
            0 => Encoding.Latin1.GetBytes(text.Replace("joint", "jöint", StringComparison.Ordinal)),
            1 => Encoding.Unicode.GetBytes(text),
            2 => [.. Encoding.UTF8.Preamble, .. Encoding.UTF8.GetBytes(text)],
            _ => Encoding.UTF8.GetBytes(text),
        };
    }
}
