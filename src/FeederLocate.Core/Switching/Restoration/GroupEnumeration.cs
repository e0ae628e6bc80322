using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Every group of zones a restoring switch can pick up that keeps every limit: the connected groups of
/// an island's zone tree that hold its root. Each group is reached once, by deciding for each zone on
/// the group's frontier whether it joins (then its children join the frontier) or stays out. The load
/// of a radial network with constant-power loads only grows with the group, so a group that breaks a
/// limit ends its branch: no larger group holding it is checked. Zones join as early as they can, so
/// the largest feasible groups come first; at most <c>cap</c> groups are checked (a deterministic limit).
/// Unless <c>every</c> is set, a source that can pick up everything it reaches gives that one group only:
/// it holds every customer and node the smaller ones do, with at most as many ties and operations, so
/// the smaller ones matter only when the whole group is refused together with others on the same donor.
/// </summary>
internal sealed class GroupEnumeration(ZoneTree tree, Func<int, bool> admits, int cap, bool every, Func<HashSet<int>, Candidate?> check)
{
    private readonly HashSet<int> _group = [];
    private readonly List<Candidate> _found = [];
    private int _checks;

    /// <summary>True when the limit of checks stopped the enumeration before every group was seen.</summary>
    public bool Capped { get; private set; }

    /// <summary>True when only the whole reachable group was given (it keeps every limit).</summary>
    public bool WholeOnly { get; private set; }

    public List<Candidate> Run()
    {
        if (!admits(tree.Root))
        {
            return _found;
        }

        if (!every)
        {
            var reachable = Reachable();
            if (reachable.Count > 1 && check(reachable) is { } all)
            {
                _checks++;
                WholeOnly = true;
                _found.Add(all);
                return _found;
            }
        }

        _group.Add(tree.Root);
        _checks++;
        if (check(_group) is { } whole)
        {
            Grow(Children(tree.Root), whole);
        }

        return _found;
    }

    /// <summary>The admitted zones reached from the root through admitted zones.</summary>
    private HashSet<int> Reachable()
    {
        var reached = new HashSet<int> { tree.Root };
        var stack = new Stack<int>([tree.Root]);
        while (stack.TryPop(out var z))
        {
            foreach (var (child, _) in tree.Children(z))
            {
                if (admits(child) && reached.Add(child))
                {
                    stack.Push(child);
                }
            }
        }

        return reached;
    }

    private ImmutableList<int> Children(int zone) => [.. tree.Children(zone).Select(c => c.Zone)];

    private void Grow(ImmutableList<int> frontier, Candidate current)
    {
        if (frontier.IsEmpty)
        {
            _found.Add(current);
            return;
        }

        var zone = frontier[0];
        var rest = frontier.RemoveAt(0);
        if (admits(zone))
        {
            if (_checks >= cap)
            {
                Capped = true;
            }
            else
            {
                _checks++;
                _group.Add(zone);
                if (check(_group) is { } larger)
                {
                    Grow(rest.AddRange(Children(zone)), larger);
                }

                _group.Remove(zone);
            }
        }

        Grow(rest, current);
    }
}
