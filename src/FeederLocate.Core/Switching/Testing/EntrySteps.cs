using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The steps of one test entry, numbered from 1, placed on the timeline that leads to the entry: the
/// crews are where the entries before it left them (they leave their bases at the start of the incident;
/// remote operations take the remote time). Null <paramref name="after"/> starts a fresh timeline.
/// </summary>
internal sealed class EntrySteps(PlanningContext ctx, Timeline? after)
{
    private readonly List<SwitchingStep> _steps = [];
    private readonly Timeline _timeline = after?.Copy() ?? new(ctx.Grid, ctx.Options);

    /// <summary>The timeline after this entry's steps (a copy: entries that follow continue from it).</summary>
    public Timeline End => _timeline.Copy();

    public EntrySteps Add(StepAction action, int device, string reason)
    {
        var at = _timeline.Place(action, device);
        _steps.Add(new SwitchingStep(_steps.Count + 1, action, ctx.Grid.Switches[device].Id, null, [], at, reason) { Crew = _timeline.Placements[^1].Crew });
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
