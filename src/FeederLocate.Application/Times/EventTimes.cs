using System.Globalization;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Times;

/// <summary>
/// The one rule for every time an operator gives an incident (a reading's time, a step's actual time, the trip
/// and reclosure): not later than the moment of entry, and not before the fault began.
/// </summary>
public static class EventTimes
{
    /// <summary>Why <paramref name="at"/> is refused for <paramref name="what"/>; null when it is allowed.</summary>
    public static string? Problem(string what, DateTimeOffset at, DateTimeOffset? faultAt, DateTimeOffset now, string earliest = "the fault began")
    {
        if (at > now)
        {
            return $"{what} {Text(at)} is in the future (now {Text(now)})";
        }

        return faultAt is { } fault && at < fault ? $"{what} {Text(at)} is before {earliest} at {Text(fault)}" : null;
    }

    /// <summary><see cref="Problem(string, DateTimeOffset, DateTimeOffset?, DateTimeOffset, string)"/> against the incident's fault time as entered.</summary>
    public static string? Problem(string what, DateTimeOffset at, IncidentState state, DateTimeOffset now)
    {
        ArgumentNullException.ThrowIfNull(state);
        return Problem(what, at, state.Times.FaultAt, now);
    }

    /// <summary>A time as the incident format writes it (ISO 8601, UTC).</summary>
    public static string Text(DateTimeOffset at) => at.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture);
}
