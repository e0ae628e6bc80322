using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Isolation of the suspect section with the nearest suitable devices: when it is live, the nearest device
/// upstream that may break its fault current opens first; then every closed switch on its boundary opens
/// (dead by then, so any kind may), and open ones on it are verified.
/// </summary>
internal static class Isolation
{
    public static IsolationResult Plan(PlanningContext ctx) => Plan(ctx, ctx.SuspectZone, ctx.Suspect, ctx.StartStates, ctx.StartNetwork, ctx.FaultCurrent);

    /// <summary>Isolation of zone <paramref name="zoneIndex"/> (section <paramref name="section"/>) from <paramref name="states"/>.</summary>
    public static IsolationResult Plan(PlanningContext ctx, int zoneIndex, Model.SectionId section, SwitchStates states, EnergisedNetwork network, ThroughCurrent current)
    {
        var grid = ctx.Grid;
        var zone = ctx.Zones.All[zoneIndex];
        PlannedOperation? deEnergise = null;
        var live = zone.Nodes.FirstOrDefault(network.IsEnergised, -1);
        if (live >= 0)
        {
            var device = NearestBreaking(ctx, network, EntryOf(ctx, network, zone), current, section);
            var kind = current == ThroughCurrent.StandingEarthFault ? "the standing earth-fault current" : "the fault current";
            deEnergise = new PlannedOperation(StepAction.Open, device,
                $"de-energise the suspect section {section}: the nearest device upstream that may break {kind}");
            states = states.With(grid.Switches[device].Id, SwitchPosition.Open);
            network = ctx.TryEnergise(states) ?? throw new InvalidOperationException("opening a switch cannot make a radial network loop");
        }

        var upstream = UpstreamOf(ctx, zone);
        var opens = ImmutableDictionary.CreateBuilder<int, PlannedOperation>();
        var verifies = ImmutableArray.CreateBuilder<PlannedOperation>();
        var points = ImmutableArray.CreateBuilder<(int, int)>();
        foreach (var device in zone.Switches)
        {
            if (ctx.Zones.Across(device, zone.Index) == zone.Index)
            {
                continue;
            }

            points.Add((device, ctx.Zones.NodeIn(device, zone.Index)));
            var side = device == upstream ? "upstream" : "downstream";
            if (deEnergise?.Device == device)
            {
                continue;
            }

            if (states.IsClosed(device))
            {
                opens[device] = new PlannedOperation(StepAction.Open, device, $"isolate the suspect section {section}: its {side} boundary");
                states = states.With(grid.Switches[device].Id, SwitchPosition.Open);
            }
            else
            {
                verifies.Add(new PlannedOperation(StepAction.Verify, device, $"verify open and tag: {side} boundary of the isolated section {section}"));
            }
        }

        var after = ctx.TryEnergise(states) ?? throw new InvalidOperationException("opening switches cannot make a radial network loop");
        return new IsolationResult(deEnergise, opens.ToImmutable(), verifies.ToImmutable(), points.ToImmutable(), upstream, states, after);
    }

    /// <summary>The suspect's node fed from outside it in <paramref name="network"/>.</summary>
    private static int EntryOf(PlanningContext ctx, EnergisedNetwork network, Zone zone) =>
        zone.Nodes.Where(network.IsEnergised).First(v => network.ParentOf(v) < 0 || ctx.Zones.ZoneOfNode(network.ParentOf(v)) != zone.Index);

    /// <summary>Nearest switch on the path from the bus to <paramref name="entry"/> that may open while carrying the fault current.</summary>
    private static int NearestBreaking(PlanningContext ctx, EnergisedNetwork network, int entry, ThroughCurrent current, Model.SectionId section)
    {
        var path = network.PathFromSource(ctx.Grid.Nodes[entry].Id);
        for (var k = path.Count - 1; k >= 0; k--)
        {
            if (path[k].Kind == EdgeKind.Switch && DeviceRules.CanOpenLive(ctx.Grid.Switches[path[k].Index].Kind, current))
            {
                return path[k].Index;
            }
        }

        throw new PlanningException($"no device upstream of section {section} may break its fault current; it cannot be isolated by switching");
    }

    /// <summary>The boundary switch the suspect was fed through at fault time, or -1.</summary>
    private static int UpstreamOf(PlanningContext ctx, Zone zone)
    {
        var network = ctx.FaultTimeNetwork;
        foreach (var v in zone.Nodes)
        {
            var edge = network.FeedingEdgeOf(v);
            if (network.IsEnergised(v) && !edge.IsNone && edge.Kind == EdgeKind.Switch && ctx.Zones.Across(edge.Index, zone.Index) != zone.Index)
            {
                return edge.Index;
            }
        }

        return -1;
    }
}
