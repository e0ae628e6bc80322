using System.Globalization;

namespace FeederLocate.Storage.Database;

/// <summary>Times as stored: ISO 8601 in UTC with seven fraction digits, so text order is time order.</summary>
internal static class IsoTime
{
    private const string Pattern = "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'";

    public static string Format(DateTimeOffset time) =>
        time.ToUniversalTime().ToString(Pattern, CultureInfo.InvariantCulture);

    public static bool TryParse(string? text, out DateTimeOffset time) =>
        DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture,
            DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out time);
}
