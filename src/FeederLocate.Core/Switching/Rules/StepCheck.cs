using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The device rules for one switching operation from the switch positions of the moment: the same check the
/// planner's replay makes on every step it proposes. An operation is refused when it opens a disconnector or
/// fuse live, breaks fault current with a device that cannot, closes onto the suspect (isolated) section, or
/// closes a loop or parallels two substations.
/// </summary>
public static class StepCheck
{
    /// <summary>
    /// Null when putting <paramref name="device"/> into <paramref name="position"/> is allowed from
    /// <paramref name="now"/> with the fault assumed in <paramref name="suspect"/>; else the reason in words.
    /// </summary>
    public static string? Check(NetworkGraph graph, Incident incident, SectionId suspect, SwitchStates now, SwitchId device, SwitchPosition position)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(now);
        if (!graph.Grid.HasSwitch(device))
        {
            return $"{device} is not a switching device of grid '{graph.Grid.Name}'";
        }

        PlanningContext ctx;
        try
        {
            ctx = new PlanningContext(graph, incident, suspect, null, SwitchingOptions.Default);
        }
        catch (PlanningException e)
        {
            return e.Message;
        }

        if (ctx.TryEnergise(now) is not { } network)
        {
            return "the present switch positions give no radial network: record the positions found on site first";
        }

        return Problem(ctx, now, network, graph.Grid.SwitchIndex(device), position == SwitchPosition.Open, out _, out _);
    }

    /// <summary>
    /// The device rules for an operation of the return to normal, after the repair: no section is suspect any more,
    /// so only load current flows; refused when it opens a disconnector or fuse live, closes one onto a live node,
    /// or closes a loop or parallels two substations. Null when allowed; else the reason in words.
    /// </summary>
    public static string? CheckAfterRepair(NetworkGraph graph, SwitchStates now, SwitchId device, SwitchPosition position)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(now);
        if (!graph.Grid.HasSwitch(device))
        {
            return $"{device} is not a switching device of grid '{graph.Grid.Name}'";
        }

        if (!graph.TryEnergise(now, out var network, out _) || network is null)
        {
            return "the present switch positions give no radial network: record the positions found on site first";
        }

        var d = graph.Grid.Switch(device);
        var closed = now.IsClosed(device);
        var open = position == SwitchPosition.Open;
        var fromLive = network.IsEnergised(d.From);
        var toLive = network.IsEnergised(d.To);
        if (!open && !graph.TryEnergise(now.With(device, SwitchPosition.Closed), out _, out _))
        {
            return $"closing {device} would close a loop or parallel two substations";
        }

        return open
            ? DeviceRules.Open(d, closed, fromLive, toLive, ThroughCurrent.Load)
            : DeviceRules.Close(d, closed, fromLive, toLive, energisesSuspect: false);
    }

    /// <summary>
    /// The rule an open or close of switch <paramref name="index"/> breaks from <paramref name="states"/>
    /// (null when none), with the positions and the energised network after it (null when not radial).
    /// </summary>
    internal static string? Problem(
        PlanningContext ctx, SwitchStates states, EnergisedNetwork network, int index, bool open,
        out SwitchStates next, out EnergisedNetwork? nextNetwork)
    {
        var device = ctx.Grid.Switches[index];
        var fromLive = network.IsEnergised(device.From);
        var toLive = network.IsEnergised(device.To);
        next = states.With(device.Id, open ? SwitchPosition.Open : SwitchPosition.Closed);
        var after = ctx.TryEnergise(next);
        nextNetwork = after;
        return open
            ? DeviceRules.Open(device, states.IsClosed(index), fromLive, toLive, ctx.CurrentThrough(network, index))
            : after is null
                ? $"closing {device.Id} would close a loop or parallel two substations"
                : DeviceRules.Close(device, states.IsClosed(index), fromLive, toLive, ctx.ZoneLive(after, ctx.SuspectZone) || ctx.AlsoIsolated.Any(z => ctx.ZoneLive(after, z)));
    }
}
