using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>
/// The outcome of an incident whose patrol found no fault: no segment is confirmed. <paramref name="Transient"/>
/// says the fault cleared by itself (a reclosure held, a flashover); false means nothing was found and the cause is
/// unknown. Like <see cref="OutcomeLogged"/> it is the outcome in force until another outcome or a retraction
/// replaces it; the learning counts it as a fault on no segment.
/// </summary>
/// <param name="FaultType">The fault type as established; null when not established.</param>
public sealed record NoFaultFoundLogged(bool Transient, FaultType? FaultType = null, string? Notes = null) : IncidentEvent;
