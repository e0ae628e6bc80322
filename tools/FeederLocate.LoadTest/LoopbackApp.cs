using FeederLocate.Storage.Accounts;
using FeederLocate.Web;
using Microsoft.AspNetCore.Builder;

namespace FeederLocate.LoadTest;

/// <summary>
/// The web app, built as the program builds it, served in this process on a loopback port with a
/// fresh incident log in a temporary folder, and an operator account with an API token for the clients.
/// </summary>
public sealed class LoopbackApp : IAsyncDisposable
{
    public const string AccountName = "loadtest";

    private readonly string _folder;
    private WebApplication? _app;

    private LoopbackApp(string folder, string databasePath, string secret, WebApplication app, Uri address)
    {
        _folder = folder;
        DatabasePath = databasePath;
        TokenSecret = secret;
        _app = app;
        Address = address;
    }

    /// <summary>The incident log the app writes; read it after <see cref="StopAsync"/>.</summary>
    public string DatabasePath { get; }

    /// <summary>The bearer token of <see cref="AccountName"/>, role operator.</summary>
    public string TokenSecret { get; }

    /// <summary>Where the app listens, for instance http://127.0.0.1:40123.</summary>
    public Uri Address { get; }

    public static async Task<LoopbackApp> StartAsync(string gridFolder, CancellationToken cancellation = default)
    {
        var folder = Directory.CreateTempSubdirectory("feederlocate-load-").FullName;
        var databasePath = Path.Combine(folder, "incidents.db");
        WebApplication? app = null;
        try
        {
            // Seeded before the app starts, so its first run finds an account and creates no administrator.
            string secret;
            using (var accounts = AccountStore.Open(databasePath))
            {
                accounts.Create(AccountName, "Load test client", AccountRole.Operator, passwordHash: "!no-password-sign-in",
                    mustChangePassword: false, grids: null, by: AccountName);
                secret = accounts.IssueToken(AccountName, "loopback load test", AccountName).Secret;
            }

            app = FeederLocateWebApp.Build(
            [
                "--urls=http://127.0.0.1:0",
                "--environment=Production",
                $"--FeederLocate:DatabasePath={databasePath}",
                $"--FeederLocate:GridFolder={Path.GetFullPath(gridFolder)}",
                // The request log would cost more than the requests; warnings and errors still show.
                "--Logging:LogLevel:Default=Warning",
            ]);
            await app.StartAsync(cancellation);
            return new LoopbackApp(folder, databasePath, secret, app, new Uri(app.Urls.First()));
        }
        catch
        {
            if (app is not null)
            {
                await app.DisposeAsync();
            }

            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
            Directory.Delete(folder, recursive: true);
            throw;
        }
    }

    /// <summary>Stops the app and closes its incident log, so that it can be read whole.</summary>
    public async Task StopAsync()
    {
        if (_app is { } app)
        {
            _app = null;
            await app.StopAsync();
            await app.DisposeAsync();
            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        }
    }

    public async ValueTask DisposeAsync()
    {
        await StopAsync();
        Directory.Delete(_folder, recursive: true);
    }
}
