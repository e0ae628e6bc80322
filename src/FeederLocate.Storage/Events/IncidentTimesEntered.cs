namespace FeederLocate.Storage.Events;

/// <summary>
/// The incident's times as the operator gives them: when the fault began (<c>faultAt</c>, as in the incident
/// format), when the protection tripped and when it reclosed. A null leaves the time given before as it was.
/// </summary>
public sealed record IncidentTimesEntered(DateTimeOffset? FaultAt, DateTimeOffset? TrippedAt = null, DateTimeOffset? ReclosedAt = null) : IncidentEvent;
