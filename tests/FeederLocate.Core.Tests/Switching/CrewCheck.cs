using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Follows every crew through a plan's steps, written for the tests and sharing no code with the planner's
/// timeline: each crew sets out from its base at minute 0 and does one thing at a time. A manual step done
/// by a crew is done no earlier than the crew's arrival plus the operation's time, the arrival being when
/// it was free plus the trip (none when it is already at the device; the base's travel time to the device
/// where the grid gives one, else the device's own, else the default). A reading of field indicators is a
/// trip of the default travel time. A crew leaves (its dispatch step) only once it is free, and the plan
/// has a dispatch for each of its trips before the step that needs it. Test orders are followed path by
/// path, each entry from where the entries before it left the crews. Without crews in the grid, no step
/// names a crew.
/// </summary>
public sealed class CrewCheck(Grid grid, SwitchingOptions options)
{
    private const double Slack = 1e-6;

    private readonly HashSet<string> _labels = [.. grid.CrewBases.SelectMany(b => Enumerable.Range(1, b.Count).Select(k => $"{b.Id.Value}/{k}"))];

    /// <summary>Manual operations checked against a crew, over every call (a test asserts it is not zero).</summary>
    public int CheckedOperations { get; private set; }

    /// <summary>Test entries whose steps were followed, over every call.</summary>
    public int CheckedEntries { get; private set; }

    public List<string> Check(SwitchingPlan plan)
    {
        var problems = Follow(plan.Steps, Fresh(), "plan", dispatched: true);
        if (!plan.TestOrder.IsDefaultOrEmpty)
        {
            var byEntry = plan.TestOrder.ToDictionary(e => e.Entry);
            var pending = new Stack<(int Entry, Dictionary<string, CrewState> Crews)>([(plan.TestOrder[0].Entry, Fresh())]);
            var seen = new HashSet<int>();
            while (pending.TryPop(out var item))
            {
                if (!seen.Add(item.Entry) || !byEntry.TryGetValue(item.Entry, out var entry))
                {
                    continue;
                }

                CheckedEntries++;
                var crews = item.Crews.ToDictionary(p => p.Key, p => p.Value);
                problems.AddRange(Follow(entry.Steps, crews, $"test entry {entry.Entry}", dispatched: false));
                foreach (var branch in entry.Branches.Where(b => b.Next is not null))
                {
                    pending.Push((branch.Next!.Value, crews));
                }
            }
        }

        return problems;
    }

    public List<string> Check(ReturnPlan back) => Follow(back.Steps, Fresh(), "return", dispatched: true);

    private Dictionary<string, CrewState> Fresh() => _labels.ToDictionary(l => l, _ => new CrewState(TimeSpan.Zero, null));

    private List<string> Follow(IEnumerable<SwitchingStep> steps, Dictionary<string, CrewState> crews, string where, bool dispatched)
    {
        var problems = new List<string>();
        var sent = new HashSet<(string Crew, string Where)>();
        foreach (var step in steps.OrderBy(s => s.Order))
        {
            var at = $"{where} step {step.Order}";
            if (step.Crew is { } label && !_labels.Contains(label))
            {
                problems.Add($"{at}: crew {label} is not one of the grid's crews");
                continue;
            }

            var device = step.Device is { } id ? grid.Switch(id) : null;
            var operates = step.Action is StepAction.Open or StepAction.Close or StepAction.Replace;
            if (operates && device!.Remote != (step.Crew is null) && _labels.Count > 0)
            {
                problems.Add($"{at}: {(device.Remote ? "remote" : "manual")} {device.Id} {(device.Remote ? "names" : "names no")} crew");
                continue;
            }

            if (step.Crew is not { } crew)
            {
                continue;
            }

            var state = crews[crew];
            if (step.Action == StepAction.Dispatch)
            {
                if (step.At < state.Free - TimeSpan.FromTicks(1))
                {
                    problems.Add($"{at}: crew {crew} leaves at {step.At.TotalMinutes} min, still busy until {state.Free.TotalMinutes} min");
                }

                sent.Add((crew, step.Device?.Value ?? "indicators"));
                continue;
            }

            if (operates)
            {
                CheckedOperations++;
                var travel = state.Where == device!.Id.Value ? TimeSpan.Zero : Travel(crew, device);
                var earliest = state.Free + travel + Duration(step.Action, device);
                if (step.At.TotalMinutes < earliest.TotalMinutes - Slack)
                {
                    problems.Add($"{at}: crew {crew} finishes {step.Action} {device.Id} at {step.At.TotalMinutes} min, before it can ({earliest.TotalMinutes} min: free {state.Free.TotalMinutes} + travel {travel.TotalMinutes} + work)");
                }

                if (dispatched && travel > TimeSpan.Zero && !sent.Remove((crew, device.Id.Value)))
                {
                    problems.Add($"{at}: crew {crew} works at {device.Id} with no dispatch there before");
                }

                crews[crew] = new CrewState(step.At, device.Id.Value);
            }
            else if (step.Action == StepAction.Verify && step.Node is not null)
            {
                // A field indicator read: the crew went there from wherever it was.
                if (state.Where != "indicators")
                {
                    var earliest = state.Free + options.DefaultTravelTime;
                    if (step.At.TotalMinutes < earliest.TotalMinutes - Slack)
                    {
                        problems.Add($"{at}: crew {crew} reads an indicator at {step.At.TotalMinutes} min, before it can be there ({earliest.TotalMinutes} min)");
                    }

                    if (dispatched && !sent.Remove((crew, "indicators")))
                    {
                        problems.Add($"{at}: crew {crew} reads indicators with no dispatch there before");
                    }
                }

                crews[crew] = new CrewState(step.At, "indicators");
            }
        }

        return problems;
    }

    private TimeSpan Travel(string crew, SwitchingDevice device)
    {
        var baseId = crew[..crew.LastIndexOf('/')];
        var from = grid.CrewBases.Single(b => b.Id.Value == baseId);
        return from.TravelTimes is { } times && times.TryGetValue(device.Id, out var own) ? own : device.TravelTime ?? options.DefaultTravelTime;
    }

    private TimeSpan Duration(StepAction action, SwitchingDevice device) =>
        action == StepAction.Replace ? options.FuseReplacementTime : device.Remote ? options.RemoteOperationTime : options.ManualOperationTime;

    private sealed record CrewState(TimeSpan Free, string? Where);
}
