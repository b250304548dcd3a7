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

/// <summary>How the calendar groups the due inspections of a site in time: calendar months, calendar quarters, or campaign windows of a number of days.</summary>
public enum CampaignGrouping
{
    /// <summary>Calendar months ("2028-05").</summary>
    Month,

    /// <summary>Calendar quarters ("2028-Q2": January–March is Q1).</summary>
    Quarter,

    /// <summary>Windows of <see cref="CampaignWindow.Days"/> days counted from the day after the evidence date ("W03 2027-01-28..2027-04-27").</summary>
    Days,
}

/// <summary>The calendar's time grouping (the campaign window a planner plans inspections in).</summary>
/// <param name="Grouping">Months, quarters or windows of <paramref name="Days"/> days.</param>
/// <param name="Days">Window length in days for <see cref="CampaignGrouping.Days"/> (1 to 3660); ignored otherwise.</param>
public sealed record CampaignWindow(CampaignGrouping Grouping = CampaignGrouping.Month, int Days = 0)
{
    /// <summary>The default: calendar months.</summary>
    public static CampaignWindow Month { get; } = new();

    /// <summary>
    /// Parses "month", "quarter" or a whole number of days (1 to 3660); null when the text is none of these.
    /// </summary>
    public static CampaignWindow? TryParse(string? text)
    {
        var t = text?.Trim().ToLowerInvariant();
        if (t == "month") return Month;
        if (t == "quarter") return new CampaignWindow(CampaignGrouping.Quarter);
        return int.TryParse(t, NumberStyles.None, CultureInfo.InvariantCulture, out var days) && days is >= 1 and <= 3660
            ? new CampaignWindow(CampaignGrouping.Days, days) : null;
    }

    /// <summary>The option's spelling: "month", "quarter" or the number of days.</summary>
    public override string ToString() => Grouping switch
    {
        CampaignGrouping.Quarter => "quarter",
        CampaignGrouping.Days => Days.ToString(CultureInfo.InvariantCulture),
        _ => "month",
    };

    /// <summary>
    /// The window holding <paramref name="date"/>: its label, first and last day. An overdue date (on or before the
    /// evidence date) is in no window: label "overdue", both days the evidence date.
    /// </summary>
    public (string Label, DateOnly First, DateOnly Last) Of(DateOnly date, DateOnly evidenceDate)
    {
        if (date <= evidenceDate) return ("overdue", evidenceDate, evidenceDate);
        switch (Grouping)
        {
            case CampaignGrouping.Quarter:
                {
                    var q = (date.Month - 1) / 3;
                    var first = new DateOnly(date.Year, 3 * q + 1, 1);
                    return (string.Create(CultureInfo.InvariantCulture, $"{date.Year}-Q{q + 1}"), first, first.AddMonths(3).AddDays(-1));
                }

            case CampaignGrouping.Days when Days >= 1:
                {
                    var k = (date.DayNumber - evidenceDate.DayNumber - 1) / Days;
                    var first = evidenceDate.AddDays(1 + k * Days);
                    var last = first.AddDays(Days - 1);
                    return (string.Create(CultureInfo.InvariantCulture, $"W{k + 1:00} {first:yyyy-MM-dd}..{last:yyyy-MM-dd}"), first, last);
                }

            default:
                {
                    var first = new DateOnly(date.Year, date.Month, 1);
                    return (date.ToString("yyyy-MM", CultureInfo.InvariantCulture), first, first.AddMonths(1).AddDays(-1));
                }
        }
    }
}

/// <summary>
/// The inspection calendar for planners: every due inspection of the plans, overdue ones (latest date on or before
/// the evidence date) first, then grouped by site and by campaign window (calendar month by default, or quarter, or
/// windows of N days from the evidence date) in date order; as CSV and as an iCalendar file (RFC 5545).
/// </summary>
public static class InspectionCalendar
{
    /// <summary>File name of the CSV calendar.</summary>
    public const string CsvName = "calendar.csv";

    /// <summary>File name of the iCalendar file.</summary>
    public const string IcsName = "calendar.ics";

    /// <summary>Header of the CSV, in column order.</summary>
    public static IReadOnlyList<string> CsvColumns { get; } =
        ["status", "site", "month", "campaign", "campaign_start", "campaign_end", "date", "component_id", "component_name", "sequence", "method", "basis", "uid"];

    /// <summary>
    /// Entries in calendar order: overdue first (by date), then by site, campaign window and date. The window groups
    /// follow the date, so the order within a site is the date order whatever the window.
    /// </summary>
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
    public static void WriteCsv(TextWriter writer, IEnumerable<CalendarEntry> entries, DateOnly evidenceDate, CampaignWindow? window = null)
    {
        ArgumentNullException.ThrowIfNull(writer);
        window ??= CampaignWindow.Month;
        writer.Write(string.Join(',', CsvColumns));
        writer.Write('\n');
        foreach (var e in Order(entries, evidenceDate))
        {
            var (label, first, last) = window.Of(e.Date, evidenceDate);
            string[] cells =
            [
                e.Date <= evidenceDate ? "overdue" : "due", e.Site, e.Date.ToString("yyyy-MM", CultureInfo.InvariantCulture),
                label, first.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), last.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                e.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), e.ComponentId, e.ComponentName,
                e.Sequence.ToString(CultureInfo.InvariantCulture), e.Method, e.Basis, Uid(e),
            ];
            writer.Write(string.Join(',', cells.Select(Quote)));
            writer.Write('\n');
        }
    }

    /// <summary>
    /// The iCalendar text: one all-day event per due inspection on its latest date (an overdue one on the evidence
    /// date, its summary starting "OVERDUE"), the site and the campaign window as categories, the site as location,
    /// the window, the basis and the caution in the description.
    /// </summary>
    public static string Ics(IEnumerable<CalendarEntry> entries, DateOnly evidenceDate, string title, CampaignWindow? window = null)
    {
        window ??= CampaignWindow.Month;
        var calendar = new Ical.Net.Calendar { ProductId = "-//InspectionUpdate//inspection calendar//EN" };
        calendar.AddProperty("X-WR-CALNAME", title);
        foreach (var e in Order(entries, evidenceDate))
        {
            var overdue = e.Date <= evidenceDate;
            var day = overdue ? evidenceDate : e.Date;
            var (label, first, last) = window.Of(e.Date, evidenceDate);
            var ev = new CalendarEvent
            {
                Uid = Uid(e),
                Summary = (overdue ? "OVERDUE: inspect " : "Inspect ") + e.ComponentId + (e.Method.Length > 0 ? " (" + e.Method + ")" : string.Empty) + " by " + e.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                Description = $"{e.ComponentName}, site {e.Site}. Latest date {e.Date:yyyy-MM-dd}" + (overdue ? $" (on or before the evidence date {evidenceDate:yyyy-MM-dd}: overdue)" : $"; campaign {label} ({first:yyyy-MM-dd} to {last:yyyy-MM-dd})")
                    + $". {e.Basis.TrimEnd('.')}. {Cautions.Line}",
                Location = e.Site,
                Start = new CalDateTime(day.Year, day.Month, day.Day),
                End = new CalDateTime(day.AddDays(1).Year, day.AddDays(1).Month, day.AddDays(1).Day),
            };
            ev.Categories.Add(e.Site);
            ev.Categories.Add("campaign " + label);
            calendar.Events.Add(ev);
        }

        return new CalendarSerializer().SerializeToString(calendar) ?? string.Empty;
    }

    private static string Quote(string s) =>
        s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;
}
