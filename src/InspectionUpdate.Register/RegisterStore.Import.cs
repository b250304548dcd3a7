using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using CsvHelper;

namespace InspectionUpdate.Register;

public sealed partial class RegisterStore
{
    /// <summary>Columns of the findings CSV, in the documented order (docs/register.md).</summary>
    public static IReadOnlyList<string> FindingCsvColumns { get; } =
        ["component_code", "inspection_date", "kind", "method", "measured_size_mm", "remaining_wall_mm", "location", "note"];

    private static readonly string[] RequiredCsvColumns = ["component_code", "inspection_date", "kind"];

    /// <summary>
    /// Imports findings from a CSV file, all or nothing (see <see cref="ImportFindingsCsv(TextReader, string, string, string, IProgress{int}?)"/>).
    /// The file must be UTF-8, with or without a byte-order mark; anything else (Latin-1, UTF-16) is refused naming the
    /// line and the byte, never silently changed. The recorded SHA-256 is of the file's bytes as they are.
    /// </summary>
    /// <exception cref="FileNotFoundException">The file does not exist.</exception>
    public ImportResult ImportFindingsCsv(string filePath, string actor, string reason, IProgress<int>? progress = null)
    {
        var bytes = File.ReadAllBytes(filePath);
        var sourceName = System.IO.Path.GetFileName(filePath);
        var sha = Convert.ToHexStringLower(SHA256.HashData(bytes));
        if (FirstInvalidUtf8(bytes) is { } bad)
        {
            return new ImportResult(null, [], [new("file", sourceName,
                FormattableString.Invariant($"byte {bad.ByteInLine} of line {bad.Line} (0x{bytes[bad.Index]:X2}) is not UTF-8: save the file as UTF-8 (with or without BOM); nothing was imported"), bad.Line)], sha);
        }

        var bom = bytes.AsSpan().StartsWith(Encoding.UTF8.Preamble) ? Encoding.UTF8.Preamble.Length : 0;
        return Import(Encoding.UTF8.GetString(bytes, bom, bytes.Length - bom), sha, sourceName, actor, reason, progress);
    }

    /// <summary>The first byte that does not begin a valid UTF-8 sequence, with its 1-based line and byte in that line.</summary>
    internal static (int Index, int Line, int ByteInLine)? FirstInvalidUtf8(ReadOnlySpan<byte> bytes)
    {
        var i = 0;
        while (i < bytes.Length)
        {
            if (Rune.DecodeFromUtf8(bytes[i..], out _, out var consumed) != System.Buffers.OperationStatus.Done)
            {
                var before = bytes[..i];
                var lineStart = before.LastIndexOf((byte)'\n') + 1;
                return (i, before.Count((byte)'\n') + 1, i - lineStart + 1);
            }

            i += consumed;
        }

        return null;
    }

