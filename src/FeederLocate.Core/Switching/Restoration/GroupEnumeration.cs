using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Every group of zones a restoring switch can pick up that keeps every limit: the connected groups of
/// an island's zone tree that hold its root. Each group is reached once, by deciding for each zone on
/// the group's frontier whether it joins (then its children join the frontier) or stays out. The load
/// of a radial network with constant-power loads only grows with the group, so a group that breaks a
/// limit ends its branch: no larger group holding it is checked. Zones join as early as they can, so
/// the largest feasible groups come first; at most <c>cap</c> groups are checked (a deterministic limit).
/// </summary>
internal sealed class GroupEnumeration(ZoneTree tree, Func<int, bool> admits, int cap, Func<HashSet<int>, Candidate?> check)
{
    private readonly HashSet<int> _group = [];
    private readonly List<Candidate> _found = [];
    private int _checks;

    /// <summary>True when the limit of checks stopped the enumeration before every group was seen.</summary>
    public bool Capped { get; private set; }

    public List<Candidate> Run()
    {
        if (!admits(tree.Root))
        {
            return _found;
        }

        _group.Add(tree.Root);
        _checks++;
        if (check(_group) is { } whole)
        {
            Grow(Children(tree.Root), whole);
        }

        return _found;
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
