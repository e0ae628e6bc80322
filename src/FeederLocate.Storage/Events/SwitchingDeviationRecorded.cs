using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Events;

/// <summary>
/// A switch operated outside the switching order, on an engineer's decision: the device, the position it was
/// put in, the reason given, and the rule or order it departed from (null when it broke none). The plan is
/// made again from the positions after it.
/// </summary>
public sealed record SwitchingDeviationRecorded(SwitchId Switch, SwitchPosition Position, string Reason, string? Departure = null) : IncidentEvent;
