using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Remote devices first: where a restoration must wait for a crew at a manual device, the part of its
/// group that remote devices can separate from the zones that crew work touches is restored first (the
/// remote switches between open dead), and the rest follows by closing those switches once the crew is
/// done. The first stage supplies a subset of the final load, so it keeps every limit the whole does.
/// </summary>
internal static class Staging
{
    public static IEnumerable<Job> Split(PlanningContext ctx, DeadArea dead, Job job)
    {
        var grid = ctx.Grid;
        var c = job.Candidate;
        var source = grid.Switches[c.Source];
        var manual = job.Operations.Where(o => !grid.Switches[o.Device].Remote).ToList();
        if (!source.Remote || !DeviceRules.CanCloseLive(source.Kind) || c.Operations.Length == 0 || c.Operations[^1].Device != c.Source || manual.Count == 0)
        {
            return [job];
        }

        var group = c.Zones.ToHashSet();
        var root = group.First(z => ctx.Zones.All[z].Switches.Contains(c.Source));
        var tree = new ZoneTree(ctx, dead.States, root, group.Contains);
        var hot = manual.SelectMany(o => Touching(ctx, o.Device)).ToHashSet();
        var good = new Dictionary<int, bool>();
        bool Good(int z)
        {
            if (good.TryGetValue(z, out var known))
            {
                return known;
            }

            var ok = !hot.Contains(z) && tree.Children(z).All(ch => Good(ch.Zone) || Separable(ctx, ch.Switch));
            good[z] = ok;
            return ok;
        }

        if (!Good(root))
        {
            return [job];
        }

        var first = new HashSet<int>();
        var gates = new List<int>();
        var stack = new Stack<int>([root]);
        while (stack.TryPop(out var z))
        {
            first.Add(z);
            foreach (var (child, device) in tree.Children(z))
            {
                if (Good(child))
                {
                    stack.Push(child);
                }
                else
                {
                    gates.Add(device);
                }
            }
        }

        if (gates.Count == 0)
        {
            return [job];
        }

        var sourceClose = job.Operations[^1] with { Reason = RestorationWords.Close(ctx, c, first) + "; the rest follows once the crew is done" };
        var earlier = job.Operations.Take(job.Operations.Length - 1).Where(o => grid.Switches[o.Device].Remote && Touching(ctx, o.Device).Any(first.Contains)).ToList();
        var later = job.Operations.Take(job.Operations.Length - 1).Where(o => !earlier.Contains(o)).ToList();
        var firstCustomers = first.Sum(z => ctx.Zones.All[z].Customers);
        var crews = Words.List(manual.Select(o => grid.Switches[o.Device].Id).Distinct());
        var stage1 = new Job(c,
            [.. earlier, .. gates.Select(g => new PlannedOperation(StepAction.Open, g,
                $"open {grid.Switches[g].Id} (dead, remote) so that {source.Id} restores the part before it without waiting for the crew at {crews}")), sourceClose],
            firstCustomers);
        var stage2 = new Job(c,
            [.. later, .. gates.Select(g => new PlannedOperation(StepAction.Close, g,
                $"close {grid.Switches[g].Id} now that {crews} is done: restores {RestorationWords.What(ctx, tree.Subtree(ctx.Zones.Across(g, Parent(tree, first, g))))} through {source.Id}"))],
            job.Customers - firstCustomers,
            stage1);
        return [stage1, stage2];
    }

    /// <summary>The zone of the first stage that gate <paramref name="g"/> hangs below.</summary>
    private static int Parent(ZoneTree tree, HashSet<int> first, int g) => first.First(z => tree.Children(z).Any(ch => ch.Switch == g));

    /// <summary>A gate between stages: remote, and may later close from the live side onto the healthy rest.</summary>
    private static bool Separable(PlanningContext ctx, int device) =>
        ctx.Grid.Switches[device].Remote && DeviceRules.CanCloseLive(ctx.Grid.Switches[device].Kind);

    private static IEnumerable<int> Touching(PlanningContext ctx, int device)
    {
        var s = ctx.Grid.Switches[device];
        yield return ctx.Zones.ZoneOfNode(ctx.Grid.NodeIndex(s.From));
        yield return ctx.Zones.ZoneOfNode(ctx.Grid.NodeIndex(s.To));
    }
}
