namespace InspectionUpdate.TimeVariant;

/// <summary>
/// The times (years since entry into service) at which a profile is computed: strictly increasing, all after
/// <see cref="StartYears"/>. Pf at the start is 0 when the start is 0 (the component is intact when it enters
/// service) and computed otherwise.
/// </summary>
public sealed record TimeGrid
{
    private TimeGrid(double startYears, double[] times)
    {
        StartYears = startYears;
        TimesYears = times;
    }

    /// <summary>Start of the grid (years); ΔPf of the first point is measured from here.</summary>
    public double StartYears { get; }

    /// <summary>Grid times in years, strictly increasing, each &gt; <see cref="StartYears"/>.</summary>
    public IReadOnlyList<double> TimesYears { get; }

    /// <summary>True when every time and the start are whole years.</summary>
    public bool IsWholeYears => IsWhole(StartYears) && TimesYears.All(IsWhole);

    /// <summary>A grid from <paramref name="startYears"/> to <paramref name="endYears"/> with <paramref name="stepsPerYear"/> steps per year.</summary>
    /// <exception cref="ArgumentOutOfRangeException">Start negative or not finite, end not after the start, or steps per year outside 1…365.</exception>
    public static TimeGrid Yearly(double endYears, int stepsPerYear = 1, double startYears = 0)
    {
        if (!(double.IsFinite(startYears) && startYears >= 0)) throw new ArgumentOutOfRangeException(nameof(startYears), startYears, "The start must be finite and ≥ 0.");
        if (!(double.IsFinite(endYears) && endYears > startYears)) throw new ArgumentOutOfRangeException(nameof(endYears), endYears, "The end must be finite and after the start.");
        if (stepsPerYear is < 1 or > 365) throw new ArgumentOutOfRangeException(nameof(stepsPerYear), stepsPerYear, "Steps per year must lie in 1…365.");
        var h = 1.0 / stepsPerYear;
        var count = (int)Math.Ceiling((endYears - startYears) / h - 1e-9);
        var times = new double[count];
        for (var i = 0; i < count; i++) times[i] = Math.Min(startYears + (i + 1) * h, endYears);
        times[^1] = endYears;
        return new TimeGrid(startYears, times);
    }

    /// <summary>A grid of given times.</summary>
    /// <exception cref="ArgumentException">No times, a time not finite, not strictly increasing, or not after the start (the message names the entry).</exception>
    public static TimeGrid FromTimes(IReadOnlyList<double> timesYears, double startYears = 0)
    {
        ArgumentNullException.ThrowIfNull(timesYears);
        if (timesYears.Count == 0) throw new ArgumentException("A time grid needs at least one time.", nameof(timesYears));
        if (!(double.IsFinite(startYears) && startYears >= 0)) throw new ArgumentOutOfRangeException(nameof(startYears), startYears, "The start must be finite and ≥ 0.");
        var previous = startYears;
        for (var i = 0; i < timesYears.Count; i++)
        {
            var t = timesYears[i];
            if (!double.IsFinite(t) || !(t > previous))
            {
                throw new ArgumentException(FormattableString.Invariant($"Time {i} = {t} must be finite and after {previous} (the times must increase strictly from the start)."), nameof(timesYears));
            }

            previous = t;
        }

        return new TimeGrid(startYears, timesYears.ToArray());
    }

    private static bool IsWhole(double t) => Math.Abs(t - Math.Round(t)) < 1e-9;
}
