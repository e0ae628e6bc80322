namespace FeederLocate.Storage.Tests.Support;

/// <summary>A clock that shows <see cref="Start"/> until a test moves it.</summary>
public sealed class ManualClock : TimeProvider
{
    public static readonly DateTimeOffset Start = new(2026, 3, 14, 5, 45, 0, TimeSpan.Zero);

    public DateTimeOffset Now { get; private set; } = Start;

    public override DateTimeOffset GetUtcNow() => Now;

    /// <summary>Sets the clock to <paramref name="minutes"/> after <see cref="Start"/> and returns that time.</summary>
    public DateTimeOffset At(int minutes) => Now = Start.AddMinutes(minutes);
}
