using System.Globalization;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace InspectionUpdate.Reporting.Export;

/// <summary>
/// Writes instants as UTC with a "Z" (e.g. 2025-06-30T12:00:00.0000000Z), the form the register stores and the docs
/// promise, instead of the default "+00:00" offset; reads any ISO 8601 instant.
/// </summary>
public sealed class UtcTimeConverter : JsonConverter<DateTimeOffset>
{
    /// <inheritdoc />
    public override DateTimeOffset Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
        DateTimeOffset.Parse(reader.GetString() ?? string.Empty, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal);

    /// <inheritdoc />
    public override void Write(Utf8JsonWriter writer, DateTimeOffset value, JsonSerializerOptions options)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.WriteStringValue(value.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'", CultureInfo.InvariantCulture));
    }
}
