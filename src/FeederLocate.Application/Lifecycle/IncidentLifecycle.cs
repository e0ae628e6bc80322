using FeederLocate.Application.Analysis;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Lifecycle;

/// <summary>
/// An incident from the first report to its closing: it moves on through located, isolated, restored and
/// repaired (never back); the outcome leads to the return to normal, the incident's own switching order
/// (<see cref="ReturnSwitching"/>); it closes once its outcome is logged and the return is carried out; a closed incident changes no more unless an engineer reopens it with a
/// reason. Every move is logged with who and when; a refusal says why and logs nothing.
/// </summary>
public sealed class IncidentLifecycle(IncidentLog log, IncidentAnalysis analysis)
{
    /// <summary>Moves the incident on to <paramref name="stage"/> (located, isolated, restored or repaired).</summary>
    public StepDecision MoveTo(IncidentId id, IncidentStage stage, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        var refusal = stage switch
        {
            _ when state.Status == IncidentStatus.Closed => $"incident {id} is closed: an engineer reopens it with a reason",
            IncidentStage.Open or IncidentStage.Closed => $"an incident moves on to located, isolated, restored or repaired; closing has its own step",
            _ when stage <= state.Stage => $"incident {id} is already {IncidentStages.Name(state.Stage)}: stages only move on",
            _ => null,
        };
        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(id, new IncidentStageChanged(stage), actor);
        return StepDecision.Logged;
    }

    /// <summary>The switches not in their normal position now: what the return to normal puts back, device by device.</summary>
    public static IReadOnlyList<(SwitchId Device, SwitchPosition Now, SwitchPosition Normal)> OffNormal(Grid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        var now = IncidentSwitching.Current(grid, state);
        var normal = SwitchStates.Normal(grid);
        return [.. now.Deviations().OrderBy(d => d.Key.Value, StringComparer.Ordinal).Select(d => (d.Key, d.Value, normal.PositionOf(d.Key)))];
    }

    /// <summary>
    /// Closes the incident: its outcome logged (a confirmed segment or no fault found), every step of the return
    /// order ticked and every switch back in its normal position.
    /// </summary>
    public async Task<StepDecision> CloseAsync(NetworkGraph graph, IncidentId id, string? note, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        if (state.Status == IncidentStatus.Closed)
        {
            return StepDecision.Refused($"incident {id} is already closed");
        }

        if (!state.HasOutcome)
        {
            return StepDecision.Refused($"log the outcome of incident {id} before closing it");
        }

        if ((await analysis.ReturnAsync(graph, state).ConfigureAwait(false)).Plan is { } back
            && ReturnSwitching.Remaining(state, back) is { Count: > 0 } left)
        {
            return StepDecision.Refused("carry out the return to normal first: step " + string.Join(", ", left.Select(s => s.Order)) + " not ticked");
        }

        var off = OffNormal(graph.Grid, state);
        if (off.Count > 0)
        {
            return StepDecision.Refused("return to normal first: " + string.Join("; ", off.Select(d => $"{d.Device} is {Word(d.Now)}, normally {Word(d.Normal)}")));
        }

        log.Append(id, new IncidentClosed(string.IsNullOrWhiteSpace(note) ? null : note.Trim()), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>Opens a closed incident again: engineers only, with the reason.</summary>
    public StepDecision Reopen(IncidentId id, string reason, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        var refusal = actor.Role != "engineer" ? "only an engineer reopens an incident"
            : string.IsNullOrWhiteSpace(reason) ? "give the reason for reopening"
            : state.Status != IncidentStatus.Closed ? $"incident {id} is open"
            : null;
        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(id, new IncidentReopened(reason.Trim()), actor);
        return StepDecision.Logged;
    }

    private static string Word(SwitchPosition position) => position == SwitchPosition.Open ? "open" : "closed";
}
