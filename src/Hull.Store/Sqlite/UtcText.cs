using System.Globalization;

namespace Hull.Store.Sqlite;

/// <summary>UTC instants as fixed-width ISO 8601 text: sorts as time does and reads back exactly (100 ns ticks).</summary>
internal static class UtcText
{
    private const string Format = "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'";

    public static string Write(DateTimeOffset instant) =>
        instant.UtcDateTime.ToString(Format, CultureInfo.InvariantCulture);

    public static DateTimeOffset Read(string text) =>
        new(DateTime.ParseExact(text, Format, CultureInfo.InvariantCulture,
            DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal), TimeSpan.Zero);
}
