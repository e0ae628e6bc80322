using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>A substation record; the values it gives replace those held for the same device, the others stay.</summary>
public sealed record MeasurementRecorded(SubstationMeasurement Measurement) : IncidentEvent;
