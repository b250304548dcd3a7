namespace InspectionUpdate.Application;

/// <summary>The tool's identity as results and reports record it.</summary>
public static class ToolInfo
{
    /// <summary>The tool version (major.minor.build) shown in reports, exports and stored result keys.</summary>
    public static string Version { get; } =
        typeof(ToolInfo).Assembly.GetName().Version is { } v ? $"{v.Major}.{v.Minor}.{v.Build}" : "0.0.0";

    /// <summary>
    /// The version stored in result keys: <see cref="Version"/> and the build of the engine and of this layer
    /// ("0.1.0+build.1a2b3c4d5e6f"). Builds are deterministic, so the build part changes exactly when the compiled
    /// numerics or orchestration change, even between releases of the same version: results of another build are stale.
    /// </summary>
    public static string ResultVersion { get; } = Version + "+build." + Convert.ToHexStringLower(System.Security.Cryptography.SHA256.HashData(
        System.Text.Encoding.UTF8.GetBytes(typeof(Probability.RandomVariable).Assembly.ManifestModule.ModuleVersionId.ToString("N")
            + typeof(ToolInfo).Assembly.ManifestModule.ModuleVersionId.ToString("N"))))[..12];
}

/// <summary>A clock that stands at noon UTC of one day (tests, the demo's scenario date, what-if registers).</summary>
public sealed class FixedClock(DateOnly day) : TimeProvider
{
    /// <inheritdoc />
    public override DateTimeOffset GetUtcNow() => new(day.ToDateTime(new TimeOnly(12, 0)), TimeSpan.Zero);
}
