namespace FeederLocate.Core.Switching;

/// <summary>What one entry of a test order does.</summary>
public enum TestAction
{
    /// <summary>Close a breaker or recloser onto a part that may hold the fault: it holds or trips.</summary>
    TrialClose,

    /// <summary>Open a device on a network with a standing earth fault and watch the neutral voltage U0.</summary>
    OpenWatchingU0,

    /// <summary>Reclose a breaker or recloser onto a dead part that may hold the standing earth fault and watch U0.</summary>
    CloseWatchingU0,
}
