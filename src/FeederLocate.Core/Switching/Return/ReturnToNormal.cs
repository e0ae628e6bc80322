using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Orders the return to the normal switch states. Every device out of its normal position is operated
/// once; the order is an exact search over the subsets of devices already operated (each subset is one
/// network state), keeping for each the order of least customer minutes, with a step allowed only when
/// the device rules allow it and the network stays radial. Closing a normal path while a tie still feeds
/// the far side would parallel two feeders or substations, so the tie opens first (break before make).
/// </summary>
internal static class ReturnToNormal
{
    /// <summary>Beyond this many devices out of position the subsets are too many: the search takes the best next step only.</summary>
    private const int ExactLimit = 12;

    public static ReturnPlan Plan(NetworkGraph graph, Incident incident, SwitchingPlan plan, SwitchingOptions options)
    {
        var grid = graph.Grid;
        // A reclosure that held left the tripped device closed.
        var states = incident.Reclosing is { Transient: true } && plan.IsolatedSections.IsEmpty
            ? SwitchStates.AtFaultTime(grid, incident)
            : SwitchStates.AfterTrip(grid, incident);
        foreach (var step in plan.Steps.Where(s => s.ChangesNetwork))
        {
            states = states.With(step.Device!.Value, step.Action == StepAction.Open ? SwitchPosition.Open : SwitchPosition.Closed);
        }

        if (!graph.TryEnergise(states, out _, out var problem))
        {
            throw new PlanningException($"the plan's final state gives no radial network: {problem}");
        }

        return From(graph, states, plan, options);
    }

    /// <summary>
    /// The return from the switch positions <paramref name="states"/> as they stand (the switching as carried out),
    /// with the clearance of <paramref name="plan"/>'s earths and locks (none when null).
    /// </summary>
    public static ReturnPlan From(NetworkGraph graph, SwitchStates states, SwitchingPlan? plan, SwitchingOptions options)
    {
        var grid = graph.Grid;
        if (!graph.TryEnergise(states, out _, out var problem))
        {
            throw new PlanningException($"the present switch positions give no radial network: {problem}");
        }

        var normal = SwitchStates.Normal(grid);
        var served = graph.TryEnergise(normal, out var normalNetwork, out _) ? normalNetwork! : null;
        var steps = new List<SwitchingStep>();
        if (plan is not null)
        {
            Clearance(grid, plan, steps);
        }

        var moves = Enumerable.Range(0, grid.Switches.Length).Where(i => states.IsClosed(i) != normal.IsClosed(i)).ToList();
        var notes = new List<string>();
        var order = moves.Count <= ExactLimit ? Exact(graph, states, moves, served, options) : null;
        if (order is null && moves.Count > ExactLimit)
        {
            notes.Add($"{moves.Count} devices are out of position: the order takes the best next step each time, not the exact best");
        }

        order ??= Greedy(graph, states, moves, served)
            ?? throw new PlanningException($"no safe order returns {Words.List(moves.Select(i => grid.Switches[i].Id))} to normal: a disconnector or fuse would have to operate live; switch by local instruction");

        // Placed first, written after: a crew's first trip at the top, a later one after the step it leaves from.
        var timeline = new Timeline(grid, options);
        var placed = order.Select(o =>
        {
            timeline.Place(o.Action, o.Device);
            return timeline.Placements[^1];
        }).ToList();
        foreach (var (placement, k) in placed.Select((p, k) => (p, k)).Where(t => t.p.Trip is { After: < 0 }))
        {
            steps.Add(Step(steps, StepAction.Dispatch, grid.Switches[order[k].Device].Id, null, placement.Trip!.Leaves,
                CrewWords.Dispatch(placement.Trip, grid.Switches[order[k].Device].Id)) with { Crew = placement.Crew });
        }

        var leaving = placed.Select((p, j) => (p.Trip, j)).Where(t => t.Trip is { After: >= 0 }).ToLookup(t => t.Trip!.After, t => t.j);
        var network = graph.Energise(states);
        var changes = new List<SupplyChange>();
        var atStart = Without(grid, network, served);
        var most = atStart;
        for (var k = 0; k < order.Count; k++)
        {
            var (device, action, after) = order[k];
            var id = grid.Switches[device].Id;
            var before = network;
            network = after;
            var at = placed[k].Done;
            var without = Without(grid, network, served);
            most = Math.Max(most, without);
            changes.Add(new SupplyChange(at, without));
            steps.Add(Step(steps, action, id, null, at, Reason(grid, device, action, before, network, served)) with { Crew = placed[k].Crew });
            foreach (var j in leaving[k])
            {
                var trip = placed[j].Trip!;
                steps.Add(Step(steps, StepAction.Dispatch, grid.Switches[order[j].Device].Id, null, trip.Leaves,
                    CrewWords.Dispatch(trip, grid.Switches[order[j].Device].Id)) with { Crew = trip.Crew });
            }
        }

        var horizon = changes.Count > 0 ? changes[^1].At : TimeSpan.Zero;
        notes.Add("the return counts from the moment the repair is reported complete; the order is checked against the device rules and radial supply at every step, the load of each intermediate state is not checked by load flow (the normal state is the one the network is built for)");
        if (moves.Count == 0)
        {
            notes.Add("every device is in its normal position: nothing to switch");
        }

        return new ReturnPlan([.. steps], most, CustomerMinutes.Interrupted(atStart, changes, horizon), Cautions.All, [.. notes]);
    }

