using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Trial closures for a split ranking of a tripping fault, the alternative to the plan's steps when the
/// operator tests before isolating, carried out from the start state: the entrance switch of every
/// suspect opens (dead), the tripped breaker or recloser closes onto the rest, then the suspects are
/// added one at a time — the least likely first where the network allows (a suspect beyond another is
/// reached only through it), each by opening the breaker, closing the suspect's entrance dead, and
/// closing the breaker again. The most likely suspect is left for last and inferred, never
/// re-energised, when every other one holds; suspects reached only through it are not tested but
/// isolated with it. The search stops at the first trip, so
/// the expected number of re-energisations onto the fault is the sum of the entries' own probabilities.
/// Only breakers and reclosers make onto a fault.
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

        // Left for last and inferred, never re-energised: the most likely suspect (those beyond it are reached only through it).
        var last = inTree.OrderByDescending(s => s.Probability).ThenBy(s => s.Section.Value, StringComparer.Ordinal).First();
        var remaining = inTree.ToList();
        var live = Reach(tree, root, entrance.Values.ToHashSet());
        var entries = new List<TestEntry>();
        var steps = new EntrySteps(ctx, null);
        // A suspect beyond another one stays dead behind that one's entrance; its own entrance opens only when that one is added.
        Suspect? Above(Suspect s)
        {
            for (var z = zones.Across(entrance[s.Zone], s.Zone); tree.ParentSwitch(z) >= 0; z = zones.Across(tree.ParentSwitch(z), z))
            {
                if (inTree.FirstOrDefault(o => o.Zone == z) is { } outer)
                {
                    return outer;
                }
            }

            return null;
        }

        foreach (var s in inTree.Where(s => Above(s) is null))
        {
            steps.Add(StepAction.Open, entrance[s.Zone], $"open {grid.Switches[entrance[s.Zone]].Id} (dead): the entrance of suspect {s.Section} stays open");
        }

        steps.Add(StepAction.Close, trip, $"close {trippedId} onto the part with no suspect beyond an open entrance");
        var energised = live;
        var reason = $"the ranking is split (top section {ctx.Ranking!.Sections[0].Id} {Words.Probability(ctx.Ranking.Sections[0].Probability)}): trial closures by {trippedId}, "
            + $"the suspects in turn, least likely first where the network allows; {last.Section} ({Words.Probability(last.Probability)}) is left for last and inferred, never re-energised";
        expected = 0;
        while (true)
        {
            var p = energised.Sum(z => ctx.ProbabilityOfZone[z]);
            var sections = Sections(ctx, energised);
            var suspectsHere = Likeliest(ctx, energised);
            Suspect? next = null;
            if (remaining.Count > 1)
            {
                var testable = remaining.Where(s => live.Contains(zones.Across(entrance[s.Zone], s.Zone))).ToList();
                next = testable.Where(s => s != last).OrderBy(s => s.Probability).ThenByDescending(s => zones.All[s.Zone].Customers).FirstOrDefault();
            }

            var order = entries.Count + 1;
            expected += p;
            var untested = remaining.Where(s => s != next).OrderByDescending(s => s.Probability).Select(s => s.Section).ToImmutableArray();
            var holds = next is not null
                ? new TestBranch(TestResult.Holds, [.. remaining.OrderByDescending(s => s.Probability).Select(s => s.Section)], order + 1,
                    $"no fault in {Words.List(sections)}; they stay supplied; go on with entry {order + 1}")
                : remaining.Count == 1
                    ? new TestBranch(TestResult.Holds, [remaining[0].Section], null,
                        $"no fault in {Words.List(sections)}; the fault lies in {remaining[0].Section} (or beyond it), inferred without re-energising it; follow the plan for {remaining[0].Section}")
                    : new TestBranch(TestResult.Holds, untested, null, remaining.Contains(last)
                        ? $"no fault in {Words.List(sections)}; the fault lies in {Words.List(untested)}: the others are reached only through the most likely one, {last.Section}, which is never re-energised; isolate them together and patrol them, most likely first"
                        : $"no fault in {Words.List(sections)}; the suspects {Words.List(untested)} cannot be reached by a trial closure of {trippedId}: patrol them");
            var trips = new TestBranch(TestResult.Trips, suspectsHere.Length > 0 ? suspectsHere : sections, null,
                $"the fault lies in {Words.List(sections)}: leave {trippedId} open, open the entrance of the faulted part dead, reclose {trippedId} for the rest, and follow the plan for it");
            entries.Add(new TestEntry(order, steps.ToImmutable(), TestObservation.Trip, sections, [], p, [holds, trips],
                $"{reason}; probability {Words.Probability(p)} of re-energising onto the fault"));
            if (next is null)
            {
                break;
            }

            remaining.Remove(next);
            var gate = entrance[next.Zone];
            var blocked = remaining.Select(s => entrance[s.Zone]).ToHashSet();
            energised = Reach(tree, next.Zone, blocked);
            live.UnionWith(energised);
            steps = new EntrySteps(ctx, steps.End)
                .Add(StepAction.Open, trip, $"open {trippedId}: it held, so it breaks load current only (briefly interrupts the sections it supplies)");
            foreach (var inner in remaining.Where(s => Above(s) == next))
            {
                steps.Add(StepAction.Open, entrance[inner.Zone], $"open {grid.Switches[entrance[inner.Zone]].Id} (dead): the entrance of suspect {inner.Section}, beyond {next.Section}, stays open");
            }

            steps.Add(StepAction.Close, gate, $"close {grid.Switches[gate].Id} (dead): adds suspect {next.Section}")
                .Add(StepAction.Close, trip, $"reclose {trippedId} onto suspect {next.Section}");
            reason = $"adds suspect {next.Section} ({Words.Probability(next.Probability)})";
        }

        return [.. entries];
    }

    /// <summary>The sections of the zones that the ranking gives any probability, most likely first.</summary>
    private static ImmutableArray<SectionId> Likeliest(PlanningContext ctx, IEnumerable<int> zones) =>
        [.. zones.Where(z => ctx.ProbabilityOfZone[z] > 0 && ctx.Zones.All[z].Section is not null)
            .OrderByDescending(z => ctx.ProbabilityOfZone[z]).ThenBy(z => z).Select(z => ctx.Zones.All[z].Section!.Value)];

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
