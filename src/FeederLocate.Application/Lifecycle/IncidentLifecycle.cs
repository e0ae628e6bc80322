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
/// repaired (never back); it closes once its outcome is logged and every switch is back in its normal
/// position (the return to normal); a closed incident changes no more unless an engineer reopens it with a
/// reason. Every move is logged with who and when; a refusal says why and logs nothing.
/// </summary>
public sealed class IncidentLifecycle(IncidentLog log)
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

    /// <summary>The reason logged with each operation of the return to normal.</summary>
    public const string ReturnToNormalReason = "return to normal";

    /// <summary>
    /// Puts <paramref name="device"/> back in its normal position, once the incident is repaired; refused when
    /// that would close a loop or parallel two substations (open the other device first). Logged as switching
    /// outside the fault's order, with the reason <see cref="ReturnToNormalReason"/>.
    /// </summary>
    public StepDecision ReturnToNormal(NetworkGraph graph, IncidentId id, SwitchId device, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        var off = OffNormal(graph.Grid, state).Where(d => d.Device == device).ToList();
        var refusal = state.Status == IncidentStatus.Closed ? $"incident {id} is closed"
            : state.Stage < IncidentStage.Repaired ? "the return to normal follows the repair: move the incident to repaired first"
            : off.Count == 0 ? $"{device} is in its normal position"
            : null;
        if (refusal is null && !RadialCheck.Of(graph, IncidentSwitching.Current(graph.Grid, state).With(device, off[0].Normal)).IsRadial)
        {
            refusal = $"putting {device} back {Word(off[0].Normal)} would close a loop or parallel two substations: open the other device first";
        }

        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(id, new SwitchingDeviationRecorded(device, off[0].Normal, ReturnToNormalReason), actor, graph.Grid);
        return StepDecision.Logged;
    }

    /// <summary>Closes the incident: its outcome logged and every switch back in its normal position.</summary>
    public StepDecision Close(Grid grid, IncidentId id, string? note, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        if (state.Status == IncidentStatus.Closed)
        {
            return StepDecision.Refused($"incident {id} is already closed");
        }

        if (state.Outcome is null)
        {
            return StepDecision.Refused($"log the outcome of incident {id} before closing it");
        }

        var off = OffNormal(grid, state);
        if (off.Count > 0)
        {
            return StepDecision.Refused("return to normal first: " + string.Join("; ", off.Select(d => $"{d.Device} is {Word(d.Now)}, normally {Word(d.Normal)}")));
        }

        log.Append(id, new IncidentClosed(string.IsNullOrWhiteSpace(note) ? null : note.Trim()), actor, grid);
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
