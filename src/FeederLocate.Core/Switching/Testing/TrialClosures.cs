using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Trial closures for a split ranking of a tripping fault, carried out from the start state before the
/// plan's steps: the entrance switch of every suspect opens (dead), the tripped breaker or recloser
/// closes onto the rest, then the suspects are added one at a time — the least likely first, each by
/// opening the breaker, closing the suspect's entrance dead, and closing the breaker again. The search
/// stops at the first trip, so the expected number of re-energisations onto the fault is the probability
/// of the parts energised; the most likely suspect comes last and is inferred, never re-energised, when
/// every other one holds. Only breakers and reclosers make onto a fault.
/// </summary>
internal static class TrialClosures
{
    public static ImmutableArray<TestEntry> Build(PlanningContext ctx, IReadOnlyList<Suspect> suspects, ICollection<string> notes, out double? expected)
    {
        expected = null;
        var grid = ctx.Grid;
        if (ctx.Incident.TrippedDevice is not { } trippedId)
        {
            return [];
        }

        var trip = grid.SwitchIndex(trippedId);
        if (!DeviceRules.CanMakeOntoFault(grid.Switches[trip].Kind))
        {
            notes.Add($"the ranking is split but {trippedId} is a {Words.Kind(grid.Switches[trip].Kind)}, which never closes onto a fault: no trial closures; patrol the suspects");
            return [];
        }

        var zones = ctx.Zones;
        var start = ctx.StartNetwork;
        var device = grid.Switches[trip];
        int a = zones.ZoneOfNode(grid.NodeIndex(device.From)), b = zones.ZoneOfNode(grid.NodeIndex(device.To));
        bool DeadAffected(int z) => !ctx.ZoneLive(start, z) && zones.All[z].Nodes.Any(v => ctx.Affected[v]);
        var root = DeadAffected(a) ? a : DeadAffected(b) ? b : -1;
        if (root < 0)
        {
            return [];
        }

        var tree = new ZoneTree(ctx, ctx.StartStates, root, DeadAffected);
        var inTree = suspects.Where(s => tree.Contains(s.Zone) && s.Zone != root).ToList();
        if (inTree.Count < 2)
        {
            if (suspects.Count >= 2)
            {
                notes.Add($"the ranking is split, but fewer than two suspects lie behind {trippedId} with an entrance switch: no trial closures");
            }

            return [];
        }

        var entrance = inTree.ToDictionary(s => s.Zone, s => tree.ParentSwitch(s.Zone));
        var remaining = inTree.ToList();
        var live = Reach(tree, root, entrance.Values.ToHashSet());
        var entries = new List<TestEntry>();
        var before = new List<string>(inTree.Select(s => $"open {grid.Switches[entrance[s.Zone]].Id} (dead): the entrance of suspect {s.Section}"));
        var energised = live;
        var reason = $"the ranking is split (top section {ctx.Ranking!.Sections[0].Id} {Words.Probability(ctx.Ranking.Sections[0].Probability)}); trial closures by {trippedId}, least likely suspect first, the most likely one last";
        expected = 0;
        while (true)
        {
            var p = energised.Sum(z => ctx.ProbabilityOfZone[z]);
            var sections = Sections(ctx, energised);
            Suspect? next = null;
            if (remaining.Count > 1)
            {
                var testable = remaining.Where(s => live.Contains(zones.Across(entrance[s.Zone], s.Zone))).ToList();
                next = testable.OrderBy(s => s.Probability).ThenByDescending(s => zones.All[s.Zone].Customers).FirstOrDefault();
            }

            var order = entries.Count + 1;
            if (sections.Length > 0 || entries.Count > 0)
            {
                expected += p;
                var holdsThen = next is not null
                    ? $"no fault in {Words.List(sections)}; they stay supplied; go on with entry {order + 1}"
                    : remaining.Count == 1
                        ? $"no fault in {Words.List(sections)}; the fault lies in {remaining[0].Section} (or beyond it), inferred without re-energising it; follow the plan for {remaining[0].Section}"
                        : $"no fault in {Words.List(sections)}; the suspects {Words.List(remaining.Select(s => s.Section))} cannot be reached by a trial closure of {trippedId}: patrol them";
                var untested = tree.Zones.Where(z => !live.Contains(z) && ctx.Zones.All[z].Section is not null)
                    .OrderByDescending(z => ctx.ProbabilityOfZone[z]).Select(z => ctx.Zones.All[z].Section!.Value);
                var holds = new TestBranch("holds", holdsThen, next is not null ? order + 1 : null, next is null ? [.. untested] : []);
                var trips = new TestBranch("trips",
                    $"the fault lies in {Words.List(sections)}: leave {trippedId} open, open the entrance of the faulted part dead, reclose {trippedId} for the rest, and follow the plan for it",
                    null, sections);
                entries.Add(new TestEntry(order, TestAction.TrialClose, trippedId, [.. before], sections, p, holds, trips, reason));
                before.Clear();
                reason = $"probability {Words.Probability(p)} of re-energising onto the fault";
            }

            if (next is null)
            {
                break;
            }

            remaining.Remove(next);
            var gate = entrance[next.Zone];
            var blocked = remaining.Select(s => entrance[s.Zone]).ToHashSet();
            energised = Reach(tree, next.Zone, blocked);
            live.UnionWith(energised);
            before.Add($"open {trippedId} (briefly interrupts the sections it supplies)");
            before.Add($"close {grid.Switches[gate].Id} (dead): adds suspect {next.Section}");
        }

        return [.. entries];
    }

    /// <summary>The zones reached from <paramref name="from"/> down the tree without crossing a switch in <paramref name="blocked"/>.</summary>
    private static HashSet<int> Reach(ZoneTree tree, int from, IReadOnlySet<int> blocked)
    {
        var reached = new HashSet<int> { from };
        var stack = new Stack<int>([from]);
        while (stack.TryPop(out var z))
        {
            foreach (var (child, device) in tree.Children(z))
            {
                if (!blocked.Contains(device) && reached.Add(child))
                {
                    stack.Push(child);
                }
            }
        }

        return reached;
    }

    private static ImmutableArray<SectionId> Sections(PlanningContext ctx, IEnumerable<int> zones) =>
        [.. zones.Select(z => ctx.Zones.All[z].Section).OfType<SectionId>().OrderBy(s => s.Value, StringComparer.Ordinal)];
}
