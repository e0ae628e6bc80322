using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>A substation measurement; the values it gives replace those held for the same device, the others stay.</summary>
public sealed record MeasurementRecorded(SubstationMeasurement Measurement) : IncidentEvent;
