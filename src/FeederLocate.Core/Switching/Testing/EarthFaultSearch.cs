using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The sectioning search for a standing earth fault on an isolated or resonant network, watching the
/// neutral voltage U0. Each entry opens the device that cuts off the most probability per customer it
/// interrupts (the order of least expected customer interruptions for a sequence of tests each ending
/// the search with its probability: the ratio rule of sequential search), or with
/// <see cref="EarthFaultSearchOrder.Bisection"/> the one that cuts off about half of it (breakers, reclosers and load-break switches may
/// break the earth-fault current, IEC 62271-103); U0 staying means the fault is not beyond it, so it closes
/// again onto a healthy part; U0 collapsing means it is. A load-break switch never closes onto the faulted
/// part, so there the search ends; a breaker or recloser may reclose onto it after a dead split, and the
/// search goes on watching whether U0 returns.
/// </summary>
internal static class EarthFaultSearch
{
    public static ImmutableArray<TestEntry> Build(PlanningContext ctx, ICollection<string> notes) => Build(ctx, notes, out _);

    /// <param name="expectedInterruptions">Σ over entries of the probability of reaching it times the customers it interrupts.</param>
    public static ImmutableArray<TestEntry> Build(PlanningContext ctx, ICollection<string> notes, out double expectedInterruptions)
    {
        expectedInterruptions = 0;
        if (ctx.SuspectSubstation < 0)
        {
            return [];
        }

        var grid = ctx.Grid;
        var start = ctx.StartNetwork;
        var bus = ctx.Zones.ZoneOfNode(grid.NodeIndex(grid.Substations[ctx.SuspectSubstation].BusNode));
        var tree = new ZoneTree(ctx, ctx.StartStates, bus, z => ctx.ZoneLive(start, z) && start.SubstationIndexOf(ctx.Zones.All[z].Nodes[0]) == ctx.SuspectSubstation);
        if (tree.Zones.Sum(z => ctx.ProbabilityOfZone[z]) <= 0)
        {
            notes.Add("the ranking gives no probability to the network of the suspect's substation: no earth-fault search");
            return [];
        }

        var search = new Search(ctx, tree);
        search.Live([.. tree.Zones], depth: 0, [], null);
        expectedInterruptions = search.ExpectedInterruptions / Math.Max(1e-300, tree.Zones.Sum(z => ctx.ProbabilityOfZone[z]));
        return [.. search.Entries.OrderBy(e => e.Entry)];
    }

    private sealed class Search(PlanningContext ctx, ZoneTree tree)
    {
        private const int MaxDepth = 12;

        /// <summary>Remote devices first: a manual one is taken only when it splits the probability this much better.</summary>
        private const double ManualPenalty = 0.2;

        private const double NegligibleShare = 1e-3;
        private int _next = 1;

        public List<TestEntry> Entries { get; } = [];

        /// <summary>Σ probability mass of reaching an entry × customers it interrupts (divided by the total mass by the caller).</summary>
        public double ExpectedInterruptions { get; private set; }

        private Grid Grid => ctx.Grid;

        /// <summary>
        /// The search on the live part <paramref name="region"/> (holding the fault), after <paramref name="prefix"/>;
        /// returns its first entry, or null when it ends.
        /// </summary>
        public int? Live(HashSet<int> region, int depth, IReadOnlyList<(StepAction, int, string)> prefix, Timeline? start)
        {
            var cut = Bisect(region, z => DeviceRules.CanOpenLive(Grid.Switches[tree.ParentSwitch(z)].Kind, ThroughCurrent.StandingEarthFault));
            if (cut < 0 || depth >= MaxDepth || Entries.Count >= ctx.Options.MaxSearchEntries)
            {
                return null;
            }

            var order = _next++;
            var beyond = Beyond(region, cut);
            var rest = region.Except(beyond).ToHashSet();
            ExpectedInterruptions += Mass(region) * Customers(beyond);
            var index = tree.ParentSwitch(cut);
            var device = Grid.Switches[index];
            var steps = new EntrySteps(ctx, start).AddRange(prefix)
                .Add(StepAction.Open, index, $"open {device.Id} ({Words.Kind(device.Kind)}: it may break the standing earth-fault current) and watch U0");
            var staysNext = Live(rest, depth + 1, [(StepAction.Close, index, $"close {device.Id} again: U0 stayed, so the part beyond it is healthy")], steps.End);
            var stays = new TestBranch(TestResult.U0Stays, Suspects(rest), staysNext,
                $"the fault is not beyond {device.Id}: close {device.Id} again (onto a healthy part){(staysNext is { } s ? $"; go on with entry {s}" : $"; patrol {Words.List(Suspects(rest))} and follow the plan for the section found")}");
            int? collapsesNext = DeviceRules.CanMakeOntoFault(device.Kind) ? Dead(beyond, cut, depth + 1, [], steps.End) : null;
            var collapses = new TestBranch(TestResult.U0Collapses, Suspects(beyond), collapsesNext,
                $"the fault is beyond {device.Id}: leave it open{(collapsesNext is { } c ? $"; go on with entry {c}" : $"; patrol {Words.List(Suspects(beyond))} and follow the plan for the section found")}");
            Entries.Add(new TestEntry(order, steps.ToImmutable(), TestObservation.NeutralVoltage, [], Sections(beyond), Mass(beyond), [stays, collapses],
                $"open {device.Id} and watch U0: cuts off {Words.Probability(Share(beyond, region))} of the remaining probability ({Customers(beyond)} customers briefly)"));
            return order;
        }

