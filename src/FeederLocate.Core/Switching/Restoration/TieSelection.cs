using Google.OrTools.Sat;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Chooses which candidate groups to restore with CP-SAT: disjoint groups (each zone at most once), each
/// restoring switch at most once, no combination already found to break a limit together; maximising
/// restored customers, then restored nodes, then the fewest non-normal supplies (ties), then the fewest
/// operations (lexicographic, as one weighted integer objective).
/// </summary>
internal static class TieSelection
{
    public static List<Candidate> Select(IReadOnlyList<Candidate> candidates, IReadOnlyList<IReadOnlyList<int>> forbidden, TimeSpan limit, out bool optimal)
    {
        optimal = true;
        if (candidates.Count == 0)
        {
            return [];
        }

        var model = new CpModel();
        var chosen = candidates.Select((_, i) => model.NewBoolVar($"candidate{i}")).ToArray();
        foreach (var group in candidates.Select((c, i) => (c, i)).SelectMany(p => p.c.Zones.Select(z => (z, p.i))).GroupBy(p => p.z))
        {
            model.AddAtMostOne(group.Select(p => chosen[p.i]));
        }

        foreach (var group in candidates.Select((c, i) => (c.Source, i)).GroupBy(p => p.Source))
        {
            model.AddAtMostOne(group.Select(p => chosen[p.i]));
        }

        foreach (var combination in forbidden)
        {
            model.Add(LinearExpr.Sum(combination.Select(i => chosen[i])) <= combination.Count - 1);
        }

        // Lexicographic weights: each criterion's range fits below one unit of the one before it.
        long nodeRange = candidates.Sum(c => (long)c.Nodes) + 1;
        long tieRange = candidates.Count + 1;
        long operationRange = candidates.Sum(c => (long)c.Operations.Length) + 1;
        var weights = candidates.Select(c =>
            (((((long)c.Customers * nodeRange) + c.Nodes) * tieRange) - (c.NormalFeed ? 0 : 1)) * operationRange - c.Operations.Length).ToArray();
        model.Maximize(LinearExpr.WeightedSum(chosen, weights));

        var solver = new CpSolver
        {
            StringParameters = $"max_time_in_seconds:{limit.TotalSeconds.ToString(System.Globalization.CultureInfo.InvariantCulture)} num_workers:1 random_seed:1",
        };
        var status = solver.Solve(model);
        if (status is not (CpSolverStatus.Optimal or CpSolverStatus.Feasible))
        {
            optimal = false;
            return [];
        }

        optimal = status == CpSolverStatus.Optimal;
        return [.. candidates.Where((_, i) => solver.BooleanValue(chosen[i]))];
    }
}
