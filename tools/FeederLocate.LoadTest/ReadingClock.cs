namespace FeederLocate.LoadTest;

/// <summary>
/// Hands out reading times one millisecond apart, shared by every client, so that each posted
/// indication carries a <c>readAt</c> no other has and can be found in the log afterwards.
/// </summary>
public sealed class ReadingClock(DateTimeOffset start)
{
    private long _ticks;

    public DateTimeOffset Next() => start.AddMilliseconds(Interlocked.Increment(ref _ticks));
}
