namespace FeederLocate.Storage.Events;

/// <summary>
/// A plan step ticked by mistake: the tick of step <paramref name="Order"/> no longer counts as done. The tick
/// stays in the log; this event says why it was withdrawn.
/// </summary>
public sealed record PlanStepCorrected(int Order, string Reason) : IncidentEvent;
