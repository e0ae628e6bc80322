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

        // A reclosure that held leaves the tripped device closed: a transient fault.
        var transient = incident.Reclosing is { Transient: true };
        if (incident.TrippedDevice is { } tripped && !transient)
        {
            closed[_grid.SwitchIndex(tripped)] = false;
        }

        var isolated = plan.IsolatedSections.SelectMany(s => plan.Sections.Single(p => p.Id == s).Segments).Select(_grid.SegmentIndex).ToHashSet();
        var faultSegment = _grid.SegmentIndex(trueFault);
        var live = Walk(closed);
        problems.AddRange(SafetyOrder(incident, plan, atFault, live));
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

        if (transient && (!plan.IsolatedSections.IsEmpty || plan.Steps.Any(s => s.ChangesNetwork)))
        {
            problems.Add("a transient fault's plan switches: it must isolate nothing and open or close nothing");
        }

        foreach (var action in transient ? [] : new[] { StepAction.ProveDead, StepAction.Earth, StepAction.Permit })
        {
            if (!plan.Steps.Any(s => s.Action == action))
            {
                problems.Add($"no {action} step");
            }
        }

        string[] cautions = ["Advice only", "verify", "lock and tag", "prove dead", "earth", "permit", "switching rules"];
        if (cautions.Any(word => !plan.Cautions.Any(c => c.Contains(word, StringComparison.OrdinalIgnoreCase))))
        {
            problems.Add("the cautions are missing");
        }

        problems.AddRange(FinalState(plan, closed, live, atFault, everDead));
        return (problems, false);
    }

    /// <summary>
    /// Replays every path of the plan's test order from the incident's start state, each entry's steps after
    /// those of the entry that led to it, against the device rules: nothing opens or closes live that may not,
    /// no close joins two live parts, and a close that puts voltage on a section still suspect on that path
    /// (at first every section the test order names; after a branch, its <c>faultIn</c>) is made by a breaker
    /// or recloser. Then follows the path the true fault takes — the breaker trips when a close energises it,
    /// U0 is present while it is live — to where it ends. Returns the problems, the sections where the
    /// order ended (its last branch's <c>faultIn</c>), how many entries ran, and how many closes re-energised
    /// the true fault.
    /// </summary>
    public (List<string> Problems, IReadOnlyList<SectionId> FaultIn, int Entries, int Trips) CheckTestOrder(Incident incident, SwitchingPlan plan, SegmentId trueFault, bool standing)
    {
        var problems = new List<string>();
        if (plan.TestOrder.IsDefaultOrEmpty)
        {
            return (problems, [], 0, 0);
        }

        var segmentsOf = plan.Sections.ToDictionary(s => s.Id, s => s.Segments.Select(_grid.SegmentIndex).ToList());
        foreach (var id in plan.TestOrder.SelectMany(e => e.ReenergisesSections.Concat(e.CutsOffSections).Concat(e.Branches.SelectMany(b => b.FaultIn))))
        {
            if (!segmentsOf.ContainsKey(id))
            {
                problems.Add($"the test order names section {id}, which the plan's sections do not list");
            }
        }

        if (problems.Count > 0)
        {
            return (problems, [], 0, 0);
        }

        var start = StartState(incident);
        var byEntry = plan.TestOrder.ToDictionary(e => e.Entry);
        var all = segmentsOf.Keys.ToHashSet();
        var pending = new Stack<(int Entry, bool[] Closed, HashSet<SectionId> Suspects)>([(plan.TestOrder[0].Entry, start, all)]);
        var seen = new HashSet<int>();
        while (pending.TryPop(out var item))
        {
            if (!seen.Add(item.Entry) || !byEntry.TryGetValue(item.Entry, out var entry))
            {
                problems.Add($"entry {item.Entry} is reached twice or does not exist");
                continue;
            }

            var closed = (bool[])item.Closed.Clone();
            foreach (var step in entry.Steps.OrderBy(s => s.Order))
            {
                problems.AddRange(TestStep(closed, step, item.Suspects.SelectMany(s => segmentsOf[s]).ToHashSet(), standing, $"test entry {entry.Entry} step {step.Order}"));
            }

            if (entry.Branches.Length < 2)
            {
                problems.Add($"test entry {entry.Entry} has {entry.Branches.Length} branches, not one per result");
            }

            foreach (var branch in entry.Branches.Where(b => b.Next is not null))
            {
                pending.Push((branch.Next!.Value, closed, [.. branch.FaultIn]));
            }
        }

        if (seen.Count != plan.TestOrder.Length)
        {
            problems.Add($"{plan.TestOrder.Length - seen.Count} test entries are reached by no branch");
        }

        // The path of the true fault.
        var fault = _grid.SegmentIndex(trueFault);
        var state = StartState(incident);
        var current = plan.TestOrder[0];
        var ran = 0;
        var trips = 0;
        while (true)
        {
            ran++;
            if (ran > plan.TestOrder.Length)
            {
                problems.Add("the test order loops");
                return (problems, [], ran, trips);
            }

            var tripped = false;
            var opened = false;
            foreach (var step in current.Steps.OrderBy(s => s.Order))
            {
                state[_grid.SwitchIndex(step.Device!.Value)] = step.Action == StepAction.Close;
                opened |= step.Action == StepAction.Open;
                if (step.Action == StepAction.Close && !standing && SegmentLive(Walk(state), fault))
                {
                    // Protection trips: the close is undone by the breaker.
                    tripped = true;
                    trips++;
                    state[_grid.SwitchIndex(step.Device!.Value)] = false;
                    break;
                }
            }

            var live = SegmentLive(Walk(state), fault);
            var result = current.Observe == TestObservation.Trip
                ? (tripped ? TestResult.Trips : TestResult.Holds)
                : current.Steps[^1].Action == StepAction.Open
                    ? (live ? TestResult.U0Stays : TestResult.U0Collapses)
                    : (live ? TestResult.U0Returns : TestResult.U0StaysAbsent);
            var branch = current.Branches.FirstOrDefault(b => b.Result == result);
            if (branch is null)
            {
                problems.Add($"test entry {current.Entry}: no branch for the result {result}");
                return (problems, [], ran, trips);
            }

            if (branch.Next is not { } next)
            {
                return (problems, branch.FaultIn, ran, trips);
            }

            current = byEntry[next];
        }
    }

    /// <summary>
    /// Every isolation point is locked, tagged or remote-blocked before the first earth goes on; every field
    /// indicator in the part without supply that the incident has no field reading of is read before the first close.
    /// </summary>
    private IEnumerable<string> SafetyOrder(Incident incident, SwitchingPlan plan, Walked atFault, Walked start)
    {
        var firstEarth = plan.Steps.Where(s => s.Action == StepAction.Earth).Select(s => s.Order).DefaultIfEmpty(int.MaxValue).Min();
        foreach (var point in plan.Steps.Where(s => s.Action == StepAction.ProveDead).Select(s => s.Device).Distinct())
        {
            if (!plan.Steps.Any(s => s.Action == StepAction.Lock && s.Device == point && s.Order < firstEarth))
            {
                yield return $"isolation point {point} is not locked, tagged or blocked before the first earth";
            }
        }

        var firstClose = plan.Steps.Where(s => s.Action == StepAction.Close).Select(s => s.Order).DefaultIfEmpty(int.MaxValue).Min();
        var read = incident.Indications.Where(i => i.Source == IndicationSource.Field).Select(i => i.Indicator).ToHashSet();
        foreach (var indicator in _grid.Indicators.Where(i => !i.Remote && !read.Contains(i.Id)))
        {
            var v = _grid.NodeIndex(indicator.Node);
            if (firstClose < int.MaxValue && atFault.Substation[v] >= 0 && start.Substation[v] < 0
                && !plan.Steps.Any(s => s.Action == StepAction.Verify && s.Node == indicator.Node && s.Segments.Contains(indicator.Segment) && s.Order < firstClose))
            {
                yield return $"field indicator {indicator.Id} is not read before the first close";
            }
        }
    }

    /// <summary>
    /// Replays the return to normal from the state the plan leaves: clearance first (every earth the plan put
    /// on removed and every lock taken off before the first switching step), then each open and close by the
    /// device rules, with no close joining two live parts and no loop or parallel of substations at any step;
    /// at the end every device is in its normal position.
    /// </summary>
    public List<string> CheckReturn(Incident incident, SwitchingPlan plan, ReturnPlan back)
    {
        var problems = new List<string>();
        var transient = incident.Reclosing is { Transient: true } && plan.IsolatedSections.IsEmpty;
        var closed = transient ? StartStateAtFault(incident) : StartState(incident);
        foreach (var step in plan.Steps.Where(s => s.ChangesNetwork).OrderBy(s => s.Order))
        {
            closed[_grid.SwitchIndex(step.Device!.Value)] = step.Action == StepAction.Close;
        }

        var firstSwitching = back.Steps.Where(s => s.ChangesNetwork).Select(s => s.Order).DefaultIfEmpty(int.MaxValue).Min();
        foreach (var earth in plan.Steps.Where(s => s.Action == StepAction.Earth))
        {
            if (!back.Steps.Any(s => s.Action == StepAction.RemoveEarth && s.Device == earth.Device && s.Node == earth.Node && s.Order < firstSwitching))
            {
                problems.Add($"the earth at {earth.Node} is not removed before the first switching step");
            }
        }

        foreach (var locked in plan.Steps.Where(s => s.Action == StepAction.Lock))
        {
            if (!back.Steps.Any(s => s.Action == StepAction.Unlock && s.Device == locked.Device && s.Order < firstSwitching))
            {
                problems.Add($"the lock on {locked.Device} is not taken off before the first switching step");
            }
        }

        foreach (var step in back.Steps.OrderBy(s => s.Order))
        {
            if (!step.ChangesNetwork)
            {
                continue;
            }

            var live = Walk(closed);
            var index = _grid.SwitchIndex(step.Device!.Value);
            var device = _grid.Switches[index];
            var anyLive = live.Substation[_grid.NodeIndex(device.From)] >= 0 || live.Substation[_grid.NodeIndex(device.To)] >= 0;
            var both = live.Substation[_grid.NodeIndex(device.From)] >= 0 && live.Substation[_grid.NodeIndex(device.To)] >= 0;
            if (closed[index] == (step.Action == StepAction.Close))
            {
                problems.Add($"return step {step.Order}: {device.Id} is already {(closed[index] ? "closed" : "open")}");
            }

            if (anyLive && device.Kind is SwitchKind.Disconnector or SwitchKind.Fuse)
            {
                problems.Add($"return step {step.Order}: operates {Kind(device)} {device.Id} live");
            }

            if (step.Action == StepAction.Close && both)
            {
                problems.Add($"return step {step.Order}: {device.Id} joins two live parts");
            }

            closed[index] = step.Action == StepAction.Close;
            if (Walk(closed).Loop)
            {
                problems.Add($"return step {step.Order}: the network has a loop or parallels two substations");
            }
        }

        for (var i = 0; i < closed.Length; i++)
        {
            if (closed[i] == _grid.Switches[i].NormallyOpen)
            {
                problems.Add($"{_grid.Switches[i].Id} is not in its normal position at the end of the return");
            }
        }

        return problems;
    }

    private bool[] StartStateAtFault(Incident incident)
    {
        var closed = _grid.Switches.Select(s => !s.NormallyOpen).ToArray();
        foreach (var (id, position) in incident.SwitchStates)
        {
            closed[_grid.SwitchIndex(id)] = position == SwitchPosition.Closed;
        }

        return closed;
    }

    private bool[] StartState(Incident incident)
    {
        var closed = _grid.Switches.Select(s => !s.NormallyOpen).ToArray();
        foreach (var (id, position) in incident.SwitchStates)
        {
            closed[_grid.SwitchIndex(id)] = position == SwitchPosition.Closed;
        }

        if (incident.TrippedDevice is { } tripped)
        {
            closed[_grid.SwitchIndex(tripped)] = false;
        }

        return closed;
    }

    /// <summary>One step of a test entry, applied to <paramref name="closed"/>, with the problems it has.</summary>
    private List<string> TestStep(bool[] closed, SwitchingStep step, HashSet<int> suspectSegments, bool standing, string where)
    {
        var problems = new List<string>();
        if (step.Device is not { } id || step.Action is not (StepAction.Open or StepAction.Close))
        {
            problems.Add($"{where}: a test order only opens and closes devices");
            return problems;
        }

        var index = _grid.SwitchIndex(id);
        var device = _grid.Switches[index];
        var live = Walk(closed);
        var fromLive = live.Substation[_grid.NodeIndex(device.From)] >= 0;
        var toLive = live.Substation[_grid.NodeIndex(device.To)] >= 0;
        if (step.Action == StepAction.Open)
        {
            if (!closed[index])
            {
                problems.Add($"{where}: opens {id}, which is open");
            }

            if ((fromLive || toLive) && device.Kind is SwitchKind.Disconnector or SwitchKind.Fuse)
            {
                problems.Add($"{where}: opens {Kind(device)} {id} live");
            }

            if ((fromLive || toLive) && device.Kind == SwitchKind.LoadBreakSwitch && !standing && suspectSegments.Any(s => Feeds(live, index, s)))
            {
                problems.Add($"{where}: load-break switch {id} may break fault current");
            }

            closed[index] = false;
            return problems;
        }

        if (closed[index])
        {
            problems.Add($"{where}: closes {id}, which is closed");
        }

        if (fromLive && toLive)
        {
            problems.Add($"{where}: {id} joins two live parts");
        }

        if ((fromLive || toLive) && device.Kind is SwitchKind.Disconnector or SwitchKind.Fuse)
        {
            problems.Add($"{where}: closes {Kind(device)} {id} live");
        }

        closed[index] = true;
        var after = Walk(closed);
        if (after.Loop)
        {
            problems.Add($"{where}: the network has a loop or parallels two substations");
        }

        var ontoSuspect = suspectSegments.Any(s => !SegmentLive(live, s) && SegmentLive(after, s));
        if (ontoSuspect && device.Kind is not (SwitchKind.Breaker or SwitchKind.Recloser))
        {
            problems.Add($"{where}: {device.Kind} {id} closes onto a section that may hold the fault");
        }

        return problems;
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
