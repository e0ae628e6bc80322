using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Puts the decided operations in order on the timeline: crews dispatched to manual devices first, the
/// de-energising open, the restorations in the order of least customer minutes (each after the suspect
/// boundary its island needs), the remaining boundary opens and verifications, then the crew's steps.
/// </summary>
internal static class StepAssembly
{
    public static List<SwitchingStep> Build(PlanningContext ctx, IsolationResult isolation, IsolationResult? second, DeadArea dead, IReadOnlyList<Candidate> chosen, ICollection<string> notes)
    {
        var before = isolation.DeEnergise is { } d ? new List<PlannedOperation> { d } : [];
        if (second is not null)
        {
            // The second section of a cross-country pair is cut off before anything is re-energised.
            before.AddRange(second.DeEnergise is { } d2 ? [d2] : []);
            before.AddRange(second.BoundaryOpens.OrderBy(p => p.Key).Select(p => p.Value));
        }

        var usedBoundaries = new HashSet<int>();
        var jobs = new List<Job>();
        foreach (var c in chosen)
        {
            // Every restoration of an island carries the suspect boundary it needs; the flattened order keeps its first open only.
            var ops = new List<PlannedOperation>();
            var boundary = dead.SuspectBoundaryOfIsland[c.Island];
            if (boundary >= 0 && isolation.BoundaryOpens.TryGetValue(boundary, out var open))
            {
                usedBoundaries.Add(boundary);
                ops.Add(open);
            }

            ops.AddRange(Explained(ctx, c));
            jobs.AddRange(Staging.Split(ctx, dead, new Job(c, [.. ops], c.Customers)));
        }

        if (chosen.Any(c => c.Operations.Length > c.Cuts.Length + 1))
        {
            notes.Add("customers cut off only for the minutes a disconnector or fuse is closed dead under a briefly opened device are not given the cold-load factor");
        }

        var after = isolation.BoundaryOpens.Where(p => !usedBoundaries.Contains(p.Key)).OrderBy(p => p.Key).Select(p => p.Value).ToList();
        var lostCustomers = ctx.Zones.All.Where(z => dead.Lost[z.Index] || ctx.IsIsolated(z.Index)).Sum(z => z.Customers);
        var leftOut = lostCustomers - chosen.Sum(c => c.Customers);
        var order = JobOrder.Best(ctx, before, jobs, after, leftOut, notes);

        var operations = JobOrder.Flatten(before, order, after).Concat(isolation.Verifies).Concat(second?.Verifies ?? []).ToList();

        // Placed first, written after: a crew's first trip is written at the top, a later one after the step it leaves from.
        var unread = UnreadFieldIndicators(ctx);
        var readBeforeClose = unread.Count > 0 && operations.Any(o => o.Action == StepAction.Close);
        var timeline = new Timeline(ctx.Grid, ctx.Options);
        var reading = -1;
        var placed = new List<(PlannedOperation? Operation, Placement Placement, TimeSpan At)>();
        foreach (var op in operations)
        {
            if (op.Action == StepAction.Close && readBeforeClose && reading < 0)
            {
                // Voltage back on a part can reset or change its flags: they are read first.
                var visit = timeline.Visit(ctx.Options.DefaultTravelTime);
                reading = placed.Count;
                placed.Add((null, visit, timeline.Now));
            }

            var done = timeline.Place(op.Action, op.Device);
            placed.Add((op, timeline.Placements[^1], done));
        }

        var leaving = placed.Select((p, j) => (p.Placement.Trip, j)).Where(t => t.Trip is { After: >= 0 }).ToLookup(t => t.Trip!.After, t => t.j);
        var steps = new List<SwitchingStep>();
        for (var k = 0; k < placed.Count; k++)
        {
            if (placed[k].Placement.Trip is { After: < 0 } trip && placed[k].Operation is { } op)
            {
                steps.Add(Dispatch(ctx, steps, trip, op.Device));
            }
        }

        if (readBeforeClose && reading >= 0 && placed[reading].Placement.Trip is { After: < 0 } readTrip)
        {
            steps.Add(ReadDispatch(ctx, steps, readTrip, unread));
        }

        for (var k = 0; k < placed.Count; k++)
        {
            var (op, placement, at) = placed[k];
            if (op is null)
            {
                foreach (var i in unread)
                {
                    steps.Add(Step(ctx, steps, StepAction.Verify, null, i.Node, [i.Segment], at,
                        $"read the field indicator {i.Id} on {i.Segment} at {i.Node} before anything is re-energised (voltage back can reset its flag)", placement.Crew));
                }
            }
            else
            {
                steps.Add(Step(ctx, steps, op.Action, op.Device, op.Node, [], at, op.Reason, placement.Crew));
            }

            // The crews that leave from here for their next job.
            foreach (var j in leaving[k])
            {
                var next = placed[j].Placement.Trip!;
                steps.Add(placed[j].Operation is { } nextOp ? Dispatch(ctx, steps, next, nextOp.Device) : ReadDispatch(ctx, steps, next, unread));
            }
        }

        var points = isolation.Points.Concat(second?.Points ?? []).Select(p => p.Device);
        CrewSteps(ctx, isolation, second, steps, timeline.Now, timeline.WorkCrew(points), timeline.CrewAt);
        return steps;
    }

