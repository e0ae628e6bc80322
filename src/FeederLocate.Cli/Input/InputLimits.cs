namespace FeederLocate.Cli.Input;

/// <summary>How much the command line reads and makes, so a wrong argument cannot fill the disk or the memory.</summary>
public static class InputLimits
{
    /// <summary>The largest grid or incident file read: a 200,000-segment generated grid is about 60 MB.</summary>
    public const long MaxFileBytes = 128L * 1024 * 1024;

    /// <summary>The largest grid <c>generate</c> writes.</summary>
    public const int MaxGeneratedSegments = 200_000;
}
