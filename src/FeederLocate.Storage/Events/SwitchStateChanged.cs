using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Events;

/// <summary>A switch found or put in <paramref name="Position"/>.</summary>
public sealed record SwitchStateChanged(SwitchId Switch, SwitchPosition Position) : IncidentEvent;
