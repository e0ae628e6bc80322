namespace FeederLocate.Core.Switching;

/// <summary>
/// What a plan step does. Only <see cref="Open"/> and <see cref="Close"/> change the network; the others
/// name crew work.
/// </summary>
public enum StepAction
{
    Open,
    Close,
    Dispatch,
    Patrol,
    Verify,
    Replace,

    /// <summary>Lock, tag or block the remote control of an open isolation point so that it stays open while the crew works.</summary>
    Lock,
    ProveDead,
    Earth,
    Permit,

    /// <summary>Return to normal: take an earth off after the work.</summary>
    RemoveEarth,

    /// <summary>Return to normal: take a lock, tag or remote-control block off.</summary>
    Unlock,
}
