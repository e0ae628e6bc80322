using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The serial timeline of a plan: crews leave at the start and reach a manual device after its travel
/// time; each step starts when the one before it is done and its device can be reached, and takes the
/// operation time (remote, manual, or fuse replacement).
/// </summary>
internal sealed class Timeline(Grid grid, SwitchingOptions options, TimeSpan start = default)
{
    public TimeSpan Now { get; private set; } = start;

    public TimeSpan Travel(int device)
    {
        var d = grid.Switches[device];
        return d.Remote ? TimeSpan.Zero : d.TravelTime is { } travel ? travel : options.DefaultTravelTime;
    }

    public TimeSpan Duration(StepAction action, int device) => action switch
    {
        StepAction.Replace => options.FuseReplacementTime,
        StepAction.Verify => TimeSpan.Zero,
        _ => grid.Switches[device].Remote ? options.RemoteOperationTime : options.ManualOperationTime,
    };

    /// <summary>Nothing on the timeline starts before <paramref name="moment"/>.</summary>
    public void WaitUntil(TimeSpan moment) => Now = Now > moment ? Now : moment;

    /// <summary>Places one step on the timeline; returns its completion time.</summary>
    public TimeSpan Place(StepAction action, int device)
    {
        var ready = Travel(device);
        Now = (Now > ready ? Now : ready) + Duration(action, device);
        return Now;
    }
}
