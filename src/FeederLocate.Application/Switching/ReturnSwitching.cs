using FeederLocate.Application.Analysis;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Switching;

/// <summary>
/// The return to normal as the incident's own switching order (<see cref="IncidentAnalysis.ReturnAsync"/>): once
/// the outcome is logged and the incident repaired (a no-fault-found outcome needs no repair), its steps are ticked
/// in order, each open or close checked by the device rules from the positions of the moment
/// (<see cref="StepCheck.CheckAfterRepair"/>), and logged as <see cref="ReturnStepCompleted"/>, apart from the
/// fault's steps. Closing follows when every step is ticked.
/// </summary>
public sealed class ReturnSwitching(IncidentLog log, IncidentAnalysis analysis, TimeProvider? clock = null)
{
    private readonly TimeProvider _clock = clock ?? TimeProvider.System;

    /// <summary>Why the return to normal of <paramref name="state"/> may not start yet; null when it may.</summary>
    public static string? NotYet(IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(state);
        return state.Status == IncidentStatus.Closed ? $"incident {state.Id} is closed"
            : !state.HasOutcome ? "the return to normal follows the outcome: log where the fault was found, or that none was found"
            : state.NoFaultFound is null && state.Stage < IncidentStage.Repaired ? "the return to normal follows the repair: move the incident to repaired first"
            : null;
    }

    /// <summary>Ticks step <paramref name="order"/> of the incident's return order, checked as <see cref="Tick"/>.</summary>
    public async Task<StepDecision> TickAsync(NetworkGraph graph, IncidentId id, int order, Actor actor, DateTimeOffset? doneAt = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var state = log.State(id);
        var back = await analysis.ReturnAsync(graph, state).ConfigureAwait(false);
        if (back.Plan is not { } plan)
        {
            return StepDecision.Refused($"incident {id} has no return order: {back.Problem}");
        }

        if (plan.Steps.FirstOrDefault(s => s.Order == order) is not { } step)
        {
            return StepDecision.Refused($"step {order} is not a step of the return order (steps 1 to {plan.Steps.Length})");
        }

        return Tick(graph, state, plan, step, actor, doneAt);
    }

    /// <summary>Why <paramref name="step"/> of the return order may not be ticked now; null when it may.</summary>
    public static string? Refusal(NetworkGraph graph, IncidentState state, ReturnPlan plan, SwitchingStep step)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(plan);
        ArgumentNullException.ThrowIfNull(step);
        if (NotYet(state) is { } notYet)
        {
            return notYet;
        }

        if (!plan.Steps.Any(s => s.Order == step.Order && s.Action == step.Action && s.Device == step.Device))
        {
            return $"step {step.Order} is not a step of the return order";
        }

        if (IsDone(state, step))
        {
            return $"return step {step.Order} is already ticked";
        }

        if (plan.Steps.FirstOrDefault(s => s.Order < step.Order && !IsDone(state, s)) is { } before)
        {
            return $"return step {before.Order} ({CheckedSwitching.ActionName(before.Action)} {before.Device?.Value}) is not done yet: the steps are carried out in order".Replace(" )", ")", StringComparison.Ordinal);
        }

        return step is { ChangesNetwork: true, Device: { } device }
            ? StepCheck.CheckAfterRepair(graph, IncidentSwitching.Current(graph.Grid, state), device, step.Action == StepAction.Open ? SwitchPosition.Open : SwitchPosition.Closed)
            : null;
    }

    /// <summary>
    /// Ticks <paramref name="step"/> of the return order as done, carried out at <paramref name="doneAt"/> (null:
    /// now; neither in the future nor before the fault), when the order and the device rules allow it; else refuses, logging nothing.
    /// </summary>
    public StepDecision Tick(NetworkGraph graph, IncidentState state, ReturnPlan plan, SwitchingStep step, Actor actor, DateTimeOffset? doneAt = null)
    {
        ArgumentNullException.ThrowIfNull(actor);
        ArgumentNullException.ThrowIfNull(state);
        var refusal = Refusal(graph, state, plan, step)
            ?? (doneAt is { } at ? Times.EventTimes.Problem($"return step {step.Order} done at", at, state, _clock.GetUtcNow()) : null);
        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(state.Id, new ReturnStepCompleted(step.Order, CheckedSwitching.ActionName(step.Action), step.Device?.Value, doneAt), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>The steps of <paramref name="plan"/> not ticked yet, in order.</summary>
    public static IReadOnlyList<SwitchingStep> Remaining(IncidentState state, ReturnPlan plan)
    {
        ArgumentNullException.ThrowIfNull(plan);
        return [.. plan.Steps.Where(s => !IsDone(state, s))];
    }

    internal static bool IsDone(IncidentState state, SwitchingStep step) =>
        state.ReturnSteps.Any(d => d.Step.Order == step.Order && d.Step.Action == CheckedSwitching.ActionName(step.Action));
}
