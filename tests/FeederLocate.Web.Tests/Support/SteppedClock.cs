namespace FeederLocate.Web.Tests.Support;

/// <summary>A clock that stands still until a test moves it.</summary>
public sealed class SteppedClock : TimeProvider
{
    public DateTimeOffset Now { get; private set; } = new(2026, 3, 14, 5, 45, 0, TimeSpan.Zero);

    public override DateTimeOffset GetUtcNow() => Now;

    public void Advance(TimeSpan by) => Now += by;
}