    /// <summary>
    /// Imports findings from CSV text, all or nothing: every row is parsed and validated (as
    /// <see cref="ValidateFinding"/>, plus duplicates within the file) inside one write transaction; if any row has a
    /// problem, every problem is returned with its line number and field and nothing from the file is written.
    /// Otherwise one import batch (source name, SHA-256 of the text, row count) and one finding per row are written
    /// and committed together; a process killed before the commit leaves the register as it was.
    /// </summary>
    /// <param name="reader">The CSV text: a header line with the columns of <see cref="FindingCsvColumns"/>.</param>
    /// <param name="sourceName">Name recorded with the batch (e.g. the file name).</param>
    /// <param name="actor">Who imports.</param>
    /// <param name="reason">Why; stored with the batch and each finding's first revision.</param>
    /// <param name="progress">Receives the number of rows written so far, synchronously, inside the transaction.</param>
    public ImportResult ImportFindingsCsv(TextReader reader, string sourceName, string actor, string reason, IProgress<int>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var text = reader.ReadToEnd();
        return Import(text, Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text))), sourceName, actor, reason, progress);
    }

    private ImportResult Import(string text, string sha, string sourceName, string actor, string reason, IProgress<int>? progress)
    {
        var problems = new List<ValidationProblem>();
        RequireText(problems, "recorded_by", actor);
        RequireText(problems, "reason", reason);
        RequireText(problems, "source_name", sourceName);
        var rows = ParseCsv(text, problems);

        return Write((c, t) =>
        {
            var validation = new FindingValidation(this, c, t);
            var inFile = new Dictionary<string, int>(StringComparer.Ordinal);
            foreach (var (line, finding) in rows)
            {
                var rowProblems = validation.Validate(finding, null, line);
                problems.AddRange(rowProblems);
                if (rowProblems.Count == 0)
                {
                    var key = FormattableString.Invariant($"{finding.ComponentCode}|{Sql.Date(finding.InspectionDate)}|{finding.MethodName?.Trim()}|{(finding.Location ?? "").Trim().ToUpperInvariant()}");
                    if (inFile.TryGetValue(key, out var firstLine))
                    {
                        problems.Add(new("inspection_date", Sql.Date(finding.InspectionDate),
                            FormattableString.Invariant($"duplicate of line {firstLine} in this file (same component, date, method and location)"), line));
                    }
                    else
                    {
                        inFile[key] = line;
                    }
                }
            }

            if (problems.Count == 0 && rows.Count == 0)
            {
                problems.Add(new("file", sourceName, "the file holds no findings", 2));
            }

            if (problems.Count > 0)
            {
                return (new ImportResult(null, [], problems.OrderBy(p => p.LineNumber ?? 0).ToList(), sha), false);
            }

            var now = NowText();
            var batch = Sql.Insert(c, t,
                "INSERT INTO import_batch (source_name, source_sha256, row_count, recorded_utc, recorded_by, reason) VALUES ($source, $sha, $rows, $at, $by, $reason)",
                ("$source", sourceName), ("$sha", sha), ("$rows", rows.Count), ("$at", now), ("$by", actor), ("$reason", reason));
            var written = 0;
            foreach (var (_, finding) in rows)
            {
                InsertNewFinding(c, t, validation, finding, actor, reason, batch, now);
                progress?.Report(++written);
            }

            var findings = ReadRevisions(c, t, "fr.import_batch_id = $batch ORDER BY fr.finding_id", ("$batch", batch));
            return (new ImportResult(batch, findings, [], sha), true);
        });
    }

    /// <summary>Parses the CSV text into findings with their line numbers; format problems go to <paramref name="problems"/>.</summary>
    private static List<(int Line, NewFinding Finding)> ParseCsv(string text, List<ValidationProblem> problems)
    {
        var rows = new List<(int, NewFinding)>();
        var options = new CsvReaderOptions
        {
            HasHeader = true,
            TrimWhitespace = true,
            SkipEmptyLines = true,
            TrackLineNumbers = true,
            MalformedData = CsvMalformedDataHandling.Throw,
            FieldCountMismatch = CsvFieldCountHandling.Allow,
            MissingField = CsvMissingFieldHandling.ReturnEmpty,
            FormatProvider = CultureInfo.InvariantCulture,
        };
        using var csv = CsvReader.FromText(text, options);
        string[] header;
        try
        {
            csv.ReadHeader();
            header = (csv.Headers ?? []).Select(h => h.Trim()).ToArray();
        }
        catch (CsvFormatException e)
        {
            problems.Add(new("header", null, "the header line cannot be read as CSV: " + e.Message, (int)Math.Max(1, e.LineNumber)));
            return rows;
        }

        if (header.Length == 0)
        {
            problems.Add(new("header", null, "the file is empty; expected a header line: " + string.Join(",", FindingCsvColumns), 1));
            return rows;
        }

        var headerLine = (int)Math.Max(1, csv.LineNumber);
        foreach (var name in header.Where(h => !FindingCsvColumns.Contains(h, StringComparer.Ordinal)))
        {
            problems.Add(new("header", name, "unknown column; expected " + string.Join(", ", FindingCsvColumns), headerLine));
        }

        foreach (var name in header.GroupBy(h => h, StringComparer.Ordinal).Where(g => g.Count() > 1))
        {
            problems.Add(new("header", name.Key, "column given more than once", headerLine));
        }

        var missing = RequiredCsvColumns.Where(r => !header.Contains(r, StringComparer.Ordinal)).ToList();
        foreach (var name in missing)
        {
            problems.Add(new("header", name, "required column missing", headerLine));
        }

        if (missing.Count > 0)
        {
            return rows;
        }

        while (true)
        {
            try
            {
                if (!csv.Read())
                {
                    break;
                }
            }
            catch (CsvFormatException e)
            {
                // The reader cannot resynchronize after malformed quoting: report it and stop reading the file.
                problems.Add(new("row", null, "the row cannot be read as CSV: " + e.Message, (int)e.LineNumber));
                break;
            }

            var line = (int)csv.LineNumber;
            if (csv.FieldCount != header.Length)
            {
                problems.Add(new("row", Encoding.UTF8.GetString(csv.RawRecord).TrimEnd('\r', '\n'),
                    FormattableString.Invariant($"the row has {csv.FieldCount} fields but the header has {header.Length}"), line));
                continue;
            }

            string? Field(string name)
            {
                var i = Array.IndexOf(header, name);
                if (i < 0)
                {
                    return null;
                }

                var value = csv.GetString(i)?.Trim();
                return string.IsNullOrEmpty(value) ? null : value;
            }

            var rowProblems = new List<ValidationProblem>();
            var code = Field("component_code");
            if (code is null)
            {
                rowProblems.Add(new("component_code", null, "required", line));
            }

            var dateText = Field("inspection_date");
            var date = default(DateOnly);
            if (dateText is null || !Sql.TryParseDate(dateText, out date))
            {
                rowProblems.Add(new("inspection_date", dateText, "expected an ISO 8601 date yyyy-MM-dd", line));
            }

            var kindText = Field("kind");
            if (!TryParseKind(kindText, out var kind))
            {
                rowProblems.Add(new("kind", kindText, "expected one of " + string.Join(", ", Enum.GetValues<FindingKind>().Select(KindText)), line));
            }

            double? Number(string name)
            {
                var s = Field(name);
                if (s is null)
                {
                    return null;
                }

                if (double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && double.IsFinite(v))
                {
                    return v;
                }

                rowProblems.Add(new(name, s, "expected a finite number in mm with '.' as decimal separator", line));
                return null;
            }

            var size = Number("measured_size_mm");
            var wall = Number("remaining_wall_mm");
            if (rowProblems.Count > 0)
            {
                problems.AddRange(rowProblems);
                continue;
            }

            rows.Add((line, new NewFinding(code!, date, kind, Field("method"), size, wall, Field("location"), Field("note"))));
        }

        return rows;
    }
}
