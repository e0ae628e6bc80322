using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Carries out a plan's steps on the model, written for the tests and sharing no topology code with the
/// planner: its own walk from the buses finds what is live and any loop. It checks every step against
/// the device rules, for the section the plan isolates and for the true fault; then the final state:
/// isolated section dead, no loop, no segment above its ampacity, no node below the voltage limit (the
/// core load flow, itself checked against a hand-worked case), the crew steps present, and the
/// customer counts.
/// </summary>
public sealed class PlanChecker
{
    private readonly Grid _grid;
    private readonly List<(bool IsSegment, int Index, int Other)>[] _incident;

    public PlanChecker(Grid grid)
    {
        _grid = grid;
        _incident = [.. Enumerable.Range(0, grid.Nodes.Length).Select(_ => new List<(bool, int, int)>())];
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            int a = grid.NodeIndex(grid.Segments[i].From), b = grid.NodeIndex(grid.Segments[i].To);
            _incident[a].Add((true, i, b));
            _incident[b].Add((true, i, a));
        }

        for (var i = 0; i < grid.Switches.Length; i++)
        {
            int a = grid.NodeIndex(grid.Switches[i].From), b = grid.NodeIndex(grid.Switches[i].To);
            _incident[a].Add((false, i, b));
            _incident[b].Add((false, i, a));
        }
    }

    /// <summary>
    /// Every problem found (empty when the plan is safe and complete), and whether a close put a tripping
    /// fault back on: a plan made for the wrong section can do that (protection trips again, and what
    /// follows no longer applies, so the check stops there).
    /// </summary>
    /// <param name="trueFault">The segment that really holds the fault.</param>
    /// <param name="standing">The fault is a standing earth fault on an isolated or resonant network (small current).</param>
    public (List<string> Problems, bool Reenergised) Check(Incident incident, SwitchingPlan plan, SegmentId trueFault, bool standing)
    {
        var problems = new List<string>();
        var closed = _grid.Switches.Select(s => !s.NormallyOpen).ToArray();
        foreach (var (id, position) in incident.SwitchStates)
        {
            closed[_grid.SwitchIndex(id)] = position == SwitchPosition.Closed;
        }

        var atFault = Walk(closed);
        if (incident.TrippedDevice is { } tripped)
        {
            closed[_grid.SwitchIndex(tripped)] = false;
        }

        var isolated = plan.IsolatedSections.SelectMany(s => plan.Sections.Single(p => p.Id == s).Segments).Select(_grid.SegmentIndex).ToHashSet();
        var faultSegment = _grid.SegmentIndex(trueFault);
        var live = Walk(closed);
        var everDead = new bool[_grid.Nodes.Length];
        Mark(atFault, live, everDead);
        var last = TimeSpan.Zero;
        foreach (var step in plan.Steps.OrderBy(s => s.Order))
        {
            if (step.At < last)
            {
                problems.Add($"step {step.Order}: earlier than the step before it");
            }

            last = step.At;
            if (step.Action is not (StepAction.Open or StepAction.Close or StepAction.Replace))
            {
                continue;
            }

            var index = _grid.SwitchIndex(step.Device!.Value);
            var device = _grid.Switches[index];
            var fromLive = live.Substation[_grid.NodeIndex(device.From)] >= 0;
            var toLive = live.Substation[_grid.NodeIndex(device.To)] >= 0;
            var anyLive = fromLive || toLive;
            if (step.Action == StepAction.Replace)
            {
                if (device.Kind != SwitchKind.Fuse || anyLive || closed[index])
                {
                    problems.Add($"step {step.Order}: replace {device.Id} needs an open fuse with both nodes dead");
                }

                continue;
            }

            if (step.Action == StepAction.Open)
            {
                if (!closed[index])
                {
                    problems.Add($"step {step.Order}: opens {device.Id}, which is open");
                }

                if (anyLive && device.Kind is SwitchKind.Disconnector or SwitchKind.Fuse)
                {
                    problems.Add($"step {step.Order}: opens {Kind(device)} {device.Id} live");
                }

                // A load-break switch must not break fault current: of the true fault, or of the one the plan assumes.
                var carriesFault = Feeds(live, index, faultSegment) || isolated.Any(s => Feeds(live, index, s));
                if (anyLive && device.Kind == SwitchKind.LoadBreakSwitch && carriesFault && !standing)
                {
                    problems.Add($"step {step.Order}: load-break switch {device.Id} breaks fault current");
                }

                closed[index] = false;
            }
            else
            {
                if (closed[index])
                {
                    problems.Add($"step {step.Order}: closes {device.Id}, which is closed");
                }

                if (fromLive && toLive)
                {
                    problems.Add($"step {step.Order}: {device.Id} joins two live parts");
                }

                if (anyLive && device.Kind is SwitchKind.Disconnector or SwitchKind.Fuse)
                {
                    problems.Add($"step {step.Order}: closes {Kind(device)} {device.Id} live");
                }

                closed[index] = true;
            }

            live = Walk(closed);
            if (live.Loop)
            {
                problems.Add($"step {step.Order}: the network has a loop or parallels two substations");
            }

            if (step.Action == StepAction.Close && isolated.Any(s => SegmentLive(live, s)))
            {
                problems.Add($"step {step.Order}: closing {device.Id} energises the isolated section");
            }

            if (step.Action == StepAction.Close && !standing && SegmentLive(live, faultSegment))
            {
                return (problems, true);
            }

            Mark(atFault, live, everDead);
        }

        if (isolated.Any(s => SegmentLive(live, s)))
        {
            problems.Add("the isolated section is live at the end");
        }

        if (isolated.Contains(faultSegment) && SegmentLive(live, faultSegment))
        {
            problems.Add("the faulted segment is live at the end");
        }

        foreach (var action in new[] { StepAction.ProveDead, StepAction.Earth, StepAction.Permit })
        {
            if (!plan.Steps.Any(s => s.Action == action))
            {
                problems.Add($"no {action} step");
            }
        }

        if (!plan.Cautions.Any(c => c.Contains("prove dead", StringComparison.OrdinalIgnoreCase)) || !plan.Cautions.Any(c => c.Contains("Advice only", StringComparison.Ordinal)))
        {
            problems.Add("the cautions are missing");
        }

        problems.AddRange(FinalState(plan, closed, live, atFault, everDead));
        return (problems, false);
    }

    /// <summary>Limits and counts in the final state.</summary>
    private IEnumerable<string> FinalState(SwitchingPlan plan, bool[] closed, Walked live, Walked atFault, bool[] everDead)
    {
        var states = SwitchStates.Normal(_grid);
        for (var i = 0; i < closed.Length; i++)
        {
            states = states.With(_grid.Switches[i].Id, closed[i] ? SwitchPosition.Closed : SwitchPosition.Open);
        }

        if (!new NetworkGraph(_grid).TryEnergise(states, out var network, out _))
        {
            yield return "the final state is not radial";
            yield break;
        }

        var factors = everDead.Select(d => d ? plan.ColdLoadFactor : 1.0).ToArray();
        var flow = RadialLoadFlow.Solve(network!, factors);
        if (!flow.Converged)
        {
            yield return "the final load flow does not converge";
        }

        for (var s = 0; s < _grid.Segments.Length; s++)
        {
            var ampacity = _grid.LineTypeOf(_grid.Segments[s]).AmpacityA;
            if (flow.SegmentCurrentA[s] > ampacity * (1 + 1e-9))
            {
                yield return $"segment {_grid.Segments[s].Id} carries {flow.SegmentCurrentA[s]:F0} A above {ampacity} A";
            }
        }

        for (var v = 0; v < _grid.Nodes.Length; v++)
        {
            if (live.Substation[v] >= 0 && flow.VoltagePu[v] < plan.VoltageLimitPu - 1e-9)
            {
                yield return $"node {_grid.Nodes[v].Id} at {flow.VoltagePu[v]:F3} pu below {plan.VoltageLimitPu} pu";
            }
        }

        for (var s = 0; s < _grid.Substations.Length; s++)
        {
            if (_grid.Substations[s].TransformerRatedMva is { } mva && flow.SubstationLoadMva[s] > mva)
            {
                yield return $"substation {_grid.Substations[s].Id} carries {flow.SubstationLoadMva[s]:F1} MVA above {mva} MVA";
            }
        }

        int unserved = 0, restored = 0;
        for (var v = 0; v < _grid.Nodes.Length; v++)
        {
            if (atFault.Substation[v] < 0)
            {
                continue;
            }

            if (live.Substation[v] < 0)
            {
                unserved += _grid.Nodes[v].Customers;
            }
            else if (everDead[v])
            {
                restored += _grid.Nodes[v].Customers;
            }
        }

        if (unserved != plan.UnservedCustomers)
        {
            yield return $"unserved customers: counted {unserved}, the plan says {plan.UnservedCustomers}";
        }

        if (restored != plan.RestoredCustomers)
        {
            yield return $"restored customers: counted {restored}, the plan says {plan.RestoredCustomers}";
        }
    }

    private static void Mark(Walked atFault, Walked live, bool[] everDead)
    {
        for (var v = 0; v < everDead.Length; v++)
        {
            everDead[v] |= atFault.Substation[v] >= 0 && live.Substation[v] < 0;
        }
    }

    private static string Kind(SwitchingDevice d) => d.Kind == SwitchKind.Fuse ? "fuse" : "disconnector";

    private bool SegmentLive(Walked live, int segment) => live.Substation[_grid.NodeIndex(_grid.Segments[segment].From)] >= 0;

    /// <summary>True when closed switch <paramref name="device"/> lies on the live path from a bus to the segment.</summary>
    private bool Feeds(Walked live, int device, int segment)
    {
        if (!SegmentLive(live, segment))
        {
            return false;
        }

        for (var v = _grid.NodeIndex(_grid.Segments[segment].From); v >= 0; v = live.Parent[v])
        {
            if (live.ParentSwitch[v] == device)
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>Breadth-first from every bus over segments and closed switches.</summary>
    private Walked Walk(bool[] closed)
    {
        var n = _grid.Nodes.Length;
        var substation = Enumerable.Repeat(-1, n).ToArray();
        var parent = Enumerable.Repeat(-1, n).ToArray();
        var parentSwitch = Enumerable.Repeat(-1, n).ToArray();
        var used = new HashSet<(bool, int)>();
        var loop = false;
        for (var s = 0; s < _grid.Substations.Length; s++)
        {
            var bus = _grid.NodeIndex(_grid.Substations[s].BusNode);
            if (substation[bus] >= 0)
            {
                loop = true;
                continue;
            }

            substation[bus] = s;
            var queue = new Queue<int>([bus]);
            while (queue.TryDequeue(out var u))
            {
                foreach (var (isSegment, index, other) in _incident[u])
                {
                    if ((!isSegment && !closed[index]) || !used.Add((isSegment, index)))
                    {
                        continue;
                    }

                    if (substation[other] >= 0)
                    {
                        loop = true;
                        continue;
                    }

                    substation[other] = s;
                    parent[other] = u;
                    parentSwitch[other] = isSegment ? -1 : index;
                    queue.Enqueue(other);
                }
            }
        }

        return new Walked(substation, parent, parentSwitch, loop);
    }

    private sealed record Walked(int[] Substation, int[] Parent, int[] ParentSwitch, bool Loop);
}
