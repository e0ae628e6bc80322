using Microsoft.Extensions.Time.Testing;

namespace FeederLocate.Testing;

/// <summary>
/// Fake clocks (<see cref="FakeTimeProvider"/>): they show <see cref="Start"/> until a test moves them, and
/// their timestamps stand still, so anything timed reads zero.
/// </summary>
public static class TestClock
{
    public static readonly DateTimeOffset Start = new(2026, 3, 14, 5, 45, 0, TimeSpan.Zero);

    /// <summary>A fake clock at <see cref="Start"/>.</summary>
    public static FakeTimeProvider Manual() => new(Start);

    /// <summary>Sets the clock to <paramref name="minutes"/> after <see cref="Start"/> and returns that time; a clock never goes back.</summary>
    public static DateTimeOffset At(this FakeTimeProvider clock, int minutes)
    {
        ArgumentNullException.ThrowIfNull(clock);
        var time = Start.AddMinutes(minutes);
        clock.SetUtcNow(time);
        return time;
    }
}
