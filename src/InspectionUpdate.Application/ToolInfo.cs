namespace InspectionUpdate.Application;

/// <summary>The tool's identity as results and reports record it.</summary>
public static class ToolInfo
{
    /// <summary>The tool version (major.minor.build) shown in reports, exports and stored result keys.</summary>
    public static string Version { get; } =
        typeof(ToolInfo).Assembly.GetName().Version is { } v ? $"{v.Major}.{v.Minor}.{v.Build}" : "0.0.0";
}

/// <summary>A clock that stands at noon UTC of one day (tests, the demo's scenario date, what-if registers).</summary>
public sealed class FixedClock(DateOnly day) : TimeProvider
{
    /// <inheritdoc />
    public override DateTimeOffset GetUtcNow() => new(day.ToDateTime(new TimeOnly(12, 0)), TimeSpan.Zero);
}