    /// <summary>Before any switching: the permit cancelled and the crews clear, the earths removed, the locks, tags and remote blocks taken off.</summary>
    private static void Clearance(Grid grid, SwitchingPlan plan, List<SwitchingStep> steps)
    {
        if (plan.IsolatedSections.IsEmpty)
        {
            return;
        }

        var sections = Words.List(plan.IsolatedSections);
        steps.Add(Step(steps, StepAction.Verify, null, null, TimeSpan.Zero,
            $"confirm the repair of {sections} is complete, every crew is clear and the permit to work is cancelled"));
        foreach (var earth in plan.Steps.Where(s => s.Action == StepAction.Earth))
        {
            steps.Add(Step(steps, StepAction.RemoveEarth, earth.Device, earth.Node, TimeSpan.Zero,
                $"remove the earth at {earth.Node} beside {earth.Device} and account for it"));
        }

        foreach (var locked in plan.Steps.Where(s => s.Action == StepAction.Lock))
        {
            var remote = locked.Device is { } d && grid.Switch(d).Remote;
            steps.Add(Step(steps, StepAction.Unlock, locked.Device, null, TimeSpan.Zero, remote
                ? $"remove the remote-control block and the tag from {locked.Device}"
                : $"remove the lock and the tag from {locked.Device}"));
        }
    }

    /// <summary>The exact order of least customer minutes over the subsets of <paramref name="moves"/>; null when none is safe.</summary>
    private static List<Operation>? Exact(NetworkGraph graph, SwitchStates start, List<int> moves, EnergisedNetwork? served, SwitchingOptions options)
    {
        var grid = graph.Grid;
        var full = (1 << moves.Count) - 1;
        var best = new Dictionary<int, (double Cost, Timeline Timeline, int Previous, List<Operation> Ops)> { [0] = (0, new Timeline(grid, options), -1, []) };
        var networks = new Dictionary<int, EnergisedNetwork> { [0] = graph.Energise(start) };

        // Subsets in order of size: every transition adds one device, so each is final before it is expanded.
        foreach (var mask in Enumerable.Range(0, full + 1).OrderBy(m => System.Numerics.BitOperations.PopCount((uint)m)).ThenBy(m => m))
        {
            if (!best.TryGetValue(mask, out var here) || !networks.TryGetValue(mask, out var network))
            {
                continue;
            }

            var states = Apply(start, moves, mask, grid);
            for (var k = 0; k < moves.Count; k++)
            {
                if ((mask & (1 << k)) != 0 || Move(graph, states, network, moves[k]) is not { } ops)
                {
                    continue;
                }

                var next = mask | (1 << k);
                // The crews where the best order to this subset left them (with crews in the grid, the search is exact in the positions, not in the crews' whereabouts).
                var timeline = here.Timeline.Copy();
                var cost = here.Cost;
                var before = network;
                foreach (var op in ops)
                {
                    var from = timeline.Now;
                    cost += Without(grid, before, served) * (timeline.Place(op.Action, op.Device) - from).TotalMinutes;
                    before = op.After;
                }

                if (!best.TryGetValue(next, out var there) || cost < there.Cost - 1e-9)
                {
                    best[next] = (cost, timeline, mask, ops);
                    networks[next] = ops[^1].After;
                }
            }
        }

        if (!best.ContainsKey(full))
        {
            return null;
        }

        var order = new List<Operation>();
        for (var m = full; m != 0; m = best[m].Previous)
        {
            order.InsertRange(0, best[m].Ops);
        }

        return order;
    }

    /// <summary>The move leaving the fewest customers without supply each time; null when stuck.</summary>
    private static List<Operation>? Greedy(NetworkGraph graph, SwitchStates start, List<int> moves, EnergisedNetwork? served)
    {
        var grid = graph.Grid;
        var states = start;
        var network = graph.Energise(start);
        var left = new List<int>(moves);
        var order = new List<Operation>();
        while (left.Count > 0)
        {
            var choices = left.Select(d => (Device: d, Ops: Move(graph, states, network, d)))
                .Where(o => o.Ops is not null)
                .OrderBy(o => Without(grid, o.Ops![^1].After, served))
                .ThenBy(o => o.Ops!.Count)
                .ThenBy(o => o.Device)
                .ToList();
            if (choices.Count == 0)
            {
                return null;
            }

            var (device, ops) = choices[0];
            order.AddRange(ops!);
            foreach (var op in ops!)
            {
                states = states.With(grid.Switches[op.Device].Id, op.Action == StepAction.Open ? SwitchPosition.Open : SwitchPosition.Closed);
            }

            network = ops![^1].After;
            left.Remove(device);
        }

        return order;
    }

