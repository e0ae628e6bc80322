namespace FeederLocate.Storage.Incidents;

/// <summary>The incident's own times as entered (null where not given): fault, trip and reclosure.</summary>
public sealed record IncidentTimes(DateTimeOffset? FaultAt, DateTimeOffset? TrippedAt, DateTimeOffset? ReclosedAt)
{
    public static IncidentTimes None { get; } = new(null, null, null);
}
