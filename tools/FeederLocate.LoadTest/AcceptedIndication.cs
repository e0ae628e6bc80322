using FeederLocate.Core.Evidence;

namespace FeederLocate.LoadTest;

/// <summary>An indication of a post the API accepted (202): it must be in the incident's log afterwards.</summary>
public sealed record AcceptedIndication(long IncidentId, Indication Indication);
