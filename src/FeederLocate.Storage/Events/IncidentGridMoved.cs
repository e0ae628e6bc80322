namespace FeederLocate.Storage.Events;

/// <summary>
/// An engineer moved an open incident from the grid version it was pinned to onto another version of the same
/// grid, with the reason. A new grid version never changes an incident's model without this event.
/// </summary>
public sealed record IncidentGridMoved(int FromVersion, int ToVersion, string Reason) : IncidentEvent;
