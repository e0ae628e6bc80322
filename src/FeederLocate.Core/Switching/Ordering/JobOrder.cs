namespace FeederLocate.Core.Switching;

/// <summary>
/// The order of restorations that minimises the estimated customer minutes: every order is tried for up
/// to <see cref="ExhaustiveLimit"/> restorations; beyond that a greedy order takes next the restoration
/// with the most customers per minute it adds to the timeline (Smith's ratio rule). Both place the
/// operations on the crews' timeline, so the order follows from where the crews are.
/// </summary>
internal static class JobOrder
{
    public const int ExhaustiveLimit = 6;

    public static List<Job> Best(PlanningContext ctx, IReadOnlyList<PlannedOperation> before, IReadOnlyList<Job> jobs, IReadOnlyList<PlannedOperation> after, int customersLeftOut, ICollection<string> notes)
    {
        if (jobs.Count <= 1)
        {
            return [.. jobs];
        }

        if (jobs.Count <= ExhaustiveLimit)
        {
            return Permutations([.. jobs]).Where(Respects).MinBy(order => Estimate(ctx, before, order, after, customersLeftOut))!;
        }

        notes.Add($"more than {ExhaustiveLimit} restorations: their order is greedy (most customers per minute first), not searched exhaustively");
        var left = jobs.ToList();
        var order = new List<Job>();
        var timeline = new Timeline(ctx.Grid, ctx.Options);
        foreach (var op in before)
        {
            timeline.Place(op.Action, op.Device);
        }

        while (left.Count > 0)
        {
            var start = timeline.Now;
            var next = left.Where(j => j.After is null || order.Contains(j.After)).MaxBy(j =>
            {
                var end = Finish(timeline, j);
                return j.Customers / Math.Max(1e-3, (end - start).TotalMinutes);
            })!;
            foreach (var op in next.Operations)
            {
                timeline.Place(op.Action, op.Device);
            }

            order.Add(next);
            left.Remove(next);
        }

        return order;
    }

    /// <summary>
    /// The operations of an order in sequence, each open kept only where the device is not already open
    /// (restorations of one island share its suspect boundary; neighbouring groups share a cut).
    /// </summary>
    public static List<PlannedOperation> Flatten(IEnumerable<PlannedOperation> before, IEnumerable<Job> order, IEnumerable<PlannedOperation> after)
    {
        var opened = new HashSet<int>();
        var list = new List<PlannedOperation>();
        foreach (var op in before.Concat(order.SelectMany(j => j.Operations)).Concat(after))
        {
            if (op.Action == StepAction.Open && !opened.Add(op.Device))
            {
                continue;
            }

            if (op.Action == StepAction.Close)
            {
                opened.Remove(op.Device);
            }

            list.Add(op);
        }

        return list;
    }

    /// <summary>Estimated CMI of one order: each restoration's customers until its last operation, the rest until the end.</summary>
    private static double Estimate(PlanningContext ctx, IReadOnlyList<PlannedOperation> before, IReadOnlyList<Job> order, IReadOnlyList<PlannedOperation> after, int customersLeftOut)
    {
        var timeline = new Timeline(ctx.Grid, ctx.Options);
        var opened = new HashSet<int>();
        void Place(PlannedOperation op)
        {
            if (op.Action == StepAction.Open && !opened.Add(op.Device))
            {
                return;
            }

            if (op.Action == StepAction.Close)
            {
                opened.Remove(op.Device);
            }

            timeline.Place(op.Action, op.Device);
        }

        foreach (var op in before)
        {
            Place(op);
        }

        var total = 0.0;
        foreach (var job in order)
        {
            foreach (var op in job.Operations)
            {
                Place(op);
            }

            total += job.Customers * timeline.Now.TotalMinutes;
        }

        foreach (var op in after)
        {
            Place(op);
        }

        return total + (customersLeftOut * timeline.Now.TotalMinutes);
    }

    /// <summary>True when every staged job comes after the stage it needs.</summary>
    private static bool Respects(List<Job> order) =>
        order.Select((j, k) => j.After is null || order.IndexOf(j.After) < k).All(ok => ok);

    /// <summary>When <paramref name="job"/> would be done if it came next (with the crews where the timeline leaves them).</summary>
    private static TimeSpan Finish(Timeline timeline, Job job)
    {
        var trial = timeline.Copy();
        foreach (var op in job.Operations)
        {
            trial.Place(op.Action, op.Device);
        }

        return trial.Now;
    }

    private static IEnumerable<List<Job>> Permutations(List<Job> items)
    {
        if (items.Count <= 1)
        {
            yield return items;
            yield break;
        }

        for (var i = 0; i < items.Count; i++)
        {
            var rest = items.Where((_, k) => k != i).ToList();
            foreach (var tail in Permutations(rest))
            {
                yield return [items[i], .. tail];
            }
        }
    }
}
