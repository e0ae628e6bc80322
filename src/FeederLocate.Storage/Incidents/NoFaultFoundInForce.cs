using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A no-fault-found outcome in force (the latest outcome logged), with who logged it and when.</summary>
public sealed record NoFaultFoundInForce(NoFaultFoundLogged Finding, Actor Actor, DateTimeOffset LoggedAt);
