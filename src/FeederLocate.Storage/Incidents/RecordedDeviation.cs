using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A deviation from the switching order, with who logged it and when.</summary>
public sealed record RecordedDeviation(SwitchingDeviationRecorded Deviation, Actor Actor, DateTimeOffset RecordedAt);
