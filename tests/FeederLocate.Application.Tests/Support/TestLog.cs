using FeederLocate.Application.Incidents;
using FeederLocate.Storage;

namespace FeederLocate.Application.Tests.Support;

/// <summary>An incident log on a fresh SQLite file, deleted with its folder when the test ends.</summary>
public sealed class TestLog : IDisposable
{
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "feederlocate-application-" + Guid.NewGuid().ToString("N"));

    public TestLog()
    {
        Directory.CreateDirectory(_folder);
        Log = new IncidentLog(IncidentStore.Open(Path.Combine(_folder, "incidents.db")));
    }

    public IncidentLog Log { get; }

    public void Dispose()
    {
        Log.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }
}
