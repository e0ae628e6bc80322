using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Events;

/// <summary>
/// What the protection did, as now known: the fault time and the reclosing sequence (each replaces the
/// earlier one where given), fuses found blown or intact and relay results (each replaces the earlier
/// entry of the same device).
/// </summary>
public sealed record ProtectionRecorded(
    DateTimeOffset? FaultAt,
    Reclosing? Reclosing,
    ImmutableDictionary<SwitchId, FuseCondition> Fuses,
    ImmutableArray<RelayResult> Relays) : IncidentEvent
{
    /// <summary>The protection context of an incident as one event.</summary>
    public static ProtectionRecorded Of(Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        return new(incident.FaultAt, incident.Reclosing, incident.Fuses, incident.Relays.IsDefault ? [] : incident.Relays);
    }

    /// <summary>The incident with this event applied.</summary>
    public Incident ApplyTo(Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        var fuses = incident.Fuses.SetItems(Fuses);
        var relays = incident.Relays.IsDefault ? [] : incident.Relays;
        foreach (var relay in Relays)
        {
            var at = relays.Select((r, i) => (r, i)).FirstOrDefault(x => x.r.Device == relay.Device, (null!, -1)).Item2;
            relays = at < 0 ? relays.Add(relay) : relays.SetItem(at, relay);
        }

        return incident with
        {
            FaultAt = FaultAt ?? incident.FaultAt,
            Reclosing = Reclosing ?? incident.Reclosing,
            Fuses = fuses,
            Relays = relays,
        };
    }
}
