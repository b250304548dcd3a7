using System.Security.Cryptography;
using System.Text;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

public abstract class CsvImportTests
{
    protected abstract RegisterStoreKind Kind { get; }
    private static string DataFile(string name) => Path.Combine(AppContext.BaseDirectory, "data", "register", name);

    [SkippableFact]
    [Reference("data/register/findings-good.csv (invented scenario, README.md); SHA-256 of the file computed in the test")]
    public void A_good_file_is_imported_whole_as_one_batch()
    {
        using var r = new TestRegister(Kind);
        var result = r.Store.ImportFindingsCsv(DataFile("findings-good.csv"), "inspector A", "2022 campaign upload");

        Assert.True(result.Succeeded, string.Join("; ", result.Problems));
        Assert.Equal(5, result.Findings.Count);
        Assert.All(result.Findings, f => Assert.Equal(result.ImportBatchId, f.ImportBatchId));
        var text = File.ReadAllText(DataFile("findings-good.csv"));
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text))), result.SourceSha256);
        Assert.Equal("linear indication,\nnot sized (note spans two lines)", result.Findings[3].Note.Replace("\r", "", StringComparison.Ordinal));
        Assert.Equal(3, r.Store.Findings(r.ComponentId).Count);
        Assert.Single(r.Store.AuditTrail(entity: "import"));
        Assert.True(r.Store.Check().IsHealthy);
    }

    [SkippableFact]
    [Reference("data/register/findings-bad.csv: one problem per line 3–12, each listed with its line number and field")]
    public void A_bad_file_is_refused_with_each_line_and_field_and_nothing_is_written()
    {
        using var r = new TestRegister(Kind);
        var counts = new[] { "finding", "finding_revision", "import_batch", "audit_log" }.Select(r.Count).ToArray();

        var result = r.Store.ImportFindingsCsv(DataFile("findings-bad.csv"), "inspector A", "bad upload");

        Assert.False(result.Succeeded);
        Assert.Empty(result.Findings);
        Assert.Equal(
            [
                (3, "component_code"), (4, "inspection_date"), (5, "measured_size_mm"), (6, "measured_size_mm"), (7, "method"),
                (8, "inspection_date"), (9, "measured_size_mm"), (10, "inspection_date"), (11, "kind"), (12, "row"),
            ],
            result.Problems.Select(p => (p.LineNumber!.Value, p.Field)));
        Assert.Contains("duplicate of line 2", result.Problems[7].Message, StringComparison.Ordinal);
        Assert.Equal("2,5", result.Problems[6].Value);
        Assert.Equal(counts, new[] { "finding", "finding_revision", "import_batch", "audit_log" }.Select(r.Count).ToArray());
    }

    [SkippableFact]
    [Reference("All-or-nothing import with duplicate detection against the register")]
    public void Importing_the_same_file_twice_is_refused_as_duplicates()
    {
        using var r = new TestRegister(Kind);
        Assert.True(r.Store.ImportFindingsCsv(DataFile("findings-good.csv"), "inspector A", "upload").Succeeded);
        var again = r.Store.ImportFindingsCsv(DataFile("findings-good.csv"), "inspector A", "upload again");
        Assert.False(again.Succeeded);
        Assert.Equal([2, 3, 4, 5, 7], again.Problems.Select(p => p.LineNumber!.Value));
        Assert.All(again.Problems, p => Assert.Contains("duplicate", p.Message, StringComparison.Ordinal));
        Assert.Equal(5, r.Count("finding"));
    }

    [SkippableTheory]
    [InlineData("component_code,inspection_date,kind,method,depth\nP-101-W3,2019-01-01,no-indication,UT-PA,1\n", 1, "header", "depth")]
    [InlineData("component_code,kind\nP-101-W3,no-indication\n", 1, "header", "inspection_date")]
    [InlineData("component_code,inspection_date,kind,method\nP-101-W3,2019-01-01,no-indication,UT-PA\nP-101-W3,2019-01-02,\"no-indication,UT-PA\n", 3, "row", null)]
    [InlineData("", 1, "header", null)]
    [InlineData("component_code,inspection_date,kind,method\n", 2, "file", "inline.csv")]
    [Reference("Format problems are reported with the line and the column (docs/register.md, CSV import)")]
    public void Format_problems_name_the_line_and_the_field(string csv, int line, string field, string? value)
    {
        using var r = new TestRegister(Kind);
        var result = r.Store.ImportFindingsCsv(new StringReader(csv), "inline.csv", "inspector A", "test");
        Assert.False(result.Succeeded);
        var problem = Assert.Single(result.Problems);
        Assert.Equal((line, field, value), (problem.LineNumber!.Value, problem.Field, problem.Value));
        Assert.Equal(0, r.Count("finding"));
    }
}

/// <summary><see cref="CsvImportTests"/> on a SQLite file.</summary>
public sealed class CsvImportTestsOnSqlite : CsvImportTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="CsvImportTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class CsvImportTestsOnPostgres : CsvImportTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}
