namespace FeederLocate.Storage.Events;

/// <summary>The incident is finished; no event may follow.</summary>
public sealed record IncidentClosed(string? Note = null) : IncidentEvent;
