using System.Security.Cryptography;
using System.Text;
using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Tests.Cli;

/// <summary>Finding CSVs are UTF-8 or refused; method files are read strictly; recorded times are written with "Z".</summary>
public sealed class InputFileTests
{
    private static readonly string SampleData = Path.Combine(AppContext.BaseDirectory, "sample-data");

    private static CliRunner WithComponent(out string register)
    {
        var cli = ValidationAtTheDoorTests.Prepared(out register);
        Assert.Equal(ExitCodes.Ok, cli.Run("method", "add", "MFL-ILI", "--file", Path.Combine(SampleData, "methods", "mfl-ili.method.json"), "-r", register).ExitCode);
        Assert.Equal(ExitCodes.Ok, cli.Run("component", "add", "IL3-KP42", "--site", "SF-IL3", "--model", Path.Combine(SampleData, "models", "sandwick-injection-line-external-corrosion.json"),
            "--in-service", "2008-05-01", "--wall-mm", "12.7", "-r", register).ExitCode);
        return cli;
    }

    private const string Csv = "component_code,inspection_date,kind,method,measured_size_mm,location,note\nIL3-KP42,2016-05-20,no-indication,MFL-ILI,,KP 4.2 près du coude,vérifié\n";

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void A_utf8_csv_with_or_without_bom_is_imported_and_its_hash_is_of_the_file_bytes(bool bom)
    {
        using var cli = WithComponent(out var register);
        var path = cli.PathOf("utf8.csv");
        File.WriteAllText(path, Csv, new UTF8Encoding(bom));
        var run = cli.Run("finding", "import", path, "-r", register, "--json");
        Assert.Equal(ExitCodes.Ok, run.ExitCode);
        // SHA-256 of the bytes on disk (BOM included), computed independently here.
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(path))), run.Json().GetProperty("source_sha256").GetString());
        var row = cli.Run("finding", "list", "-r", register, "--json").Json().GetProperty("findings")[0];
        Assert.Equal("KP 4.2 près du coude", row.GetProperty("location").GetString());
    }

    [Fact]
    public void A_latin1_csv_is_refused_with_the_line_and_byte_and_nothing_is_written()
    {
        using var cli = WithComponent(out var register);
        var path = cli.PathOf("latin1.csv");
        File.WriteAllBytes(path, Encoding.Latin1.GetBytes(Csv));
        var before = ValidationAtTheDoorTests.Fingerprint(cli, register);
        var run = cli.Run("finding", "import", path, "-r", register);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        // The byte of the accented letter in line 2, counted independently from the Latin-1 bytes.
        var line2 = Encoding.Latin1.GetBytes(Csv.Split('\n')[1]);
        var expectedByte = Array.IndexOf(line2, (byte)0xE8) + 1;
        Assert.Contains($"byte {expectedByte} of line 2 (0xE8) is not UTF-8", run.Error, StringComparison.Ordinal);
        Assert.Equal(before, ValidationAtTheDoorTests.Fingerprint(cli, register));
    }

    [Fact]
    public void Recorded_times_are_written_in_utc_with_z()
    {
        using var cli = WithComponent(out var register);
        var text = cli.Run("site", "list", "-r", register, "--json").Output;
        Assert.Matches("\"recorded_utc\": \"\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d\\.\\d{7}Z\"", text);
        Assert.DoesNotContain("+00:00", text, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("""{"format":"inspection-update/method/1","pod":{"form":"log-logistic","mu_ln_mm":0.4,"sigma_ln":0.35,"sigma_ln":0.5},"sizing":{"kind":"additive-normal","sd":0.8}}""", "duplicate key")]
    [InlineData("""{"format":"inspection-update/method/1","pod":{"form":"log-logistic","mu_ln_mm":0.4,"sigma_ln":0.35,"sigmaln":0.5},"sizing":{"kind":"additive-normal","sd":0.8}}""", "pod.sigmaln")]
    [InlineData("""{"format":"inspection-update/method/1","pod":{"form":"log-logistic","mu_ln_mm":"0.4","sigma_ln":0.35},"sizing":{"kind":"additive-normal","sd":0.8}}""", "pod.mu_ln_mm '0.4'")]
    [InlineData("""{"format":"inspection-update/method/1","pod":{"form":"log-logistic","mu_ln_mm":0.4,"sigma_ln":0.35},"sizing":{"kind":"additive-normal","sd":0.8},"note":"x"}""", "note")]
    public void A_method_file_with_a_duplicate_unknown_or_mistyped_field_is_refused(string json, string named)
    {
        using var cli = ValidationAtTheDoorTests.Prepared(out var register);
        var path = cli.PathOf("m.method.json");
        File.WriteAllText(path, json);
        var run = cli.Run("method", "add", "M", "--file", path, "-r", register);
        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains(named, run.Error, StringComparison.Ordinal);
        Assert.DoesNotContain("System.", run.Error, StringComparison.Ordinal);
        Assert.Empty(cli.Run("method", "list", "-r", register, "--json").Json().GetProperty("methods").EnumerateArray());
    }
}
