using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Enumerates, per restoring switch (an open switch between a live node and a dead island), the connected
/// groups of the island's zones it could pick up — rooted at the zone it touches, cut from the rest of the
/// island by opening switches — and keeps those the load flow finds within every limit.
/// </summary>
internal static class CandidateSearch
{
    public static ImmutableArray<Candidate> Find(
        PlanningContext ctx, IsolationResult isolation, DeadArea dead, SupplyLimits limits, IReadOnlySet<int> avoidZones, ICollection<string> notes,
        IReadOnlySet<int> enumerateEvery, ISet<int> wholeOnly)
    {
        var grid = ctx.Grid;
        var zones = ctx.Zones;
        var found = ImmutableArray.CreateBuilder<Candidate>();
        var flow = new RestorationFlow(ctx, dead.Network, limits);
        for (var source = 0; source < grid.Switches.Length; source++)
        {
            if (dead.States.IsClosed(source))
            {
                continue;
            }

            var device = grid.Switches[source];
            int a = zones.ZoneOfNode(grid.NodeIndex(device.From)), b = zones.ZoneOfNode(grid.NodeIndex(device.To));
            if (ctx.IsIsolated(a) || ctx.IsIsolated(b))
            {
                continue;
            }

            var (root, liveNode) = dead.Lost[a] && ctx.ZoneLive(dead.Network, b) ? (a, zones.NodeIn(source, b))
                : dead.Lost[b] && ctx.ZoneLive(dead.Network, a) ? (b, zones.NodeIn(source, a))
                : (-1, -1);
            if (root < 0)
            {
                continue;
            }

            var procedure = Procedure(ctx, dead, source, liveNode);
            if (procedure is null)
            {
                notes.Add($"{device.Id} is not used to restore: a {Words.Kind(device.Kind)} closes only dead and no device upstream of it may break load");
                continue;
            }

            var donor = dead.Network.SubstationIndexOf(liveNode);
            var head = SupplyLimits.FeederHeadOf(dead.Network, liveNode);
            var deadNode = zones.NodeIn(source, root);
            var normal = ctx.FaultTimeNetwork.FeedingEdgeOf(deadNode) == new EdgeRef(EdgeKind.Switch, source);
            var makesOntoFault = DeviceRules.CanMakeOntoFault(grid.Switches[procedure[^1].Device].Kind);
            var tree = new ZoneTree(ctx, dead.States, root, z => dead.Lost[z]);
            var enumeration = new GroupEnumeration(tree, z => makesOntoFault || !avoidZones.Contains(z), ctx.Options.MaxCandidatesPerSource, enumerateEvery.Contains(source), group =>
            {
                var cuts = tree.CutsOf(group);
                var verdict = flow.Check(head, source, liveNode, deadNode, group);
                if (!verdict.Holds)
                {
                    return null;
                }

                var operations = cuts.Select(c => new PlannedOperation(StepAction.Open, c,
                        $"open {grid.Switches[c].Id} (dead): {device.Id} picks up only the part on its side"))
                    .Concat(procedure)
                    .ToImmutableArray();
                return new Candidate(source, donor, head, dead.IslandOf[root], [.. group.Order()], [.. cuts],
                    group.Sum(z => zones.All[z].Customers), group.Sum(z => zones.All[z].Nodes.Length), normal, operations, verdict);
            });
            found.AddRange(enumeration.Run());
            if (enumeration.WholeOnly)
            {
                wholeOnly.Add(source);
            }

            if (enumeration.Capped)
            {
                notes.Add($"{device.Id}: more than {ctx.Options.MaxCandidatesPerSource} groups of zones could be picked up; the largest ones found first were checked, not every group");
            }
        }

        return found.ToImmutable();
    }

    /// <summary>
    /// How the source closes: directly where it may close onto a dead part with one node live; a
    /// disconnector or fuse closes only dead, so the nearest device upstream that breaks load opens briefly.
    /// </summary>
    private static List<PlannedOperation>? Procedure(PlanningContext ctx, DeadArea dead, int source, int liveNode)
    {
        var grid = ctx.Grid;
        var device = grid.Switches[source];
        if (DeviceRules.CanCloseLive(device.Kind))
        {
            return [new PlannedOperation(StepAction.Close, source, string.Empty)];
        }

        var path = dead.Network.PathFromSource(grid.Nodes[liveNode].Id);
        for (var k = path.Count - 1; k >= 0; k--)
        {
            if (path[k].Kind == EdgeKind.Switch && DeviceRules.CanOpenLive(grid.Switches[path[k].Index].Kind, ThroughCurrent.Load))
            {
                var upstream = path[k].Index;
                var steps = new List<PlannedOperation>
                {
                    new(StepAction.Open, upstream, $"open briefly so that {Words.Kind(device.Kind)} {device.Id} can be closed with both nodes dead"),
                };
                if (device.Kind == SwitchKind.Fuse)
                {
                    steps.Add(new PlannedOperation(StepAction.Replace, source, $"replace the fuse link of {device.Id} (both nodes dead)"));
                }

                steps.Add(new PlannedOperation(StepAction.Close, source, $"close {device.Id} with both nodes dead"));
                steps.Add(new PlannedOperation(StepAction.Close, upstream, string.Empty));
                return steps;
            }
        }

        return null;
    }
}
