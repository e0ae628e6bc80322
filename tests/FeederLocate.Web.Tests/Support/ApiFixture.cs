using Microsoft.AspNetCore.Mvc.Testing;

namespace FeederLocate.Web.Tests.Support;

/// <summary>The app in the test host with a fresh incident log, for HTTP tests.</summary>
public sealed class ApiFixture : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-api-").FullName;

    public ApiFixture()
    {
        Factory = new WebApplicationFactory<Program>().WithWebHostBuilder(b =>
        {
            b.UseSetting("FeederLocate:DatabasePath", Path.Combine(_folder, "incidents.db"));
            b.UseSetting("FeederLocate:GridFolder", Path.Combine(TestGrids.Root, "sample-grid"));
        });
        Client = Factory.CreateClient();
    }

    public WebApplicationFactory<Program> Factory { get; }

    public HttpClient Client { get; }

    public void Dispose()
    {
        Client.Dispose();
        Factory.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }
}
