using FeederLocate.Storage;
using FeederLocate.Web.Security;

namespace FeederLocate.Web.Services;

/// <summary>Every service of the web app, registered in one place.</summary>
public static class ServiceRegistration
{
    public static IServiceCollection AddFeederLocate(this IServiceCollection services, IConfiguration configuration, string contentRoot)
    {
        var options = configuration.GetSection("FeederLocate").Get<FeederLocateOptions>() ?? new FeederLocateOptions();
        var root = contentRoot;
        services.AddSingleton(options);
        services.AddSingleton(_ => new GridCatalog(Path.GetFullPath(options.GridFolder, root), options.DefaultGrid));
        var databasePath = Path.GetFullPath(options.DatabasePath, root);
        services.AddSingleton(_ => new IncidentBoard(IncidentStore.Open(databasePath)));
        services.AddFeederLocateSecurity(databasePath);
        services.AddSingleton<IncidentAnalysis>();
        services.AddSingleton<IncidentHistory>();
        services.AddSingleton(TimeProvider.System);
        return services;
    }
}
