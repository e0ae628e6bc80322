namespace FeederLocate.Core.Evidence;

/// <summary>
/// The bounds every entry point applies to evidence, in one place: the incident reader (files, the API's
/// documents), the API's single items and the pages. They keep one incident's ranking within the speed the
/// control room needs and refuse times that are surely typing errors.
/// </summary>
public static class EvidenceLimits
{
    /// <summary>The earliest time accepted for a report, a reading or a re-energisation.</summary>
    public static readonly DateTimeOffset EarliestTime = new(1950, 1, 1, 0, 0, 0, TimeSpan.Zero);

    /// <summary>The first time no longer accepted.</summary>
    public static readonly DateTimeOffset LatestTime = new(2100, 1, 1, 0, 0, 0, TimeSpan.Zero);

    /// <summary>Substation records in one incident (one per device, and at most this many).</summary>
    public const int MaxMeasurementsPerIncident = 200;

    /// <summary>Characters of an outcome's notes.</summary>
    public const int MaxNoteChars = 2000;

    /// <summary>Characters of an outcome's cause or a retraction's reason.</summary>
    public const int MaxCauseChars = 200;

    public static bool IsAcceptedTime(DateTimeOffset time) => time >= EarliestTime && time < LatestTime;

    /// <summary>The sentence a refused time gets, naming the bounds.</summary>
    public static string TimeRange => $"must lie between {EarliestTime:yyyy-MM-dd} and {LatestTime:yyyy-MM-dd}";
}