        /// <summary>
        /// The search on the dead part <paramref name="region"/> below <paramref name="gate"/>'s zone, which a breaker or
        /// recloser recloses, after <paramref name="prefix"/>; returns its first entry, or null when it ends.
        /// </summary>
        private int? Dead(HashSet<int> region, int gate, int depth, IReadOnlyList<(StepAction, int, string)> prefix, Timeline? start)
        {
            var cut = Bisect(region, _ => true);
            if (cut < 0 || depth >= MaxDepth || Entries.Count >= ctx.Options.MaxSearchEntries)
            {
                return null;
            }

            var order = _next++;
            var beyond = Beyond(region, cut);
            var energised = region.Except(beyond).ToHashSet();

            // U0 returning means the closer opens again: what it energised is interrupted a second time.
            ExpectedInterruptions += Mass(energised) * Customers(energised);
            var closerIndex = tree.ParentSwitch(gate);
            var splitIndex = tree.ParentSwitch(cut);
            var closer = Grid.Switches[closerIndex];
            var split = Grid.Switches[splitIndex];
            var steps = new EntrySteps(ctx, start).AddRange(prefix)
                .Add(StepAction.Open, splitIndex, $"open {split.Id} (dead): splits the part beyond {closer.Id}")
                .Add(StepAction.Close, closerIndex, $"reclose {closer.Id} ({Words.Kind(closer.Kind)}: it may close onto the earth fault) and watch U0");
            var returnsNext = Dead(energised, gate, depth + 1, [(StepAction.Open, closerIndex, $"open {closer.Id} again: U0 returned, the fault lies in what it energised")], steps.End);
            var returns = new TestBranch(TestResult.U0Returns, Suspects(energised), returnsNext,
                $"the fault lies in what {closer.Id} energised: open {closer.Id} again{(returnsNext is { } r ? $"; go on with entry {r}" : $"; patrol {Words.List(Suspects(energised))}")}");
            int? absentNext = DeviceRules.CanMakeOntoFault(split.Kind) ? Dead(beyond, cut, depth + 1, [], steps.End) : null;
            var absent = new TestBranch(TestResult.U0StaysAbsent, Suspects(beyond), absentNext,
                $"the fault lies beyond {split.Id}: leave it open; the part {closer.Id} energised stays supplied{(absentNext is { } a ? $"; go on with entry {a}" : $"; patrol {Words.List(Suspects(beyond))}")}");
            Entries.Add(new TestEntry(order, steps.ToImmutable(), TestObservation.NeutralVoltage, Sections(energised), [], Mass(energised), [returns, absent],
                $"reclose {closer.Id} and watch U0: energises {Words.Probability(Share(energised, region))} of the remaining probability"));
            return order;
        }

        /// <summary>The zone whose parent switch best halves the region's probability, among those <paramref name="usable"/>; -1 when none splits it.</summary>
        private int Bisect(HashSet<int> region, Func<int, bool> usable)
        {
            var total = Mass(region);
            var best = -1;
            var bestKey = (double.MaxValue, 1.0, int.MaxValue);
            foreach (var z in region)
            {
                var parent = tree.ParentSwitch(z);
                if (parent < 0 || !region.Contains(ctx.Zones.Across(parent, z)) || !usable(z))
                {
                    continue;
                }

                // A part holding under 0.1 % of the remaining probability is not worth an interruption.
                var m = Mass(Beyond(region, z));
                if (m < NegligibleShare * total || total - m < NegligibleShare * total)
                {
                    continue;
                }

                var manual = Grid.Switches[parent].Remote ? 0 : ManualPenalty;
                var customers = Customers(Beyond(region, z));
                var key = ctx.Options.EarthFaultSearchOrder == EarthFaultSearchOrder.Bisection
                    ? (Math.Abs((m / total) - 0.5) + manual, manual, customers)
                    : ((customers + 1.0) / m * total, manual, customers);
                if (key.CompareTo(bestKey) < 0)
                {
                    bestKey = key;
                    best = z;
                }
            }

            return best;
        }

        private HashSet<int> Beyond(HashSet<int> region, int zone) => [.. tree.Subtree(zone).Where(region.Contains)];

        private double Mass(IEnumerable<int> zones) => zones.Sum(z => ctx.ProbabilityOfZone[z]);

        private double Share(IEnumerable<int> part, HashSet<int> region) => Mass(part) / Math.Max(1e-300, Mass(region));

        private int Customers(IEnumerable<int> zones) => zones.Sum(z => ctx.Zones.All[z].Customers);

        private ImmutableArray<SectionId> Sections(IEnumerable<int> zones) =>
            [.. zones.Select(z => ctx.Zones.All[z].Section).OfType<SectionId>().OrderBy(s => s.Value, StringComparer.Ordinal)];

        /// <summary>The sections of the part that the ranking gives any probability, most likely first.</summary>
        private ImmutableArray<SectionId> Suspects(IEnumerable<int> zones) =>
            [.. zones.Where(z => ctx.ProbabilityOfZone[z] > 0 && ctx.Zones.All[z].Section is not null)
                .OrderByDescending(z => ctx.ProbabilityOfZone[z]).Select(z => ctx.Zones.All[z].Section!.Value)];
    }
}
