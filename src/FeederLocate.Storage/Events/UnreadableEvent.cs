namespace FeederLocate.Storage.Events;

/// <summary>
/// A stored event that cannot be read back (damaged payload, unknown kind, bad time). It is never written:
/// reading yields it in place of the event so that the fold can quarantine it and serve everything else.
/// </summary>
/// <param name="StoredKind">The kind as stored, possibly not one this program knows.</param>
/// <param name="Problem">Why it cannot be read, naming the field.</param>
public sealed record UnreadableEvent(string StoredKind, string Problem) : IncidentEvent;
