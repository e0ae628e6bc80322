namespace FeederLocate.Web.Security;

/// <summary>
/// Slows down whoever keeps guessing, per client address: the first <see cref="FreeFailures"/> failed sign-ins
/// cost nothing; after that each attempt must wait 1 s, 2 s, 4 s, … (at most <see cref="LongestWait"/>) after
/// the last failure. A client forgets its failures after <see cref="ForgetAfter"/> without one. Success does not
/// wipe the count (one valid account must not reset another's guessing). Thread-safe; kept in memory.
/// </summary>
public sealed class SignInThrottle(TimeProvider clock, int freeFailures = SignInThrottle.DefaultFreeFailures)
{
    public const int DefaultFreeFailures = 5;
    public static readonly TimeSpan FirstWait = TimeSpan.FromSeconds(1);
    public static readonly TimeSpan LongestWait = TimeSpan.FromMinutes(1);
    public static readonly TimeSpan ForgetAfter = TimeSpan.FromMinutes(15);
    private const int MaxClients = 10_000;

    private readonly Dictionary<string, (int Failures, DateTimeOffset Last)> _clients = new(StringComparer.Ordinal);
    private readonly Lock _gate = new();

    public int FreeFailures { get; } = freeFailures;

    /// <summary>How long <paramref name="client"/> must still wait before its next attempt is heard; zero when it may try now.</summary>
    public TimeSpan WaitFor(string client)
    {
        lock (_gate)
        {
            var now = clock.GetUtcNow();
            if (!_clients.TryGetValue(client, out var entry) || now - entry.Last >= ForgetAfter || entry.Failures < FreeFailures)
            {
                return TimeSpan.Zero;
            }

            var left = entry.Last + WaitAfter(entry.Failures) - now;
            return left > TimeSpan.Zero ? left : TimeSpan.Zero;
        }
    }

    public void RecordFailure(string client)
    {
        lock (_gate)
        {
            var now = clock.GetUtcNow();
            if (_clients.Count >= MaxClients)
            {
                foreach (var stale in _clients.Where(c => now - c.Value.Last >= ForgetAfter).Select(c => c.Key).ToList())
                {
                    _clients.Remove(stale);
                }
            }

            var failures = _clients.TryGetValue(client, out var entry) && now - entry.Last < ForgetAfter ? entry.Failures + 1 : 1;
            _clients[client] = (failures, now);
        }
    }

    /// <summary>The wait after the <paramref name="failures"/>-th failure: doubling from <see cref="FirstWait"/>.</summary>
    public TimeSpan WaitAfter(int failures)
    {
        var doublings = Math.Clamp(failures - FreeFailures, 0, 30);
        var wait = FirstWait * Math.Pow(2, doublings);
        return wait < LongestWait ? wait : LongestWait;
    }
}
