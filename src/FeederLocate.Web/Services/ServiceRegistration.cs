using FeederLocate.Application.Analysis;
using FeederLocate.Application.Evidence;
using FeederLocate.Application.History;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
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
        services.AddSingleton(_ => new IncidentBoard(IncidentStore.Open(databasePath)));
        services.AddSingleton<IncidentLog>(provider => provider.GetRequiredService<IncidentBoard>());
        services.AddFeederLocateSecurity(databasePath);
        services.AddSingleton<IFaultRanker, CoreFaultRanker>();
        services.AddSingleton(provider => new GridLearning(provider.GetRequiredService<IncidentLog>()));
        services.AddSingleton(provider => new IncidentAnalysis(provider.GetRequiredService<GridLearning>(), provider.GetRequiredService<IFaultRanker>()));
        services.AddSingleton<IncidentHistory>();
        services.AddSingleton<EvidenceIntake>();
        services.AddSingleton<CheckedSwitching>();
        services.AddSingleton<FeederLocate.Application.Lifecycle.IncidentLifecycle>();
        services.AddSingleton<FeederLocate.Application.Times.IncidentTimesEntry>();
        services.AddSingleton(TimeProvider.System);
        return services;
    }
}
