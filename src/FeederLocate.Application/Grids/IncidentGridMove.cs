using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Grids;

/// <summary>
/// Moves an open incident onto another stored version of its grid: engineers only, with a reason, logged as an
/// incident event. Refused when the incident is closed, the version is the one it is on or is not stored, or its
/// evidence names an element the version lacks or its switch states give no radial network there.
/// </summary>
public sealed class IncidentGridMove(IncidentLog log, GridVersions grids)
{
    public StepDecision Move(IncidentId id, int toVersion, string? reason, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(actor);
        var state = log.State(id);
        var target = toVersion >= 1 ? grids.Find(state.GridName, toVersion) : null;
        var refusal = actor.Role != "engineer" ? "only an engineer moves an incident to another grid version"
            : string.IsNullOrWhiteSpace(reason) ? "give the reason for moving the incident to another grid version"
            : state.Status == IncidentStatus.Closed ? $"incident {id} is closed"
            : toVersion == state.GridVersion ? $"incident {id} is already on version {toVersion} of grid \"{state.GridName}\""
            : target is null ? $"grid \"{state.GridName}\" has no version {toVersion}"
            : Unfit(target.Grid, state) is { } unfit ? $"incident {id} cannot move to version {toVersion}: {unfit}"
            : null;
        if (refusal is not null)
        {
            return StepDecision.Refused(refusal);
        }

        log.Append(id, new IncidentGridMoved(state.GridVersion, toVersion, reason!.Trim()), actor);
        return StepDecision.Logged;
    }

    /// <summary>Why the incident's evidence does not fit <paramref name="grid"/>, or null when it does.</summary>
    public static string? Unfit(Grid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(state);
        var incident = state.Incident;
        var missing = incident.Indications.Select(i => i.Indicator).Where(i => !grid.HasIndicator(i)).Select(i => $"indicator {i}")
            .Concat(incident.SwitchStates.Keys.Concat(incident.Measurements.Select(m => m.Device))
                .Concat(incident.TrippedDevice is { } tripped ? [tripped] : [])
                .Concat(state.SwitchedBeforePlan.Keys)
                .Where(s => !grid.HasSwitch(s)).Select(s => $"switch {s}"))
            .Concat(state.Outcome is { } outcome && !grid.HasSegment(outcome.Outcome.ConfirmedSegment) ? [$"segment {outcome.Outcome.ConfirmedSegment}"] : [])
            .Distinct()
            .ToList();
        if (missing.Count > 0)
        {
            return "the version has no " + string.Join(", ", missing);
        }

        var graph = new NetworkGraph(grid);
        return RadialCheck.Of(graph, IncidentSwitching.Current(grid, state)).IsRadial
            ? null
            : "its switch states close a loop or parallel two substations on that version";
    }
}
