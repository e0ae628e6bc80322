using FeederLocate.Application.Incidents;
using FeederLocate.Storage;

namespace FeederLocate.Application.Tests.Support;

/// <summary>An incident log on a fresh SQLite file with a clock that stands still, deleted when the test ends.</summary>
public sealed class TestLog : IDisposable
{
    private readonly TempDatabase _database = new();

    public TestLog()
    {
        Log = new IncidentLog(IncidentStore.Open(_database.Path, TestClock.Manual()));
    }

    public IncidentLog Log { get; }

    public void Dispose()
    {
        Log.Dispose();
        _database.Dispose();
    }
}
