using System.Net.Http.Headers;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;
using FeederLocate.Web.Security;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;

namespace FeederLocate.Web.Tests.Support;

/// <summary>
/// The app in the test host with a fresh incident log, for HTTP tests. Its accounts: the first-run
/// administrator (password from the setting), a telecontrol operator whose token <see cref="Client"/>
/// carries, a viewer, and an operator limited to the solid grid, each with a token.
/// </summary>
public sealed class ApiFixture : IDisposable
{
    public const string AdministratorPassword = "first-run-password-for-tests";
    public const string SolidGrid = "Marrowdell 20 kV (solidly grounded)";
    private static readonly Actor Setup = new("admin", "engineer");
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-api-").FullName;
    private readonly List<HttpClient> _clients = [];

    public ApiFixture()
    {
        Factory = new WebApplicationFactory<Program>().WithWebHostBuilder(b =>
        {
            b.UseSetting("FeederLocate:DatabasePath", Path.Combine(_folder, "incidents.db"));
            b.UseSetting("FeederLocate:GridFolder", Path.Combine(RepositoryFiles.Root, "sample-grid"));
            b.UseSetting("FeederLocate:AdministratorPassword", AdministratorPassword);
        });
        Accounts = Factory.Services.GetRequiredService<AccountDirectory>();
        Accounts.CreateWithPassword("telecontrol", "Telecontrol gateway", AccountRole.Operator, "telecontrol-password", null, Setup);
        Accounts.CreateWithPassword("watcher", "Shift watcher", AccountRole.Viewer, "watcher-password", null, Setup);
        Accounts.CreateWithPassword("solid-only", "Solid grid desk", AccountRole.Operator, "solid-only-password", [SolidGrid], Setup);
        OperatorToken = Accounts.IssueToken("telecontrol", "gateway 1", Setup).Secret;
        ViewerToken = Accounts.IssueToken("watcher", "wall display", Setup).Secret;
        SolidOnlyToken = Accounts.IssueToken("solid-only", "solid desk", Setup).Secret;
        Client = ClientWith(OperatorToken);
        Anonymous = Factory.CreateClient();
        _clients.Add(Anonymous);
    }

    public WebApplicationFactory<Program> Factory { get; }

    public AccountDirectory Accounts { get; }

    public string OperatorToken { get; }

    public string ViewerToken { get; }

    public string SolidOnlyToken { get; }

    /// <summary>Signed in with the telecontrol operator's token.</summary>
    public HttpClient Client { get; }

    /// <summary>No token at all.</summary>
    public HttpClient Anonymous { get; }

    public HttpClient ClientWith(string token)
    {
        var client = Factory.CreateClient();
        client.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", token);
        _clients.Add(client);
        return client;
    }

    public void Dispose()
    {
        foreach (var client in _clients)
        {
            client.Dispose();
        }

        Factory.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }
}
