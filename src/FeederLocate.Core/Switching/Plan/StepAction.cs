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
    ProveDead,
    Earth,
    Permit,
}
