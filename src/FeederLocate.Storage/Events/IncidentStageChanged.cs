using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Events;

/// <summary>The incident moved on to <paramref name="Stage"/> (located, isolated, restored or repaired); closing is <see cref="IncidentClosed"/>.</summary>
public sealed record IncidentStageChanged(IncidentStage Stage) : IncidentEvent;
