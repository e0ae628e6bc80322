namespace FeederLocate.Storage.Events;

/// <summary>The incident is finished; no event may follow but <see cref="IncidentReopened"/>.</summary>
public sealed record IncidentClosed(string? Note = null) : IncidentEvent;
