using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>An indicator's state as reported or read; a later one for the same indicator replaces it.</summary>
public sealed record IndicationEntered(Indication Indication) : IncidentEvent;
