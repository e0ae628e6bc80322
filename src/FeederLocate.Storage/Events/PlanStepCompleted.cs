namespace FeederLocate.Storage.Events;

/// <summary>A step of the switching plan carried out.</summary>
/// <param name="Order">The step's <c>order</c> in the plan, ≥ 1.</param>
/// <param name="Action">The plan's action: open, close, patrol, verify, replace, lock, proveDead, earth, permit, dispatch.</param>
/// <param name="Device">The switch or other device acted on, when the action has one.</param>
/// <param name="DoneAt">When it was actually carried out, as the operator gives it; null: when it was logged.</param>
public sealed record PlanStepCompleted(int Order, string Action, string? Device = null, string? Note = null, DateTimeOffset? DoneAt = null) : IncidentEvent;
