namespace FeederLocate.Core.Switching;

/// <summary>
/// Zones as a tree rooted at <see cref="Root"/>, joined by the switches closed in a state, over the zones
/// a filter admits: an island seen from where a restoring switch touches it (the groups a source can
/// pick up are its rooted subtrees), or a feeder seen from its bus.
/// </summary>
internal sealed class ZoneTree
{
    private readonly Dictionary<int, List<(int Zone, int Switch)>> _children = [];
    private readonly Dictionary<int, int> _depth = [];
    private readonly Dictionary<int, int> _parentSwitch = [];

    public ZoneTree(PlanningContext ctx, Topology.SwitchStates states, int root, Func<int, bool> admits)
    {
        Root = root;
        _depth[root] = 0;
        var queue = new Queue<int>([root]);
        while (queue.TryDequeue(out var u))
        {
            _children[u] = [];
            foreach (var device in ctx.Zones.All[u].Switches)
            {
                var w = ctx.Zones.Across(device, u);
                if (states.IsClosed(device) && admits(w) && !_depth.ContainsKey(w))
                {
                    _depth[w] = _depth[u] + 1;
                    _parentSwitch[w] = device;
                    _children[u].Add((w, device));
                    queue.Enqueue(w);
                }
            }
        }
    }

    public int Root { get; }

    public IReadOnlyCollection<int> Zones => _depth.Keys;

    /// <summary>The switch a zone hangs from (toward the root), or -1 for the root.</summary>
    public int ParentSwitch(int zone) => _parentSwitch.GetValueOrDefault(zone, -1);

    public bool Contains(int zone) => _depth.ContainsKey(zone);

    /// <summary>The zones hanging from <paramref name="zone"/> and the switches they hang from.</summary>
    public IReadOnlyList<(int Zone, int Switch)> Children(int zone) => _children[zone];

    /// <summary>
    /// The rooted subtrees: all of them when there are at most <paramref name="cap"/>; otherwise a sample
    /// (the whole tree, the tree less each subtree, and each depth limit) and <paramref name="sampled"/> is true.
    /// </summary>
    public List<HashSet<int>> Groups(int cap, out bool sampled)
    {
        sampled = Count(Root, cap) > cap;
        if (!sampled)
        {
            return [.. Enumerate(Root).Select(g => g.ToHashSet())];
        }

        var whole = _depth.Keys.ToHashSet();
        var groups = new List<HashSet<int>> { whole };
        foreach (var z in _depth.Keys.Where(z => z != Root))
        {
            var less = whole.ToHashSet();
            less.ExceptWith(Subtree(z));
            groups.Add(less);
        }

        for (var d = 0; d < _depth.Values.Max(); d++)
        {
            groups.Add([.. _depth.Where(p => p.Value <= d).Select(p => p.Key)]);
        }

        return groups;
    }

    /// <summary>The tree's switches from a zone in <paramref name="group"/> to one outside it.</summary>
    public List<int> CutsOf(HashSet<int> group) =>
        [.. group.SelectMany(z => _children[z]).Where(c => !group.Contains(c.Zone)).Select(c => c.Switch)];

    public IEnumerable<int> Subtree(int zone)
    {
        yield return zone;
        foreach (var (child, _) in _children[zone])
        {
            foreach (var z in Subtree(child))
            {
                yield return z;
            }
        }
    }

    private long Count(int zone, int cap)
    {
        long count = 1;
        foreach (var (child, _) in _children[zone])
        {
            count = Math.Min((long)cap + 1, count * (1 + Count(child, cap)));
        }

        return count;
    }

    private List<List<int>> Enumerate(int zone)
    {
        var groups = new List<List<int>> { new() { zone } };
        foreach (var (child, _) in _children[zone])
        {
            var below = Enumerate(child);
            var grown = new List<List<int>>(groups.Count * (below.Count + 1));
            foreach (var g in groups)
            {
                grown.Add(g);
                grown.AddRange(below.Select(b => g.Concat(b).ToList()));
            }

            groups = grown;
        }

        return groups;
    }
}
