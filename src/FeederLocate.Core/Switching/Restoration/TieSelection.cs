namespace FeederLocate.Core.Switching;

/// <summary>
/// Chooses which candidate groups to restore, exactly, by depth-first branch and bound: disjoint groups
/// (each zone at most once), each restoring switch at most once, no combination already found to break
/// a limit together (nor any set holding one: more load on the same donor only adds to it); maximising
/// the <see cref="RestorationScore"/> (customers, then nodes, then fewest ties, then fewest operations).
/// The bound of the candidates still open is, per island, the customers and nodes their groups can
/// cover at most. Deterministic: candidates are taken in a fixed order and the search is limited by a
/// number of branches, never by a clock.
/// </summary>
internal static class TieSelection
{
    /// <param name="branchLimit">At most this many branches are explored; beyond it the best found is returned and <paramref name="complete"/> is false.</param>
    public static List<Candidate> Select(ZoneMap zones, IReadOnlyList<Candidate> candidates, IReadOnlyList<IReadOnlyList<int>> forbidden, long branchLimit, out bool complete)
    {
        complete = true;
        if (candidates.Count == 0)
        {
            return [];
        }

        // Islands joined by no forbidden combination are independent: each part is searched on its own.
        var islands = candidates.Select(c => c.Island).Distinct().Order().ToList();
        var part = islands.ToDictionary(i => i, i => i);
        int Find(int island) => part[island] == island ? island : part[island] = Find(part[island]);
        foreach (var combination in forbidden)
        {
            foreach (var i in combination.Skip(1))
            {
                part[Find(candidates[i].Island)] = Find(candidates[combination[0]].Island);
            }
        }

        var chosen = new List<Candidate>();
        var budget = branchLimit;
        foreach (var members in Enumerable.Range(0, candidates.Count).GroupBy(i => Find(candidates[i].Island)).OrderBy(g => g.Key))
        {
            var indices = members.ToList();
            var local = indices.Select((global, k) => (global, k)).ToDictionary(p => p.global, p => p.k);
            var localForbidden = forbidden.Where(f => local.ContainsKey(f[0])).Select(f => (IReadOnlyList<int>)[.. f.Select(i => local[i])]).ToList();
            var search = new Search(zones, [.. indices.Select(i => candidates[i])], localForbidden, Math.Max(1, budget));
            search.Run();
            budget -= search.Branches;
            complete &= !search.Stopped;
            chosen.AddRange(search.Best.Order().Select(k => candidates[indices[k]]));
        }

        return chosen;
    }

    private sealed class Search
    {
        private readonly ZoneMap _zones;
        private readonly IReadOnlyList<Candidate> _candidates;
        private readonly int[] _order;
        private readonly RestorationScore[] _score;
        private readonly RestorationScore[] _boundFrom;
        private readonly List<int>[] _forbiddenOf;
        private readonly IReadOnlyList<IReadOnlyList<int>> _forbidden;
        private readonly int[] _forbiddenChosen;
        private readonly HashSet<int> _zonesUsed = [];
        private readonly HashSet<int> _sourcesUsed = [];
        private readonly List<int> _chosen = [];
        private readonly long _branchLimit;
        private long _branches;
        private RestorationScore _bestScore = RestorationScore.Zero;

        public Search(ZoneMap zones, IReadOnlyList<Candidate> candidates, IReadOnlyList<IReadOnlyList<int>> forbidden, long branchLimit)
        {
            _zones = zones;
            _candidates = candidates;
            _forbidden = forbidden;
            _branchLimit = branchLimit;
            _score = [.. candidates.Select(RestorationScore.Of)];

            // Island by island, the best groups first, so that a good selection is found early and the bound prunes.
            _order = [.. Enumerable.Range(0, candidates.Count)
                .OrderBy(i => candidates[i].Island)
                .ThenByDescending(i => _score[i])
                .ThenBy(i => i)];
            _boundFrom = new RestorationScore[_order.Length + 1];
            var later = RestorationScore.Zero;
            for (var k = _order.Length - 1; k >= 0; k--)
            {
                var island = candidates[_order[k]].Island;
                if (k + 1 < _order.Length && candidates[_order[k + 1]].Island != island)
                {
                    later = _boundFrom[k + 1];
                }

                _boundFrom[k] = later + IslandBound(k, island);
            }

            _forbiddenOf = [.. candidates.Select(_ => new List<int>())];
            for (var f = 0; f < forbidden.Count; f++)
            {
                foreach (var i in forbidden[f])
                {
                    _forbiddenOf[i].Add(f);
                }
            }

            _forbiddenChosen = new int[forbidden.Count];
        }

