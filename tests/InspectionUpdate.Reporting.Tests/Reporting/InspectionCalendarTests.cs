using System.Globalization;
using InspectionUpdate.Reporting.Export;

namespace InspectionUpdate.Tests.Reporting;

/// <summary>
/// The inspection calendar grouped by site and by campaign window (month, quarter, or windows of N days from the
/// evidence date), overdue first, as CSV and as iCalendar parsed back with Ical.Net. The expected windows are computed
/// in the test from their definitions, independently of <see cref="CampaignWindow.Of"/>.
/// </summary>
public class InspectionCalendarTests
{
    private static readonly DateOnly EvidenceDate = new(2026, 6, 30);

    // Invented components at two invented sites; dates chosen on the edges of months, quarters and 90-day windows.
    private static readonly CalendarEntry[] Entries =
    [
        new("B-2", "pump header", "SITE-B", 1, new DateOnly(2026, 3, 1), "", "overdue"),
        new("A-1", "riser weld", "SITE-A", 1, new DateOnly(2026, 6, 30), "UT", "due on the evidence date"),
        new("A-1", "riser weld", "SITE-A", 2, new DateOnly(2026, 7, 1), "UT", "first day after the evidence date"),
        new("B-1", "spool", "SITE-B", 1, new DateOnly(2026, 9, 28), "MFL", "last day of the first 90-day window"),
        new("B-1", "spool", "SITE-B", 2, new DateOnly(2026, 9, 29), "MFL", "first day of the second 90-day window"),
        new("A-2", "bend", "SITE-A", 1, new DateOnly(2026, 12, 31), "", "last day of a quarter"),
        new("A-2", "bend", "SITE-A", 2, new DateOnly(2027, 1, 1), "", "first day of a quarter"),
        new("B-3", "tee", "SITE-B", 1, new DateOnly(2028, 2, 29), "UT", "leap day"),
    ];

    /// <summary>The window of a date by its definition: (label, first, last).</summary>
    private static (string Label, DateOnly First, DateOnly Last) Expected(string grouping, DateOnly d)
    {
        if (d <= EvidenceDate) return ("overdue", EvidenceDate, EvidenceDate);
        switch (grouping)
        {
            case "month":
                return (d.ToString("yyyy-MM", CultureInfo.InvariantCulture), new DateOnly(d.Year, d.Month, 1), new DateOnly(d.Year, d.Month, DateTime.DaysInMonth(d.Year, d.Month)));
            case "quarter":
                var q = (d.Month + 2) / 3;
                var lastMonth = 3 * q;
                return ($"{d.Year}-Q{q}", new DateOnly(d.Year, lastMonth - 2, 1), new DateOnly(d.Year, lastMonth, DateTime.DaysInMonth(d.Year, lastMonth)));
            default:
                // Window k (from 1) holds the days EvidenceDate + (k − 1)·N + 1 … EvidenceDate + k·N.
                var n = int.Parse(grouping, CultureInfo.InvariantCulture);
                var daysAfter = d.DayNumber - EvidenceDate.DayNumber;
                var k = (daysAfter + n - 1) / n;
                var first = EvidenceDate.AddDays((k - 1) * n + 1);
                var last = EvidenceDate.AddDays(k * n);
                return (string.Create(CultureInfo.InvariantCulture, $"W{k:00} {first:yyyy-MM-dd}..{last:yyyy-MM-dd}"), first, last);
        }
    }

    [Theory]
    [InlineData("month")]
    [InlineData("quarter")]
    [InlineData("90")]
    [InlineData("1")]
    [Reference("RFC 5545 (iCalendar: VEVENT, CATEGORIES, all-day DATE values), parsed back with Ical.Net; windows from their definitions, computed in the test")]
    public void The_calendar_groups_by_site_and_window_overdue_first_and_the_ics_holds_every_due_date(string grouping)
    {
        var window = CampaignWindow.TryParse(grouping)!;
        Assert.NotNull(window);
        using var writer = new StringWriter();
        InspectionCalendar.WriteCsv(writer, Entries.Reverse(), EvidenceDate, window);
        var lines = writer.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var header = lines[0].Split(',');
        int Col(string name) => Array.IndexOf(header, name);
        var rows = lines.Skip(1).Select(l => l.Split(',')).ToArray();

        Assert.Equal(Entries.Length, rows.Length);
        // Overdue first, then by site, then by window and date (windows follow the date).
        Assert.Equal(["overdue", "overdue"], rows.Take(2).Select(r => r[Col("status")]));
        var due = rows.Skip(2).Select(r => (Site: r[Col("site")], Date: r[Col("date")])).ToArray();
        Assert.Equal(due.OrderBy(d => d.Site, StringComparer.Ordinal).ThenBy(d => d.Date, StringComparer.Ordinal), due);
        foreach (var r in rows)
        {
            var date = DateOnly.ParseExact(r[Col("date")], "yyyy-MM-dd", CultureInfo.InvariantCulture);
            var (label, first, last) = Expected(grouping, date);
            Assert.Equal(label, r[Col("campaign")]);
            Assert.Equal(first.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r[Col("campaign_start")]);
            Assert.Equal(last.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), r[Col("campaign_end")]);
        }

        // Within a site, rows of one window are contiguous (a group, not scattered).
        foreach (var site in due.Select(d => d.Site).Distinct())
        {
            var labels = rows.Skip(2).Where(r => r[Col("site")] == site).Select(r => r[Col("campaign")]).ToArray();
            var seen = new List<string>();
            foreach (var l in labels)
            {
                if (seen.Count == 0 || seen[^1] != l)
                {
                    Assert.DoesNotContain(l, seen);
                    seen.Add(l);
                }
            }
        }

        var calendar = Ical.Net.Calendar.Load(InspectionCalendar.Ics(Entries, EvidenceDate, "trial", window))!;
        var events = calendar.Events.ToArray();
        Assert.Equal(Entries.Length, events.Length);
        foreach (var e in Entries)
        {
            var day = e.Date <= EvidenceDate ? EvidenceDate : e.Date;
            var ev = Assert.Single(events, v => v.Uid == InspectionCalendar.Uid(e));
            Assert.Equal((day.Year, day.Month, day.Day), (ev.Start!.Year, ev.Start.Month, ev.Start.Day));
            Assert.Contains("by " + e.Date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), ev.Summary, StringComparison.Ordinal);
            Assert.Equal(e.Date <= EvidenceDate, ev.Summary!.StartsWith("OVERDUE", StringComparison.Ordinal));
            Assert.Contains(e.Site, ev.Categories);
            Assert.Contains("campaign " + Expected(grouping, e.Date).Label, ev.Categories);
        }
    }

    [Theory]
    [InlineData("0")]
    [InlineData("3661")]
    [InlineData("week")]
    [InlineData("-5")]
    [InlineData("")]
    public void A_window_that_is_not_month_quarter_or_1_to_3660_days_is_refused(string text) => Assert.Null(CampaignWindow.TryParse(text));
}
