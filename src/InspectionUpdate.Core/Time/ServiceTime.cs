namespace InspectionUpdate.Time;

/// <summary>
/// Converts between calendar dates and service time in years since a component entered service. One year is
/// 365.2425 days (the mean Gregorian year), so a date round-trips to within a day.
/// </summary>
public static class ServiceTime
{
    /// <summary>Days in a mean Gregorian year.</summary>
    public const double DaysPerYear = 365.2425;

    /// <summary>Years from <paramref name="inServiceDate"/> to <paramref name="date"/> (negative before it).</summary>
    public static double YearsSince(DateOnly inServiceDate, DateOnly date) =>
        (date.DayNumber - inServiceDate.DayNumber) / DaysPerYear;

    /// <summary>The calendar date <paramref name="timeYears"/> after <paramref name="inServiceDate"/>, rounded to the nearest day.</summary>
    /// <exception cref="ArgumentOutOfRangeException">timeYears is not finite or lands outside the calendar.</exception>
    public static DateOnly DateAt(DateOnly inServiceDate, double timeYears)
    {
        if (!double.IsFinite(timeYears))
        {
            throw new ArgumentOutOfRangeException(nameof(timeYears), timeYears, "Service time must be finite.");
        }

        var day = inServiceDate.DayNumber + Math.Round(timeYears * DaysPerYear, MidpointRounding.AwayFromZero);
        if (day < DateOnly.MinValue.DayNumber || day > DateOnly.MaxValue.DayNumber)
        {
            throw new ArgumentOutOfRangeException(nameof(timeYears), timeYears, "The date falls outside the calendar.");
        }

        return DateOnly.FromDayNumber((int)day);
    }
}
