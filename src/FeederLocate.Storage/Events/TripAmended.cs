using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Events;

/// <summary>
/// The trip as now known: the device that tripped (null where nothing tripped) and the fault type
/// (null when unknown). Replaces what the incident held.
/// </summary>
public sealed record TripAmended(SwitchId? TrippedDevice, FaultType? FaultType) : IncidentEvent;