        public List<int> Best { get; private set; } = [];

        public bool Stopped { get; private set; }

        public long Branches => _branches;

        public void Run() => Branch(0, RestorationScore.Zero);

        /// <summary>An upper bound of what the candidates from position <paramref name="k"/> to the end of their island can add.</summary>
        private RestorationScore IslandBound(int k, int island)
        {
            var zones = new HashSet<int>();
            long perSourceCustomers = 0, perSourceNodes = 0;
            var bestOfSource = new Dictionary<int, (long Customers, long Nodes)>();
            for (var j = k; j < _order.Length && _candidates[_order[j]].Island == island; j++)
            {
                var c = _candidates[_order[j]];
                zones.UnionWith(c.Zones);
                var (customers, nodes) = bestOfSource.GetValueOrDefault(c.Source);
                bestOfSource[c.Source] = (Math.Max(customers, c.Customers), Math.Max(nodes, c.Nodes));
            }

            foreach (var (customers, nodes) in bestOfSource.Values)
            {
                perSourceCustomers += customers;
                perSourceNodes += nodes;
            }

            // Customers and nodes cannot exceed what the zones hold, nor what each source's best group holds summed;
            // ties and operations never add, so 0 bounds them.
            var zoneCustomers = zones.Sum(z => (long)CustomersOfZone(z));
            var zoneNodes = zones.Sum(z => (long)NodesOfZone(z));
            return new RestorationScore(Math.Min(zoneCustomers, perSourceCustomers), Math.Min(zoneNodes, perSourceNodes), 0, 0);
        }

        private int CustomersOfZone(int zone) => _zones.All[zone].Customers;

        private int NodesOfZone(int zone) => _zones.All[zone].Nodes.Length;

        private void Branch(int k, RestorationScore current)
        {
            if (Stopped)
            {
                return;
            }

            if (++_branches > _branchLimit)
            {
                Stopped = true;
                return;
            }

            if (current > _bestScore)
            {
                _bestScore = current;
                Best = [.. _chosen];
            }

            if (k == _order.Length || current + _boundFrom[k] <= _bestScore)
            {
                return;
            }

            var i = _order[k];
            var c = _candidates[i];
            if (Fits(i, c))
            {
                Take(i, c, +1);
                Branch(k + 1, current + _score[i]);
                Take(i, c, -1);
            }

            Branch(k + 1, current);
        }

        private bool Fits(int i, Candidate c)
        {
            if (_sourcesUsed.Contains(c.Source) || c.Zones.Any(_zonesUsed.Contains))
            {
                return false;
            }

            foreach (var f in _forbiddenOf[i])
            {
                if (_forbiddenChosen[f] + 1 == _forbidden[f].Count)
                {
                    return false;
                }
            }

            return true;
        }

        private void Take(int i, Candidate c, int sign)
        {
            foreach (var f in _forbiddenOf[i])
            {
                _forbiddenChosen[f] += sign;
            }

            if (sign > 0)
            {
                _sourcesUsed.Add(c.Source);
                _zonesUsed.UnionWith(c.Zones);
                _chosen.Add(i);
            }
            else
            {
                _sourcesUsed.Remove(c.Source);
                _zonesUsed.ExceptWith(c.Zones);
                _chosen.RemoveAt(_chosen.Count - 1);
            }
        }
    }
}
