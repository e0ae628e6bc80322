using FeederLocate.Core.Switching;

namespace FeederLocate.Application.Words;

/// <summary>
/// A step's action in the plain words people read (the page, the board, the handover, the command line's
/// text); the file formats, the API and the log keep the format's own action names.
/// </summary>
public static class StepWords
{
    public static string Action(StepAction action) => action switch
    {
        StepAction.Open => "open",
        StepAction.Close => "close",
        StepAction.Dispatch => "send a crew to",
        StepAction.Patrol => "patrol",
        StepAction.Verify => "verify",
        StepAction.Replace => "replace the fuse",
        StepAction.Lock => "lock and tag",
        StepAction.ProveDead => "prove dead",
        StepAction.Earth => "earth",
        StepAction.Permit => "issue a permit for",
        StepAction.RemoveEarth => "remove the earths from",
        StepAction.Unlock => "remove the lock and tag from",
        _ => action.ToString().ToLowerInvariant(),
    };
}
