using FeederLocate.Application.Analysis;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Switching;

/// <summary>
/// Ticks, corrections and deviations of an incident's switching order, checked before they are logged: a step
/// is ticked only in the plan's order and only when the device rules allow it from the incident's switch
/// positions of the moment (<see cref="StepCheck"/>, the planner's own rules). A mistaken tick is withdrawn by a
/// logged correction; a switch operated outside the order is logged as a deviation with its reason, after
/// which the plan is made again from the positions switched. The page, the HTTP interface and the command line
/// all go through here; the by-number forms take the present plan from <see cref="IncidentAnalysis"/>.
/// </summary>
public sealed class CheckedSwitching(IncidentLog log, IncidentAnalysis analysis, TimeProvider? clock = null)
{
    private readonly TimeProvider _clock = clock ?? TimeProvider.System;

    /// <summary>Ticks step <paramref name="order"/> of the incident's present switching order, checked as <see cref="Tick"/>.</summary>
    public async Task<StepDecision> TickAsync(NetworkGraph graph, IncidentId id, int order, Actor actor, DateTimeOffset? doneAt = null)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var state = log.State(id);
        var (plan, problem) = await analysis.PlanAsync(graph, state).ConfigureAwait(false);
        if (plan is null)
        {
            return StepDecision.Refused($"incident {id} has no switching order: {problem}");
        }

        if (plan.Steps.FirstOrDefault(s => s.Order == order) is not { } step)
        {
            return StepDecision.Refused($"step {order} is not a step of the present switching order (steps 1 to {plan.Steps.Length})");
        }

        return Tick(graph, state, plan, step, actor, doneAt);
    }

    /// <summary>Withdraws the tick of step <paramref name="order"/> of incident <paramref name="id"/>, as <see cref="Correct(IncidentState, int, string, Actor)"/>.</summary>
    public StepDecision Correct(IncidentId id, int order, string reason, Actor actor) => Correct(log.State(id), order, reason, actor);

    /// <summary>Logs a deviation on incident <paramref name="id"/>, checked against the present plan's isolated section.</summary>
    public async Task<StepDecision> DeviateAsync(NetworkGraph graph, IncidentId id, SwitchId device, SwitchPosition position, string reason, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var state = log.State(id);
        var plan = (await analysis.PlanAsync(graph, state).ConfigureAwait(false)).Plan;
        return Deviate(graph, state, plan?.IsolatedSections.FirstOrDefault(), device, position, reason, actor);
    }

    /// <summary>Why <paramref name="step"/> of <paramref name="plan"/> may not be ticked now; null when it may.</summary>
    public static string? Refusal(NetworkGraph graph, IncidentState state, SwitchingPlan plan, SwitchingStep step)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(plan);
        ArgumentNullException.ThrowIfNull(step);
        if (state.Status == IncidentStatus.Closed)
        {
            return $"incident {state.Id} is closed";
        }

        if (!plan.Steps.Any(s => s.Order == step.Order && s.Action == step.Action && s.Device == step.Device))
        {
            return $"step {step.Order} is not a step of the present switching order";
        }

        if (IsDone(state, step))
        {
            return $"step {step.Order} is already ticked";
        }

        if (plan.Steps.FirstOrDefault(s => s.Order < step.Order && !IsDone(state, s)) is { } before)
        {
            return $"step {before.Order} ({Describe(before)}) is not done yet: the steps are carried out in order";
        }

        if (step is not { ChangesNetwork: true, Device: { } device })
        {
            return null;
        }

        var position = step.Action == StepAction.Open ? SwitchPosition.Open : SwitchPosition.Closed;
        return StepCheck.Check(graph, state.PlanBasis, plan.IsolatedSections[0], IncidentSwitching.Current(graph.Grid, state), device, position);
    }

    /// <summary>
    /// Ticks <paramref name="step"/> as done when the order and the device rules allow it, carried out at
    /// <paramref name="doneAt"/> (null: now; neither in the future nor before the fault); else refuses, logging nothing.
    /// </summary>
    public StepDecision Tick(NetworkGraph graph, IncidentState state, SwitchingPlan plan, SwitchingStep step, Actor actor, DateTimeOffset? doneAt = null)
    {
        ArgumentNullException.ThrowIfNull(actor);
        var refusal = Refusal(graph, state, plan, step)
            ?? (doneAt is { } at ? Times.EventTimes.Problem($"step {step.Order} done at", at, state, _clock.GetUtcNow()) : null);
        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(state.Id, new PlanStepCompleted(step.Order, ActionName(step.Action), step.Device?.Value, null, doneAt), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>Withdraws the tick of step <paramref name="order"/>, with the reason; the tick stays in the log.</summary>
    public StepDecision Correct(IncidentState state, int order, string reason, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(actor);
        if (string.IsNullOrWhiteSpace(reason))
        {
            return StepDecision.Refused("give the reason for the correction");
        }

        if (!state.CompletedSteps.Any(d => d.Step.Order == order))
        {
            return StepDecision.Refused($"step {order} is not ticked");
        }

        log.Append(state.Id, new PlanStepCorrected(order, reason.Trim()), actor);
        return StepDecision.Logged;
    }

    /// <summary>
    /// Logs that <paramref name="device"/> was put in <paramref name="position"/> outside the switching order,
    /// with the reason and the rule it departs from, if any (named in the log). The plan is then made again.
    /// </summary>
    public StepDecision Deviate(NetworkGraph graph, IncidentState state, SectionId? suspect, SwitchId device, SwitchPosition position, string reason, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(actor);
        if (string.IsNullOrWhiteSpace(reason))
        {
            return StepDecision.Refused("give the reason for the deviation");
        }

        if (!graph.Grid.HasSwitch(device))
        {
            return StepDecision.Refused($"{device} is not a switching device of grid '{graph.Grid.Name}'");
        }

        var now = IncidentSwitching.Current(graph.Grid, state);
        if (now.PositionOf(device) == position)
        {
            return StepDecision.Refused($"{device} is already {(position == SwitchPosition.Open ? "open" : "closed")}");
        }

        var departure = suspect is { } section ? StepCheck.Check(graph, state.PlanBasis, section, now, device, position) : null;
        log.Append(state.Id, new SwitchingDeviationRecorded(device, position, reason.Trim(), departure), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>
    /// Logs that <paramref name="device"/> was found in <paramref name="position"/> on site (named with its
    /// position, as the page's confirmation does); refused when the model already has it so, or the incident is closed.
    /// </summary>
    public StepDecision Found(NetworkGraph graph, IncidentId id, SwitchId device, SwitchPosition position, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var state = log.State(id);
        if (state.Status == IncidentStatus.Closed)
        {
            return StepDecision.Refused($"incident {id} is closed");
        }

        if (!graph.Grid.HasSwitch(device))
        {
            return StepDecision.Refused($"{device} is not a switching device of grid '{graph.Grid.Name}'");
        }

        log.Append(id, new SwitchStateChanged(device, position), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>The plan document's action words (camelCase, as in the file formats).</summary>
    public static string ActionName(StepAction action) => action switch
    {
        StepAction.ProveDead => "proveDead",
        StepAction.RemoveEarth => "removeEarth",
        _ => action.ToString().ToLowerInvariant(),
    };

    private static bool IsDone(IncidentState state, SwitchingStep step) =>
        state.CompletedSteps.Any(d => d.Step.Order == step.Order && d.Step.Action == ActionName(step.Action));

    private static string Describe(SwitchingStep step) =>
        $"{ActionName(step.Action)} {step.Device?.Value ?? string.Join(" ", step.Segments)}".TrimEnd();
}