    private static SwitchingStep Dispatch(PlanningContext ctx, List<SwitchingStep> steps, CrewTrip trip, int device)
    {
        return Step(ctx, steps, StepAction.Dispatch, device, null, [], trip.Leaves, CrewWords.Dispatch(trip, ctx.Grid.Switches[device].Id), trip.Crew);
    }

    private static SwitchingStep ReadDispatch(PlanningContext ctx, List<SwitchingStep> steps, CrewTrip trip, List<Model.Indicator> unread)
    {
        var who = trip.Crew is null ? "a crew" : $"crew {trip.Crew}";
        var from = trip.Crew is null || trip.After < 0 ? string.Empty : $" from {(trip.From is { } f ? f.Value : "where it is")}";
        return Step(ctx, steps, StepAction.Dispatch, null, null, [.. unread.Select(i => i.Segment).Distinct()], trip.Leaves,
            $"send {who}{from} to read the field indicators {Words.List(unread.Select(i => i.Id))} (about {Words.Number(trip.Travel.TotalMinutes)} min to reach them)", trip.Crew);
    }

    /// <summary>Indicators read in the field, in the part that lost supply, that the incident gives no field reading of.</summary>
    private static List<Model.Indicator> UnreadFieldIndicators(PlanningContext ctx)
    {
        var read = ctx.Incident.Indications.Where(i => i.Source == IndicationSource.Field).Select(i => i.Indicator).ToHashSet();
        return [.. ctx.Grid.Indicators.Where(i =>
        {
            var v = ctx.Grid.NodeIndex(i.Node);
            return !i.Remote && !read.Contains(i.Id) && ctx.Affected[v] && !ctx.StartNetwork.IsEnergised(v);
        })];
    }

    /// <summary>The candidate's operations with the reason of its last close written out.</summary>
    private static IEnumerable<PlannedOperation> Explained(PlanningContext ctx, Candidate c)
    {
        var text = RestorationWords.Close(ctx, c, c.Zones);
        var last = c.Operations.Length - 1;
        return c.Operations.Select((op, k) => op.Reason.Length > 0 ? op : op with { Reason = k == last ? text : op.Reason });
    }

    /// <summary>
    /// The work at the isolated section, all written at <paramref name="at"/> (the end of the switching; the work is not timed):
    /// <paramref name="crew"/> patrols, proves dead, earths and takes the permit; each manual isolation point is locked
    /// by the crew standing at it (<paramref name="standing"/>), else by <paramref name="crew"/>.
    /// </summary>
    private static void CrewSteps(PlanningContext ctx, IsolationResult first, IsolationResult? second, List<SwitchingStep> steps, TimeSpan at, string? crew, Func<int, string?> standing)
    {
        var zones = new[] { ctx.SuspectZone }.Concat(ctx.AlsoIsolated.Order()).Select(z => ctx.Zones.All[z]).ToList();
        var segments = zones.SelectMany(z => z.Segments).Select(i => ctx.Grid.Segments[i].Id).ToImmutableArray();
        var sections = Words.List(zones.Select(z => z.Section).OfType<Model.SectionId>());
        var isolation = first with { Points = [.. first.Points, .. second?.Points ?? []] };
        steps.Add(Step(ctx, steps, StepAction.Dispatch, null, null, segments, at, $"send {(crew is null ? "a crew" : $"crew {crew}")} to the isolated section{(zones.Count > 1 ? "s" : string.Empty)} {sections}", crew));
        steps.Add(Step(ctx, steps, StepAction.Patrol, null, null, segments, at, $"patrol the suspect segments {Words.List(segments)} to find the fault", crew));
        foreach (var (device, _) in isolation.Points)
        {
            var d = ctx.Grid.Switches[device];
            steps.Add(Step(ctx, steps, StepAction.Lock, device, null, [], at, d.Remote
                ? $"block the remote control of {d.Id} and tag it open: it stays open while the crew works (before the earths go on)"
                : $"lock {d.Id} open and tag it: it stays open while the crew works (before the earths go on)", d.Remote ? null : standing(device) ?? crew));
        }

        foreach (var (device, node) in isolation.Points)
        {
            steps.Add(Step(ctx, steps, StepAction.ProveDead, device, ctx.Grid.Nodes[node].Id, [], at,
                $"prove dead at {ctx.Grid.Nodes[node].Id}, the isolated side of {ctx.Grid.Switches[device].Id} (open)", crew));
        }

        foreach (var (device, node) in isolation.Points)
        {
            steps.Add(Step(ctx, steps, StepAction.Earth, device, ctx.Grid.Nodes[node].Id, [], at,
                $"earth at {ctx.Grid.Nodes[node].Id} beside {ctx.Grid.Switches[device].Id}: the work zone is earthed on every side", crew));
        }

        steps.Add(Step(ctx, steps, StepAction.Permit, null, null, segments, at,
            $"issue a permit to work on {sections} only once it is proved dead and earthed at every isolation point; local switching rules and licensed practice govern", crew));
    }

    private static SwitchingStep Step(PlanningContext ctx, List<SwitchingStep> steps, StepAction action, int? device, NodeId? node, ImmutableArray<SegmentId> segments, TimeSpan at, string reason, string? crew = null) =>
        new(steps.Count + 1, action, device is { } d ? ctx.Grid.Switches[d].Id : null, node, segments, at, reason) { Crew = crew };
}
