namespace FeederLocate.Storage.Events;

/// <summary>A closed incident opened again by an engineer, with the reason; it returns to the stage it had before closing.</summary>
public sealed record IncidentReopened(string Reason) : IncidentEvent;
