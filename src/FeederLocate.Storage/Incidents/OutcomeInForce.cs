using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>The outcome in force (the latest logged), with who logged it and when.</summary>
public sealed record OutcomeInForce(OutcomeLogged Outcome, Actor Actor, DateTimeOffset LoggedAt);
