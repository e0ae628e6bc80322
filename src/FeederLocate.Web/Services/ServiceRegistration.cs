using FeederLocate.Storage;
using FeederLocate.Web.Security;

namespace FeederLocate.Web.Services;

/// <summary>Every service of the web app, registered in one place.</summary>
public static class ServiceRegistration
{
    public static IServiceCollection AddFeederLocate(this IServiceCollection services, IConfiguration configuration, string contentRoot)
    {
        var options = configuration.GetSection("FeederLocate").Get<FeederLocateOptions>() ?? new FeederLocateOptions();
        var root = RepositoryPaths.Root(contentRoot);
        services.AddSingleton(options);
        services.AddSingleton(_ => new GridCatalog(RepositoryPaths.Resolve(root, options.GridFolder), options.DefaultGrid));
        var databasePath = RepositoryPaths.Resolve(root, options.DatabasePath);
        services.AddSingleton(sp => new IncidentBoard(IncidentStore.Open(databasePath), name => sp.GetRequiredService<GridCatalog>().Find(name)?.Grid));
        // Claimed before the database is opened: a second web app on the same file is refused at start.
        services.AddSingleton(_ => Storage.Maintenance.InstanceLock.Claim(databasePath));
        services.AddFeederLocateSecurity(databasePath, options.SignInFreeFailuresPerClient);
        services.AddSingleton<IncidentAnalysis>();
        services.AddSingleton<IncidentHistory>();
        services.AddSingleton(TimeProvider.System);
        return services;
    }
}
