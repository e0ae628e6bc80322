using System.Collections.Immutable;

namespace FeederLocate.Core.Model;

/// <summary>Id of a crew base (a depot) as written in the grid file.</summary>
public readonly record struct CrewBaseId(string Value)
{
    public override string ToString() => Value;
}

/// <summary>
/// Where field crews set out from and how many are based there. A crew does one thing at a time; the
/// switching planner sends the crews of every base to the manual devices.
/// </summary>
/// <param name="Node">The node the crews set out from (where the depot connects, or the nearest node to it).</param>
/// <param name="Count">Crews based there, at least 1.</param>
/// <param name="Name">Free text for people, or null.</param>
/// <param name="TravelTimes">
/// Time from this base to a manual device where it differs from the device's own travel time (the grid's
/// travelMinutes); devices not listed take their own.
/// </param>
public sealed record CrewBase(
    CrewBaseId Id,
    NodeId Node,
    int Count,
    string? Name = null,
    ImmutableDictionary<SwitchId, TimeSpan>? TravelTimes = null)
{
    /// <summary>The crews' labels in the plan: the base's id and the crew's number, <c>DEPOT/1</c>, <c>DEPOT/2</c>.</summary>
    public IEnumerable<string> CrewLabels => Enumerable.Range(1, Count).Select(k => $"{Id.Value}/{k}");

    /// <summary>This base's own time to <paramref name="device"/>, or null where the device's travel time applies.</summary>
    public TimeSpan? TravelTo(SwitchId device) => TravelTimes is { } times && times.TryGetValue(device, out var t) ? t : null;
}
