using System.Globalization;
using Ical.Net.CalendarComponents;
using Ical.Net.DataTypes;
using Ical.Net.Serialization;

namespace InspectionUpdate.Reporting.Export;

/// <summary>One due inspection of the calendar.</summary>
/// <param name="ComponentId">Component code.</param>
/// <param name="ComponentName">Component name (from the register).</param>
/// <param name="Site">Site.</param>
/// <param name="Sequence">1 for the next inspection, then the schedule's order.</param>
/// <param name="Date">Latest date of the inspection.</param>
/// <param name="Method">Method assumed (empty when none is).</param>
/// <param name="Basis">Why it is due then.</param>
public sealed record CalendarEntry(string ComponentId, string ComponentName, string Site, int Sequence, DateOnly Date, string Method, string Basis);

/// <summary>
/// The inspection calendar for planners: every due inspection of the plans in date order, grouped by site and month,
/// overdue ones (latest date on or before the evidence date) first; as CSV and as an iCalendar file (RFC 5545).
/// </summary>
public static class InspectionCalendar
{
    /// <summary>File name of the CSV calendar.</summary>
    public const string CsvName = "calendar.csv";

    /// <summary>File name of the iCalendar file.</summary>
    public const string IcsName = "calendar.ics";

    /// <summary>Header of the CSV, in column order.</summary>
    public static IReadOnlyList<string> CsvColumns { get; } =
        ["status", "site", "month", "date", "component_id", "component_name", "sequence", "method", "basis", "uid"];

    /// <summary>Entries in calendar order: overdue first (by date), then by site, month and date.</summary>
    public static IReadOnlyList<CalendarEntry> Order(IEnumerable<CalendarEntry> entries, DateOnly evidenceDate)
    {
        ArgumentNullException.ThrowIfNull(entries);
        return entries.OrderBy(e => e.Date <= evidenceDate ? 0 : 1)
            .ThenBy(e => e.Date <= evidenceDate ? string.Empty : e.Site, StringComparer.Ordinal)
            .ThenBy(e => e.Date).ThenBy(e => e.ComponentId, StringComparer.Ordinal).ThenBy(e => e.Sequence).ToArray();
    }

    /// <summary>The stable identifier of an entry (also the iCalendar UID), e.g. "HR1-J118-2-20280517@inspection-update".</summary>
    public static string Uid(CalendarEntry e)
    {
        ArgumentNullException.ThrowIfNull(e);
        return $"{e.ComponentId}-{e.Sequence.ToString(CultureInfo.InvariantCulture)}-{e.Date:yyyyMMdd}@inspection-update";
    }

    /// <summary>Writes the CSV calendar (RFC 4180 quoting).</summary>
    public static void WriteCsv(TextWriter writer, IEnumerable<CalendarEntry> entries, DateOnly evidenceDate)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.Write(string.Join(',', CsvColumns));
        writer.Write('\n');
        foreach (var e in Order(entries, evidenceDate))
        {
            string[] cells =
            [
                e.Date <= evidenceDate ? "overdue" : "due", e.Site, e.Date.ToString("yyyy-MM", CultureInfo.InvariantCulture),
                e.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), e.ComponentId, e.ComponentName,
                e.Sequence.ToString(CultureInfo.InvariantCulture), e.Method, e.Basis, Uid(e),
            ];
            writer.Write(string.Join(',', cells.Select(Quote)));
            writer.Write('\n');
        }
    }

    /// <summary>
    /// The iCalendar text: one all-day event per due inspection on its latest date (an overdue one on the evidence
    /// date, its summary starting "OVERDUE"), the site as category and location, the basis and the caution in the
    /// description.
    /// </summary>
    public static string Ics(IEnumerable<CalendarEntry> entries, DateOnly evidenceDate, string title)
    {
        var calendar = new Ical.Net.Calendar { ProductId = "-//InspectionUpdate//inspection calendar//EN" };
        calendar.AddProperty("X-WR-CALNAME", title);
        foreach (var e in Order(entries, evidenceDate))
        {
            var overdue = e.Date <= evidenceDate;
            var day = overdue ? evidenceDate : e.Date;
            var ev = new CalendarEvent
            {
                Uid = Uid(e),
                Summary = (overdue ? "OVERDUE: inspect " : "Inspect ") + e.ComponentId + (e.Method.Length > 0 ? " (" + e.Method + ")" : string.Empty) + " by " + e.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                Description = $"{e.ComponentName}, site {e.Site}. Latest date {e.Date:yyyy-MM-dd}" + (overdue ? $" (on or before the evidence date {evidenceDate:yyyy-MM-dd}: overdue)" : string.Empty)
                    + $". {e.Basis.TrimEnd('.')}. {Cautions.Line}",
                Location = e.Site,
                Start = new CalDateTime(day.Year, day.Month, day.Day),
                End = new CalDateTime(day.AddDays(1).Year, day.AddDays(1).Month, day.AddDays(1).Day),
            };
            ev.Categories.Add(e.Site);
            calendar.Events.Add(ev);
        }

        return new CalendarSerializer().SerializeToString(calendar) ?? string.Empty;
    }

    private static string Quote(string s) =>
        s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;
}
