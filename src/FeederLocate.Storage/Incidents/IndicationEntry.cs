using FeederLocate.Core.Evidence;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// Who entered an indicator's present reading and when; <paramref name="Overrode"/> is the earlier entry it
/// replaced when that came from another account within <see cref="OverrideWindow"/> (two operators at once).
/// </summary>
public sealed record IndicationEntry(Indication Indication, Actor Actor, DateTimeOffset EnteredAt, IndicationEntry? Overrode = null)
{
    /// <summary>How close two entries of one indicator by different accounts must be for the later to say it overrode the other.</summary>
    public static readonly TimeSpan OverrideWindow = TimeSpan.FromSeconds(30);
}