    /// <summary>
    /// Operates <paramref name="device"/> toward normal: alone where the device rules allow it and the network stays
    /// radial; a disconnector or fuse with a live node, under the nearest device upstream that can break load, opened
    /// for it and closed again. Null when neither is safe.
    /// </summary>
    private static List<Operation>? Move(NetworkGraph graph, SwitchStates states, EnergisedNetwork network, int device)
    {
        var grid = graph.Grid;
        var d = grid.Switches[device];
        var closed = states.IsClosed(device);
        if (Single(graph, states, network, device) is { } alone)
        {
            return [alone];
        }

        if (d.Kind is not (SwitchKind.Disconnector or SwitchKind.Fuse))
        {
            return null;
        }

        var from = grid.NodeIndex(d.From);
        var to = grid.NodeIndex(d.To);
        var feedingSide = !closed
            ? (network.IsEnergised(from) ? from : to)
            : network.FeedingEdgeOf(to) == new EdgeRef(EdgeKind.Switch, device) ? from : to;
        var helper = UpstreamBreaker(grid, network, feedingSide);
        if (helper < 0 || Single(graph, states, network, helper) is not { } open)
        {
            return null;
        }

        var opened = states.With(grid.Switches[helper].Id, SwitchPosition.Open);
        if (Single(graph, opened, open.After, device) is not { } operate)
        {
            return null;
        }

        var operated = opened.With(d.Id, closed ? SwitchPosition.Open : SwitchPosition.Closed);
        return Single(graph, operated, operate.After, helper) is { } reclose ? [open, operate, reclose] : null;
    }

    /// <summary>The first closed breaker, recloser or load-break switch on the path from <paramref name="node"/> to its bus; -1 when none.</summary>
    private static int UpstreamBreaker(Grid grid, EnergisedNetwork network, int node)
    {
        for (var v = node; v >= 0 && network.IsEnergised(v); v = network.ParentOf(v))
        {
            var edge = network.FeedingEdgeOf(v);
            if (edge.IsNone)
            {
                return -1;
            }

            if (edge.Kind == EdgeKind.Switch && grid.Switches[edge.Index].Kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.LoadBreakSwitch)
            {
                return edge.Index;
            }
        }

        return -1;
    }

    /// <summary>One operation changing <paramref name="device"/>'s position, when the device rules allow it and the network stays radial.</summary>
    private static Operation? Single(NetworkGraph graph, SwitchStates states, EnergisedNetwork network, int device)
    {
        var d = graph.Grid.Switches[device];
        var closed = states.IsClosed(device);
        var fromLive = network.IsEnergised(d.From);
        var toLive = network.IsEnergised(d.To);
        var rule = closed
            ? DeviceRules.Open(d, closed, fromLive, toLive, ThroughCurrent.Load)
            : DeviceRules.Close(d, closed, fromLive, toLive, energisesSuspect: false);
        return rule is null && graph.TryEnergise(states.With(d.Id, closed ? SwitchPosition.Open : SwitchPosition.Closed), out var after, out _)
            ? new Operation(device, closed ? StepAction.Open : StepAction.Close, after!)
            : null;
    }

    private sealed record Operation(int Device, StepAction Action, EnergisedNetwork After);

    private static SwitchStates Apply(SwitchStates start, List<int> moves, int mask, Grid grid)
    {
        var states = start;
        for (var k = 0; k < moves.Count; k++)
        {
            if ((mask & (1 << k)) != 0)
            {
                var id = grid.Switches[moves[k]].Id;
                states = states.With(id, start.IsClosed(moves[k]) ? SwitchPosition.Open : SwitchPosition.Closed);
            }
        }

        return states;
    }

    /// <summary>Customers of the nodes the normal network supplies that are without supply in <paramref name="network"/>.</summary>
    private static int Without(Grid grid, EnergisedNetwork network, EnergisedNetwork? served)
    {
        var count = 0;
        for (var v = 0; v < grid.Nodes.Length; v++)
        {
            if ((served is null || served.IsEnergised(v)) && !network.IsEnergised(v))
            {
                count += grid.Nodes[v].Customers;
            }
        }

        return count;
    }

    private static string Reason(Grid grid, int device, StepAction action, EnergisedNetwork before, EnergisedNetwork after, EnergisedNetwork? served)
    {
        var d = grid.Switches[device];
        var dropped = Without(grid, after, served) - Without(grid, before, served);
        return action == StepAction.Open
            ? d.NormallyOpen
                ? $"open {d.Id}, back to its normal open point{(dropped > 0 ? $" ({dropped} customers briefly without supply until their normal path closes: no two feeders in parallel)" : string.Empty)}"
                : $"open {d.Id}{(dropped > 0 ? $" ({dropped} customers briefly without supply)" : string.Empty)} so that the disconnector or fuse beyond it operates dead"
            : dropped < 0
                ? $"close {d.Id}: {-dropped} customers back on their normal supply"
                : $"close {d.Id}{(d.Kind is SwitchKind.Disconnector or SwitchKind.Fuse ? " (both nodes dead)" : string.Empty)}";
    }

    private static SwitchingStep Step(List<SwitchingStep> steps, StepAction action, SwitchId? device, NodeId? node, TimeSpan at, string reason) =>
        new(steps.Count + 1, action, device, node, [], at, reason);
}
