namespace FeederLocate.Storage.Events;

/// <summary>
/// A step of the return to normal carried out after the repair: the return order's own steps, apart from the
/// fault's switching order (<see cref="PlanStepCompleted"/>).
/// </summary>
/// <param name="Order">The step's <c>order</c> in the return order, ≥ 1.</param>
/// <param name="Action">The return order's action: verify, removeEarth, unlock, dispatch, open, close.</param>
/// <param name="Device">The switch acted on, when the action has one.</param>
/// <param name="DoneAt">When it was actually carried out, as the operator gives it; null: when it was logged.</param>
public sealed record ReturnStepCompleted(int Order, string Action, string? Device = null, DateTimeOffset? DoneAt = null) : IncidentEvent;
