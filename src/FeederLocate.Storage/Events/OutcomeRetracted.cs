namespace FeederLocate.Storage.Events;

/// <summary>
/// The outcome in force was wrong: from this event on the incident has no outcome (until another is logged),
/// and learning no longer uses it. The wrong outcome stays in the log; <paramref name="Reason"/> says why it
/// was withdrawn. May follow <see cref="IncidentClosed"/>: a mistake is often found after closing.
/// </summary>
public sealed record OutcomeRetracted(string Reason) : IncidentEvent;
