using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Switching;

/// <summary>The one place an incident's switch positions of the moment are worked out.</summary>
public static class IncidentSwitching
{
    /// <summary>
    /// Every device's position now: normal positions, then the positions recorded for the incident, then its
    /// tripped device open, then the positions switched before the present plan (ticks and deviations up to the
    /// latest deviation), then the open and close steps of the present switching order ticked as done, in the
    /// order they were ticked, then those of the return to normal. A step naming a device not in <paramref name="grid"/> is passed over.
    /// </summary>
    public static SwitchStates Current(Grid grid, IncidentState state)
    {
        var states = BeforeReturn(grid, state);
        foreach (var done in state.ReturnSteps)
        {
            if (done.Step is { Device: { } device, Action: "open" or "close" } && grid.HasSwitch(new SwitchId(device)))
            {
                states = states.With(new SwitchId(device), done.Step.Action == "close" ? SwitchPosition.Closed : SwitchPosition.Open);
            }
        }

        return states;
    }

    /// <summary>
    /// The positions the return to normal starts from: <see cref="Current"/> without the return order's own ticks
    /// (the fault's switching as carried out). It stays the same while the return is ticked through.
    /// </summary>
    public static SwitchStates BeforeReturn(Grid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(state);
        var states = SwitchStates.AfterTrip(grid, state.Incident);
        foreach (var (device, position) in state.SwitchedBeforePlan)
        {
            if (grid.HasSwitch(device))
            {
                states = states.With(device, position);
            }
        }

        foreach (var done in state.CompletedSteps)
        {
            if (done.Step is { Device: { } device, Action: "open" or "close" } && grid.HasSwitch(new SwitchId(device)))
            {
                states = states.With(new SwitchId(device), done.Step.Action == "close" ? SwitchPosition.Closed : SwitchPosition.Open);
            }
        }

        return states;
    }
}
