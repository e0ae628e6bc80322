using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A plan step carried out, with who logged it and when.</summary>
public sealed record CompletedPlanStep(PlanStepCompleted Step, Actor Actor, DateTimeOffset CompletedAt);
