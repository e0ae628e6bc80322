using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The steps of one test entry, numbered from 1, placed on the timeline that leads to the entry
/// (crews leave at the start of the incident; remote operations take the remote time).
/// </summary>
internal sealed class EntrySteps(PlanningContext ctx, TimeSpan start)
{
    private readonly List<SwitchingStep> _steps = [];
    private readonly Timeline _timeline = new(ctx.Grid, ctx.Options, start);

    public TimeSpan End => _timeline.Now;

    public EntrySteps Add(StepAction action, int device, string reason)
    {
        _steps.Add(new SwitchingStep(_steps.Count + 1, action, ctx.Grid.Switches[device].Id, null, [], _timeline.Place(action, device), reason));
        return this;
    }

    public EntrySteps AddRange(IEnumerable<(StepAction Action, int Device, string Reason)> steps)
    {
        foreach (var (action, device, reason) in steps)
        {
            Add(action, device, reason);
        }

        return this;
    }

    public ImmutableArray<SwitchingStep> ToImmutable() => [.. _steps];
}
