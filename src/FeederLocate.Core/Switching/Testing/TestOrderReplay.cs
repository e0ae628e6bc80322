using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>
/// Carries out every path of a test order on the model — each entry's steps after those of the entry
/// whose branch named it, from the incident's start state — checking each step against the device
/// rules. The sections still suspect on a path are those of the branch that led there (at first every
/// section the ranking gives any probability): a device opening live while feeding one of them breaks
/// its fault current, and a close that puts voltage on one of them must be made by a breaker or recloser.
/// </summary>
internal static class TestOrderReplay
{
    public static List<string> Violations(PlanningContext ctx, IReadOnlyList<TestEntry> entries)
    {
        var violations = new List<string>();
        if (entries.Count == 0)
        {
            return violations;
        }

        var byNumber = entries.ToDictionary(e => e.Entry);
        var suspects = Enumerable.Range(0, ctx.Zones.All.Length).Where(z => ctx.ProbabilityOfZone[z] > 0).ToHashSet();
        var reached = new HashSet<int>();
        var pending = new Stack<(int Entry, SwitchStates States, HashSet<int> Suspects)>([(entries[0].Entry, ctx.StartStates, suspects)]);
        while (pending.TryPop(out var item))
        {
            if (!reached.Add(item.Entry) || !byNumber.TryGetValue(item.Entry, out var entry))
            {
                violations.Add($"entry {item.Entry} is reached twice or does not exist");
                continue;
            }

            var states = item.States;
            foreach (var step in entry.Steps)
            {
                states = Apply(ctx, states, step, item.Suspects, $"entry {entry.Entry} step {step.Order}", violations);
            }

            foreach (var branch in entry.Branches.Where(b => b.Next is not null))
            {
                var next = branch.FaultIn.Select(s => ctx.Zones.TryZoneOf(s, out var z) ? z : -1).Where(z => z >= 0).ToHashSet();
                pending.Push((branch.Next!.Value, states, next));
            }
        }

        if (reached.Count != entries.Count)
        {
            violations.Add($"{entries.Count - reached.Count} entries are reached by no branch");
        }

        return violations;
    }

    private static SwitchStates Apply(PlanningContext ctx, SwitchStates states, SwitchingStep step, IReadOnlySet<int> suspects, string where, List<string> violations)
    {
        if (step.Device is not { } id || step.Action is not (StepAction.Open or StepAction.Close))
        {
            violations.Add($"{where}: a test order switches only (open or close a device)");
            return states;
        }

        var grid = ctx.Grid;
        var index = grid.SwitchIndex(id);
        var device = grid.Switches[index];
        var network = ctx.TryEnergise(states)!;
        var fromLive = network.IsEnergised(device.From);
        var toLive = network.IsEnergised(device.To);
        var open = step.Action == StepAction.Open;
        var next = states.With(id, open ? SwitchPosition.Open : SwitchPosition.Closed);
        var nextNetwork = ctx.TryEnergise(next);
        string? problem;
        if (open)
        {
            var far = ctx.FarNodeOf(network, index);
            var feedsSuspect = far >= 0 && suspects.Any(z => ctx.Zones.All[z].Nodes.Any(v => network.IsEnergised(v) && network.IsAtOrBeyond(far, v)));
            problem = DeviceRules.Open(device, states.IsClosed(index), fromLive, toLive, feedsSuspect ? ctx.FaultCurrent : ThroughCurrent.Load);
        }
        else if (nextNetwork is null)
        {
            problem = $"closing {id} would close a loop or parallel two substations";
        }
        else
        {
            problem = DeviceRules.Close(device, states.IsClosed(index), fromLive, toLive, energisesSuspect: false);
            var ontoSuspect = suspects.Any(z => !ctx.ZoneLive(network, z) && ctx.ZoneLive(nextNetwork, z));
            if (problem is null && ontoSuspect && !DeviceRules.CanMakeOntoFault(device.Kind))
            {
                problem = $"{Words.Kind(device.Kind)} {id} would close onto a section that may hold the fault";
            }
        }

        if (problem is not null)
        {
            violations.Add($"{where}: {problem}");
        }

        return nextNetwork is null ? states : next;
    }
}
