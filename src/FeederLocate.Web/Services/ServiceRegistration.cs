using FeederLocate.Application.Analysis;
using FeederLocate.Application.Evidence;
using FeederLocate.Application.Grids;
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
        var root = contentRoot;
        services.AddSingleton(options);
        var databasePath = Path.GetFullPath(options.DatabasePath, root);
        // Claimed before the database is opened: a second web app on the same file is refused at start.
        services.AddSingleton(_ => Storage.Maintenance.InstanceLock.Claim(databasePath));
        services.AddSingleton(sp =>
        {
            sp.GetRequiredService<Storage.Maintenance.InstanceLock>();
            return new GridVersions(Storage.Grids.GridVersionStore.Open(databasePath));
        });
        services.AddSingleton(sp => new GridCatalog(Path.GetFullPath(options.GridFolder, root), options.DefaultGrid, sp.GetRequiredService<GridVersions>()));
        services.AddSingleton(sp => new IncidentBoard(IncidentStore.Open(databasePath), (name, version) => sp.GetRequiredService<GridCatalog>().Find(name, version)?.Grid));
        services.AddSingleton<IncidentGridMove>();
        services.AddSingleton<IncidentLog>(provider => provider.GetRequiredService<IncidentBoard>());
        services.AddFeederLocateSecurity(databasePath, options.SignInFreeFailuresPerClient);
        services.AddSingleton<IFaultRanker, CoreFaultRanker>();
        services.AddSingleton(provider => new GridLearning(provider.GetRequiredService<IncidentLog>()));
        services.AddSingleton(provider => new IncidentAnalysis(provider.GetRequiredService<GridLearning>(), provider.GetRequiredService<IFaultRanker>()));
        services.AddSingleton<IncidentHistory>();
        services.AddSingleton<EvidenceIntake>();
        services.AddSingleton(_ => new LearningCurves(Path.GetFullPath(options.GridFolder, root)));
        services.AddSingleton<CheckedSwitching>();
        services.AddSingleton<FeederLocate.Application.Lifecycle.IncidentLifecycle>();
        services.AddSingleton<ReturnSwitching>();
        services.AddSingleton<FeederLocate.Application.Lifecycle.ShiftHandover>();
        services.AddSingleton<FeederLocate.Application.Times.IncidentTimesEntry>();
        services.AddSingleton(TimeProvider.System);
        return services;
    }
}
