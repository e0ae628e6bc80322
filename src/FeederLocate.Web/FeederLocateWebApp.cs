using FeederLocate.Storage.Maintenance;
using FeederLocate.Web.Api;
using FeederLocate.Web.Components;
using FeederLocate.Web.Security;
using FeederLocate.Web.Services;

namespace FeederLocate.Web;

/// <summary>The web app, built the same way for the program, the tests and the load test.</summary>
public static class FeederLocateWebApp
{
    /// <summary>Builds the app from command-line style arguments (for instance <c>--urls</c>, <c>--FeederLocate:DatabasePath=…</c>).</summary>
    public static WebApplication Build(string[] args)
    {
        var builder = WebApplication.CreateBuilder(new WebApplicationOptions
        {
            Args = args,
            // The web project's own name, whoever hosts it: its static web assets manifest is found by it.
            ApplicationName = typeof(FeederLocateWebApp).Assembly.GetName().Name,

            // The app's own folder, wherever it is started from: its settings, static files (wwwroot/) and
            // sample grids travel with it (see the project file), and relative paths in the settings start there.
            ContentRootPath = AppContext.BaseDirectory,
        });

        // Listens where --urls or ASPNETCORE_URLS say, else on the default address.
        if (string.IsNullOrEmpty(builder.Configuration[WebHostDefaults.ServerUrlsKey]))
        {
            builder.WebHost.UseUrls(Hosting.ListenAddresses.Default);
        }

        // Blazor's own script comes from the framework's static web assets, in every environment.
        builder.WebHost.UseStaticWebAssets();
        builder.Services.AddRazorComponents().AddInteractiveServerComponents();
        builder.Services.AddFeederLocate(builder.Configuration, builder.Environment.ContentRootPath);
        builder.Services.AddOpenApi(o => o.AddDocumentTransformer<BearerTokenDocument>().AddDocumentTransformer<EvidenceLimitsDocument>());

        var app = builder.Build();
        var options = app.Services.GetRequiredService<FeederLocateOptions>();
        CheckDatabaseAtStart(app.Services);

        app.UseForwardedHeaders(ProxyHeaders.Options(options.TrustedProxies));
        app.UseSecurityHeaders();
        if (!app.Environment.IsDevelopment())
        {
            app.UseExceptionHandler("/Error", createScopeForErrors: true);
        }

        app.UseStatusCodePagesWithReExecute("/not-found", createScopeForStatusCodePages: true);
        app.UseApiProblems();
        app.UseStaticFiles();
        app.UseAuthentication();
        app.UseAuthorization();
        app.UseAntiforgery();
        app.MapStaticAssets();
        app.MapRazorComponents<App>().AddInteractiveServerRenderMode();
        app.MapAccountEndpoints();
        app.MapIncidentApi();
        app.MapOpenApi().AllowAnonymous();

        var accounts = app.Services.GetRequiredService<AccountDirectory>();
        if (options.ResetAdministrator)
        {
            FirstRunAdministrator.Reset(accounts, Console.Out);
        }
        else
        {
            FirstRunAdministrator.Ensure(accounts,
                options.AdministratorPassword ?? Environment.GetEnvironmentVariable(FirstRunAdministrator.EnvironmentVariable), Console.Out);
        }
        app.Lifetime.ApplicationStarted.Register(() =>
            Console.WriteLine($"FeederLocate is running at {string.Join(", ", app.Urls)} (advice only: verify on site; local switching rules govern)"));
        return app;
    }

    /// <summary>
    /// Before serving: the database is claimed for this app alone (<see cref="InstanceLock"/>), and SQLite's quick
    /// check reads every page. A damaged file is refused with <see cref="DatabaseDamagedException"/>; events that
    /// cannot be read are only named (they are quarantined, the rest is served).
    /// </summary>
    private const int SqliteCorrupt = 11;      // SQLITE_CORRUPT, sqlite.org/rescode.html
    private const int SqliteNotADatabase = 26; // SQLITE_NOTADB

    private static void CheckDatabaseAtStart(IServiceProvider services)
    {
        services.GetRequiredService<InstanceLock>();
        IncidentBoard board;
        IntegrityReport report;
        try
        {
            board = services.GetRequiredService<IncidentBoard>();
            report = board.QuickCheck();
        }
        catch (Microsoft.Data.Sqlite.SqliteException e) when (e.SqliteErrorCode is SqliteCorrupt or SqliteNotADatabase)
        {
            throw new DatabaseDamagedException(services.GetRequiredService<FeederLocateOptions>().DatabasePath, new IntegrityReport([e.Message]));
        }

        if (!report.Problems.IsEmpty)
        {
            throw new DatabaseDamagedException(board.DatabasePath, report);
        }

        foreach (var quarantined in report.Quarantined)
        {
            Console.Error.WriteLine($"warning: {quarantined}");
        }
    }
}
