using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A plan step carried out, with who logged it and when (<paramref name="CompletedAt"/>: the time it was logged).</summary>
public sealed record CompletedPlanStep(PlanStepCompleted Step, Actor Actor, DateTimeOffset CompletedAt)
{
    /// <summary>When the step was actually carried out: the time the operator gave, else the time it was logged.</summary>
    public DateTimeOffset DoneAt => Step.DoneAt ?? CompletedAt;
}
