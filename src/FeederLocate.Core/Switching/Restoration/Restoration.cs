using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Restoration of the healthy dead area: candidates per restoring switch, an exact branch and bound
/// picks disjoint ones, and the combination is verified by one load flow; a combination that breaks a
/// limit on a donor substation is forbidden (with every set holding it) and the selection repeated.
/// </summary>
internal static class Restoration
{
    private const int MaxRounds = 200;

    public static RestorationResult Plan(PlanningContext ctx, IsolationResult isolation, DeadArea dead, SupplyLimits limits, IReadOnlySet<int> avoidZones, ICollection<string> notes)
    {
        var every = new HashSet<int>();
        var wholeOnly = new HashSet<int>();
        var candidates = CandidateSearch.Find(ctx, isolation, dead, limits, avoidZones, notes, every, wholeOnly);

        // Combinations found to break a limit together, by restoring switch and zones (they outlive a new enumeration).
        var forbidden = new List<List<(int Source, string Zones)>>();
        for (var round = 0; round < MaxRounds; round++)
        {
            var index = candidates.Select((c, i) => (Key(c), i)).ToDictionary(p => p.Item1, p => p.i);
            var chosen = TieSelection.Select(ctx.Zones, candidates, [.. forbidden.Select(f => (IReadOnlyList<int>)[.. f.Select(k => index[k])])],
                ctx.Options.MaxSelectionBranches, out var complete);
            if (!complete)
            {
                notes.Add($"the selection of restoring switches stopped after {ctx.Options.MaxSelectionBranches} branches: the best combination found by then is used");
            }

            var (network, verdicts) = Combine(ctx, dead, limits, chosen);
            var failing = verdicts.Where(v => !v.Value.Holds).Select(v => v.Key).ToHashSet();
            if (failing.Count == 0)
            {
                return new RestorationResult([.. chosen], network is null ? null : limits.Check(network));
            }

            var together = chosen.Where(c => failing.Contains(c.Donor)).ToList();
            forbidden.Add([.. together.Select(Key)]);

            // A source that gave only its whole group now needs its smaller groups too.
            var widen = together.Select(c => c.Source).Where(wholeOnly.Contains).ToList();
            if (widen.Count > 0)
            {
                every.UnionWith(widen);
                wholeOnly.ExceptWith(widen);
                candidates = CandidateSearch.Find(ctx, isolation, dead, limits, avoidZones, notes, every, wholeOnly);
            }
        }

        notes.Add("no combination of restoring switches passed the combined load flow within the rounds allowed: nothing is restored through ties");
        return new RestorationResult([], null);
    }

    private static (int Source, string Zones) Key(Candidate c) => (c.Source, string.Join(',', c.Zones));

    /// <summary>The state with every chosen group restored, and the verdict per donor substation.</summary>
    private static (EnergisedNetwork? Network, Dictionary<int, SupplyVerdict> Verdicts) Combine(
        PlanningContext ctx, DeadArea dead, SupplyLimits limits, IReadOnlyList<Candidate> chosen)
    {
        var states = dead.States;
        foreach (var c in chosen)
        {
            foreach (var cut in c.Cuts)
            {
                states = states.With(ctx.Grid.Switches[cut].Id, SwitchPosition.Open);
            }

            states = states.With(ctx.Grid.Switches[c.Source].Id, SwitchPosition.Closed);
        }

        var network = ctx.TryEnergise(states);
        var verdicts = new Dictionary<int, SupplyVerdict>();
        if (network is null)
        {
            // Disjoint groups from distinct sources cannot form a loop; treat it as a failure of every donor.
            foreach (var donor in chosen.Select(c => c.Donor).Distinct())
            {
                verdicts[donor] = new SupplyVerdict("the combination does not give a radial network", 0, -1, 0, -1);
            }

            return (null, verdicts);
        }

        foreach (var donor in chosen.Select(c => c.Donor).Distinct())
        {
            var heads = chosen.Where(c => c.Donor == donor).Select(c => c.FeederHead).Distinct().ToList();
            verdicts[donor] = limits.Check(network, new HashSet<int> { donor }, heads);
        }

        return (network, verdicts);
    }
}
